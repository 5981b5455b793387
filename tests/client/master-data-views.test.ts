import { createAppContext, getButton, jsonResponse, mountInApp, waitFor } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import { SUPPLIER_DEFAULT_TERMS, type Part } from '@shared/schemas/master-data';
import type { BomTree, PartDetail } from '@shared/schemas/master-data-edit';
import type { SessionUser } from '@shared/schemas/user';
import { supplierFormFields } from '@/components/master-data-presentation';
import PartView from '@/views/PartView.vue';
import PartsView from '@/views/PartsView.vue';
import SupplierView from '@/views/SupplierView.vue';
import { formatWeekdays } from '@/format';
import BomView from '@/views/BomView.vue';

const buyer: SessionUser = { email: 'buyer@example.com', name: 'Bo Buyer', role: 'buyer', supplierCode: null };
const viewer: SessionUser = { email: 'viewer@example.com', name: 'Vi Viewer', role: 'viewer', supplierCode: null };

const bolt: Part = {
  partNumber: 'BOLT-8',
  description: 'Hex bolt M8',
  uom: 'H87',
  source: 'buy',
  supplierCode: 'SUP-A',
  leadTimeDays: 3,
  packQty: 100,
  onHand: 250,
  replenishment: 'kanban',
  safetyStock: 0,
  pointOfUse: 'ST01',
  hazardous: false,
};
const detail = (part: Part = bolt): PartDetail => ({
  part,
  lowLevelCode: 2,
  supplierName: 'Supplier A',
  loop: { id: 1, containerQty: 100, activeCards: 4 },
});

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

const partAnswers = (overrides: Record<string, Answer> = {}): Record<string, Answer> => ({
  'GET /api/parts/BOLT-8': () => jsonResponse(200, detail()),
  'GET /api/parts/BOLT-8/where-used': () =>
    jsonResponse(200, {
      partNumber: 'BOLT-8',
      parents: [
        {
          lineId: 7,
          parent: 'FRAME',
          description: 'Frame',
          qtyPer: 6,
          scrapPct: 0,
          effectiveFrom: null,
          effectiveTo: null,
        },
      ],
      endItems: ['MODEL-A'],
    }),
  'GET /api/stock/BOLT-8/movements': () =>
    jsonResponse(200, {
      partNumber: 'BOLT-8',
      description: 'Hex bolt M8',
      uom: 'H87',
      opening: 250,
      movements: [],
      closing: 250,
      onHand: 250,
      lastCountedAt: null,
    }),
  'GET /api/suppliers': () => jsonResponse(200, []),
  ...overrides,
});

function dialogField(dialog: Element, label: string): HTMLInputElement {
  const item = [...dialog.querySelectorAll('.el-form-item')].find(
    (candidate) => candidate.querySelector('.el-form-item__label')?.textContent?.trim() === label,
  );
  if (!item) throw new Error(`no field "${label}"`);
  return item.querySelector('input')!;
}

async function typeInto(input: HTMLInputElement, text: string): Promise<void> {
  input.value = text;
  input.dispatchEvent(new Event('input'));
  input.dispatchEvent(new Event('change'));
  input.dispatchEvent(new FocusEvent('blur'));
  await flushPromises();
}

afterEach(() => {
  document.body.innerHTML = '';
  localStorage.clear();
  vi.unstubAllGlobals();
});

describe('supplierFormFields', () => {
  it('offers every field of the supplier schema but the code, checked by the schema’s limits, not clamped', () => {
    const fields = supplierFormFields();
    const leadTime = fields.find((field) => field.field === 'leadTimeDays')!;

    expect(fields.map((field) => field.field)).not.toContain('code');
    expect(fields.map((field) => field.field)).toEqual(expect.arrayContaining(['name', 'email', 'leadTimeDays']));
    expect(leadTime).toMatchObject({ label: 'Lead time (working days)', input: { kind: 'number', integer: true } });
    expect(leadTime.input).not.toHaveProperty('min');
    expect([-1, 0, 365, 366, 2.5].map((days) => leadTime.schema.safeParse(days).success)).toEqual([
      false,
      true,
      true,
      false,
      false,
    ]);
    expect(fields.find((field) => field.field === 'deliveryWeekdays')).toMatchObject({ input: { kind: 'weekdays' } });
  });
});

describe('formatWeekdays', () => {
  // ISO 8601-1:2019, 3.1.2.1 (from memory): weekdays are numbered 1 = Monday … 7 = Sunday.
  it('names ISO weekday numbers Monday first', () => {
    expect(formatWeekdays([4, 1])).toBe('Mon, Thu');
    expect(formatWeekdays([7])).toBe('Sun');
  });
});

describe('PartsView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('draws one page of a long part list, sorted by lead time across every page, and searches all of them', async () => {
    const parts = Array.from({ length: 140 }, (_, index) => ({
      ...bolt,
      partNumber: `P-${String(index + 1).padStart(3, '0')}`,
      description: index === 120 ? 'Gasket ring' : `Part ${index + 1}`,
      leadTimeDays: (index * 17) % 41,
    }));
    stubApi({ 'GET /api/parts': () => jsonResponse(200, parts) });
    const context = await createAppContext({ user: viewer, path: '/parts' });

    const wrapper = await mountInApp(PartsView, context);

    const drawn = () =>
      [...wrapper.element.querySelectorAll('.el-table__body-wrapper tbody tr td:first-child')].map(
        (cell) => cell.textContent?.trim() ?? '',
      );
    await waitFor(() => drawn().length > 0);
    expect(drawn()).toHaveLength(50);
    expect(wrapper.get('.el-pagination').text()).toContain('140');
    const header = [...(wrapper.element as Element).querySelectorAll<HTMLElement>('.el-table__header th')].find(
      (cell) => cell.textContent?.trim().startsWith('Lead time'),
    )!;
    header.click();
    await flushPromises();
    const shortest = [...parts].sort(
      (a, b) => a.leadTimeDays - b.leadTimeDays || a.partNumber.localeCompare(b.partNumber),
    );
    expect(drawn()).toEqual(shortest.slice(0, 50).map((part) => part.partNumber));

    const search = wrapper.get<HTMLInputElement>('input[aria-label="Search parts"]');
    await search.setValue('gasket');
    await flushPromises();
    expect(drawn()).toEqual(['P-121']);
    expect(wrapper.find('.el-pagination').exists()).toBe(false);
  });
});

describe('SupplierView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('lists one page of the parts bought from the supplier, only theirs, and turns to the next', async () => {
    const parts = Array.from({ length: 130 }, (_, index) => ({
      ...bolt,
      partNumber: `P-${String(index + 1).padStart(3, '0')}`,
      supplierCode: index % 2 ? 'SUP-A' : 'SUP-B',
    }));
    stubApi({
      'GET /api/parts': () => jsonResponse(200, parts),
      'GET /api/suppliers/SUP-A': () =>
        jsonResponse(200, {
          code: 'SUP-A',
          name: 'Supplier A',
          email: 'orders@supplier-a.example.com',
          leadTimeDays: 5,
          ...SUPPLIER_DEFAULT_TERMS,
          deliveryWeekdays: [1, 4],
        }),
    });
    const context = await createAppContext({ user: viewer, path: '/suppliers/SUP-A' });

    const wrapper = await mountInApp(SupplierView, context);

    const drawn = () =>
      [...wrapper.element.querySelectorAll('.el-table__body-wrapper tbody tr td:first-child')].map(
        (cell) => cell.textContent?.trim() ?? '',
      );
    await waitFor(() => expect(drawn()).toHaveLength(50));
    const theirs = parts.filter((part) => part.supplierCode === 'SUP-A').map((part) => part.partNumber);
    expect(drawn()).toEqual(theirs.slice(0, 50));
    expect(wrapper.get('.el-pagination').text()).toContain('65');
    // Delivery weekdays by name, as the calendar names them.
    expect(wrapper.text()).toContain('Mon, Thu');
    await wrapper.get('.el-pagination .btn-next').trigger('click');
    expect(drawn()).toEqual(theirs.slice(50, 65));
  });
});

describe('PartView', () => {
  it('shows the part’s master data, stock, loop and where-used, lead time in working days', async () => {
    stubApi(partAnswers());
    const context = await createAppContext({ user: viewer, path: '/parts/BOLT-8' });

    const wrapper = await mountInApp(PartView, context);

    expect(wrapper.text()).toContain('3 working days');
    expect(wrapper.get('[data-test="part-on-hand"]').text()).toBe('250 pcs');
    expect(wrapper.text()).toContain('4 cards of 100 pcs in circulation');
    expect(wrapper.get('[data-test="end-items"]').text()).toContain('MODEL-A');
    expect(wrapper.text()).toContain('FRAME');
    expect(wrapper.text()).not.toContain('Edit');
  });

  it('sends a buyer’s new lead time without on-hand, and shows the server’s field message under the field', async () => {
    const fetchMock = stubApi(
      partAnswers({
        'PUT /api/parts/BOLT-8': () =>
          jsonResponse(400, {
            error: {
              code: 'invalid_input',
              message: 'Part BOLT-8 was not saved: check leadTimeDays.',
              details: [{ path: ['leadTimeDays'], message: 'must be at most 365' }],
            },
          }),
      }),
    );
    const context = await createAppContext({ user: buyer, path: '/parts/BOLT-8' });
    const wrapper = await mountInApp(PartView, context);

    getButton(document.body, 'Edit').click();
    await flushPromises();
    const dialog = document.querySelector('.el-dialog')!;
    await typeInto(dialogField(dialog, 'Lead time (working days)'), '12');
    getButton(dialog, 'Save').click();
    await flushPromises();
    await flushPromises();

    const put = fetchMock.mock.calls.find(([, init]) => init?.method === 'PUT');
    const body = JSON.parse(String(put?.[1]?.body));
    expect(body.leadTimeDays).toBe(12);
    expect(body).not.toHaveProperty('onHand');
    // The message slides in with a transition.
    await waitFor(() => expect(dialog.textContent).toContain('Must be at most 365'), { timeout: 5000 });
    wrapper.unmount();
  });
});

describe('BomView', () => {
  const tree: BomTree = {
    parent: 'MODEL-A',
    description: 'Model A',
    uom: 'H87',
    lowLevelCode: 0,
    date: '2026-12-02',
    lines: [
      {
        lineId: 1,
        component: 'FRAME',
        description: 'Frame',
        uom: 'H87',
        qtyPer: 2,
        scrapPct: 10,
        effectiveFrom: null,
        effectiveTo: null,
        lowLevelCode: 1,
        level: 1,
        extendedQty: 2.2,
        children: [
          {
            lineId: 2,
            component: 'TUBE',
            description: 'Steel tube',
            uom: 'MTR',
            qtyPer: 3,
            scrapPct: 5,
            effectiveFrom: null,
            effectiveTo: '2027-02-28',
            lowLevelCode: 2,
            level: 2,
            extendedQty: 6.93,
            children: [],
          },
        ],
      },
    ],
  };

  it('shows the indented tree with what one model orders, and says the scrap convention', async () => {
    const fetchMock = stubApi({ 'GET /api/bom/MODEL-A': () => jsonResponse(200, tree) });
    const context = await createAppContext({ user: viewer, path: '/bom/MODEL-A' });

    const wrapper = await mountInApp(BomView, context);

    const request = fetchMock.mock.calls.find(([input]) => String(input).includes('/api/bom/MODEL-A'));
    expect(new URL(String(request?.[0]), 'http://localhost').searchParams.get('date')).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    expect(wrapper.findAll('[data-test="extended-qty"]').map((cell) => cell.text())).toEqual(['2.2 pcs', '6.93 m']);
    expect(wrapper.get('[data-test="scrap-convention"]').text()).toContain('compounds through the levels');
    expect(wrapper.text()).not.toContain('From a date…');
  });

  it('fetches the part list for a buyer only when a dialog that picks a component opens', async () => {
    const fetchMock = stubApi({
      'GET /api/bom/MODEL-A': () => jsonResponse(200, tree),
      'GET /api/parts': () => jsonResponse(200, [bolt]),
    });
    const context = await createAppContext({ user: buyer, path: '/bom/MODEL-A' });

    const wrapper = await mountInApp(BomView, context);

    expect(wrapper.findAll('[data-test="extended-qty"]')).toHaveLength(2);
    const partLists = () => fetchMock.mock.calls.filter(([input]) => String(input).endsWith('/api/parts'));
    expect(partLists()).toHaveLength(0);
    getButton(wrapper.element, 'Edit lines').click();
    await waitFor(() => expect(partLists()).toHaveLength(1));
  });
});
