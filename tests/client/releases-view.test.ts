import { createAppContext, demoUsers, getButton, jsonResponse, mountInApp, waitFor } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import type { OutboxMessage } from '@shared/schemas/outbox';
import type { Release, ReleaseLine } from '@shared/schemas/releases';
import type { SessionUser } from '@shared/schemas/user';
import ReleasesView from '@/views/ReleasesView.vue';
import { lineDifference, runSummary } from '@/components/releases-presentation';
import { localToday } from '@/format';

const confirmBox = vi.hoisted(() => vi.fn(() => Promise.resolve('confirm')));
vi.mock('element-plus', async (importOriginal) => {
  const original = await importOriginal<typeof import('element-plus')>();
  return { ...original, ElMessageBox: { confirm: confirmBox } };
});

const supplierUser: SessionUser = {
  email: 'ferncombe.lena@example.net',
  name: 'Lena Haverford',
  role: 'supplier',
  supplierCode: 'FBS',
};

const line = (overrides: Partial<ReleaseLine>): ReleaseLine => ({
  id: 1,
  partNumber: 'CTL-W24',
  qty: 15,
  needDate: '2026-12-09',
  description: 'Machine controller 24 V',
  uom: 'H87',
  hazardous: false,
  origin: 'plan',
  cardNumber: null,
  confirmedQty: null,
  shipDate: null,
  receivedQty: 0,
  closed: false,
  requestedQty: 15,
  requestedDate: '2026-12-09',
  expedite: false,
  arrivalDate: null,
  earliestShipDate: '2026-12-08',
  latestShipDate: '2026-12-09',
  ...overrides,
});

const release = (overrides: Partial<Release>): Release => ({
  number: 'R261201-GDC',
  supplierCode: 'GDC',
  status: 'sent',
  lines: [line({})],
  id: 1,
  supplierName: 'Drive Controls Co',
  releaseDate: '2026-12-01',
  sentAt: '2026-12-01T06:00:00.000Z',
  confirmedAt: null,
  carrier: null,
  trackingNumber: null,
  supplierNote: null,
  notice: null,
  shipNotices: [],
  ...overrides,
});

// The supplier offered 10 of 15 on the first line and ships the third line three days late.
const exception = release({
  status: 'exception',
  confirmedAt: '2026-12-01T09:30:00.000Z',
  carrier: 'Road Freight Co',
  trackingNumber: 'RF-448812',
  supplierNote: 'Ten this week, the rest on Monday.',
  lines: [
    line({ id: 1, confirmedQty: 10, shipDate: '2026-12-09' }),
    line({
      id: 2,
      needDate: '2026-12-10',
      earliestShipDate: '2026-12-09',
      latestShipDate: '2026-12-10',
      confirmedQty: 15,
      shipDate: '2026-12-10',
    }),
    line({
      id: 3,
      needDate: '2026-12-11',
      earliestShipDate: '2026-12-10',
      latestShipDate: '2026-12-11',
      confirmedQty: 15,
      shipDate: '2026-12-14',
    }),
  ],
});
const sent = release({
  number: 'R261201-FBS',
  supplierCode: 'FBS',
  supplierName: 'Battery Supply Co',
  id: 2,
  lines: [line({ id: 4, partNumber: 'BAT-06-312', hazardous: true })],
});

type Answer = (url: URL, init?: RequestInit) => Response;

function stubApi(answers: Record<string, Answer>) {
  const fetchMock = vi.fn<typeof fetch>((input, init) => {
    const url = new URL(String(input), 'http://localhost');
    const answer = answers[`${init?.method ?? 'GET'} ${url.pathname}`];
    return Promise.resolve(
      answer ? answer(url, init) : jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }),
    );
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

function listAnswer(all: Release[]): Answer {
  return (url) => {
    const status = url.searchParams.get('status');
    return jsonResponse(200, status ? all.filter((candidate) => candidate.status === status) : all);
  };
}

async function openReleases(user: SessionUser = demoUsers.buyer) {
  const context = await createAppContext({ user, path: '/releases' });
  const wrapper = await mountInApp(ReleasesView, context);
  await flushPromises();
  return wrapper;
}

describe('ReleasesView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
    confirmBox.mockClear();
  });

  it('puts the exceptions first with the differences line by line, then every release in the table', async () => {
    stubApi({
      'GET /api/releases': listAnswer([exception, sent]),
      'GET /api/releases/settings': () => jsonResponse(200, { jobTime: '06:00', lastRunDate: null }),
    });

    const wrapper = await openReleases();

    const decisions = wrapper.get('[aria-labelledby="releases-exceptions-heading"]');
    expect(decisions.text()).toContain('1 release needs your decision');
    expect(decisions.text()).toContain('Ten this week, the rest on Monday.');
    const diffRows = decisions.findAll('tbody tr');
    expect(diffRows).toHaveLength(2);
    expect(diffRows[0]!.text()).toContain('5 pcs short');
    expect(diffRows[1]!.text()).toContain('arrives after the need date');
    expect(decisions.text()).toContain('1 other line confirmed as asked.');
    const rows = wrapper.findAll('.releases-table tr.el-table__row');
    expect(rows.map((row) => row.find('.releases-table__number').text())).toEqual(['R261201-GDC', 'R261201-FBS']);
    expect(rows[0]!.text()).toContain('Exception');
    expect(rows[0]!.text()).toContain('Road Freight Co · RF-448812');
    expect(rows[1]!.text()).toContain('Sent');
    expect(wrapper.text()).toContain('Runs daily at 06:00');
  });

  it('runs releases for today and sums up what was sent', async () => {
    const fetchMock = stubApi({
      'GET /api/releases': listAnswer([]),
      'GET /api/releases/settings': () => jsonResponse(200, { jobTime: '06:00', lastRunDate: null }),
      'POST /api/releases/run': (_url, init) => {
        const { date } = JSON.parse(String(init?.body)) as { date: string };
        return jsonResponse(200, { date, releases: [sent, exception], existing: [] });
      },
    });
    const wrapper = await openReleases();

    getButton(wrapper.element, 'Run releases now').click();
    await flushPromises();

    const run = fetchMock.mock.calls.find(([, init]) => init?.method === 'POST');
    expect(JSON.parse(String(run![1]!.body))).toEqual({ date: localToday() });
    expect(wrapper.text()).toContain('2 releases with 4 lines sent for');
    expect(wrapper.text()).toContain('R261201-FBS, R261201-GDC');
  });

  it('accepts the supplier’s changes after the buyer confirms, and the exception leaves the list', async () => {
    let accepted = false;
    const fetchMock = stubApi({
      'GET /api/releases': (url) => listAnswer(accepted ? [{ ...exception, status: 'confirmed' }] : [exception])(url),
      'GET /api/releases/settings': () => jsonResponse(200, { jobTime: '06:00', lastRunDate: null }),
      'POST /api/releases/R261201-GDC/accept-exception': () => {
        accepted = true;
        return jsonResponse(200, { ...exception, status: 'confirmed' });
      },
    });
    const wrapper = await openReleases();

    getButton(wrapper.element, 'Accept changes').click();
    await flushPromises();

    expect(confirmBox).toHaveBeenCalledWith(
      expect.stringContaining('become the confirmed ones'),
      'Accept the supplier’s changes?',
      expect.any(Object),
    );
    expect(
      fetchMock.mock.calls.some(
        ([input, init]) => String(input).endsWith('/accept-exception') && init?.method === 'POST',
      ),
    ).toBe(true);
    expect(wrapper.find('[aria-labelledby="releases-exceptions-heading"]').exists()).toBe(false);
    expect(wrapper.get('.releases-table tr.el-table__row').text()).toContain('Confirmed');
  });

  it('does nothing when the buyer backs out of cancelling', async () => {
    confirmBox.mockImplementationOnce(() => Promise.reject(new Error('cancel')));
    const fetchMock = stubApi({
      'GET /api/releases': listAnswer([exception]),
      'GET /api/releases/settings': () => jsonResponse(200, { jobTime: '06:00', lastRunDate: null }),
    });
    const wrapper = await openReleases();

    getButton(wrapper.element, 'Cancel release').click();
    await flushPromises();

    expect(fetchMock.mock.calls.some(([, init]) => init?.method === 'POST')).toBe(false);
  });

  it('offers an admin the job time and a buyer only the words for it', async () => {
    stubApi({
      'GET /api/releases': listAnswer([]),
      'GET /api/releases/settings': () => jsonResponse(200, { jobTime: '05:30', lastRunDate: '2026-12-01' }),
    });

    const admin = await openReleases(demoUsers.admin);

    expect(getButton(admin.element, 'Daily run 05:30')).toBeTruthy();
    document.body.innerHTML = '';
    const buyer = await openReleases(demoUsers.buyer);
    expect(buyer.text()).toContain('Runs daily at 05:30');
    expect(buyer.findAll('button').some((button) => button.text().startsWith('Daily run'))).toBe(false);
  });

  it('shows a supplier its own releases read-only, without running or deciding', async () => {
    stubApi({ 'GET /api/releases': listAnswer([sent]) });

    const wrapper = await openReleases(supplierUser);

    expect(wrapper.get('h1').text()).toBe('Your releases');
    expect(wrapper.text()).not.toContain('Run releases now');
    expect(wrapper.find('[aria-label="Actions for R261201-FBS"]').exists()).toBe(false);
    expect(wrapper.get('.releases-table tr.el-table__row').text()).toContain('R261201-FBS');
  });
});

describe('release e-mails', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
    confirmBox.mockClear();
  });

  /** 00:05 today on this computer's clock: shown as a time alone, being today. */
  function earlyToday(): string {
    const instant = new Date();
    instant.setHours(0, 5, 0, 0);
    return instant.toISOString();
  }

  const notice = (overrides: Partial<OutboxMessage>): OutboxMessage => ({
    id: 9,
    to: 'orders@example.net',
    subject: 'Release R261201-FBS',
    status: 'sent',
    ref: 'release:R261201-FBS',
    attempts: 1,
    lastError: null,
    createdAt: earlyToday(),
    sentAt: earlyToday(),
    firstFailedAt: null,
    nextAttemptAt: null,
    ...overrides,
  });
  const failingNotice = notice({
    status: 'failing',
    attempts: 2,
    sentAt: null,
    firstFailedAt: earlyToday(),
    lastError: 'connect ECONNREFUSED 127.0.0.1:2525',
    nextAttemptAt: '2026-01-01T00:00:00.000Z',
  });

  function emailCell(wrapper: Awaited<ReturnType<typeof openReleases>>, number: string): string {
    const row = wrapper
      .findAll('.releases-table tr.el-table__row')
      .find((candidate) => candidate.text().includes(number));
    return row!.get('.outbox-status').text();
  }

  it('says for each release whether its e-mail was sent, waits or fails', async () => {
    stubApi({
      'GET /api/releases': listAnswer([
        release({ number: 'R261201-AAA', notice: notice({}) }),
        release({ number: 'R261201-BBB', notice: notice({ status: 'pending', attempts: 0, sentAt: null }) }),
        release({ number: 'R261201-CCC', notice: failingNotice }),
      ]),
      'GET /api/releases/settings': () => jsonResponse(200, { jobTime: '06:00', lastRunDate: null, version: 'j1' }),
    });

    const wrapper = await openReleases();

    expect(emailCell(wrapper, 'R261201-AAA')).toBe('E-mail sent 00:05');
    expect(emailCell(wrapper, 'R261201-BBB')).toBe('E-mail waiting');
    expect(emailCell(wrapper, 'R261201-CCC')).toBe('E-mail failing since 00:05 — retrying');
  });

  it('tries an unsent e-mail again with the same link, apart from resending with a new link', async () => {
    const failing = release({ number: 'R261201-FBS', notice: failingNotice });
    const fetchMock = stubApi({
      'GET /api/releases': listAnswer([failing]),
      'GET /api/releases/settings': () => jsonResponse(200, { jobTime: '06:00', lastRunDate: null, version: 'j1' }),
      'POST /api/releases/R261201-FBS/notice/send-again': () =>
        jsonResponse(200, { ...failing, notice: notice({ attempts: 3 }) }),
    });
    const wrapper = await openReleases();

    (document.querySelector('[aria-label="Actions for R261201-FBS"]') as HTMLElement).click();
    await flushPromises();
    const items = [...document.querySelectorAll('[role="menuitem"]')].map((item) => item.textContent?.trim());
    expect(items).toEqual(
      expect.arrayContaining(['Send e-mail again (same link)', 'Resend with a new link', 'Cancel release']),
    );
    const sendAgain = [...document.querySelectorAll('[role="menuitem"]')].find(
      (item) => item.textContent?.trim() === 'Send e-mail again (same link)',
    ) as HTMLElement;
    sendAgain.click();
    await flushPromises();

    expect(confirmBox).not.toHaveBeenCalled();
    const posts = fetchMock.mock.calls.filter(([, init]) => init?.method === 'POST').map(([input]) => String(input));
    expect(posts).toEqual(['/api/releases/R261201-FBS/notice/send-again']);
    expect(emailCell(wrapper, 'R261201-FBS')).toBe('E-mail sent 00:05');
    expect(document.body.textContent).toContain('The e-mail for R261201-FBS has reached the mail server.');
  });

  it('offers no e-mail retry once the mail server took it', async () => {
    stubApi({
      'GET /api/releases': listAnswer([release({ number: 'R261201-FBS', notice: notice({}) })]),
      'GET /api/releases/settings': () => jsonResponse(200, { jobTime: '06:00', lastRunDate: null, version: 'j1' }),
    });
    await openReleases();

    (document.querySelector('[aria-label="Actions for R261201-FBS"]') as HTMLElement).click();
    await flushPromises();

    const items = [...document.querySelectorAll('[role="menuitem"]')].map((item) => item.textContent?.trim());
    expect(items).not.toContain('Send e-mail again (same link)');
    expect(items).toContain('Resend with a new link');
  });

  it('sends the job time on the version shown, and shows the time someone else saved first', async () => {
    const fetchMock = stubApi({
      'GET /api/releases': listAnswer([]),
      'GET /api/releases/settings': () => jsonResponse(200, { jobTime: '06:00', lastRunDate: null, version: 'j1' }),
      'PUT /api/releases/settings': () =>
        jsonResponse(409, {
          error: {
            code: 'stale',
            message: 'Changed by someone else.',
            details: [{ current: { jobTime: '07:00', lastRunDate: null, version: 'j2' } }],
          },
        }),
    });
    const wrapper = await openReleases(demoUsers.admin);

    getButton(wrapper.element, 'Daily run 06:00').click();
    // The popover starts from the stored time once it has opened.
    await waitFor(() => expect(wrapper.findComponent({ name: 'ElTimeSelect' }).props('modelValue')).toBe('06:00'));
    wrapper.findComponent({ name: 'ElTimeSelect' }).vm.$emit('update:modelValue', '05:15');
    await flushPromises();
    getButton(document.body, 'Save').click();
    await flushPromises();

    const [, init] = fetchMock.mock.calls.find(([, candidate]) => candidate?.method === 'PUT')!;
    expect(JSON.parse(String(init!.body))).toEqual({ jobTime: '05:15' });
    expect((init!.headers as Record<string, string>)['If-Match']).toBe('"j1"');
    expect(document.body.textContent).toContain(
      'The release job time was changed by someone else first. The screen now shows their version',
    );
    expect(getButton(wrapper.element, 'Daily run 07:00')).toBeTruthy();
    expect(wrapper.findComponent({ name: 'ElTimeSelect' }).props('modelValue')).toBe('07:00');
  });
});

describe('release presentation', () => {
  it('tells a short quantity, a late and an early ship date apart', () => {
    expect(lineDifference(exception.lines[0]!)).toEqual({
      answered: true,
      qtyChanged: true,
      late: false,
      early: false,
      differs: true,
    });
    expect(lineDifference(exception.lines[1]!)).toEqual({
      answered: true,
      qtyChanged: false,
      late: false,
      early: false,
      differs: false,
    });
    expect(lineDifference(exception.lines[2]!)).toEqual({
      answered: true,
      qtyChanged: false,
      late: true,
      early: false,
      differs: true,
    });
    expect(lineDifference(line({ confirmedQty: 15, shipDate: '2026-12-04' }))).toMatchObject({
      early: true,
      differs: true,
    });
    expect(lineDifference(line({}))).toEqual({
      answered: false,
      qtyChanged: false,
      late: false,
      early: false,
      differs: false,
    });
  });

  it('says when a run made nothing new', () => {
    expect(
      runSummary({ date: '2026-12-01', releases: [], existing: ['R261201-GDC', 'R261201-FBS'] }, 'Tue 1 Dec'),
    ).toBe('Nothing new for Tue 1 Dec: 2 releases were already made that day.');
  });
});
