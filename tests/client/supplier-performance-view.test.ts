import { createAppContext, getButton, jsonResponse, mountInApp } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import type { SupplierMonthPerformanceDto } from '@shared/schemas/supplier-performance';
import type { SessionUser } from '@shared/schemas/user';
import SupplierPerformanceView from '@/views/SupplierPerformanceView.vue';
import { defaultMonthRange, rateBand } from '@/components/supplier-performance-presentation';
import { localToday } from '@/format';

const buyer: SessionUser = { email: 'buyer@example.com', name: 'Bo Buyer', role: 'buyer', supplierCode: null };

const month = (overrides: Partial<SupplierMonthPerformanceDto>): SupplierMonthPerformanceDto => ({
  supplierCode: 'SUP-A',
  supplierName: 'Supplier A',
  month: '2026-01',
  lines: 0,
  onTimeLines: 0,
  earlyLines: 0,
  lateLines: 0,
  onTimeRate: null,
  requestedQty: 0,
  filledQty: 0,
  fillRate: null,
  promisedLines: 0,
  promiseKeptLines: 0,
  promiseKeptRate: null,
  releases: 0,
  confirmedReleases: 0,
  unansweredReleases: 0,
  confirmationHoursMedian: null,
  confirmationHoursMean: null,
  ...overrides,
});

const rows: SupplierMonthPerformanceDto[] = [
  // 19 of 20 lines on time = 95 %: exactly on the target threshold.
  month({
    month: '2026-01',
    lines: 20,
    onTimeLines: 19,
    onTimeRate: 0.95,
    lateLines: 1,
    requestedQty: 1000,
    filledQty: 900,
    fillRate: 0.9,
    promisedLines: 20,
    promiseKeptLines: 20,
    promiseKeptRate: 1,
    releases: 4,
    confirmedReleases: 4,
    confirmationHoursMedian: 3,
    confirmationHoursMean: 5,
  }),
  // 0 of 5 lines on time; one release never answered.
  month({
    month: '2026-02',
    lines: 5,
    onTimeLines: 0,
    onTimeRate: 0,
    earlyLines: 2,
    lateLines: 3,
    requestedQty: 250,
    filledQty: 100,
    fillRate: 0.4,
    releases: 1,
    unansweredReleases: 1,
  }),
];

function stubApi(answer: () => Response) {
  const fetchMock = vi.fn<typeof fetch>((input) => {
    const url = new URL(String(input), 'http://localhost');
    if (url.pathname === '/api/suppliers/performance') return Promise.resolve(answer());
    if (url.pathname === '/api/suppliers')
      return Promise.resolve(jsonResponse(200, [{ code: 'SUP-A', name: 'Supplier A' }]));
    return Promise.resolve(jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }));
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

async function openView(user: SessionUser = buyer) {
  const context = await createAppContext({ user, path: '/suppliers/performance' });
  const wrapper = await mountInApp(SupplierPerformanceView, context);
  await flushPromises();
  return wrapper;
}

describe('SupplierPerformanceView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('asks for the last six months and shows each month and the period with bands in words', async () => {
    const fetchMock = stubApi(() => jsonResponse(200, rows));

    const wrapper = await openView();

    const asked = fetchMock.mock.calls
      .map(([input]) => new URL(String(input), 'http://localhost'))
      .find((url) => url.pathname === '/api/suppliers/performance');
    const [from, to] = defaultMonthRange(localToday());
    expect(asked?.searchParams.get('to')).toBe(to);
    expect(asked?.searchParams.get('from')).toBe(from);
    const months = wrapper.get('[data-test="performance-months"]').findAll('tr.el-table__row');
    expect(months).toHaveLength(2);
    expect(months[0]!.text()).toContain('95.0 %');
    expect(months[0]!.text()).toContain('On target');
    expect(months[0]!.text()).toContain('Watch'); // fill rate 90 %
    expect(months[0]!.text()).toContain('3.0 h');
    expect(months[1]!.text()).toContain('Act');
    expect(months[1]!.text()).toContain('1 unanswered');
    // Period: (19 + 0) / (20 + 5) = 76 % on time, (900 + 100) / (1000 + 250) = 80 % filled —
    // not the mean of monthly rates, (95 + 0) / 2 = 47.5 % and (90 + 40) / 2 = 65 %.
    const period = wrapper.get('[data-test="performance-summary"]').get('tr.el-table__row');
    expect(period.text()).toContain('76.0 %');
    expect(period.text()).toContain('80.0 %');
    expect(period.text()).not.toContain('47.5 %');
    // Early / late over the period: 0 + 2 early, 1 + 3 late.
    expect(period.text()).toContain('2 / 4');
    expect(wrapper.findAll('[data-test="performance-chart"]')).toHaveLength(1);
  });

  it('gives a supplier account its own figures without a supplier picker', async () => {
    const fetchMock = stubApi(() => jsonResponse(200, rows));
    const supplier: SessionUser = {
      email: 'orders@example.com',
      name: 'Sam Seller',
      role: 'supplier',
      supplierCode: 'SUP-A',
    };

    const wrapper = await openView(supplier);

    expect(wrapper.find('[aria-label="Supplier"]').exists()).toBe(false);
    expect(fetchMock.mock.calls.some(([input]) => String(input).endsWith('/api/suppliers'))).toBe(false);
    expect(wrapper.findAll('[data-test="performance-months"] tr.el-table__row')).toHaveLength(2);
  });

  it('says so when no release lines were due in the period', async () => {
    stubApi(() => jsonResponse(200, []));

    const wrapper = await openView();

    expect(wrapper.text()).toContain('No release lines were due in this period');
    expect(wrapper.find('[data-test="performance-months"]').exists()).toBe(false);
  });

  it('shows a load failure with a retry that asks again', async () => {
    let calls = 0;
    stubApi(() =>
      (calls += 1) === 1
        ? jsonResponse(500, { error: { code: 'internal', message: 'Database busy.' } })
        : jsonResponse(200, rows),
    );

    const wrapper = await openView();
    expect(wrapper.text()).toContain('Supplier performance could not be loaded: Database busy.');
    getButton(wrapper.element, 'Retry').click();
    await flushPromises();

    expect(wrapper.text()).not.toContain('could not be loaded');
    expect(wrapper.findAll('[data-test="performance-months"] tr.el-table__row')).toHaveLength(2);
  });
});

describe('rateBand', () => {
  // Thresholds are common practice, no source: on target from 95 %, watch from 85 %.
  it('puts a rate on the threshold into the better band', () => {
    expect([rateBand(0.95), rateBand(0.9499), rateBand(0.85), rateBand(0.8499), rateBand(null)]).toEqual([
      'on-target',
      'watch',
      'watch',
      'act',
      null,
    ]);
  });
});
