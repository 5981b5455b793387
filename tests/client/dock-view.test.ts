import { createAppContext, jsonResponse, mountInApp } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import draggable from 'vuedraggable';
import type { DockColumn, DockItem } from '@shared/schemas/dock';
import type { SessionUser } from '@shared/schemas/user';
import DockView from '@/views/DockView.vue';

const receiving: SessionUser = {
  email: 'receiving@example.com',
  name: 'Rae Receiving',
  role: 'receiving',
  supplierCode: null,
};
const viewer: SessionUser = { email: 'viewer@example.com', name: 'Vi Viewer', role: 'viewer', supplierCode: null };

function item(id: number, number: string, column: DockColumn, overrides: Partial<DockItem> = {}): DockItem {
  return {
    id: `expected-${id}-2026-12-02`,
    kind: 'expected',
    releaseId: id,
    shipNoticeId: null,
    number,
    supplierCode: 'SUP-A',
    supplierName: 'Supplier A',
    column,
    status: 'confirmed',
    shipDate: null,
    arrivalDate: '2026-12-02',
    expectedToday: false,
    overdue: false,
    carrier: null,
    trackingNumber: null,
    hazardous: false,
    lines: [
      {
        id: id * 10,
        partNumber: `P-${id}`,
        description: `Part ${id}`,
        uom: 'H87',
        qty: 10,
        receivedQty: 0,
        open: true,
        needDate: '2026-12-02',
        hazardous: false,
      },
    ],
    attachments: [],
    ...overrides,
  };
}

function board(): DockItem[] {
  return [
    item(1, 'R261201-SUP-A', 'expected', {
      expectedToday: true,
      hazardous: true,
      carrier: 'Road freight',
      trackingNumber: 'TRK-0001',
      lines: [
        {
          id: 11,
          partNumber: 'BATT-24V',
          description: 'Traction battery',
          uom: 'H87',
          qty: 4,
          receivedQty: 0,
          open: true,
          cardNumber: '000004500018',
          needDate: '2026-12-02',
          hazardous: true,
        },
        {
          id: 12,
          partNumber: 'BRUSH-20',
          description: 'Disc brush',
          uom: 'H87',
          qty: 6,
          receivedQty: 0,
          open: true,
          needDate: '2026-12-03',
          hazardous: false,
        },
      ],
    }),
    item(2, 'R261130-SUP-B', 'at_dock', {
      id: 'shipment-7',
      kind: 'shipment',
      shipNoticeId: 7,
      status: 'shipped',
      overdue: true,
      shipDate: '2026-11-27',
      arrivalDate: '2026-11-30',
      carrier: 'Parcel Example',
      trackingNumber: 'TRK-0007',
    }),
    item(3, 'R261129-SUP-C', 'to_line', { status: 'received', lines: [] }),
  ];
}

type Answer = (init: RequestInit | undefined) => Response;

function stubApi(answers: Record<string, Answer> = {}) {
  const defaults: Record<string, Answer> = {
    'GET /api/dock': () => jsonResponse(200, board()),
    'PATCH /api/dock/items/expected-1-2026-12-02': (init) =>
      jsonResponse(200, { ...board()[0]!, column: JSON.parse(String(init?.body)).column }),
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

async function openDock(user: SessionUser = receiving) {
  const context = await createAppContext({ user, path: '/dock' });
  const wrapper = await mountInApp(DockView, context);
  await flushPromises();
  return wrapper;
}

function numbersIn(column: DockColumn): string[] {
  return [...document.querySelectorAll(`[data-column="${column}"] [data-test="dock-card"]`)].map(
    (card) => card.getAttribute('data-release') ?? '',
  );
}

async function scan(text: string): Promise<void> {
  const input = document.getElementById('dock-scan-input') as HTMLInputElement;
  input.value = text;
  input.dispatchEvent(new Event('input'));
  await flushPromises();
  input.dispatchEvent(new KeyboardEvent('keydown', { key: 'Enter', code: 'Enter', bubbles: true }));
  await flushPromises();
}

function dialogTitle(): string {
  return document.querySelector('.el-dialog__title')?.textContent?.trim() ?? '';
}

describe('DockView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('shows the four columns in our words with their cards, due-today, overdue and hazard markers', async () => {
    stubApi();

    await openDock();

    const titles = [...document.querySelectorAll('[data-test="dock-column"] h2')].map((heading) =>
      heading.textContent?.replace(/\d+$/, '').trim(),
    );
    expect(titles).toEqual(['Expected', 'At dock', 'Counted', 'To line']);
    expect(numbersIn('expected')).toEqual(['R261201-SUP-A']);
    expect(numbersIn('at_dock')).toEqual(['R261130-SUP-B']);
    expect(numbersIn('to_line')).toEqual(['R261129-SUP-C']);
    const first = document.querySelector('[data-release="R261201-SUP-A"]')!.textContent!;
    expect(first).toContain('Due today');
    expect(first).toContain('Hazardous');
    expect(first).toContain('2 lines');
    expect(first).toContain('Road freight · TRK-0001');
    expect(first).toContain('Confirmed');
    expect(first).toContain('No ship notice');
    const shipment = document.querySelector('[data-card="shipment-7"]')!.textContent!;
    expect(shipment).toContain('Shipment, sent Fri 27 Nov');
    expect(shipment).toContain('Arrives Mon 30 Nov');
    expect(shipment).toContain('Parcel Example · TRK-0007');
    expect(document.querySelector('[data-release="R261130-SUP-B"] [data-test="overdue"]')?.textContent?.trim()).toBe(
      'Overdue',
    );
    expect(document.activeElement?.id).toBe('dock-scan-input');
  });

  it('says on a card counted short what is still to come of it', async () => {
    const line = board()[0]!.lines[0]!;
    const shortOne = item(8, 'R261202-SUP-A', 'counted', {
      status: 'partial',
      lines: [{ ...line, id: 80, partNumber: 'HNS-8', qty: 10, receivedQty: 7 }],
    });
    const shortTwo = item(9, 'R261202-SUP-B', 'counted', {
      status: 'partial',
      lines: [
        { ...line, id: 90, qty: 4, receivedQty: 1 },
        { ...line, id: 91, qty: 6, receivedQty: 5 },
        { ...line, id: 92, qty: 3, receivedQty: 3, open: false },
      ],
    });
    const whole = item(10, 'R261202-SUP-C', 'counted', {
      status: 'received',
      lines: [{ ...line, id: 100, qty: 10, receivedQty: 10, open: false }],
    });
    stubApi({ 'GET /api/dock': () => jsonResponse(200, [shortOne, shortTwo, whole]) });

    await openDock();

    const toCome = (release: string) =>
      document.querySelector(`[data-release="${release}"] [data-test="to-come"]`)?.textContent?.trim() ?? null;
    expect(toCome('R261202-SUP-A')).toBe('3 pcs of HNS-8 to come');
    expect(toCome('R261202-SUP-B')).toBe('2 lines partly counted, the rest to come');
    expect(toCome('R261202-SUP-C')).toBeNull();
  });

  it('moves a dropped card at once and saves its column', async () => {
    const fetchMock = stubApi();
    const wrapper = await openDock();

    wrapper.findAllComponents(draggable)[1]!.vm.$emit('change', { added: { element: board()[0], newIndex: 0 } });
    await flushPromises();

    const patch = fetchMock.mock.calls.find(([, init]) => init?.method === 'PATCH');
    expect(String(patch?.[0])).toBe('/api/dock/items/expected-1-2026-12-02');
    expect(JSON.parse(String(patch?.[1]?.body))).toEqual({ column: 'at_dock' });
    // Inside a column the cards keep arrival-day order: the overdue one stays on top.
    expect(numbersIn('at_dock')).toEqual(['R261130-SUP-B', 'R261201-SUP-A']);
    expect(numbersIn('expected')).toEqual([]);
    expect(document.querySelector('.dock-view__status')?.textContent).toBe(
      'R261201-SUP-A (no ship notice) moved to At dock.',
    );
  });

  it('puts the card back and says why when the server refuses the move', async () => {
    stubApi({
      'PATCH /api/dock/items/expected-1-2026-12-02': () =>
        jsonResponse(409, { error: { code: 'conflict', message: 'Release R261201-SUP-A cannot move.' } }),
    });
    const wrapper = await openDock();

    wrapper.findAllComponents(draggable)[1]!.vm.$emit('change', { added: { element: board()[0], newIndex: 0 } });
    await flushPromises();

    expect(numbersIn('expected')).toEqual(['R261201-SUP-A']);
    expect(numbersIn('at_dock')).toEqual(['R261130-SUP-B']);
    expect(document.querySelector('.el-message')?.textContent).toContain(
      'The move was not saved: Release R261201-SUP-A cannot move.',
    );
  });

  it('opens the check-in of a scanned release number, or of the release whose open line carries a scanned card', async () => {
    stubApi();
    await openDock();

    await scan('r261130-sup-b');
    const byRelease = dialogTitle();
    document.querySelector<HTMLElement>('.el-dialog__headerbtn')!.click();
    await flushPromises();
    await scan('000004500018');

    expect(byRelease).toBe('Check in shipment of R261130-SUP-B');
    expect(dialogTitle()).toBe('Check in R261201-SUP-A (no ship notice)');
    expect(document.querySelector('[data-test="check-in-line"]')?.getAttribute('data-part')).toBe('BATT-24V');
  });

  it('moves a card from its check-in with the column picker, for keyboard and one-handed use', async () => {
    const fetchMock = stubApi();
    const wrapper = await openDock();
    (document.querySelector('[data-release="R261201-SUP-A"] .dock-board-card__number') as HTMLElement).click();
    await flushPromises();

    wrapper
      .findAllComponents({ name: 'ElSelect' })
      .find((select) => select.element.querySelector('[aria-label="Move to column"]'))!
      .vm.$emit('update:modelValue', 'at_dock');
    await flushPromises();

    const patch = fetchMock.mock.calls.find(([, init]) => init?.method === 'PATCH');
    expect(JSON.parse(String(patch?.[1]?.body))).toEqual({ column: 'at_dock' });
    expect(numbersIn('at_dock')).toContain('R261201-SUP-A');
  });

  it('shows the handling caution once per part before a hazardous card goes to the line, and moves it only when told', async () => {
    const fetchMock = stubApi({
      'PATCH /api/dock/items/expected-1-2026-12-02': (init) =>
        jsonResponse(200, { ...board()[0]!, column: JSON.parse(String(init?.body)).column }),
    });
    const hazardous = board()[0]!;
    hazardous.lines.push({ ...hazardous.lines[0]!, id: 13, needDate: '2026-12-02' });
    const wrapper = await openDock();
    const toLine = () => wrapper.findAllComponents(draggable)[3]!;

    toLine().vm.$emit('change', { added: { element: hazardous, newIndex: 0 } });
    await flushPromises();
    const caution = document.querySelector('[data-test="to-line-caution"]');
    const notes = [...document.querySelectorAll('[data-test="to-line-caution"] [data-test="safety-note"]')];
    const patchesBeforeAnswer = fetchMock.mock.calls.filter(([, init]) => init?.method === 'PATCH').length;
    document.querySelector<HTMLElement>('[data-test="to-line-confirm"]')!.click();
    await flushPromises();

    expect(caution?.textContent).toContain('Hazardous goods: BATT-24V');
    expect(caution?.textContent).toContain('Follow local regulations and the plant’s own safety practice');
    // Two lines of the battery, one caution for it.
    expect(notes).toHaveLength(1);
    expect(patchesBeforeAnswer).toBe(0);
    const patch = fetchMock.mock.calls.find(([, init]) => init?.method === 'PATCH');
    expect(JSON.parse(String(patch?.[1]?.body))).toEqual({ column: 'to_line' });
    expect(numbersIn('to_line')).toContain('R261201-SUP-A');
  });

  it('leaves a hazardous card where it was when the clerk does not confirm the move to the line', async () => {
    const fetchMock = stubApi();
    const wrapper = await openDock();

    wrapper.findAllComponents(draggable)[3]!.vm.$emit('change', { added: { element: board()[0], newIndex: 0 } });
    await flushPromises();
    [...document.querySelectorAll<HTMLElement>('[data-test="to-line-caution"] button')]
      .find((button) => button.textContent?.trim() === 'Not now')!
      .click();
    await flushPromises();

    expect(fetchMock.mock.calls.some(([, init]) => init?.method === 'PATCH')).toBe(false);
    expect(numbersIn('expected')).toEqual(['R261201-SUP-A']);
  });

  it('moves a card without safety data to the line without asking', async () => {
    const fetchMock = stubApi({
      'PATCH /api/dock/items/shipment-7': (init) =>
        jsonResponse(200, { ...board()[1]!, column: JSON.parse(String(init?.body)).column }),
    });
    const wrapper = await openDock();

    wrapper.findAllComponents(draggable)[3]!.vm.$emit('change', { added: { element: board()[1], newIndex: 0 } });
    await flushPromises();

    expect(document.querySelector('[data-test="to-line-caution"]')).toBeNull();
    expect(fetchMock.mock.calls.some(([, init]) => init?.method === 'PATCH')).toBe(true);
  });

  it('opens the check-in of a card sent from Scan cards', async () => {
    stubApi();
    const context = await createAppContext({ user: receiving, path: '/dock?card=000004500018' });
    await mountInApp(DockView, context);
    await flushPromises();

    expect(dialogTitle()).toBe('Check in R261201-SUP-A (no ship notice)');
    expect(document.querySelector('[data-test="check-in-line"]')?.getAttribute('data-part')).toBe('BATT-24V');
  });

  it('says so when a scan matches nothing on the dock', async () => {
    stubApi();
    await openDock();

    await scan('999999999999');

    expect(document.querySelector('[data-test="scan-problem"]')?.textContent).toContain(
      'Nothing on the dock matches “999999999999”',
    );
    expect(document.querySelector('.el-dialog')).toBeNull();
  });

  it('is read only for a viewer: no scan box, no check-in buttons, no dragging', async () => {
    stubApi();
    const wrapper = await openDock(viewer);

    expect(document.getElementById('dock-scan-input')).toBeNull();
    expect([...document.querySelectorAll('button')].some((button) => button.textContent?.trim() === 'Check in')).toBe(
      false,
    );
    expect(wrapper.findAllComponents(draggable).map((list) => list.vm.$attrs.disabled)).toEqual([
      true,
      true,
      true,
      true,
    ]);
    expect(document.querySelectorAll('[data-test="dock-card"].is-editable')).toHaveLength(0);
    expect(document.body.textContent).toContain('Read only');
  });

  it('offers a retry when the board cannot be loaded', async () => {
    stubApi({
      'GET /api/dock': () =>
        jsonResponse(500, { error: { code: 'internal', message: 'Something went wrong on the server.' } }),
    });

    await openDock();

    expect(document.querySelector('.el-alert')?.textContent).toContain(
      'The dock board could not be loaded: Something went wrong on the server.',
    );
  });
});
