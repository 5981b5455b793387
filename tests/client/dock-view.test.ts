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
    id,
    number,
    supplierCode: 'SUP-A',
    supplierName: 'Supplier A',
    column,
    status: 'confirmed',
    needDate: '2026-12-02',
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
        confirmedQty: null,
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
          confirmedQty: 4,
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
          confirmedQty: null,
          receivedQty: 0,
          open: true,
          needDate: '2026-12-03',
          hazardous: false,
        },
      ],
    }),
    item(2, 'R261130-SUP-B', 'at_dock', { status: 'shipped', overdue: true, needDate: '2026-11-30' }),
    item(3, 'R261129-SUP-C', 'to_line', { status: 'received', lines: [] }),
  ];
}

type Answer = (init: RequestInit | undefined) => Response;

function stubApi(answers: Record<string, Answer> = {}) {
  const defaults: Record<string, Answer> = {
    'GET /api/dock': () => jsonResponse(200, board()),
    'PATCH /api/dock/items/1': (init) =>
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
    expect(document.querySelector('[data-release="R261130-SUP-B"] [data-test="overdue"]')?.textContent?.trim()).toBe(
      'Overdue',
    );
    expect(document.activeElement?.id).toBe('dock-scan-input');
  });

  it('moves a dropped card at once and saves its column', async () => {
    const fetchMock = stubApi();
    const wrapper = await openDock();

    wrapper.findAllComponents(draggable)[1]!.vm.$emit('change', { added: { element: board()[0], newIndex: 0 } });
    await flushPromises();

    const patch = fetchMock.mock.calls.find(([, init]) => init?.method === 'PATCH');
    expect(String(patch?.[0])).toBe('/api/dock/items/1');
    expect(JSON.parse(String(patch?.[1]?.body))).toEqual({ column: 'at_dock' });
    // Inside a column the cards keep need-date order: the overdue one stays on top.
    expect(numbersIn('at_dock')).toEqual(['R261130-SUP-B', 'R261201-SUP-A']);
    expect(numbersIn('expected')).toEqual([]);
    expect(document.querySelector('.dock-view__status')?.textContent).toBe('R261201-SUP-A moved to At dock.');
  });

  it('puts the card back and says why when the server refuses the move', async () => {
    stubApi({
      'PATCH /api/dock/items/1': () =>
        jsonResponse(409, { error: { code: 'conflict', message: 'Release R261201-SUP-A cannot move.' } }),
    });
    const wrapper = await openDock();

    wrapper.findAllComponents(draggable)[3]!.vm.$emit('change', { added: { element: board()[0], newIndex: 0 } });
    await flushPromises();

    expect(numbersIn('expected')).toEqual(['R261201-SUP-A']);
    expect(numbersIn('to_line')).toEqual(['R261129-SUP-C']);
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

    expect(byRelease).toBe('Check in R261130-SUP-B');
    expect(dialogTitle()).toBe('Check in R261201-SUP-A');
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
