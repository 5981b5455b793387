import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { replaceBomLines } from '../../server/master-data/master-data.writer';
import { postCounts, savePartsWithStock } from '../../server/stock/stock.service';
import { upsertSequenceEntries } from '../../server/sequence/sequence.writer';
import { ReleaseLineEntity } from '../../server/releases/release-line.entity';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { bumpPlanningVersion } from '../../server/settings/versions';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';

let context: TestContext;

// A two-level structure small enough to net by hand: one model M, 2 × C per unit (C bought in
// packs of 10 with 5 on hand and a 2-working-day lead time), 1 × D per unit from supplier B.
beforeAll(async () => {
  context = await createTestContext();
  await context.dataSource.transaction(async (manager) => {
    await writeCalendar(manager, { workingWeekdays: [1, 2, 3, 4, 5], holidays: ['2026-12-25'] });
    await savePartsWithStock(manager, [
      testPart('M', { source: 'end_item', supplierCode: null, replenishment: null }),
      testPart('C', { packQty: 10, onHand: 5, leadTimeDays: 2 }),
      testPart('D', { supplierCode: 'SUP-B', onHand: 100 }),
    ]);
    await replaceBomLines(manager, [
      { parent: 'M', component: 'C', qtyPer: 2, scrapPct: 0, effectiveFrom: null, effectiveTo: null },
      { parent: 'M', component: 'D', qtyPer: 1, scrapPct: 0, effectiveFrom: null, effectiveTo: null },
    ]);
    // Mon 21 Dec: 2 units, Tue 22: 1 unit, Mon 28: 3 units (24–25 Dec: Thu, holiday Fri).
    await upsertSequenceEntries(manager, [
      { date: '2026-12-21', sequence: 1, model: 'M', serial: 'S1', qty: 1 },
      { date: '2026-12-21', sequence: 2, model: 'M', serial: 'S2', qty: 1 },
      { date: '2026-12-22', sequence: 1, model: 'M', serial: 'S3', qty: 1 },
      { date: '2026-12-28', sequence: 1, model: 'M', serial: 'S4', qty: 3 },
    ]);
  });
});
afterAll(() => context.close());

describe('GET /api/plan', () => {
  it('returns one bucket per working day with gross-to-net figures worked by hand', async () => {
    const response = await request(context.app)
      .get('/api/plan')
      .query({ part: 'C', from: '2026-12-21', to: '2026-12-28' })
      .set(bearer(context.tokens.viewer));

    expect(response.status).toBe(200);
    expect(response.body.part).toMatchObject({ partNumber: 'C', packQty: 10, leadTimeDays: 2, lowLevelCode: 1 });
    const dates = response.body.buckets.map((bucket: { date: string }) => bucket.date);
    expect(dates).toEqual(['2026-12-21', '2026-12-22', '2026-12-23', '2026-12-24', '2026-12-28']);
    // Day 1: gross 4, 5 on hand → 1 left. Day 2: gross 2, short 1 → receive one pack of 10 → 9.
    // Day 5: gross 6, 9 on hand → 3. Release 2 working days before 22 Dec = 18 Dec → past due.
    const c = response.body.buckets;
    expect(c.map((bucket: { gross: number }) => bucket.gross)).toEqual([4, 2, 0, 0, 6]);
    expect(c.map((bucket: { projectedAvailable: number }) => bucket.projectedAvailable)).toEqual([1, 9, 9, 9, 3]);
    expect(c.map((bucket: { net: number }) => bucket.net)).toEqual([0, 1, 0, 0, 0]);
    expect(c.map((bucket: { plannedReceipt: number }) => bucket.plannedReceipt)).toEqual([0, 10, 0, 0, 0]);
    expect(response.body.pastDue).toEqual([{ date: '2026-12-18', qty: 10 }]);
  });

  it('exports the same buckets and past-due release as CSV', async () => {
    const response = await request(context.app)
      .get('/api/plan')
      .query({ part: 'C', from: '2026-12-21', to: '2026-12-22', format: 'csv' })
      .set(bearer(context.tokens.viewer));

    expect(response.status).toBe(200);
    expect(response.text.split('\r\n')).toEqual([
      'date,gross,scheduled_receipts,projected_available,net,planned_receipt,planned_release',
      '2026-12-21,4,0,1,0,0,0',
      '2026-12-22,2,0,9,1,10,0',
      'past due 2026-12-18,,,,,,10',
    ]);
  });

  it('answers 404 for an unknown part and 400 for a reversed horizon', async () => {
    const unknown = await request(context.app)
      .get('/api/plan')
      .query({ part: 'NOPE' })
      .set(bearer(context.tokens.buyer));
    const reversed = await request(context.app)
      .get('/api/plan')
      .query({ part: 'C', from: '2026-12-28', to: '2026-12-21' })
      .set(bearer(context.tokens.buyer));

    expect(unknown.status).toBe(404);
    expect(reversed.status).toBe(400);
  });

  it('recomputes after an input changes and not before', async () => {
    const query = { part: 'C', from: '2026-12-21', to: '2026-12-28' };
    const before = await request(context.app).get('/api/plan').query(query).set(bearer(context.tokens.buyer));

    await context.db.write((manager) => postCounts(manager, [{ partNumber: 'C', counted: 50 }], null, 'Count'));
    const after = await request(context.app).get('/api/plan').query(query).set(bearer(context.tokens.buyer));

    expect(before.body.buckets[0].projectedAvailable).toBe(1);
    expect(after.body.buckets[0].projectedAvailable).toBe(46);
    expect(after.body.pastDue).toEqual([]);
    await context.db.write((manager) => postCounts(manager, [{ partNumber: 'C', counted: 5 }], null, 'Count'));
  });

  it('counts open release lines as scheduled receipts, at the supplier’s confirmed quantity once confirmed', async () => {
    const query = { part: 'D', from: '2026-12-21', to: '2026-12-22' };
    const { id: releaseId } = await context.dataSource.getRepository(ReleaseEntity).save({
      number: 'R261218-SUP-B',
      supplierCode: 'SUP-B',
      releaseDate: '2026-12-18',
      status: 'sent',
    });
    const { id: lineId } = await context.dataSource
      .getRepository(ReleaseLineEntity)
      .save({ releaseId, partNumber: 'D', qty: 40, needDate: '2026-12-22', origin: 'plan', confirmedQty: 30 });
    await context.dataSource.transaction((manager) => bumpPlanningVersion(manager));
    const sent = await request(context.app).get('/api/plan').query(query).set(bearer(context.tokens.buyer));

    await context.dataSource.getRepository(ReleaseEntity).update(releaseId, { status: 'confirmed' });
    await context.dataSource.transaction((manager) => bumpPlanningVersion(manager));
    const confirmed = await request(context.app).get('/api/plan').query(query).set(bearer(context.tokens.buyer));

    expect(sent.body.buckets.map((bucket: { scheduledReceipts: number }) => bucket.scheduledReceipts)).toEqual([0, 40]);
    expect(confirmed.body.buckets.map((bucket: { scheduledReceipts: number }) => bucket.scheduledReceipts)).toEqual([
      0, 30,
    ]);
    await context.dataSource.getRepository(ReleaseLineEntity).delete(lineId);
    await context.dataSource.getRepository(ReleaseEntity).delete(releaseId);
    await context.dataSource.transaction((manager) => bumpPlanningVersion(manager));
  });

  it('is refused to a supplier account', async () => {
    const response = await request(context.app)
      .get('/api/plan')
      .query({ part: 'C' })
      .set(bearer(context.tokens.supplier));

    expect(response.status).toBe(403);
  });
});

describe('GET /api/demand', () => {
  it('lists gross demand of bought parts by day, filtered by supplier', async () => {
    const all = await request(context.app)
      .get('/api/demand')
      .query({ from: '2026-12-21', to: '2026-12-28' })
      .set(bearer(context.tokens.buyer));
    const supplierB = await request(context.app)
      .get('/api/demand')
      .query({ from: '2026-12-21', to: '2026-12-28', supplier: 'SUP-B' })
      .set(bearer(context.tokens.buyer));

    expect(all.status).toBe(200);
    expect(all.body.rows.map((row: { partNumber: string }) => row.partNumber)).toEqual(['C', 'D']);
    expect(supplierB.body.rows).toEqual([
      {
        partNumber: 'D',
        supplierCode: 'SUP-B',
        uom: 'H87',
        total: 6,
        byDay: { '2026-12-21': 2, '2026-12-22': 1, '2026-12-23': 0, '2026-12-24': 0, '2026-12-28': 3 },
      },
    ]);
    // The last unit of the test sequence is built on 28 Dec: the screen says demand is unknown after it.
    expect(all.body.sequenceEnds).toBe('2026-12-28');
  });

  it('exports the same figures as CSV', async () => {
    const response = await request(context.app)
      .get('/api/demand')
      .query({ from: '2026-12-21', to: '2026-12-22', format: 'csv' })
      .set(bearer(context.tokens.buyer));

    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toMatch(/^text\/csv/);
    expect(response.text.split('\r\n')).toEqual([
      'part_number,supplier_code,2026-12-21,2026-12-22,total',
      'C,SUP-A,4,2,6',
      'D,SUP-B,2,1,3',
    ]);
  });

  it('answers 404 for an unknown supplier', async () => {
    const response = await request(context.app)
      .get('/api/demand')
      .query({ supplier: 'NOPE' })
      .set(bearer(context.tokens.buyer));

    expect(response.status).toBe(404);
  });
});

describe('GET /api/demand/table', () => {
  // The fixture above worked by hand: C is 2 per unit of M, D 1 per unit; units on Mon 21 (2),
  // Tue 22 (1) and Mon 28 Dec (3). 21–24 Dec fall in ISO week 2026-W52 and 28 Dec opens 2026-W53
  // (ISO 8601-1:2019 §3.1.1.23: 2026 starts on a Thursday, so it has 53 weeks; from memory).
  it('sums the days into ISO weeks, sorts and pages on the server, and totals every matched row', async () => {
    const response = await request(context.app)
      .get('/api/demand/table')
      .query({ from: '2026-12-21', to: '2026-12-28', bucket: 'week', sort: 'total', order: 'descending', pageSize: 1 })
      .set(bearer(context.tokens.buyer));

    expect(response.status).toBe(200);
    expect(response.body.buckets).toEqual([
      { key: '2026-W52', days: ['2026-12-21', '2026-12-22', '2026-12-23', '2026-12-24'] },
      { key: '2026-W53', days: ['2026-12-28'] },
    ]);
    expect(response.body.rows).toEqual([
      { partNumber: 'C', supplierCode: 'SUP-A', uom: 'H87', total: 12, byBucket: { '2026-W52': 6, '2026-W53': 6 } },
    ]);
    expect(response.body).toMatchObject({ page: 1, pageSize: 1, matched: 2, partsWithDemand: 2, exactMatch: null });
    expect(response.body.bucketTotals).toEqual({
      '2026-W52': [{ uom: 'H87', qty: 9 }],
      '2026-W53': [{ uom: 'H87', qty: 9 }],
    });
    expect(response.body.grandTotal).toEqual([{ uom: 'H87', qty: 18 }]);
    expect(response.body.units).toEqual(['H87']);
    expect(response.body.stacks.H87.map((stack: { name: string }) => stack.name)).toEqual(['SUP-A', 'SUP-B']);

    const second = await request(context.app)
      .get('/api/demand/table')
      .query({ from: '2026-12-21', to: '2026-12-28', sort: 'total', order: 'descending', pageSize: 1, page: 2 })
      .set(bearer(context.tokens.buyer));
    expect(second.body.rows.map((row: { partNumber: string }) => row.partNumber)).toEqual(['D']);
  });

  it('agrees with GET /api/demand row for row, day for day', async () => {
    const query = { from: '2026-12-21', to: '2026-12-28' };
    const [daily, table] = await Promise.all([
      request(context.app).get('/api/demand').query(query).set(bearer(context.tokens.buyer)),
      request(context.app).get('/api/demand/table').query(query).set(bearer(context.tokens.buyer)),
    ]);

    expect(table.body.rows).toEqual(
      daily.body.rows.map(({ byDay, ...row }: { byDay: Record<string, number> }) => ({ ...row, byBucket: byDay })),
    );
    expect(table.body.sequenceEnds).toBe(daily.body.sequenceEnds);
  });

  it('searches part numbers in any case and names the part the search stands for', async () => {
    const response = await request(context.app)
      .get('/api/demand/table')
      .query({ from: '2026-12-21', to: '2026-12-28', q: 'd', supplier: 'SUP-B' })
      .set(bearer(context.tokens.planner));

    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ matched: 1, partsWithDemand: 1, exactMatch: 'D' });
    // Within one supplier the chart stacks by part.
    expect(response.body.stacks.H87).toEqual([{ name: 'D', values: [2, 1, 0, 0, 3], total: 6, rest: 0 }]);
  });

  it('answers 400 naming the field for a page size past the limit, 404 for an unknown supplier, 403 to a supplier', async () => {
    const tooLarge = await request(context.app)
      .get('/api/demand/table')
      .query({ pageSize: 5000 })
      .set(bearer(context.tokens.buyer));
    const unknown = await request(context.app)
      .get('/api/demand/table')
      .query({ supplier: 'NOPE' })
      .set(bearer(context.tokens.buyer));
    const supplier = await request(context.app).get('/api/demand/table').set(bearer(context.tokens.supplier));

    expect(tooLarge.status).toBe(400);
    expect(JSON.stringify(tooLarge.body)).toContain('pageSize');
    expect(unknown.status).toBe(404);
    expect(supplier.status).toBe(403);
  });
});
