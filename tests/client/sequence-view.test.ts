import { createAppContext, demoUsers, getButton, jsonResponse, mountInApp, waitFor } from './helpers';
import { afterEach, describe, expect, it, onTestFinished, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import draggable from 'vuedraggable';
import type { SequenceBoard, SequenceDay, SequenceUnit } from '@shared/schemas/sequence';
import type { SessionUser } from '@shared/schemas/user';
import type { LineRiskInput } from '@shared/domain/line-risk';
import { planMove } from '@shared/domain/sequence';
import SequenceView from '@/views/SequenceView.vue';
import { formatDay } from '@/format';
import { useSequenceRiskStore } from '@/stores/sequence-risk';

const FROZEN = '2026-12-01';
const FULL = '2026-12-04';
const OPEN = '2026-12-07';
const OVER = '2026-12-08';

function unit(serial: string, model: string, date: string, sequence: number): SequenceUnit {
  return { id: Number(serial.slice(1)), date, sequence, model, serial, qty: 1, status: 'planned', builtAt: null };
}

function day(date: string, units: [string, string][], overrides: Partial<SequenceDay> = {}, capacity = 3): SequenceDay {
  const list = units.map(([serial, model], index) => unit(serial, model, date, index + 1));
  return {
    date,
    working: true,
    frozen: false,
    past: false,
    capacity,
    load: list.length,
    units: list,
    version: `v-${date}`,
    ...overrides,
  };
}

/**
 * A board with capacity 3: one frozen day, one full, one with room, one over capacity. With a
 * larger capacity every day has room, for moves the board itself would refuse onto a full day.
 */
function boardOf(capacity = 3): SequenceBoard {
  return {
    from: FROZEN,
    to: OVER,
    today: FROZEN,
    frozenUntil: FROZEN,
    frozenWindowDays: 1,
    dailyCapacity: capacity,
    models: [
      { partNumber: 'M-A', description: 'Model A' },
      { partNumber: 'M-B', description: 'Model B' },
    ],
    days: [
      day(
        FROZEN,
        [
          ['S1', 'M-A'],
          ['S2', 'M-B'],
        ],
        { frozen: true },
        capacity,
      ),
      day(
        FULL,
        [
          ['S3', 'M-A'],
          ['S4', 'M-A'],
          ['S5', 'M-B'],
        ],
        {},
        capacity,
      ),
      day(OPEN, [['S6', 'M-B']], {}, capacity),
      day(
        OVER,
        [
          ['S7', 'M-A'],
          ['S8', 'M-B'],
          ['S9', 'M-A'],
          ['S10', 'M-B'],
        ],
        {},
        capacity,
      ),
    ],
  };
}

/**
 * The line-risk engine's inputs for the board: model M-A takes one BAT-1, M-B none, and three
 * batteries are in stock, so the first three M-A units in build order get one (S1, S3, S4) and the
 * next ones (S7, S9) are at risk.
 */
function engineInputOf(board: SequenceBoard): LineRiskInput {
  return {
    parts: [
      { partNumber: 'M-A', source: 'end_item', leadTimeDays: 0, packQty: 1, onHand: 0, safetyStock: 0, uom: 'H87' },
      { partNumber: 'M-B', source: 'end_item', leadTimeDays: 0, packQty: 1, onHand: 0, safetyStock: 0, uom: 'H87' },
      {
        partNumber: 'BAT-1',
        source: 'buy',
        supplierCode: 'SUP',
        leadTimeDays: 5,
        packQty: 1,
        onHand: 3,
        safetyStock: 0,
        uom: 'H87',
      },
    ],
    bom: [{ parent: 'M-A', component: 'BAT-1', qtyPer: 1, scrapPct: 0 }],
    sequence: board.days.flatMap((known) =>
      known.units.map((unit) => ({
        date: unit.date,
        sequence: unit.sequence,
        model: unit.model,
        serial: unit.serial,
        qty: unit.qty,
      })),
    ),
    firmReceipts: [],
    calendar: { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] },
    from: board.from,
    to: board.to,
    today: board.today,
    frozenWindowDays: 1,
  };
}

type Answer = (init: RequestInit | undefined) => Response;

/** Answers `METHOD /api/path`; PUT /api/sequence/days echoes the new orders unless told otherwise. */
function stubApi(answers: Record<string, Answer> = {}, capacity = 3) {
  const board = boardOf(capacity);
  const defaults: Record<string, Answer> = {
    'GET /api/sequence': () => jsonResponse(200, board),
    'GET /api/line-risk/engine-input': () => jsonResponse(200, engineInputOf(board)),
    'PUT /api/sequence/days': (init) => {
      const body = JSON.parse(String(init?.body)) as { days: { date: string; serials: string[] }[] };
      const units = new Map(board.days.flatMap((known) => known.units.map((known) => [known.serial, known] as const)));
      return jsonResponse(200, {
        days: body.days.map((order) => ({
          ...board.days.find((known) => known.date === order.date)!,
          units: order.serials.map((serial, index) => ({
            ...units.get(serial)!,
            date: order.date,
            sequence: index + 1,
          })),
          load: order.serials.length,
        })),
      });
    },
  };
  const fetchMock = vi.fn<typeof fetch>((input, init) => {
    const url = new URL(String(input), 'http://localhost');
    if (url.pathname === '/api/events') return new Promise<Response>(() => undefined);
    const key = `${init?.method ?? 'GET'} ${url.pathname}`;
    const answer = answers[key] ?? defaults[key];
    return Promise.resolve(
      answer ? answer(init) : jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }),
    );
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

/** Holds the answers of the line-risk engine's input back until the function returned is called. */
function holdEngineInput(fetchMock: ReturnType<typeof stubApi>): () => void {
  const answer = fetchMock.getMockImplementation()!;
  let release!: () => void;
  const held = new Promise<void>((resolve) => (release = resolve));
  fetchMock.mockImplementation(async (input, init) => {
    if (String(input).includes('/api/line-risk/engine-input')) await held;
    return answer(input, init);
  });
  return release;
}

function putBodies(fetchMock: ReturnType<typeof stubApi>): unknown[] {
  return fetchMock.mock.calls
    .filter(
      ([input, init]) =>
        init?.method === 'PUT' && new URL(String(input), 'http://localhost').pathname === '/api/sequence/days',
    )
    .map(([, init]) => JSON.parse(String(init?.body)));
}

const planner: SessionUser = { email: 'planner@example.com', name: 'Pat Planner', role: 'planner', supplierCode: null };
const viewer: SessionUser = { email: 'viewer@example.com', name: 'Vi Viewer', role: 'viewer', supplierCode: null };

async function openSequence(user: SessionUser = planner) {
  const context = await createAppContext({ user, path: '/sequence' });
  const wrapper = await mountInApp(SequenceView, context);
  await flushPromises();
  return wrapper;
}

function column(wrapper: Awaited<ReturnType<typeof openSequence>>, date: string) {
  return wrapper.get(`[data-test="day-column"][data-date="${date}"]`);
}

function serialsOn(wrapper: Awaited<ReturnType<typeof openSequence>>, date: string): string[] {
  return column(wrapper, date)
    .findAll('[data-test="unit-card"]')
    .map((card) => card.attributes('data-serial')!);
}

/** The newest button of that name: a message box that just closed may still be fading out. */
function lastButton(name: string): HTMLButtonElement {
  const buttons = [...document.querySelectorAll('button')].filter(
    (candidate) => candidate.textContent?.trim() === name,
  );
  if (buttons.length === 0) throw new Error(`no button "${name}"`);
  return buttons[buttons.length - 1]!;
}

/** Waits for the what-if shown before a move is saved, its effect worked out. */
async function whatIfShown(): Promise<Element> {
  await waitFor(() => expect(document.querySelector('[data-test="what-if"]')).not.toBeNull());
  await waitFor(() => expect(document.querySelector('[data-test="what-if-working"]')).toBeNull());
  return document.querySelector('[data-test="what-if"]')!;
}

/** Answers the what-if shown before a move is saved. */
async function answerWhatIf(button: 'Save the change' | 'Move it anyway' | 'Cancel'): Promise<void> {
  await whatIfShown();
  lastButton(button).click();
  await flushPromises();
}

async function chooseFromMenu(serial: string, item: string): Promise<void> {
  (document.querySelector(`[aria-label="Actions for ${serial}"]`) as HTMLElement).click();
  await flushPromises();
  const menuItem = [...document.querySelectorAll('[role="menuitem"]')].find(
    (candidate) => candidate.textContent?.trim() === item,
  );
  if (!menuItem) throw new Error(`no menu item "${item}"`);
  (menuItem as HTMLElement).click();
  await flushPromises();
}

describe('planMove', () => {
  const days = boardOf().days;

  it('reorders within a day, counting the target index after the unit has left', () => {
    const move = planMove(days, 'S3', FULL, 2);

    expect(move?.orders).toEqual([{ date: FULL, serials: ['S4', 'S5', 'S3'] }]);
    expect(move?.changedDates).toEqual([FULL]);
  });

  it('names both days of a move across days, the target first, and clamps the index to the end', () => {
    const move = planMove(days, 'S5', OPEN, 99);

    expect(move?.orders).toEqual([
      { date: OPEN, serials: ['S6', 'S5'] },
      { date: FULL, serials: ['S3', 'S4'] },
    ]);
    expect(move?.changedDates).toEqual([OPEN, FULL]);
  });

  it('plans nothing when the unit would end where it is', () => {
    expect(planMove(days, 'S4', FULL, 1)).toBeNull();
  });
});

describe('SequenceView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('heads each day with its load against capacity, frozen and over-capacity in words, and its model mix', async () => {
    stubApi();

    const wrapper = await openSequence();

    expect(column(wrapper, FROZEN).get('[data-test="day-load"]').text()).toBe('2 / 3 units');
    expect(column(wrapper, FROZEN).get('[data-test="frozen-flag"]').text()).toBe('Frozen');
    expect(column(wrapper, FULL).text()).toContain('Full');
    expect(column(wrapper, OVER).get('[data-test="over-flag"]').text()).toBe('Over capacity by 1');
    expect(column(wrapper, FULL).get('[data-test="model-mix"]').attributes('aria-label')).toBe(
      'Model mix: 2 M-A, 1 M-B',
    );
    expect(serialsOn(wrapper, FULL)).toEqual(['S3', 'S4', 'S5']);
    expect(column(wrapper, FULL).text()).toContain('M-A');
  });

  it('moves a unit down from its menu, shows the new order at once and saves that day', async () => {
    const fetchMock = stubApi();
    const wrapper = await openSequence();

    await chooseFromMenu('S3', 'Move down');
    await answerWhatIf('Save the change');

    expect(putBodies(fetchMock)).toEqual([
      { days: [{ date: FULL, serials: ['S4', 'S3', 'S5'] }], basedOn: [{ date: FULL, version: `v-${FULL}` }] },
    ]);
    expect(serialsOn(wrapper, FULL)).toEqual(['S4', 'S3', 'S5']);
    expect(
      column(wrapper, FULL)
        .findAll('.sequence-unit-card__position')
        .map((cell) => cell.text()),
    ).toEqual(['Position 1', 'Position 2', 'Position 3']);
  });

  it('saves a drop onto another day as one change naming both days', async () => {
    const fetchMock = stubApi();
    const wrapper = await openSequence();
    const target = wrapper.findAllComponents(draggable)[2]!;
    const dragged = boardOf().days[1]!.units[2]!;

    target.vm.$emit('change', { added: { element: dragged, newIndex: 0 } });
    await flushPromises();
    await answerWhatIf('Save the change');

    expect(putBodies(fetchMock)).toEqual([
      {
        days: [
          { date: OPEN, serials: ['S5', 'S6'] },
          { date: FULL, serials: ['S3', 'S4'] },
        ],
        // Both days the move touches, as the board showed them: the unit leaves one and joins the other.
        basedOn: [
          { date: FULL, version: `v-${FULL}` },
          { date: OPEN, version: `v-${OPEN}` },
        ],
      },
    ]);
    expect(serialsOn(wrapper, OPEN)).toEqual(['S5', 'S6']);
    expect(serialsOn(wrapper, FULL)).toEqual(['S3', 'S4']);
    expect(column(wrapper, OPEN).get('[data-test="day-load"]').text()).toBe('2 / 3 units');
  });

  it('says in the preview that a move changes the frozen window, and sends allowFrozen only when moved anyway', async () => {
    const fetchMock = stubApi();
    const wrapper = await openSequence();

    await chooseFromMenu('S1', 'Move down');
    await whatIfShown();
    const note = document.body.querySelector('[data-test="what-if-frozen"]');
    expect(note?.textContent).toContain(
      'Tue 1 Dec is inside the frozen window: the line may already be kitting its units. Move only if the line agrees.',
    );
    await answerWhatIf('Cancel');
    const afterCancel = putBodies(fetchMock).length;
    await chooseFromMenu('S2', 'Move up');
    await answerWhatIf('Move it anyway');
    await waitFor(() => expect(putBodies(fetchMock)).toHaveLength(1));

    expect(afterCancel).toBe(0);
    expect(putBodies(fetchMock)[0]).toEqual({
      days: [{ date: FROZEN, serials: ['S2', 'S1'] }],
      basedOn: [{ date: FROZEN, version: `v-${FROZEN}` }],
      allowFrozen: true,
    });
    await flushPromises();
    expect(serialsOn(wrapper, FROZEN)).toEqual(['S2', 'S1']);
  });

  it('refuses a move onto a full day before asking anything, as the server would', async () => {
    const fetchMock = stubApi();
    const wrapper = await openSequence();

    // S6 onto Mon 7 Dec, which already holds 3 of 3.
    wrapper.findAllComponents(draggable)[1]!.vm.$emit('change', {
      added: { element: boardOf().days[2]!.units[0]!, newIndex: 3 },
    });
    await flushPromises();

    await waitFor(() =>
      expect(document.body.textContent).toContain(
        `${formatDay(FULL)} is full: it would hold 4 units, over the daily capacity of 3.`,
      ),
    );
    expect(document.querySelector('[data-test="what-if-working"]')).toBeNull();
    expect(putBodies(fetchMock)).toHaveLength(0);
    expect(serialsOn(wrapper, FULL)).toEqual(['S3', 'S4', 'S5']);
  });

  it('puts the days back and says why when the server refuses a move', async () => {
    // The board has room; the server's capacity was lowered meanwhile.
    const reason = 'Fri 4 Dec would hold 4 units, over the daily capacity of 3.';
    stubApi(
      { 'PUT /api/sequence/days': () => jsonResponse(409, { error: { code: 'over_capacity', message: reason } }) },
      6,
    );
    const wrapper = await openSequence();
    const target = wrapper.findAllComponents(draggable)[1]!;

    target.vm.$emit('change', { added: { element: boardOf().days[2]!.units[0]!, newIndex: 3 } });
    await flushPromises();
    await answerWhatIf('Save the change');

    await waitFor(() => expect(document.body.textContent).toContain(`The move was not saved: ${reason}`));
    expect(serialsOn(wrapper, FULL)).toEqual(['S3', 'S4', 'S5']);
    expect(serialsOn(wrapper, OPEN)).toEqual(['S6']);
  });

  it('says who changed a day first when the move was made on a stale board, and shows the board as it is now', async () => {
    // The day as another planner left it: S5 moved to the front.
    const current = boardOf();
    const changedDay = day(FULL, [
      ['S5', 'M-B'],
      ['S3', 'M-A'],
      ['S4', 'M-A'],
    ]);
    current.days[1] = { ...changedDay, version: 'v-changed' };
    const changedAt = new Date(2026, 11, 4, 14, 5).toISOString();
    // A change made on another day than today is told with its day.
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date(2026, 11, 2, 9, 0));
    onTestFinished(() => {
      vi.useRealTimers();
    });
    let moved = false;
    const fetchMock = stubApi({
      'GET /api/sequence': () => jsonResponse(200, moved ? current : boardOf()),
      'PUT /api/sequence/days': () => {
        moved = true;
        return jsonResponse(409, {
          error: {
            code: 'stale',
            message: 'Fri 4 Dec changed since your board was loaded.',
            details: [
              { days: [current.days[1]], lastChange: { by: 'Ada Admin', at: changedAt, action: 'resequence' } },
            ],
          },
        });
      },
    });
    const wrapper = await openSequence();

    await chooseFromMenu('S3', 'Move down');
    await answerWhatIf('Save the change');
    await flushPromises();

    const alert = wrapper.get('[role="alert"]');
    expect(alert.text()).toContain('Someone changed these days first');
    expect(alert.text()).toContain(
      'Fri 4 Dec has changed since your board was loaded. Ada Admin changed it at Fri 4 Dec 14:05.',
    );
    expect(alert.text()).toContain('The board now shows the current order');
    expect(serialsOn(wrapper, FULL)).toEqual(['S5', 'S3', 'S4']);
    const boardLoads = fetchMock.mock.calls.filter(
      ([input, init]) =>
        (init?.method ?? 'GET') === 'GET' && new URL(String(input), 'http://localhost').pathname === '/api/sequence',
    );
    expect(boardLoads).toHaveLength(2);
  });

  it('says it is working out line risk until the marks are in', async () => {
    const fetchMock = stubApi();
    const release = holdEngineInput(fetchMock);

    const wrapper = await openSequence();

    expect(wrapper.get('[data-test="risk-working"]').text()).toBe('Working out line risk…');
    expect(wrapper.find('[data-test="at-risk-count"]').exists()).toBe(false);
    release();
    await waitFor(() => expect(wrapper.find('[data-test="at-risk-count"]').exists()).toBe(true));
    expect(wrapper.find('[data-test="risk-working"]').exists()).toBe(false);
  });

  it('forgets the line risk when the board is left, and works it out anew when it is opened again', async () => {
    const fetchMock = stubApi();
    const context = await createAppContext({ user: planner, path: '/sequence' });
    const first = await mountInApp(SequenceView, context);
    await waitFor(() => expect(first.find('[data-test="at-risk-count"]').exists()).toBe(true));
    first.unmount();

    const release = holdEngineInput(fetchMock);
    const again = await mountInApp(SequenceView, context);

    // No marks of the last visit meanwhile: the plan may have changed since.
    expect(again.find('[data-test="at-risk-count"]').exists()).toBe(false);
    expect(again.get('[data-test="risk-working"]').text()).toBe('Working out line risk…');
    release();
    await waitFor(() => expect(again.find('[data-test="at-risk-count"]').exists()).toBe(true));
  });

  it('drops a line risk that arrives after the board was left', async () => {
    const fetchMock = stubApi();
    const release = holdEngineInput(fetchMock);
    const context = await createAppContext({ user: planner, path: '/sequence' });
    const wrapper = await mountInApp(SequenceView, context);
    wrapper.unmount();
    release();
    await flushPromises();

    const risk = useSequenceRiskStore(context.pinia);
    expect(risk.loaded).toBe(false);
    expect(risk.loading).toBe(false);
    expect(fetchMock.mock.calls.filter(([input]) => String(input).includes('/engine-input'))).toHaveLength(1);
  });

  it('marks the units at risk on their cards, with what they lack for hover and keyboard focus', async () => {
    stubApi();

    const wrapper = await openSequence();

    const marked = wrapper
      .findAll('[data-test="unit-card"]')
      .filter((card) => card.find('[data-test="unit-risk"]').exists())
      .map((card) => card.attributes('data-serial'));
    expect(marked).toEqual(['S7', 'S9']);
    expect(wrapper.get('[data-test="at-risk-count"]').text()).toContain('2 units at risk');
    const mark = wrapper.get('[data-serial="S7"] [data-test="unit-risk"]');
    expect(mark.attributes('tabindex')).toBe('0');
    expect(mark.text()).toBe('At risk');
    const description = wrapper.get(`[id="${mark.attributes('aria-describedby')}"]`);
    expect(description.text()).toBe('At risk: lacks BAT-1 ×1 by Tue 8 Dec.');
    await mark.trigger('focus');
    expect(document.querySelector('[data-test="unit-risk-tip"]')?.textContent).toBe(
      'At risk: lacks BAT-1 ×1 by Tue 8 Dec.',
    );
    await mark.trigger('blur');
    expect(document.querySelector('[data-test="unit-risk-tip"]')).toBeNull();
  });

  it('opens the what-if at once, and offers to save once the effect is worked out', async () => {
    const fetchMock = stubApi({}, 6);
    const release = holdEngineInput(fetchMock);
    const wrapper = await openSequence();
    const s4 = boardOf().days[1]!.units[1]!;

    wrapper.findAllComponents(draggable)[3]!.vm.$emit('change', { added: { element: s4, newIndex: 4 } });
    await flushPromises();

    await waitFor(() => expect(document.querySelector('[data-test="what-if-working"]')).not.toBeNull());
    expect(document.querySelector('[data-test="what-if-working"]')?.textContent).toContain(
      'Working out what the move would do…',
    );
    expect(lastButton('Save the change').disabled).toBe(true);
    release();
    const dialog = await whatIfShown();
    expect(dialog.querySelector('[data-test="what-if-becomes"]')?.textContent).toContain('Becomes at risk: S4');
    expect(lastButton('Save the change').disabled).toBe(false);
    await answerWhatIf('Cancel');
    expect(putBodies(fetchMock)).toHaveLength(0);
  });

  it('shows what a move would do before saving it, and saves nothing on Cancel', async () => {
    const fetchMock = stubApi({}, 6);
    const wrapper = await openSequence();
    const over = wrapper.findAllComponents(draggable)[3]!;
    const s4 = boardOf().days[1]!.units[1]!;

    // S4 goes to the end of Tue 8 Dec: S7 now gets the third battery, S4 none.
    over.vm.$emit('change', { added: { element: s4, newIndex: 4 } });
    await flushPromises();
    const dialog = await whatIfShown();
    expect(dialog.textContent).toContain('Move S4 to Tue 8 Dec, position 5.');
    expect(dialog.querySelector('[data-test="what-if-becomes"]')?.textContent).toContain(
      'Becomes at risk: S4 (M-A), Tue 8 Dec position 5. Would lack BAT-1 ×1 by Tue 8 Dec.',
    );
    expect(dialog.querySelector('[data-test="what-if-stops"]')?.textContent).toContain(
      'No longer at risk: S7 (M-A), Tue 8 Dec position 1.',
    );
    const demand = [...dialog.querySelectorAll('[data-test="what-if-demand"] tbody tr')].map((row) =>
      [...row.querySelectorAll('td')].map((cell) => cell.textContent?.replace(/\s+/g, ' ').trim()),
    );
    // The Change cell also carries Now → After, shown there on a phone where those columns fold away.
    expect(demand).toEqual([
      ['SUP', 'BAT-1', 'Fri 4 Dec', '2 pcs', '1 pc', '−1 pc (2 pcs → 1 pc)'],
      ['SUP', 'BAT-1', 'Tue 8 Dec', '2 pcs', '3 pcs', '+1 pc (2 pcs → 3 pcs)'],
    ]);
    await answerWhatIf('Cancel');

    expect(putBodies(fetchMock)).toHaveLength(0);
    expect(serialsOn(wrapper, FULL)).toEqual(['S3', 'S4', 'S5']);
    over.vm.$emit('change', { added: { element: s4, newIndex: 4 } });
    await flushPromises();
    await answerWhatIf('Save the change');
    expect(putBodies(fetchMock)).toHaveLength(1);
    await flushPromises();
    const marked = wrapper
      .findAll('[data-test="unit-card"]')
      .filter((card) => card.find('[data-test="unit-risk"]').exists())
      .map((card) => card.attributes('data-serial'));
    expect(marked).toEqual(['S9', 'S4']);
  });

  it('shows other roles the board without grips, menus or the add button', async () => {
    stubApi();

    const wrapper = await openSequence(viewer);

    expect(serialsOn(wrapper, FULL)).toEqual(['S3', 'S4', 'S5']);
    expect(wrapper.findAll('[data-test="drag-handle"]')).toHaveLength(0);
    expect(wrapper.find('[aria-label="Actions for S3"]').exists()).toBe(false);
    expect(wrapper.findAll('button').map((button) => button.text())).not.toContain('Add unit');
    expect(wrapper.text()).toContain('Read only');
  });

  it('offers a retry when the board cannot be loaded', async () => {
    let failing = true;
    stubApi({
      'GET /api/sequence': () =>
        failing
          ? jsonResponse(500, { error: { code: 'internal', message: 'Something went wrong on the server.' } })
          : jsonResponse(200, boardOf()),
    });
    const wrapper = await openSequence(demoUsers.admin);
    expect(wrapper.text()).toContain('The build sequence could not be loaded: Something went wrong on the server.');

    failing = false;
    getButton(wrapper.element, 'Try again').click();
    await flushPromises();

    expect(wrapper.text()).not.toContain('could not be loaded');
    expect(serialsOn(wrapper, OPEN)).toEqual(['S6']);
  });
});
