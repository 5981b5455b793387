import { createAppContext, getButton, jsonResponse, mountInApp } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import type { BuildResponse } from '@shared/schemas/builds';
import type { SequenceBoard, SequenceUnit } from '@shared/schemas/sequence';
import type { SessionUser } from '@shared/schemas/user';
import BuildsView from '@/views/BuildsView.vue';

const TODAY = '2026-12-02';

const planner: SessionUser = { email: 'planner@example.com', name: 'Pat Planner', role: 'planner', supplierCode: null };
const line: SessionUser = { email: 'line@example.com', name: 'Lee Line', role: 'line', supplierCode: null };

function unit(serial: string, sequence: number, overrides: Partial<SequenceUnit> = {}): SequenceUnit {
  return {
    id: sequence,
    date: TODAY,
    sequence,
    model: 'M-A',
    serial,
    qty: 1,
    status: 'planned',
    builtAt: null,
    ...overrides,
  };
}

function boardOf(units: SequenceUnit[]): SequenceBoard {
  return {
    from: TODAY,
    to: TODAY,
    today: TODAY,
    frozenUntil: TODAY,
    frozenWindowDays: 1,
    dailyCapacity: 24,
    models: [{ partNumber: 'M-A', description: 'Model A' }],
    days: [
      {
        date: TODAY,
        working: true,
        frozen: true,
        past: false,
        capacity: 24,
        load: units.length,
        units,
        version: 'v1',
      },
    ],
  };
}

function built(serial: string, builtAt = '2026-12-02T09:15:00.000Z'): BuildResponse {
  return {
    serial,
    status: 'built',
    builtAt,
    movements: [
      { partNumber: 'P-1', qty: -2 },
      { partNumber: 'P-2', qty: -1 },
    ],
  };
}

type Answer = (init: RequestInit | undefined, url: URL) => Response | Promise<Response>;

/** Answers `METHOD /api/path`; the live event stream stays open and silent. */
function stubApi(answers: Record<string, Answer>) {
  const fetchMock = vi.fn<typeof fetch>((input, init) => {
    const url = new URL(String(input), 'http://localhost');
    if (url.pathname === '/api/events') return new Promise<Response>(() => undefined);
    const key = `${init?.method ?? 'GET'} ${url.pathname}`;
    const answer = answers[key];
    return Promise.resolve(
      answer ? answer(init, url) : jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }),
    );
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

function callsTo(fetchMock: ReturnType<typeof stubApi>, method: string, path: string) {
  return fetchMock.mock.calls.filter(
    ([input, init]) =>
      (init?.method ?? 'GET') === method && new URL(String(input), 'http://localhost').pathname === path,
  );
}

function keyOf(init: RequestInit | undefined): string | undefined {
  return (init?.headers as Record<string, string>)['Idempotency-Key'];
}

async function openLineEnd(user: SessionUser = planner) {
  const context = await createAppContext({ user, path: '/line-end' });
  const wrapper = await mountInApp(BuildsView, context);
  await flushPromises();
  return wrapper;
}

/** Types a serial and Enter, as a keyboard-wedge scanner does. */
async function scan(wrapper: Awaited<ReturnType<typeof openLineEnd>>, serial: string): Promise<void> {
  const input = wrapper.get<HTMLInputElement>('#builds-scan-input');
  await input.setValue(serial);
  await input.trigger('keydown', { key: 'Enter' });
  await flushPromises();
}

function feedback(wrapper: Awaited<ReturnType<typeof openLineEnd>>) {
  return wrapper.get('[data-test="build-feedback"]');
}

/** The newest button of that name: a message box that just closed may still be fading out. */
function lastButton(name: string): HTMLButtonElement {
  const buttons = [...document.querySelectorAll('button')].filter(
    (candidate) => candidate.textContent?.trim() === name,
  );
  if (buttons.length === 0) throw new Error(`no button "${name}"`);
  return buttons[buttons.length - 1]!;
}

describe('BuildsView (Line end)', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('lists the day in build order with each status in words, the next unit marked and a running count', async () => {
    stubApi({
      'GET /api/sequence': () =>
        jsonResponse(
          200,
          boardOf([
            unit('S1', 1, { status: 'built', builtAt: '2026-12-02T08:00:00.000Z' }),
            unit('S2', 2, { status: 'started' }),
            unit('S3', 3),
          ]),
        ),
    });

    const wrapper = await openLineEnd();

    const rows = wrapper.findAll('[data-test="line-unit"]');
    expect(rows.map((row) => row.attributes('data-serial'))).toEqual(['S1', 'S2', 'S3']);
    expect(rows.map((row) => row.get('[data-test="unit-status"]').text())).toEqual(['Built', 'Started', 'Planned']);
    expect(rows[1]!.find('[data-test="next-unit"]').exists()).toBe(true);
    expect(rows[1]!.attributes('aria-current')).toBe('step');
    expect(wrapper.get('[data-test="built-count"]').text()).toBe('1 of 3 built');
  });

  it('reports a scanned serial built with an Idempotency-Key and ticks it off', async () => {
    const fetchMock = stubApi({
      'GET /api/sequence': () => jsonResponse(200, boardOf([unit('S1', 1), unit('S2', 2)])),
      'POST /api/builds': () => jsonResponse(201, built('S1')),
    });
    const wrapper = await openLineEnd();

    await scan(wrapper, ' S1 ');

    const [[, init]] = callsTo(fetchMock, 'POST', '/api/builds');
    expect(JSON.parse(String(init?.body))).toEqual({ serial: 'S1' });
    expect(keyOf(init)).toMatch(/^[0-9a-f-]{36}$/);
    expect(feedback(wrapper).text()).toContain('S1 reported built');
    expect(feedback(wrapper).text()).toContain('2 part numbers came off stock.');
    expect(feedback(wrapper).text()).not.toContain('ahead of');
    expect(feedback(wrapper).classes()).toContain('is-success');
    expect(wrapper.get('[data-serial="S1"] [data-test="unit-status"]').text()).toBe('Built');
    expect(wrapper.get('[data-test="built-count"]').text()).toBe('1 of 2 built');
    expect(wrapper.find('[data-serial="S2"] [data-test="next-unit"]').exists()).toBe(true);
  });

  it('says when a unit is reported built ahead of the one due next', async () => {
    stubApi({
      'GET /api/sequence': () => jsonResponse(200, boardOf([unit('S1', 1), unit('S2', 2), unit('S3', 3)])),
      'POST /api/builds': () => jsonResponse(201, built('S3')),
    });
    const wrapper = await openLineEnd();

    await scan(wrapper, 'S3');

    expect(feedback(wrapper).text()).toContain('S3 reported built');
    expect(feedback(wrapper).text()).toContain('It was built ahead of S1 (position 1), which is still to build.');
    expect(feedback(wrapper).classes()).toContain('is-success');
  });

  it('says plainly, without an error tone, that a unit is already built', async () => {
    stubApi({
      'GET /api/sequence': () => jsonResponse(200, boardOf([unit('S1', 1, { status: 'built' })])),
      'POST /api/builds': () =>
        jsonResponse(409, {
          error: {
            code: 'already_built',
            message: 'Unit S1 was already reported built; nothing was consumed again.',
            details: [{ serial: 'S1', builtAt: '2026-12-02T09:15:00.000Z' }],
          },
        }),
    });
    const wrapper = await openLineEnd();

    await scan(wrapper, 'S1');

    expect(feedback(wrapper).classes()).toContain('is-info');
    expect(feedback(wrapper).text()).toContain('S1 is already built');
    expect(feedback(wrapper).text()).toContain('Nothing was taken off stock again');
  });

  it('names an unknown serial as not in the sequence', async () => {
    stubApi({
      'GET /api/sequence': () => jsonResponse(200, boardOf([unit('S1', 1)])),
      'POST /api/builds': () => jsonResponse(404, { error: { code: 'not_found', message: 'No unit with serial X9.' } }),
    });
    const wrapper = await openLineEnd();

    await scan(wrapper, 'X9');

    expect(feedback(wrapper).classes()).toContain('is-error');
    expect(feedback(wrapper).text()).toContain('No unit X9 in the sequence');
  });

  it('sends a retry of an unanswered report with the same key, and the next unit with a new one', async () => {
    let attempts = 0;
    const fetchMock = stubApi({
      'GET /api/sequence': () => jsonResponse(200, boardOf([unit('S1', 1), unit('S2', 2)])),
      'POST /api/builds': (init) => {
        attempts += 1;
        if (attempts === 1) throw new TypeError('Failed to fetch');
        const serial = (JSON.parse(String(init?.body)) as { serial: string }).serial;
        return jsonResponse(201, built(serial));
      },
    });
    const wrapper = await openLineEnd();

    await scan(wrapper, 'S1');
    expect(feedback(wrapper).text()).toContain('it will not be counted twice');
    await scan(wrapper, 'S1');
    await scan(wrapper, 'S2');

    const keys = callsTo(fetchMock, 'POST', '/api/builds').map(([, init]) => keyOf(init));
    expect(keys).toHaveLength(3);
    expect(keys[1]).toBe(keys[0]);
    expect(keys[2]).not.toBe(keys[0]);
    expect(wrapper.get('[data-test="built-count"]').text()).toBe('2 of 2 built');
  });

  it('undoes the last unit built with the reason given', async () => {
    const fetchMock = stubApi({
      'GET /api/sequence': () =>
        jsonResponse(
          200,
          boardOf([
            unit('S1', 1, { status: 'built', builtAt: '2026-12-02T08:00:00.000Z' }),
            unit('S2', 2, { status: 'built', builtAt: '2026-12-02T08:30:00.000Z' }),
          ]),
        ),
      'DELETE /api/builds/S2': () =>
        jsonResponse(200, { serial: 'S2', status: 'planned', builtAt: null, movements: [] }),
    });
    const wrapper = await openLineEnd();

    getButton(wrapper.element, 'Undo last (S2)').click();
    await flushPromises();
    const reason = document.querySelector<HTMLInputElement>('.builds-undo-dialog input')!;
    expect(reason.value).toBe('Reported built by mistake');
    reason.value = 'Wrong unit scanned';
    reason.dispatchEvent(new Event('input'));
    lastButton('Undo build').click();
    await flushPromises();

    const [[input]] = callsTo(fetchMock, 'DELETE', '/api/builds/S2');
    expect(new URL(String(input), 'http://localhost').searchParams.get('reason')).toBe('Wrong unit scanned');
    expect(wrapper.get('[data-serial="S2"] [data-test="unit-status"]').text()).toBe('Planned');
    expect(feedback(wrapper).text()).toContain('S2 undone');
    expect(wrapper.get('[data-test="built-count"]').text()).toBe('1 of 2 built');
  });

  it('explains the line’s 30-minute rule when the server refuses an undo', async () => {
    const rule =
      'At the line you can undo only a unit you reported yourself in the last 30 minutes; ask the planner to undo S1.';
    stubApi({
      'GET /api/sequence': () =>
        jsonResponse(200, boardOf([unit('S1', 1, { status: 'built', builtAt: '2026-12-02T08:00:00.000Z' })])),
      'DELETE /api/builds/S1': () => jsonResponse(403, { error: { code: 'forbidden', message: rule } }),
    });
    const wrapper = await openLineEnd(line);

    getButton(wrapper.element, 'Undo last (S1)').click();
    await flushPromises();
    lastButton('Undo build').click();
    await flushPromises();

    expect(document.querySelector('[data-test="undo-refusal"]')?.textContent).toContain('in the last 30 minutes');
    expect(wrapper.get('[data-serial="S1"] [data-test="unit-status"]').text()).toBe('Built');
  });

  it('offers the line no way to close the day', async () => {
    stubApi({ 'GET /api/sequence': () => jsonResponse(200, boardOf([unit('S1', 1)])) });

    const wrapper = await openLineEnd(line);

    expect(() => getButton(wrapper.element, 'Close the day')).toThrow();
    expect(() => getButton(wrapper.element, 'Report built')).not.toThrow();
  });

  it('closes the day after a confirmation naming how many units it reports built', async () => {
    let closed = false;
    const fetchMock = stubApi({
      'GET /api/sequence': () =>
        jsonResponse(
          200,
          boardOf([
            unit('S1', 1, { status: 'built', builtAt: '2026-12-02T08:00:00.000Z' }),
            unit('S2', 2, closed ? { status: 'built', builtAt: '2026-12-02T16:00:00.000Z' } : {}),
            unit('S3', 3, closed ? { status: 'built', builtAt: '2026-12-02T16:00:00.000Z' } : {}),
          ]),
        ),
      'POST /api/builds/close-day': () => {
        closed = true;
        return jsonResponse(200, { date: TODAY, built: ['S2', 'S3'], movements: [] });
      },
    });
    const wrapper = await openLineEnd();

    getButton(wrapper.element, 'Close the day').click();
    await flushPromises();
    expect(document.querySelector('.el-message-box')?.textContent).toContain(
      '2 units of Wed 2 Dec not yet reported will be reported built now',
    );
    lastButton('Report 2 units built').click();
    await flushPromises();
    await flushPromises();

    const [[, init]] = callsTo(fetchMock, 'POST', '/api/builds/close-day');
    expect(JSON.parse(String(init?.body))).toEqual({ date: TODAY });
    expect(wrapper.get('[data-test="built-count"]').text()).toBe('3 of 3 built');
  });
});
