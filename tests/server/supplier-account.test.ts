import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { ReceiptEntity } from '../../server/dock/receipt.entity';
import { replaceBomLines } from '../../server/master-data/master-data.writer';
import { ReleaseLineEntity } from '../../server/releases/release-line.entity';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { upsertSequenceEntries } from '../../server/sequence/sequence.writer';
import { savePartsWithStock } from '../../server/stock/stock.service';
import type { Discrepancy } from '../../shared/schemas/receipts';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';

let context: TestContext;

// The plant's day is Monday 30 Nov 2026 on a Monday–Friday calendar with the default 3-day frozen
// window (Mon 30, Tue 1, Wed 2 Dec). P1 (SUP-A, lead time 5) is planned through Mon 7 Dec.
beforeAll(async () => {
  context = await createTestContext();
  vi.useFakeTimers({ toFake: ['Date'], now: new Date(2026, 10, 30, 9, 0) });
  await context.dataSource.transaction(async (manager) => {
    await writeCalendar(manager, { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] });
    await savePartsWithStock(manager, [
      testPart('M', { source: 'end_item', supplierCode: null, replenishment: null }),
      testPart('P1', { leadTimeDays: 5 }),
      testPart('P2', { supplierCode: 'SUP-B' }),
    ]);
    await replaceBomLines(manager, [
      { parent: 'M', component: 'P1', qtyPer: 1, scrapPct: 0, effectiveFrom: null, effectiveTo: null },
      { parent: 'M', component: 'P2', qtyPer: 1, scrapPct: 0, effectiveFrom: null, effectiveTo: null },
    ]);
    await upsertSequenceEntries(manager, [
      { date: '2026-12-01', sequence: 1, model: 'M', serial: 'S1', qty: 2 },
      { date: '2026-12-03', sequence: 1, model: 'M', serial: 'S2', qty: 1 },
      { date: '2026-12-08', sequence: 1, model: 'M', serial: 'S3', qty: 4 },
    ]);
  });
  await addClaim('SUP-A', 'R-A-1', 'P1', 12, [10, 'short']);
  await addClaim('SUP-A', 'R-A-2', 'P1', 6, [6, null], '2026-11-23');
  await addClaim('SUP-B', 'R-B-1', 'P2', 8, [8, 'damaged']);
});
afterAll(async () => {
  vi.useRealTimers();
  await context.close();
});

async function addClaim(
  supplierCode: string,
  number: string,
  partNumber: string,
  qty: number,
  receipt: [number, Discrepancy | null],
  releaseDate = '2026-11-20',
) {
  const release = await context.dataSource.getRepository(ReleaseEntity).save({
    number,
    supplierCode,
    releaseDate,
    status: 'received',
  });
  const line = await context.dataSource
    .getRepository(ReleaseLineEntity)
    .save({ releaseId: release.id, partNumber, qty, needDate: '2026-11-27', origin: 'plan' });
  await context.dataSource.getRepository(ReceiptEntity).save({
    releaseLineId: line.id,
    qty: receipt[0],
    discrepancy: receipt[1],
    note: receipt[1] ? 'counted at the dock' : null,
    final: false,
    idempotencyKey: `claim-${number}`,
    onHandAfter: 0,
    userEmail: 'receiving@example.com',
    receivedAt: '2026-11-27T08:00:00.000Z',
  });
}

const forecastOf = (code: string, role: keyof TestContext['tokens'], query: Record<string, string> = {}) =>
  request(context.app)
    .get(`/api/suppliers/${code}/forecast`)
    .query({ from: '2026-11-30', to: '2026-12-08', ...query })
    .set(bearer(context.tokens[role]));

describe('GET /api/suppliers/{code}/forecast', () => {
  it('zones each day firm inside the frozen window, planned inside the lead time, forecast beyond', async () => {
    const response = await forecastOf('SUP-A', 'supplier');

    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ supplierCode: 'SUP-A', today: '2026-11-30', frozenUntil: '2026-12-02' });
    // The last unit of the test sequence is built on 8 Dec.
    expect(response.body.sequenceEnds).toBe('2026-12-08');
    // Only SUP-A's part; P2 belongs to SUP-B.
    expect(response.body.parts.map((part: { partNumber: string }) => part.partNumber)).toEqual(['P1']);
    const [p1] = response.body.parts;
    expect(p1).toMatchObject({ leadTimeDays: 5, plannedUntil: '2026-12-07', total: 7 });
    const byDay = Object.fromEntries(
      p1.days.map((day: { date: string; qty: number; zone: string }) => [day.date, `${day.qty} ${day.zone}`]),
    );
    expect(byDay).toMatchObject({
      '2026-12-01': '2 firm',
      '2026-12-02': '0 firm',
      '2026-12-03': '1 planned',
      '2026-12-07': '0 planned',
      '2026-12-08': '4 forecast',
    });
  });

  it('downloads the same days as CSV, one row per part and day', async () => {
    const response = await forecastOf('SUP-A', 'supplier', { format: 'csv' });

    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toContain('text/csv');
    const lines = response.text.split('\r\n');
    expect(lines[0]).toBe('part_number,description,uom,date,qty,zone');
    expect(lines).toContain('P1,Part P1,H87,2026-12-01,2,firm');
    expect(lines).toContain('P1,Part P1,H87,2026-12-08,4,forecast');
  });

  it('keeps a supplier account to its own code and lets the buyer read any', async () => {
    expect((await forecastOf('SUP-B', 'supplier')).status).toBe(404);
    expect((await forecastOf('SUP-B', 'buyer')).status).toBe(200);
    expect((await forecastOf('NOPE', 'buyer')).status).toBe(404);
    expect((await request(context.app).get('/api/suppliers/SUP-A/forecast')).status).toBe(401);
  });
});

describe('GET /api/demand as a supplier', () => {
  it('gives a supplier account its own parts and refuses another supplier’s', async () => {
    const own = await request(context.app)
      .get('/api/demand')
      .query({ from: '2026-11-30', to: '2026-12-08' })
      .set(bearer(context.tokens.supplier));
    const another = await request(context.app)
      .get('/api/demand')
      .query({ supplier: 'SUP-B' })
      .set(bearer(context.tokens.supplier));

    expect(own.status).toBe(200);
    expect(own.body.rows.map((row: { partNumber: string }) => row.partNumber)).toEqual(['P1']);
    expect(another.status).toBe(404);
  });
});

describe('GET /api/suppliers/{code}/claims', () => {
  it('lists what the dock recorded short, over or damaged against the supplier, its own only', async () => {
    const own = await request(context.app).get('/api/suppliers/SUP-A/claims').set(bearer(context.tokens.supplier));
    const another = await request(context.app).get('/api/suppliers/SUP-B/claims').set(bearer(context.tokens.supplier));
    const asBuyer = await request(context.app).get('/api/suppliers/SUP-B/claims').set(bearer(context.tokens.buyer));

    expect(own.status).toBe(200);
    // R-A-2 was received without a discrepancy: no claim.
    expect(own.body).toEqual([
      expect.objectContaining({ releaseNumber: 'R-A-1', partNumber: 'P1', lineQty: 12, qty: 10, discrepancy: 'short' }),
    ]);
    expect(another.status).toBe(404);
    expect(asBuyer.body).toEqual([expect.objectContaining({ releaseNumber: 'R-B-1', discrepancy: 'damaged' })]);
  });
});
