import { createAppContext, demoUsers, getButton, getByLabel, jsonResponse, mountInApp, waitFor } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { Check, Minus, Plus } from '@element-plus/icons-vue';
import type { KanbanLoop } from '@shared/schemas/loops';
import type { SessionUser } from '@shared/schemas/user';
import LoopsCardStateStrip from '@/components/LoopsCardStateStrip.vue';
import LoopsProposalBadge from '@/components/LoopsProposalBadge.vue';
import LoopsView from '@/views/LoopsView.vue';

/**
 * A loop as GET /api/kanban/loops sends it. The figures are the formula's own arithmetic:
 * D = 8/day, delivery cycle 5–2–1 gives T = 5 × (1 + 1) / 2 = 5 days, α = 0.1, C = 10, so
 * N = ⌈8 × 5 × 1.1 / 10⌉ = ⌈4.4⌉ = 5 (PRODUCT.md capability 5, the standard card formula).
 */
function loopOf(overrides: Partial<KanbanLoop> = {}): KanbanLoop {
  return {
    version: 'v1',
    partNumber: 'ACT-DK36',
    supplierCode: 'OMW',
    containerQty: 10,
    safetyFactor: 0.1,
    averageDailyDemand: 8,
    replenishmentDays: 5,
    recommendedCards: 5,
    activeCards: 0,
    id: 45,
    description: 'Brush deck lift actuator 36 V',
    kind: 'supplier',
    pointOfUse: 'L1-ST03',
    uom: 'H87',
    peakDailyDemand: 8,
    safetyDays: 0,
    safetyUnits: 0,
    sizingWindowDays: 20,
    windowFrom: '2026-12-01',
    windowTo: '2026-12-29',
    exactCards: 4.4,
    formula: 'T = 5 × (1 + 1) / 2 = 5; ⌈(8 × (5 × (1 + 0.1) + 0) + 0) / 10⌉ = ⌈4.4⌉ = 5',
    proposal: { action: 'add', count: 5 },
    cardStates: { full: 0, empty: 0, ordered: 0, shipped: 0 },
    partIsKanban: true,
    ...overrides,
  };
}

type Answer = (init: RequestInit | undefined) => Response;

/** Answers `METHOD /api/path` with a handler; the planning event stream stays silent. */
function stubApi(answers: Record<string, Answer>) {
  const fetchMock = vi.fn<typeof fetch>((input, init) => {
    const url = new URL(String(input), 'http://localhost');
    if (url.pathname === '/api/events') return new Promise<Response>(() => undefined);
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

// PRODUCT.md capability 5: the screen "shows recommended vs active cards and how many to add or
// pull"; the badge is that difference in words, with an icon, never colour alone.
describe('LoopsProposalBadge', () => {
  it.each([
    { recommended: 5, active: 3, proposal: { action: 'add', count: 2 }, word: 'Add 2', icon: Plus, tone: 'is-add' },
    { recommended: 2, active: 3, proposal: { action: 'pull', count: 1 }, word: 'Pull 1', icon: Minus, tone: 'is-pull' },
    {
      recommended: 4,
      active: 4,
      proposal: { action: 'none', count: 0 },
      word: 'Right-sized',
      icon: Check,
      tone: 'is-right',
    },
    { recommended: 0, active: 2, proposal: { action: 'pull', count: 2 }, word: 'Pull 2', icon: Minus, tone: 'is-pull' },
  ] as const)(
    'shows “$word” for the proposal of $recommended recommended and $active active cards',
    ({ recommended, active, proposal, word, icon, tone }) => {
      const wrapper = mount(LoopsProposalBadge, { props: { proposal, recommended, active } });

      expect(wrapper.text()).toBe(word);
      expect(wrapper.findComponent(icon).exists()).toBe(true);
      expect(wrapper.classes()).toContain(tone);
    },
  );
});

describe('LoopsCardStateStrip', () => {
  it('gives each state that holds cards a segment with its count, in cycle order, and names all four', () => {
    const wrapper = mount(LoopsCardStateStrip, { props: { counts: { full: 3, empty: 1, ordered: 0, shipped: 2 } } });

    const segments = wrapper.findAll('.loops-card-state-strip__segment');
    expect(segments.map((segment) => segment.text())).toEqual(['3', '1', '2']);
    expect(segments.map((segment) => segment.attributes('title'))).toEqual([
      '3 full — in the rack with parts',
      '1 empty — signalled, waiting to be ordered',
      '2 shipped — on its way back with parts',
    ]);
    expect(wrapper.attributes('aria-label')).toBe('Cards: 3 full, 1 empty, 0 ordered, 2 shipped');
  });

  it('says so when a loop has no active cards', () => {
    const wrapper = mount(LoopsCardStateStrip, { props: { counts: { full: 0, empty: 0, ordered: 0, shipped: 0 } } });

    expect(wrapper.text()).toBe('no cards');
    expect(wrapper.attributes('aria-label')).toBe('No active cards');
  });
});

describe('LoopsView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  async function openLoops(user: SessionUser = demoUsers.buyer) {
    const context = await createAppContext({ user, path: '/loops' });
    const wrapper = await mountInApp(LoopsView, context);
    await flushPromises();
    return wrapper;
  }

  it('counts the loops that need cards added and those with cards to pull', async () => {
    stubApi({
      'GET /api/kanban/loops': () =>
        jsonResponse(200, [
          loopOf(),
          loopOf({
            id: 46,
            partNumber: 'AXL-20',
            recommendedCards: 3,
            activeCards: 5,
            proposal: { action: 'pull', count: 2 },
          }),
          loopOf({
            id: 47,
            partNumber: 'AXL-R',
            recommendedCards: 4,
            activeCards: 4,
            proposal: { action: 'none', count: 0 },
          }),
        ]),
      'GET /api/suppliers': () => jsonResponse(200, []),
    });

    const wrapper = await openLoops();

    expect(wrapper.get('[data-test="summary-add"]').text()).toContain('1 loop needs cards added');
    expect(wrapper.get('[data-test="summary-add"]').text()).toContain('5 cards to print');
    expect(wrapper.get('[data-test="summary-pull"]').text()).toContain('1 loop has cards to pull');
    expect(wrapper.get('[data-test="summary-none"]').text()).toContain('1 loop right-sized');
  });

  it('accepts with the recommendation the buyer saw and, on a 409, shows the server’s reason and reloads', async () => {
    const reason = 'The recommendation for ACT-DK36 is now 6 cards, not 5; review it and accept again.';
    const fetchMock = stubApi({
      'GET /api/kanban/loops': () => jsonResponse(200, [loopOf()]),
      'GET /api/suppliers': () => jsonResponse(200, []),
      'POST /api/kanban/loops/45/accept': () => jsonResponse(409, { error: { code: 'conflict', message: reason } }),
    });
    const wrapper = await openLoops();

    wrapper.get('[aria-label="Accept the proposal for ACT-DK36"]').trigger('click');
    await flushPromises();
    getButton(document.body, 'Add 5').click();
    await waitFor(() => expect(callsTo(fetchMock, 'POST', '/api/kanban/loops/45/accept')).toHaveLength(1));
    await flushPromises();

    const [, init] = callsTo(fetchMock, 'POST', '/api/kanban/loops/45/accept')[0]!;
    expect(JSON.parse(String(init?.body))).toEqual({ expectedRecommended: 5 });
    await waitFor(() => expect(document.body.textContent).toContain(reason));
    expect(callsTo(fetchMock, 'GET', '/api/kanban/loops')).toHaveLength(2);
  });

  it('saves an edit on the version shown; when someone changed the loop first, shows theirs and says so', async () => {
    const theirs = loopOf({ version: 'v2', containerQty: 12 });
    const fetchMock = stubApi({
      'GET /api/kanban/loops': () => jsonResponse(200, [loopOf()]),
      'GET /api/suppliers': () => jsonResponse(200, []),
      'PATCH /api/kanban/loops/45': () =>
        jsonResponse(409, {
          error: { code: 'stale', message: 'Changed by someone else.', details: [{ current: theirs }] },
        }),
    });
    const wrapper = await openLoops();

    wrapper.get('[aria-label="Edit loop ACT-DK36"]').trigger('click');
    await flushPromises();
    const dialog = document.body.querySelector<HTMLElement>('[role="dialog"][aria-label="Edit loop ACT-DK36"]')!;
    const containerInput = getByLabel(dialog, 'Container quantity (C)') as HTMLInputElement;
    containerInput.value = '20';
    containerInput.dispatchEvent(new Event('input'));
    containerInput.dispatchEvent(new Event('change'));
    await flushPromises();
    getButton(dialog, 'Save loop').click();
    await waitFor(() => expect(callsTo(fetchMock, 'PATCH', '/api/kanban/loops/45')).toHaveLength(1));
    await flushPromises();

    const [, init] = callsTo(fetchMock, 'PATCH', '/api/kanban/loops/45')[0]!;
    expect(JSON.parse(String(init?.body))).toEqual({ containerQty: 20 });
    expect((init?.headers as Record<string, string>)['If-Match']).toBe('"v1"');
    expect(dialog.textContent).toContain(
      'Loop ACT-DK36 was changed by someone else first. The screen now shows their version',
    );
    expect(containerInput.value).toBe('12');
  });

  it('refuses numbers out of range in words beside each field, and sends nothing', async () => {
    const fetchMock = stubApi({
      'GET /api/kanban/loops': () => jsonResponse(200, [loopOf()]),
      'GET /api/suppliers': () => jsonResponse(200, []),
    });
    const wrapper = await openLoops();

    wrapper.get('[aria-label="Edit loop ACT-DK36"]').trigger('click');
    await flushPromises();
    const dialog = document.body.querySelector<HTMLElement>('[role="dialog"][aria-label="Edit loop ACT-DK36"]')!;
    for (const [label, value] of [
      ['Container quantity (C)', '0'],
      ['Safety factor (α)', '-1'],
      ['Sizing window (working days)', '500'],
    ]) {
      const input = getByLabel(dialog, label) as HTMLInputElement;
      input.value = value;
      input.dispatchEvent(new Event('input'));
      input.dispatchEvent(new Event('change'));
    }
    await flushPromises();
    getButton(dialog, 'Save loop').click();
    await flushPromises();

    const errors = () => [...dialog.querySelectorAll('.el-form-item__error')].map((error) => error.textContent?.trim());
    await waitFor(() =>
      expect(errors()).toEqual(['Must be greater than 0', 'Must be at least 0', 'Must be at most 120']),
    );
    expect(callsTo(fetchMock, 'PATCH', '/api/kanban/loops/45')).toHaveLength(0);
  });

  it('offers Accept and Edit to a buyer but not to a viewer', async () => {
    stubApi({
      'GET /api/kanban/loops': () => jsonResponse(200, [loopOf()]),
      'GET /api/suppliers': () => jsonResponse(200, []),
    });
    const viewer: SessionUser = { email: 'viewer@example.com', name: 'Vi Viewer', role: 'viewer', supplierCode: null };

    const asBuyer = await openLoops();
    const buyerCanAccept = asBuyer.find('[aria-label="Accept the proposal for ACT-DK36"]').exists();
    const buyerCanEdit = asBuyer.find('[aria-label="Edit loop ACT-DK36"]').exists();
    asBuyer.unmount();
    const asViewer = await openLoops(viewer);

    expect([buyerCanAccept, buyerCanEdit]).toEqual([true, true]);
    expect(asViewer.find('[aria-label="Accept the proposal for ACT-DK36"]').exists()).toBe(false);
    expect(asViewer.find('[aria-label="Edit loop ACT-DK36"]').exists()).toBe(false);
    expect(asViewer.find('[aria-label="Print labels of ACT-DK36"]').exists()).toBe(true);
  });
});
