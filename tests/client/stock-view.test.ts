import { createAppContext, getButton, jsonResponse, mountInApp, waitFor } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import type { StockItem, StockLedger } from '@shared/schemas/stock';
import type { SessionUser } from '@shared/schemas/user';
import AppPartLink from '@/components/AppPartLink.vue';
import StockCountDialog from '@/components/StockCountDialog.vue';
import StockScrapDialog from '@/components/StockScrapDialog.vue';
import StockPartView from '@/views/StockPartView.vue';
import StockView from '@/views/StockView.vue';

const buyer: SessionUser = { email: 'buyer@example.com', name: 'Bo Buyer', role: 'buyer', supplierCode: null };
const line: SessionUser = { email: 'line@example.com', name: 'Lee Line', role: 'line', supplierCode: null };
const viewer: SessionUser = { email: 'viewer@example.com', name: 'Vi Viewer', role: 'viewer', supplierCode: null };

function item(partNumber: string, overrides: Partial<StockItem> = {}): StockItem {
  return {
    partNumber,
    description: `Part ${partNumber}`,
    uom: 'H87',
    source: 'buy',
    supplierCode: 'SUP',
    pointOfUse: 'ST01',
    onHand: 10,
    lastCountedAt: '2026-11-20T10:00:00.000Z',
    negative: false,
    countDue: false,
    ...overrides,
  };
}

/** A ledger whose balances follow from its opening: 40, −6 (a build) → 34, −2 (scrap) → 32, +8 (receipt) → 40. */
function ledgerOf(partNumber = 'P-1'): StockLedger {
  return {
    partNumber,
    description: 'Brush motor',
    uom: 'H87',
    opening: 40,
    movements: [
      {
        id: 1,
        at: '2026-11-30T08:10:00.000Z',
        kind: 'backflush',
        qty: -6,
        balance: 34,
        userEmail: 'line@example.com',
        reason: 'Built SN1 (M-A)',
        refType: 'serial',
        ref: 'SN1',
      },
      {
        id: 2,
        at: '2026-12-01T09:00:00.000Z',
        kind: 'scrap',
        qty: -2,
        balance: 32,
        userEmail: 'line@example.com',
        reason: 'Dropped',
        refType: null,
        ref: null,
      },
      {
        id: 3,
        at: '2026-12-01T11:00:00.000Z',
        kind: 'receipt',
        qty: 8,
        balance: 40,
        userEmail: 'receiving@example.com',
        reason: 'Release R261201-SUP1',
        refType: 'release',
        ref: 'R261201-SUP1',
      },
    ],
    closing: 40,
    onHand: 40,
    lastCountedAt: null,
  };
}

type Answer = (init: RequestInit | undefined, url: URL) => Response;

function stubApi(answers: Record<string, Answer>) {
  const fetchMock = vi.fn<typeof fetch>((input, init) => {
    const url = new URL(String(input), 'http://localhost');
    if (url.pathname === '/api/events') return new Promise<Response>(() => undefined);
    const answer = answers[`${init?.method ?? 'GET'} ${url.pathname}`];
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

function textOf(selector: string, root: ParentNode = document): string[] {
  return [...root.querySelectorAll(selector)].map((element) => element.textContent?.trim() ?? '');
}

async function typeInto(input: HTMLInputElement, text: string): Promise<void> {
  input.value = text;
  input.dispatchEvent(new Event('input'));
  input.dispatchEvent(new Event('change'));
  input.dispatchEvent(new FocusEvent('blur'));
  await flushPromises();
}

/** The input under a visible form label inside an open dialog. */
function field(dialog: Element, label: string): HTMLInputElement {
  const item = [...dialog.querySelectorAll('.el-form-item')].find((candidate) =>
    candidate.querySelector('.el-form-item__label')?.textContent?.trim().startsWith(label),
  );
  if (!item) throw new Error(`no field "${label}"`);
  return item.querySelector('input')!;
}

function errorOf(dialog: Element, label: string): string {
  const item = field(dialog, label).closest('.el-form-item')!;
  return item.querySelector('.el-form-item__error')?.textContent?.trim() ?? '';
}

describe('StockView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('flags a part below zero "Count it" and one not counted lately "Count due", in words with icons', async () => {
    stubApi({
      'GET /api/stock': () =>
        jsonResponse(200, [
          item('P-1'),
          item('P-2', { onHand: -3, negative: true, countDue: true }),
          item('P-3', { countDue: true, lastCountedAt: null }),
        ]),
    });
    const context = await createAppContext({ user: buyer, path: '/stock' });

    const wrapper = await mountInApp(StockView, context);

    const rows = [...wrapper.element.querySelectorAll('.el-table__body-wrapper tbody tr')];
    expect(rows.map((row) => textOf('[data-test="stock-flag"]', row))).toEqual([
      [],
      ['Count it', 'Count due'],
      ['Count due'],
    ]);
    expect(rows[1]!.querySelectorAll('[data-test="stock-flag"] .el-icon')).toHaveLength(2);
    expect(rows[1]!.querySelector('[data-test="on-hand"]')?.textContent).toBe('-3 pcs');
    expect(rows[2]!.textContent).toContain('Never');
    expect(wrapper.get('[data-test="stock-summary"]').text()).toBe('3 parts · 1 part below zero · 2 parts due a count');
  });

  it('draws one page of a long stock list, sorted by on hand across every page', async () => {
    const items = Array.from({ length: 130 }, (_, index) =>
      item(`P-${String(index + 1).padStart(3, '0')}`, { onHand: (index * 53) % 131 }),
    );
    stubApi({ 'GET /api/stock': () => jsonResponse(200, items) });
    const context = await createAppContext({ user: buyer, path: '/stock' });

    const wrapper = await mountInApp(StockView, context);

    const drawn = () => textOf('.el-table__body-wrapper tbody tr td:first-child', wrapper.element);
    expect(drawn()).toHaveLength(50);
    expect(wrapper.get('.el-pagination').text()).toContain('130');
    const onHandHeader = [...(wrapper.element as Element).querySelectorAll<HTMLElement>('.el-table__header th')].find(
      (cell) => cell.textContent?.trim() === 'On hand',
    )!;
    onHandHeader.click();
    await flushPromises();
    onHandHeader.click();
    await flushPromises();
    // Descending: the largest on hand of all 130 parts heads the first page.
    const largest = [...items].sort((a, b) => b.onHand - a.onHand || a.partNumber.localeCompare(b.partNumber));
    expect(drawn()).toEqual(largest.slice(0, 50).map((entry) => entry.partNumber));
    expect(wrapper.get('.el-table__body-wrapper tbody tr [data-test="on-hand"]').text()).toBe(
      `${largest[0]!.onHand} pcs`,
    );
  });

  it('shows only the parts to count, and finds a part by its description', async () => {
    stubApi({
      'GET /api/stock': () =>
        jsonResponse(200, [item('P-1'), item('P-2', { negative: true, onHand: -1 }), item('P-3', { countDue: true })]),
    });
    const context = await createAppContext({ user: buyer, path: '/stock' });
    const wrapper = await mountInApp(StockView, context);

    const toCountChoice = [...(wrapper.element as HTMLElement).querySelectorAll<HTMLElement>('.el-radio-button')].find(
      (choice) => choice.textContent?.trim() === 'To count',
    )!;
    toCountChoice.querySelector('input')!.click();
    await flushPromises();
    const toCount = textOf('.el-table__body-wrapper tbody tr .app-part-link', wrapper.element);
    await wrapper.get('input[aria-label="Search parts"]').setValue('part p-3');
    await flushPromises();

    expect(toCount).toEqual(['P-2', 'P-3']);
    expect(textOf('.el-table__body-wrapper tbody tr .app-part-link', wrapper.element)).toEqual(['P-3']);
  });

  it('links each part number to its stock page', async () => {
    stubApi({ 'GET /api/stock': () => jsonResponse(200, [item('BRM-04')]) });
    const context = await createAppContext({ user: buyer, path: '/stock' });

    const wrapper = await mountInApp(StockView, context);

    expect(wrapper.get('a.app-part-link').attributes('href')).toBe('/stock/BRM-04');
  });
});

describe('AppPartLink', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
  });

  it('links a part to its stock page, but shows a supplier, who may not read stock, the plain number', async () => {
    const supplier: SessionUser = {
      email: 'contact@example.net',
      name: 'Sam Supplier',
      role: 'supplier',
      supplierCode: 'FBS',
    };
    const asBuyer = await mountInApp(AppPartLink, await createAppContext({ user: buyer }), {
      props: { partNumber: 'BAT/6 V' },
    });
    const asSupplier = await mountInApp(AppPartLink, await createAppContext({ user: supplier, path: '/releases' }), {
      props: { partNumber: 'BAT/6 V' },
    });

    expect(asBuyer.get('a').attributes('href')).toBe('/stock/BAT%2F6%20V');
    expect(asSupplier.find('a').exists()).toBe(false);
    expect(asSupplier.text()).toBe('BAT/6 V');
  });
});

describe('StockPartView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  async function openPart(user: SessionUser, answers: Record<string, Answer> = {}) {
    const fetchMock = stubApi({
      'GET /api/stock': () => jsonResponse(200, [item('P-1', { countDue: true })]),
      'GET /api/stock/P-1/movements': () => jsonResponse(200, ledgerOf()),
      ...answers,
    });
    const context = await createAppContext({ user, path: '/stock/P-1' });
    // ECharts needs a real canvas; the chart is looked at in the browser tests.
    const wrapper = await mountInApp(StockPartView, context, { global: { stubs: { StockBalanceChart: true } } });
    await flushPromises();
    return { wrapper, fetchMock };
  }

  it('asks for the last 30 days and lists each movement newest first, in words, signed, with its running balance', async () => {
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2026-12-02T12:00:00'));
    try {
      const { wrapper, fetchMock } = await openPart(viewer);

      const [[input]] = callsTo(fetchMock, 'GET', '/api/stock/P-1/movements');
      const query = new URL(String(input), 'http://localhost').searchParams;
      expect([query.get('from'), query.get('to')]).toEqual(['2026-11-02', '2026-12-02']);
      const rows = [...wrapper.element.querySelectorAll('.stock-ledger-table .el-table__body-wrapper tbody tr')];
      expect(rows.map((row) => textOf('[data-test="movement-kind"]', row)[0])).toEqual([
        'Received',
        'Scrapped',
        'Used in a build',
      ]);
      expect(rows.map((row) => textOf('[data-test="movement-qty"]', row)[0])).toEqual(['+8 pcs', '−2 pcs', '−6 pcs']);
      expect(rows.map((row) => textOf('[data-test="movement-balance"]', row)[0])).toEqual([
        '40 pcs',
        '32 pcs',
        '34 pcs',
      ]);
      expect(rows[2]!.textContent).toContain('Unit SN1');
      expect(rows[0]!.textContent).toContain('Release R261201-SUP1');
      expect(wrapper.get('[data-test="part-on-hand"]').text()).toBe('40 pcs');
      expect(wrapper.text()).toContain('Count due');
      expect(wrapper.get('.stock-part-view__range-text').text()).toBe(
        '3 movements · 40 pcs at the start, 40 pcs at the end',
      );
    } finally {
      vi.useRealTimers();
    }
  });

  it('offers counting to the buyer, scrap to the line, and neither to a viewer', async () => {
    const buyerView = (await openPart(buyer)).wrapper;
    const buyerButtons = textOf('button', buyerView.element);
    buyerView.unmount();
    vi.unstubAllGlobals();
    const lineButtons = textOf('button', (await openPart(line)).wrapper.element);
    vi.unstubAllGlobals();
    const viewerButtons = textOf('button', (await openPart(viewer)).wrapper.element);

    expect(buyerButtons).toEqual(expect.arrayContaining(['Record a count', 'Record scrap']));
    expect(lineButtons).toContain('Record scrap');
    expect(lineButtons).not.toContain('Record a count');
    expect(viewerButtons).not.toContain('Record scrap');
    expect(viewerButtons).not.toContain('Record a count');
  });
});

describe('StockCountDialog and StockScrapDialog', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  async function openDialog(component: typeof StockCountDialog | typeof StockScrapDialog) {
    const context = await createAppContext({ user: buyer, path: '/stock/P-1' });
    const wrapper = await mountInApp(component, context, {
      props: { modelValue: true, partNumber: 'P-1', uom: 'H87', onHand: 12 },
    });
    await flushPromises();
    return { wrapper, dialog: document.querySelector('.el-dialog')! };
  }

  it('records a count and shows the adjustment it will post', async () => {
    const fetchMock = stubApi({
      'POST /api/stock/counts': () => jsonResponse(201, { partNumber: 'P-1', movement: null, onHand: 10 }),
    });
    const { wrapper, dialog } = await openDialog(StockCountDialog);

    await typeInto(field(dialog, 'Counted'), '10');
    await typeInto(field(dialog, 'Reason'), 'Cycle count');
    expect(dialog.querySelector('[data-test="count-difference"]')?.textContent).toContain('Adjustment: −2 pcs');
    getButton(document.body, 'Record count').click();
    await flushPromises();

    const [[, init]] = callsTo(fetchMock, 'POST', '/api/stock/counts');
    expect(JSON.parse(String(init?.body))).toEqual({ partNumber: 'P-1', counted: 10, reason: 'Cycle count' });
    expect(wrapper.emitted('recorded')).toEqual([[{ partNumber: 'P-1', movement: null, onHand: 10 }]]);
  });

  it('keeps a negative count as typed, says what is wrong beside it and sends nothing', async () => {
    const fetchMock = stubApi({});
    const { wrapper, dialog } = await openDialog(StockCountDialog);

    await typeInto(field(dialog, 'Counted'), '-3');
    getButton(document.body, 'Record count').click();
    await flushPromises();

    expect(field(dialog, 'Counted').value).toBe('-3');
    await waitFor(() => expect(errorOf(dialog, 'Counted')).toBe('Must be 0 or more'));
    expect(dialog.querySelector('[data-test="count-difference"]')).toBeNull();
    expect(callsTo(fetchMock, 'POST', '/api/stock/counts')).toHaveLength(0);
    expect(wrapper.emitted('recorded')).toBeUndefined();
  });

  it('refuses a fraction of a part counted in pieces when the box is left, keeps it and sends nothing', async () => {
    const fetchMock = stubApi({});
    const { dialog } = await openDialog(StockScrapDialog);

    await typeInto(field(dialog, 'What happened'), 'Dropped');
    await typeInto(field(dialog, 'Scrapped'), '1.5');
    await waitFor(() => expect(errorOf(dialog, 'Scrapped')).toBe('Must be a whole number of pcs'));
    getButton(document.body, 'Record scrap').click();
    await flushPromises();

    expect(field(dialog, 'Scrapped').value).toBe('1.5');
    expect(errorOf(dialog, 'Scrapped')).toBe('Must be a whole number of pcs');
    expect(callsTo(fetchMock, 'POST', '/api/stock/scrap')).toHaveLength(0);
  });

  // Element Plus shows client-side rule messages only in a real browser (tests/e2e/line-end.spec.ts
  // checks them); here the server's field messages are placed through each item's `error`.
  it('places the server’s field message on its field and reports nothing recorded', async () => {
    const fetchMock = stubApi({
      'POST /api/stock/scrap': () =>
        jsonResponse(400, {
          error: {
            code: 'validation_error',
            message: 'Invalid request.',
            details: [{ path: ['qty'], message: 'Too big: expected number to be <=1000000000' }],
          },
        }),
    });
    const { wrapper, dialog } = await openDialog(StockScrapDialog);

    await typeInto(field(dialog, 'What happened'), ' Dropped at station 3 ');
    await typeInto(field(dialog, 'Scrapped'), '2');
    getButton(document.body, 'Record scrap').click();
    await flushPromises();

    const [[, init]] = callsTo(fetchMock, 'POST', '/api/stock/scrap');
    expect(JSON.parse(String(init?.body))).toEqual({ partNumber: 'P-1', qty: 2, reason: 'Dropped at station 3' });
    await waitFor(() => expect(errorOf(dialog, 'Scrapped')).toBe('Too big: expected number to be <=1000000000'));
    expect(wrapper.emitted('recorded')).toBeUndefined();
  });
});
