import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ReceiptEntity } from '../../server/dock/receipt.entity';
import { ReleaseLineEntity } from '../../server/releases/release-line.entity';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { plantToday } from '../../server/planning/plan-dates';
import { addMonths, monthOf } from '../../shared/domain/supplier-performance';
import type { Discrepancy } from '../../shared/schemas/receipts';
import { bearer, createTestContext, type TestContext } from './helpers';

let context: TestContext;
let serial = 0;

interface LineSpec {
  qty: number;
  confirmedQty?: number;
  needDate: string;
  /** What was first asked, when an accepted answer has since changed qty and need date. */
  requestedQty?: number;
  requestedDate?: string;
  arrivalDate?: string;
  /** [qty, local plant time "YYYY-MM-DD HH:MM", discrepancy] */
  receipts?: [number, string, Discrepancy | null][];
}

// A plant-time wall clock as the ISO instant the server stores, whatever the host's time zone.
function instant(local: string): string {
  const [date, time] = local.split(' ');
  const [year, month, day] = date.split('-').map(Number);
  const [hour, minute] = time.split(':').map(Number);
  return new Date(year, month - 1, day, hour, minute).toISOString();
}

/** A release with its lines and receipts, written straight to the tables as the app would leave them. */
async function makeRelease(
  supplierCode: string,
  status: string,
  sentAt: string | null,
  confirmedAt: string | null,
  lines: LineSpec[],
): Promise<void> {
  serial += 1;
  const release = await context.dataSource.getRepository(ReleaseEntity).save({
    number: `R-PERF-${serial}`,
    supplierCode,
    releaseDate: `2000-01-${String(serial).padStart(2, '0')}`,
    status,
    sentAt,
    confirmedAt,
    carrier: null,
    trackingNumber: null,
  });
  for (const spec of lines) {
    const saved = await context.dataSource.getRepository(ReleaseLineEntity).save({
      releaseId: release.id,
      partNumber: 'PART-1',
      qty: spec.qty,
      needDate: spec.needDate,
      origin: 'plan',
      cardId: null,
      confirmedQty: spec.confirmedQty ?? null,
      requestedQty: spec.requestedQty ?? spec.qty,
      requestedDate: spec.requestedDate ?? spec.needDate,
      arrivalDate: spec.arrivalDate ?? null,
      receivedQty: 0,
      closed: false,
    });
    for (const [qty, at, discrepancy] of spec.receipts ?? []) {
      serial += 1;
      await context.dataSource.getRepository(ReceiptEntity).save({
        releaseLineId: saved.id,
        qty,
        discrepancy,
        note: null,
        final: false,
        idempotencyKey: `perf-${serial}`,
        onHandAfter: 0,
        userEmail: 'receiving@example.com',
        receivedAt: instant(at),
      });
    }
  }
}

const get = (query: string, role: keyof TestContext['tokens'] = 'buyer') =>
  request(context.app).get(`/api/suppliers/performance${query}`).set(bearer(context.tokens[role]));

beforeAll(async () => {
  context = await createTestContext();
  // SUP-A, January: answered in 3 h (06:00 → 09:00 UTC).
  await makeRelease('SUP-A', 'received', '2025-01-06T06:00:00.000Z', '2025-01-06T09:00:00.000Z', [
    // Confirmed 80 of 100; 80 usable late on the need day → on time, fills 80 of the 100 asked, promise kept.
    { qty: 100, confirmedQty: 80, needDate: '2025-01-10', receipts: [[80, '2025-01-10 23:30', null]] },
    // 50 damaged and 20 good the day before (inside the one-day early window) → on time, fills 20 of 50.
    {
      qty: 50,
      needDate: '2025-01-10',
      receipts: [
        [50, '2025-01-09 10:00', 'damaged'],
        [20, '2025-01-09 10:05', null],
      ],
    },
  ]);
  // SUP-A, January: answered in 30 h; all 60 arrive the day after the need date → late, still fills 60.
  await makeRelease('SUP-A', 'received', '2025-01-13T06:00:00.000Z', '2025-01-14T12:00:00.000Z', [
    { qty: 60, needDate: '2025-01-17', receipts: [[60, '2025-01-18 08:00', null]] },
  ]);
  // Cancelled: never measured.
  await makeRelease('SUP-A', 'cancelled', '2025-01-15T06:00:00.000Z', null, [{ qty: 999, needDate: '2025-01-20' }]);
  // SUP-A, February: never answered; the wrong part came → late, fills 0.
  await makeRelease('SUP-A', 'sent', '2025-02-03T06:00:00.000Z', null, [
    { qty: 40, needDate: '2025-02-07', receipts: [[40, '2025-02-06 09:00', 'wrong_part']] },
  ]);
  // SUP-B, January: answered in 1.5 h; 10 of 10 the day before (recorded short of a larger pack, all usable).
  await makeRelease('SUP-B', 'received', '2025-01-20T06:00:00.000Z', '2025-01-20T07:30:00.000Z', [
    { qty: 10, needDate: '2025-01-24', receipts: [[10, '2025-01-23 14:00', 'short']] },
  ]);
});
afterAll(() => context.close());

describe('GET /api/suppliers/performance', () => {
  it('measures each supplier and month of need date', async () => {
    const response = await get('?from=2025-01&to=2025-02');

    expect(response.status).toBe(200);
    expect(response.body).toEqual([
      {
        supplierCode: 'SUP-A',
        supplierName: 'Supplier A',
        month: '2025-01',
        // On time: 2 of 3 lines. Fill: (80 + 20 + 60) / (100 + 50 + 60) = 160 / 210. Promise: 1 answered line, kept.
        lines: 3,
        onTimeLines: 2,
        earlyLines: 0,
        lateLines: 1,
        onTimeRate: 2 / 3,
        requestedQty: 210,
        filledQty: 160,
        fillRate: 160 / 210,
        promisedLines: 1,
        promiseKeptLines: 1,
        promiseKeptRate: 1,
        // Latency 3 h and 30 h: median (3 + 30) / 2 = 16.5, mean 16.5.
        releases: 2,
        confirmedReleases: 2,
        unansweredReleases: 0,
        confirmationHoursMedian: 16.5,
        confirmationHoursMean: 16.5,
      },
      {
        supplierCode: 'SUP-A',
        supplierName: 'Supplier A',
        month: '2025-02',
        lines: 1,
        onTimeLines: 0,
        earlyLines: 0,
        lateLines: 1,
        onTimeRate: 0,
        requestedQty: 40,
        filledQty: 0,
        fillRate: 0,
        promisedLines: 0,
        promiseKeptLines: 0,
        promiseKeptRate: null,
        releases: 1,
        confirmedReleases: 0,
        unansweredReleases: 1,
        confirmationHoursMedian: null,
        confirmationHoursMean: null,
      },
      {
        supplierCode: 'SUP-B',
        supplierName: 'Supplier B',
        month: '2025-01',
        lines: 1,
        onTimeLines: 1,
        earlyLines: 0,
        lateLines: 0,
        onTimeRate: 1,
        requestedQty: 10,
        filledQty: 10,
        fillRate: 1,
        promisedLines: 0,
        promiseKeptLines: 0,
        promiseKeptRate: null,
        releases: 1,
        confirmedReleases: 1,
        unansweredReleases: 0,
        confirmationHoursMedian: 1.5,
        confirmationHoursMean: 1.5,
      },
    ]);
  });

  it('filters by supplier and answers 404 for an unknown one', async () => {
    const one = await get('?from=2025-01&to=2025-02&supplier=SUP-B');
    const unknown = await get('?from=2025-01&to=2025-02&supplier=NOPE');

    expect(one.status).toBe(200);
    expect(one.body.map((row: { supplierCode: string; month: string }) => `${row.supplierCode} ${row.month}`)).toEqual([
      'SUP-B 2025-01',
    ]);
    expect(unknown.status).toBe(404);
  });

  it('defaults to the current month and the five before it', async () => {
    const current = monthOf(plantToday());
    await makeRelease('SUP-B', 'sent', '2000-01-01T00:00:00.000Z', null, [
      { qty: 7, needDate: `${addMonths(current, -5)}-15` },
      { qty: 9, needDate: `${addMonths(current, -6)}-15` },
    ]);

    const response = await get('');

    // Only the line five months back falls in the default range; the one six months back does not.
    expect(response.status).toBe(200);
    expect(response.body).toEqual([
      expect.objectContaining({ supplierCode: 'SUP-B', month: addMonths(current, -5), lines: 1, requestedQty: 7 }),
    ]);
  });

  it('rejects bad months, a reversed range and more than 24 months', async () => {
    expect((await get('?from=2025-13')).status).toBe(400);
    expect((await get('?from=2025-1&to=2025-02')).status).toBe(400);
    expect((await get('?from=2025-03&to=2025-02')).status).toBe(400);
    // 2023-01 through 2025-01 is 25 months; 2023-02 through 2025-01 is 24.
    expect((await get('?from=2023-01&to=2025-01')).status).toBe(400);
    expect((await get('?from=2023-02&to=2025-01')).status).toBe(200);
  });

  it('measures against what was first asked, not the accepted answer', async () => {
    // SUP-B, March 2025 (Monday–Friday plant). Asked 48 for Friday 03-14; the supplier confirmed 36
    // and the buyer accepted, so the line now reads 36; 36 came on the 14th.
    await makeRelease('SUP-B', 'received', '2025-03-03T06:00:00.000Z', '2025-03-03T08:00:00.000Z', [
      {
        qty: 36,
        confirmedQty: 36,
        needDate: '2025-03-14',
        requestedQty: 48,
        requestedDate: '2025-03-14',
        arrivalDate: '2025-03-14',
        receipts: [[36, '2025-03-14 10:00', null]],
      },
      // Asked for Thursday 03-27, came on Friday 03-14: nine working days early.
      { qty: 10, needDate: '2025-03-27', receipts: [[10, '2025-03-14 10:00', null]] },
    ]);

    const response = await get('?from=2025-03&to=2025-03&supplier=SUP-B');

    // Fill (36 + 10) / (48 + 10) = 46 / 58: the 48 line alone fills 75 %. Promise kept 1 of 1.
    expect(response.status).toBe(200);
    expect(response.body).toEqual([
      expect.objectContaining({
        lines: 2,
        onTimeLines: 1,
        earlyLines: 1,
        requestedQty: 58,
        filledQty: 46,
        promisedLines: 1,
        promiseKeptLines: 1,
      }),
    ]);
  });

  it('gives a supplier account its own figures only', async () => {
    const own = await get('?from=2025-01&to=2025-02', 'supplier');
    const named = await get('?from=2025-01&to=2025-02&supplier=SUP-A', 'supplier');
    const another = await get('?from=2025-01&to=2025-02&supplier=SUP-B', 'supplier');

    // The supplier user belongs to SUP-A (tests/server/helpers.ts).
    expect(own.status).toBe(200);
    expect(new Set(own.body.map((row: { supplierCode: string }) => row.supplierCode))).toEqual(new Set(['SUP-A']));
    expect(named.body).toEqual(own.body);
    expect(another.status).toBe(404);
  });

  it('is open to reading roles and asks for a sign-in', async () => {
    expect((await get('?from=2025-01&to=2025-01', 'viewer')).status).toBe(200);
    expect((await request(context.app).get('/api/suppliers/performance')).status).toBe(401);
  });
});
