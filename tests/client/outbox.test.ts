import { createAppContext, demoUsers, jsonResponse, mountInApp } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import type { OutboxMessage } from '@shared/schemas/outbox';
import AppShellNotices from '@/components/AppShellNotices.vue';
import OutboxView from '@/views/OutboxView.vue';

/** 00:05 today on this computer's clock: shown as a time alone, being today. */
function earlyToday(): string {
  const instant = new Date();
  instant.setHours(0, 5, 0, 0);
  return instant.toISOString();
}

const failing: OutboxMessage = {
  id: 5,
  to: 'orders@example.net',
  subject: 'Release R261202-FBS',
  status: 'failing',
  ref: 'release:R261202-FBS',
  attempts: 3,
  lastError: 'connect ECONNREFUSED 127.0.0.1:2525',
  createdAt: earlyToday(),
  sentAt: null,
  firstFailedAt: earlyToday(),
  nextAttemptAt: '2026-01-01T00:00:00.000Z',
};
const sent: OutboxMessage = {
  id: 4,
  to: 'sales@example.org',
  subject: 'Forecast week 49',
  status: 'sent',
  ref: null,
  attempts: 1,
  lastError: null,
  createdAt: earlyToday(),
  sentAt: earlyToday(),
  firstFailedAt: null,
  nextAttemptAt: null,
};

type Answer = (init?: RequestInit) => Response;

function stubApi(answers: Record<string, Answer>) {
  const fetchMock = vi.fn<typeof fetch>((input, init) => {
    const url = new URL(String(input), 'http://localhost');
    const answer = answers[`${init?.method ?? 'GET'} ${url.pathname}`];
    return Promise.resolve(
      answer ? answer(init) : jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }),
    );
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

function callsTo(fetchMock: ReturnType<typeof stubApi>, method: string, pathname: string) {
  return fetchMock.mock.calls.filter(
    ([input, init]) =>
      (init?.method ?? 'GET') === method && new URL(String(input), 'http://localhost').pathname === pathname,
  );
}

const health = { pending: 0, failing: 1, failingSince: earlyToday() };

describe('OutboxView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  async function openOutbox() {
    const context = await createAppContext({ user: demoUsers.admin, path: '/admin/outbox' });
    const wrapper = await mountInApp(OutboxView, context);
    await flushPromises();
    return wrapper;
  }

  function rowOf(wrapper: Awaited<ReturnType<typeof openOutbox>>, subject: string) {
    return wrapper.findAll('tr.el-table__row').find((row) => row.text().includes(subject))!;
  }

  it('shows a failing notice in words and with an icon: since when, the last error and the next try', async () => {
    stubApi({
      'GET /api/outbox': () => jsonResponse(200, [failing, sent]),
      'GET /api/outbox/health': () => jsonResponse(200, health),
      'GET /api/dev/mail': () => jsonResponse(200, []),
    });

    const wrapper = await openOutbox();

    const row = rowOf(wrapper, 'Release R261202-FBS');
    expect(row.get('.outbox-status').text()).toBe('Failing');
    expect(row.find('.outbox-status svg').exists()).toBe(true);
    expect(row.text()).toContain('Failing since 00:05 · 3 attempts · next try now');
    expect(row.text()).toContain('Last error: connect ECONNREFUSED 127.0.0.1:2525');
    expect(row.find('button[aria-label^="Send again"]').exists()).toBe(true);
    const sentRow = rowOf(wrapper, 'Forecast week 49');
    expect(sentRow.get('.outbox-status').text()).toBe('Sent');
    expect(sentRow.text()).toContain('Sent 00:05');
    expect(sentRow.findAll('button').map((button) => button.text())).toEqual(['Read']);
    expect(wrapper.get('.outbox-view__failing').text()).toContain(
      '1 notice has not reached the mail server since 00:05',
    );
  });

  it('opens a notice as written from its row, the sent one as its recipient got it', async () => {
    const fetchMock = stubApi({
      'GET /api/outbox': () => jsonResponse(200, [failing, sent]),
      'GET /api/outbox/health': () => jsonResponse(200, health),
      'GET /api/dev/mail': () => jsonResponse(200, []),
      'GET /api/outbox/4/mail': () =>
        jsonResponse(200, {
          id: 4,
          to: sent.to,
          subject: sent.subject,
          text: 'Your forecast for week 49 is attached.',
          html: '',
          date: sent.sentAt,
          attachments: [{ fileName: 'forecast.csv', contentType: 'text/csv', sizeBytes: 120 }],
        }),
    });
    const wrapper = await openOutbox();

    rowOf(wrapper, 'Forecast week 49').get('[data-test="read-notice"]').element.dispatchEvent(new Event('click'));
    await flushPromises();

    expect(callsTo(fetchMock, 'GET', '/api/outbox/4/mail')).toHaveLength(1);
    const preview = document.querySelector('[aria-label="Selected message"]')!;
    expect(preview.textContent).toContain('Forecast week 49');
    expect(preview.textContent).toContain('sales@example.org');
    expect(preview.textContent).toContain('Your forecast for week 49 is attached.');
    expect(preview.textContent).toContain('forecast.csv');
  });

  it('shows the action column only while a notice in view can be sent again', async () => {
    stubApi({
      'GET /api/outbox': () => jsonResponse(200, [sent]),
      'GET /api/outbox/health': () => jsonResponse(200, health),
      'GET /api/dev/mail': () => jsonResponse(200, []),
    });
    const headers = (wrapper: Awaited<ReturnType<typeof openOutbox>>) =>
      wrapper.findAll('.outbox-view__table th').map((cell) => cell.text());

    const allSent = await openOutbox();
    expect(headers(allSent)).toEqual(['Status', 'To', 'Subject', 'Delivery', 'Queued', 'Message']);
    allSent.unmount();
    stubApi({
      'GET /api/outbox': () => jsonResponse(200, [failing, sent]),
      'GET /api/outbox/health': () => jsonResponse(200, health),
      'GET /api/dev/mail': () => jsonResponse(200, []),
    });
    const oneFailing = await openOutbox();

    expect(headers(oneFailing)).toEqual(['Status', 'To', 'Subject', 'Delivery', 'Queued', 'Message', 'Action']);
  });

  it('tries a failing notice again at once and shows it as it now stands', async () => {
    const fetchMock = stubApi({
      'GET /api/outbox': () => jsonResponse(200, [failing, sent]),
      'GET /api/outbox/health': () => jsonResponse(200, health),
      'GET /api/dev/mail': () => jsonResponse(200, []),
      'POST /api/outbox/5/send-again': () =>
        jsonResponse(200, { ...failing, status: 'sent', attempts: 4, sentAt: earlyToday(), nextAttemptAt: null }),
    });
    const wrapper = await openOutbox();

    await rowOf(wrapper, 'Release R261202-FBS').get('button[aria-label^="Send again"]').trigger('click');
    await flushPromises();

    expect(callsTo(fetchMock, 'POST', '/api/outbox/5/send-again')).toHaveLength(1);
    const row = rowOf(wrapper, 'Release R261202-FBS');
    expect(row.get('.outbox-status').text()).toBe('Sent');
    expect(row.text()).toContain('Sent 00:05 after 4 attempts');
    expect(row.findAll('button').map((button) => button.text())).toEqual(['Read']);
  });
});

describe('mail alert in the shell', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
    vi.useRealTimers();
  });

  it('tells an admin how many notices fail since when, with a way to the Outbox, and checks again minutes later', async () => {
    vi.useFakeTimers();
    const fetchMock = stubApi({
      'GET /api/outbox/health': () => jsonResponse(200, { pending: 2, failing: 3, failingSince: earlyToday() }),
    });
    const context = await createAppContext({ user: demoUsers.admin, path: '/' });

    const wrapper = await mountInApp(AppShellNotices, context);
    await flushPromises();

    const alert = wrapper.get('[role="alert"]');
    expect(alert.text()).toBe(
      '3 notices have not reached the mail server since 00:05. Cardloop keeps trying. Open the Outbox.',
    );
    expect(alert.get('a').attributes('href')).toBe('/admin/outbox');
    expect(callsTo(fetchMock, 'GET', '/api/outbox/health')).toHaveLength(1);

    await vi.advanceTimersByTimeAsync(60_000);
    expect(callsTo(fetchMock, 'GET', '/api/outbox/health')).toHaveLength(1);
    await vi.advanceTimersByTimeAsync(5 * 60_000);
    expect(callsTo(fetchMock, 'GET', '/api/outbox/health')).toHaveLength(2);
    wrapper.unmount();
    await vi.advanceTimersByTimeAsync(10 * 60_000);
    expect(callsTo(fetchMock, 'GET', '/api/outbox/health')).toHaveLength(2);
  });

  it('says nothing when every notice reaches the mail server', async () => {
    stubApi({ 'GET /api/outbox/health': () => jsonResponse(200, { pending: 1, failing: 0, failingSince: null }) });
    const context = await createAppContext({ user: demoUsers.admin, path: '/' });

    const wrapper = await mountInApp(AppShellNotices, context);
    await flushPromises();

    expect(wrapper.find('[role="alert"]').exists()).toBe(false);
  });

  it('never asks for a buyer, whose role may not read the outbox', async () => {
    const fetchMock = stubApi({});
    const context = await createAppContext({ user: demoUsers.buyer, path: '/' });

    const wrapper = await mountInApp(AppShellNotices, context);
    await flushPromises();

    expect(callsTo(fetchMock, 'GET', '/api/outbox/health')).toHaveLength(0);
    expect(wrapper.text()).toBe('');
  });
});
