import { createAppContext, demoUsers, getButton, jsonResponse, mountInApp, waitFor } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import { addCalendarDays } from '@shared/domain/date';
import { demandTablePage, type DemandSort } from '@shared/domain/demand-table';
import type { DemandResponse, PlanResponse } from '@shared/schemas/horizon';
import HorizonView from '@/views/HorizonView.vue';
import { localToday } from '@/format';
import { createPinia, setActivePinia } from 'pinia';
import { useHorizonStore } from '@/stores/horizon';

const demand: DemandResponse = {
  days: ['2026-12-01', '2026-12-02'],
  sequenceEnds: '2026-12-02',
  rows: [
    {
      partNumber: 'BAT-06-225',
      supplierCode: 'FBS',
      uom: 'H87',
      total: 60,
      byDay: { '2026-12-01': 32, '2026-12-02': 28 },
    },
    {
      partNumber: 'BAT-06-312',
      supplierCode: 'FBS',
      uom: 'H87',
      total: 96,
      byDay: { '2026-12-01': 48, '2026-12-02': 48 },
    },
  ],
};

const plan: PlanResponse = {
  part: {
    partNumber: 'BAT-06-225',
    description: 'Battery 6 V 225 Ah',
    uom: 'H87',
    source: 'buy',
    supplierCode: 'FBS',
    leadTimeDays: 7,
    packQty: 4,
    onHand: 476,
    safetyStock: 8,
    lowLevelCode: 1,
  },
  buckets: [
    {
      date: '2026-12-01',
      gross: 32,
      scheduledReceipts: 0,
      projectedAvailable: 444,
      net: 0,
      plannedReceipt: 0,
      plannedRelease: 0,
    },
    {
      date: '2026-12-02',
      gross: 28,
      scheduledReceipts: 0,
      projectedAvailable: 416,
      net: 0,
      plannedReceipt: 0,
      plannedRelease: 0,
    },
  ],
  pastDue: [],
};

type Answer = (url: URL) => Response;

/** Answers GET /api/demand/table as the server does: the shared page cut from a daily report. */
function tableOf(daily: DemandResponse): Answer {
  return (url) => {
    const asked = url.searchParams;
    const sort = { prop: asked.get('sort'), order: asked.get('order') } as DemandSort;
    const page = demandTablePage(daily, {
      bucket: asked.get('bucket') === 'week' ? 'week' : 'day',
      search: asked.get('q') ?? undefined,
      sort,
      page: Number(asked.get('page') ?? 1),
      pageSize: Number(asked.get('pageSize') ?? 50),
      stackBy: asked.get('supplier') ? 'part' : 'supplier',
    });
    return jsonResponse(200, { ...page, sequenceEnds: daily.sequenceEnds });
  };
}

/** Answers each API path with a handler; the event stream stays silent. */
function stubApi(answers: Record<string, Answer>) {
  const fetchMock = vi.fn<typeof fetch>((input) => {
    const url = new URL(String(input), 'http://localhost');
    if (url.pathname === '/api/events') return new Promise<Response>(() => undefined);
    const answer = answers[url.pathname];
    return Promise.resolve(
      answer ? answer(url) : jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }),
    );
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

function requestsTo(fetchMock: ReturnType<typeof stubApi>, pathname: string): URL[] {
  return fetchMock.mock.calls
    .map(([input]) => new URL(String(input), 'http://localhost'))
    .filter((url) => url.pathname === pathname);
}

async function openHorizon(path: string) {
  const context = await createAppContext({ user: demoUsers.buyer, path });
  const wrapper = await mountInApp(HorizonView, context, {
    global: { stubs: { HorizonDemandChart: true, HorizonPartChart: true } },
  });
  await flushPromises();
  return { wrapper, router: context.router };
}

describe('HorizonView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('sums pieces and kilograms apart in the count line and charts one unit at a time', async () => {
    stubApi({
      '/api/demand/table': tableOf({
        ...demand,
        rows: [
          ...demand.rows,
          { partNumber: 'STL-SHT-30', supplierCode: 'HSS', uom: 'KGM', total: 37.5, byDay: { '2026-12-01': 37.5 } },
        ],
      }),
      '/api/suppliers': () => jsonResponse(200, []),
    });

    const { wrapper } = await openHorizon('/horizon');

    expect(wrapper.text()).toContain('3 parts · 156 pcs · 37.5 kg in total');
    const chart = wrapper.findComponent({ name: 'HorizonDemandChart' });
    // Pieces only, stacked by supplier: both batteries come from FBS, 60 + 96 = 156 pieces.
    expect(chart.props('stacks')).toEqual([{ name: 'FBS', values: [80, 76], total: 156, rest: 0 }]);
    expect(wrapper.get('[aria-label="Unit charted"]').text()).toContain('kg');
  });

  it('says where the build sequence ends when the horizon reaches past it', async () => {
    stubApi({ '/api/demand/table': tableOf(demand), '/api/suppliers': () => jsonResponse(200, []) });

    const { wrapper } = await openHorizon('/horizon');

    // The fixture's sequence ends on 2 Dec 2026, inside any horizon that starts on or before it.
    expect(wrapper.get('[data-test="sequence-end"]').text()).toMatch(
      /^The build sequence ends on .*2 Dec 2026: no demand is known after that day until more units are planned\.$/,
    );
  });

  it('asks for the horizon and supplier written in the link', async () => {
    const fetchMock = stubApi({
      '/api/demand/table': tableOf(demand),
      '/api/suppliers': () => jsonResponse(200, []),
    });

    await openHorizon('/horizon?supplier=FBS&weeks=2&bucket=week');

    const [request] = requestsTo(fetchMock, '/api/demand/table');
    const today = localToday();
    // Two weeks are 14 calendar days, today included.
    expect(Object.fromEntries(request!.searchParams)).toEqual({
      from: today,
      to: addCalendarDays(today, 13),
      supplier: 'FBS',
      bucket: 'week',
      page: '1',
      pageSize: '50',
    });
  });

  it('opens the drill-down of the part typed in the search box when Enter is pressed', async () => {
    const fetchMock = stubApi({
      '/api/demand/table': tableOf(demand),
      '/api/suppliers': () => jsonResponse(200, []),
      '/api/plan': () => jsonResponse(200, plan),
    });
    const { wrapper, router } = await openHorizon('/horizon');

    const search = wrapper.get<HTMLInputElement>('input[aria-label="Part search"]');
    await search.setValue('bat-06-225');
    await search.trigger('keydown', { key: 'Enter' });
    await flushPromises();

    expect(router.currentRoute.value.query.part).toBe('BAT-06-225');
    expect(requestsTo(fetchMock, '/api/plan')[0]!.searchParams.get('part')).toBe('BAT-06-225');
    await waitFor(() => expect(document.body.querySelector('[aria-label="Gross-to-net buckets"]')).not.toBeNull());
    expect(document.body.textContent).toContain('Battery 6 V 225 Ah');
  });

  it('says a part number typed that is no part at all, with no Retry that could never work', async () => {
    stubApi({
      '/api/demand/table': tableOf(demand),
      '/api/suppliers': () => jsonResponse(200, []),
      '/api/plan': () => jsonResponse(404, { error: { code: 'not_found', message: 'No part NOSUCHPART.' } }),
    });

    await openHorizon('/horizon?part=NOSUCHPART');
    await waitFor(() => expect(document.body.textContent).toContain('There is no part NOSUCHPART in the part master.'));

    expect(document.body.textContent).not.toContain('could not be loaded');
    expect([...document.body.querySelectorAll('button')].map((button) => button.textContent?.trim())).not.toContain(
      'Retry',
    );
  });

  it('says in the drill-down that the scrap allowance is added when ordering, and links the part to its stock', async () => {
    stubApi({
      '/api/demand/table': tableOf(demand),
      '/api/suppliers': () => jsonResponse(200, []),
      '/api/plan': () => jsonResponse(200, plan),
    });

    await openHorizon('/horizon?part=BAT-06-225');
    await waitFor(() => expect(document.body.querySelector('[data-test="scrap-note"]')).not.toBeNull());

    const note = document.body.querySelector('[data-test="scrap-note"]')!;
    expect(note.textContent).toContain('added when ordering, not when consuming');
    expect(note.querySelector('a')?.getAttribute('href')).toBe('/stock/BAT-06-225');
    expect(document.body.querySelector('.horizon-part-drawer__title a')?.getAttribute('href')).toBe(
      '/stock/BAT-06-225',
    );
  });

  it('reports a failed load with a Retry that asks again', async () => {
    let calls = 0;
    const fetchMock = stubApi({
      '/api/suppliers': () => jsonResponse(200, []),
      '/api/demand/table': (url) =>
        ++calls === 1
          ? jsonResponse(503, { error: { code: 'unavailable', message: 'The planning data is being rebuilt.' } })
          : tableOf(demand)(url),
    });
    const { wrapper } = await openHorizon('/horizon');

    expect(wrapper.get('[role="alert"]').text()).toContain('The planning data is being rebuilt.');
    getButton(wrapper.element, 'Retry').click();
    await flushPromises();

    expect(requestsTo(fetchMock, '/api/demand/table')).toHaveLength(2);
    expect(wrapper.find('[role="alert"]').exists()).toBe(false);
    expect(wrapper.text()).toContain('BAT-06-312');
  });

  it('shows a large plant a page of rows at a time, sorted and totalled over every row', async () => {
    // 250 parts; part n needs n on the first day, so the largest totals are at the end of the list.
    const many: DemandResponse = {
      days: ['2026-12-01'],
      sequenceEnds: '2026-12-01',
      rows: Array.from({ length: 250 }, (_, index) => ({
        partNumber: `P-${String(index + 1).padStart(3, '0')}`,
        supplierCode: 'FBS',
        uom: 'H87',
        total: index + 1,
        byDay: { '2026-12-01': index + 1 },
      })),
    };
    const fetchMock = stubApi({ '/api/demand/table': tableOf(many), '/api/suppliers': () => jsonResponse(200, []) });
    const { wrapper } = await openHorizon('/horizon');
    const bodyRows = () => wrapper.findAll('.horizon-table .el-table__body-wrapper tbody tr');
    const firstPart = () => bodyRows()[0]!.find('button').text();

    expect(bodyRows()).toHaveLength(50);
    expect(wrapper.get('.horizon-view__pager').text()).toContain('Total 250');
    // 1 + 2 + … + 250 = 250 × 251 / 2 = 31,375, whichever page is shown.
    expect(wrapper.get('.horizon-table .el-table__footer-wrapper').text()).toContain('31,375');

    await wrapper.get('.horizon-table th.is-sortable:last-child .cell').trigger('click');
    await flushPromises();
    const ascending = firstPart();
    await wrapper.get('.horizon-table th.is-sortable:last-child .cell').trigger('click');
    await flushPromises();

    expect(ascending).toBe('P-001');
    expect(firstPart()).toBe('P-250');
    await wrapper.get('.horizon-view__pager .btn-next').trigger('click');
    await flushPromises();
    expect(firstPart()).toBe('P-200');
    expect(bodyRows()).toHaveLength(50);
    // The browser asked for one page at a time, never the whole table.
    const last = requestsTo(fetchMock, '/api/demand/table').at(-1)!.searchParams;
    expect([last.get('sort'), last.get('order'), last.get('page'), last.get('pageSize')]).toEqual([
      'total',
      'descending',
      '2',
      '50',
    ]);
  });

  it('asks the server for the parts matching the search once typing settles, from the first page', async () => {
    const many: DemandResponse = {
      days: ['2026-12-01'],
      sequenceEnds: '2026-12-01',
      rows: Array.from({ length: 120 }, (_, index) => ({
        partNumber: `P-${String(index + 1).padStart(3, '0')}`,
        supplierCode: 'FBS',
        uom: 'H87',
        total: 1,
        byDay: { '2026-12-01': 1 },
      })),
    };
    const fetchMock = stubApi({ '/api/demand/table': tableOf(many), '/api/suppliers': () => jsonResponse(200, []) });
    const { wrapper } = await openHorizon('/horizon');
    await wrapper.get('.horizon-view__pager .btn-next').trigger('click');
    await flushPromises();

    await wrapper.get<HTMLInputElement>('input[aria-label="Part search"]').setValue('p-01');

    // P-010 … P-019: ten parts, one piece each.
    await vi.waitFor(() => expect(wrapper.text()).toContain('10 parts · 10 pcs in total'));
    const asked = requestsTo(fetchMock, '/api/demand/table').at(-1)!.searchParams;
    expect([asked.get('q'), asked.get('page')]).toEqual(['p-01', '1']);
    expect(wrapper.findAll('.horizon-table .el-table__body-wrapper tbody tr')).toHaveLength(10);
  });
});

describe('horizon store', () => {
  afterEach(() => vi.unstubAllGlobals());

  it('keeps the page on screen untouched when a live refresh finds nothing changed, and replaces it when something did', async () => {
    setActivePinia(createPinia());
    let answer = demand;
    stubApi({ '/api/demand/table': (url) => tableOf(answer)(url) });
    const horizon = useHorizonStore();
    const request = {
      from: '2026-12-01',
      to: '2026-12-02',
      bucket: 'day' as const,
      sort: { prop: null, order: null },
      page: 1,
      pageSize: 50,
    };

    await horizon.fetchTable(request);
    const shown = horizon.table;
    await horizon.refreshLive(null);
    expect(horizon.table).toBe(shown);

    answer = { ...demand, rows: demand.rows.map((row) => ({ ...row, total: row.total + 1 })) };
    await horizon.refreshLive(null);
    expect(horizon.table).not.toBe(shown);
    expect(horizon.table!.rows.map((row) => row.total)).toEqual([61, 97]);
  });
});
