import { createAppContext, jsonResponse, mountInApp } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import type { Release } from '@shared/schemas/releases';
import type { ReceivingClaim, SupplierForecast } from '@shared/schemas/supplier-account';
import type { SessionUser } from '@shared/schemas/user';
import SupplierAccountView from '@/views/SupplierAccountView.vue';

const supplier: SessionUser = {
  email: 'orders@example.com',
  name: 'Sam Seller',
  role: 'supplier',
  supplierCode: 'SUP-A',
};

const forecast: SupplierForecast = {
  supplierCode: 'SUP-A',
  supplierName: 'Supplier A',
  today: '2026-11-30',
  frozenUntil: '2026-12-01',
  days: ['2026-12-01', '2026-12-02', '2026-12-03'],
  sequenceEnds: '2026-12-03',
  parts: [
    {
      partNumber: 'P1',
      description: 'Bracket',
      uom: 'H87',
      leadTimeDays: 2,
      plannedUntil: '2026-12-02',
      total: 9,
      days: [
        { date: '2026-12-01', qty: 2, zone: 'firm' },
        { date: '2026-12-02', qty: 3, zone: 'planned' },
        { date: '2026-12-03', qty: 4, zone: 'forecast' },
      ],
    },
  ],
};
const claims: ReceivingClaim[] = [
  {
    receiptId: 7,
    releaseNumber: 'R261120-SUP-A',
    partNumber: 'P1',
    lineQty: 12,
    qty: 10,
    discrepancy: 'short',
    overAction: null,
    excessQty: 0,
    note: 'two short',
    receivedAt: '2026-11-27T08:00:00.000Z',
  },
];
/** An open line: answered with a ship date, or not yet (then it ships by its latest on-time day). */
const line = (shipDate: string | null, latestShipDate: string): Release['lines'][number] => ({
  id: 1,
  partNumber: 'C-1',
  qty: 10,
  needDate: latestShipDate,
  description: 'Clip',
  uom: 'H87',
  hazardous: false,
  origin: 'plan',
  cardNumber: null,
  confirmedQty: shipDate ? 10 : null,
  shipDate,
  receivedQty: 0,
  closed: false,
  requestedQty: 10,
  requestedDate: latestShipDate,
  expedite: false,
  arrivalDate: null,
  earliestShipDate: latestShipDate,
  latestShipDate,
});
const release = (number: string, status: Release['status'], lines: Release['lines'] = []): Release => ({
  number,
  supplierCode: 'SUP-A',
  status,
  lines,
  shipNotices: [],
  id: 1,
  supplierName: 'Supplier A',
  releaseDate: '2026-11-27',
  sentAt: null,
  confirmedAt: null,
  carrier: null,
  trackingNumber: null,
  supplierNote: null,
  notice: null,
});

function stubApi() {
  const fetchMock = vi.fn<typeof fetch>((input) => {
    const url = new URL(String(input), 'http://localhost');
    if (url.pathname === '/api/suppliers/SUP-A/forecast') return Promise.resolve(jsonResponse(200, forecast));
    if (url.pathname === '/api/suppliers/SUP-A/claims') return Promise.resolve(jsonResponse(200, claims));
    if (url.pathname === '/api/releases')
      return Promise.resolve(
        jsonResponse(200, [
          release('R2-ASKED', 'sent', [line(null, '2099-01-05')]),
          // Confirmed to ship on a day long gone, and not shipped.
          release('R1-OPEN', 'confirmed', [line('2020-01-06', '2020-01-08')]),
          release('R0-DONE', 'received'),
        ]),
      );
    return Promise.resolve(jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }));
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

describe('SupplierAccountView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('shows its own forecast by zone, the releases left to ship and the dock’s claims', async () => {
    const fetchMock = stubApi();
    const context = await createAppContext({ user: supplier, path: '/supplier' });

    const wrapper = await mountInApp(SupplierAccountView, context);
    await flushPromises();

    const asked = fetchMock.mock.calls.map(([input]) => new URL(String(input), 'http://localhost').pathname);
    expect(asked).toContain('/api/suppliers/SUP-A/forecast');
    const cells = wrapper.findAll('[data-test="supplier-forecast"] td[data-zone]');
    expect(cells.map((cell) => `${cell.attributes('data-zone')} ${cell.text()}`)).toEqual([
      'firm 2',
      'planned 3',
      'forecast 4',
    ]);
    expect(wrapper.get('[data-test="sequence-end"]').text()).toMatch(
      /^The plant’s build sequence is planned to .*3 Dec 2026; demand after that day is not known yet\.$/,
    );
    const releases = wrapper.get('[data-test="own-releases"]').findAll('tr.el-table__row');
    expect(releases).toHaveLength(2);
    const linksOf = (row: (typeof releases)[number]) =>
      row.findAll('a').map((link) => `${link.text()} ${link.attributes('href')}`);
    // A release still waiting for its answer can be answered here, signed in, as well as from the e-mail.
    expect(releases[0]!.text()).toContain('R2-ASKED');
    expect(linksOf(releases[0]!)).toEqual([
      'Answer /releases/R2-ASKED/confirm',
      'Send ship notice /releases/R2-ASKED/ship-notice',
    ]);
    expect(releases[1]!.text()).toContain('R1-OPEN');
    expect(linksOf(releases[1]!)).toEqual(['Send ship notice /releases/R1-OPEN/ship-notice']);
    // The status in words, and a release past its ship-by day marked late.
    expect(releases[0]!.text()).toContain('Sent');
    expect(releases[0]!.text()).not.toContain('late');
    expect(releases[1]!.text()).toContain('Confirmed');
    expect(releases[1]!.text()).toContain('Mon 6 Jan · late');
    const claim = wrapper.get('[data-test="receiving-claims"]').get('tr.el-table__row');
    expect(claim.text()).toContain('Short');
    expect(claim.text()).toContain('10 / 12');
  });
});
