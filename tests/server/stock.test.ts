import fc from 'fast-check';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { replaceBomLines } from '../../server/master-data/master-data.writer';
import { plantToday } from '../../server/planning/plan-dates';
import { upsertSequenceEntries } from '../../server/sequence/sequence.writer';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';
import { runSql } from '../../server/db/sql';

let context: TestContext;
const today = plantToday();

beforeAll(async () => {
  context = await createTestContext();
  await context.db.write(async (manager) => {
    await writeCalendar(manager, { workingWeekdays: [1, 2, 3, 4, 5, 6, 7], holidays: [] });
    await savePartsWithStock(manager, [
      testPart('M', { source: 'end_item', supplierCode: null, replenishment: null }),
      testPart('WHEEL', { onHand: 40 }),
      testPart('GLUE', { uom: 'LTR', onHand: 2.5 }),
      testPart('BOLT', { onHand: 0 }),
    ]);
    await replaceBomLines(manager, [
      { parent: 'M', component: 'WHEEL', qtyPer: 4, scrapPct: 0, effectiveFrom: null, effectiveTo: null },
      { parent: 'M', component: 'GLUE', qtyPer: 0.1, scrapPct: 0, effectiveFrom: null, effectiveTo: null },
    ]);
  });
});
afterAll(() => context.close());

const ledger = async (partNumber: string, query: Record<string, string> = {}) =>
  (await request(context.app).get(`/api/stock/${partNumber}/movements`).query(query).set(bearer(context.tokens.buyer)))
    .body;

describe('the stock ledger', () => {
  it('opens each part’s ledger with its on-hand', async () => {
    const wheels = await ledger('WHEEL');

    expect(wheels).toMatchObject({ partNumber: 'WHEEL', opening: 0, closing: 40, onHand: 40 });
    expect(wheels.movements).toEqual([
      expect.objectContaining({ kind: 'opening', qty: 40, balance: 40, reason: 'Part master' }),
    ]);
  });

  it('posts a count as the variance, with who counted and why, and dates the count', async () => {
    const counted = await request(context.app)
      .post('/api/stock/counts')
      .set(bearer(context.tokens.receiving))
      .send({ partNumber: 'WHEEL', counted: 37, reason: 'Cycle count aisle 4' });

    expect(counted.status).toBe(201);
    expect(counted.body).toMatchObject({ onHand: 37, movement: { kind: 'count', qty: -3, balance: 37 } });
    const wheels = await ledger('WHEEL');
    expect(wheels.movements.at(-1)).toMatchObject({
      kind: 'count',
      userEmail: 'receiving@example.com',
      reason: 'Cycle count aisle 4',
    });
    expect(wheels.lastCountedAt).toEqual(expect.any(String));
  });

  it('posts scrap with its reason and refuses bad input with the field named, changing nothing', async () => {
    const scrapped = await request(context.app)
      .post('/api/stock/scrap')
      .set(bearer(context.tokens.line))
      .send({ partNumber: 'WHEEL', qty: 2, reason: 'Dropped from the rack' });
    const negative = await request(context.app)
      .post('/api/stock/scrap')
      .set(bearer(context.tokens.line))
      .send({ partNumber: 'WHEEL', qty: -2, reason: 'x' });
    const noReason = await request(context.app)
      .post('/api/stock/scrap')
      .set(bearer(context.tokens.line))
      .send({ partNumber: 'WHEEL', qty: 1 });
    const unknown = await request(context.app)
      .post('/api/stock/counts')
      .set(bearer(context.tokens.buyer))
      .send({ partNumber: 'NOPE', counted: 1 });
    const viewer = await request(context.app)
      .post('/api/stock/counts')
      .set(bearer(context.tokens.viewer))
      .send({ partNumber: 'WHEEL', counted: 1 });

    expect(scrapped.status).toBe(201);
    expect(scrapped.body).toMatchObject({ onHand: 35, movement: { kind: 'scrap', qty: -2 } });
    expect(negative.status).toBe(400);
    expect(negative.body.error.details[0].path).toEqual(['qty']);
    expect(noReason.body.error.details[0].path).toEqual(['reason']);
    expect(unknown.status).toBe(404);
    expect(viewer.status).toBe(403);
    expect((await ledger('WHEEL')).onHand).toBe(35);
  });

  it('turns an on-hand import into counts, never an overwrite without a trace', async () => {
    const upload = await request(context.app)
      .post('/api/imports/on-hand')
      .set(bearer(context.tokens.buyer))
      .attach('file', Buffer.from('part_number,on_hand\nGLUE,3\n'), 'on-hand.csv');

    expect(upload.status).toBe(200);
    const glue = await ledger('GLUE');
    expect(glue.movements.at(-1)).toMatchObject({ kind: 'count', qty: 0.5, balance: 3, reason: 'On-hand import' });
  });

  it('flags negative on-hand and parts due a count in the stock list', async () => {
    await context.db.write((manager) =>
      upsertSequenceEntries(manager, [{ date: today, sequence: 1, model: 'M', serial: 'FLAG-1', qty: 10 }]),
    );
    await request(context.app)
      .post('/api/builds')
      .set(bearer(context.tokens.planner))
      .set('Idempotency-Key', 'flag-1')
      .send({ serial: 'FLAG-1' });

    // Counted 91 days ago: one day past the default 90-day interval.
    const longAgo = new Date(Date.now() - 91 * 86_400_000).toISOString();
    await context.db.write((manager) =>
      runSql(manager, 'UPDATE part SET last_counted_at = ? WHERE part_number = ?', [longAgo, 'GLUE']),
    );

    const list = await request(context.app).get('/api/stock').set(bearer(context.tokens.viewer));
    const item = (partNumber: string) =>
      list.body.find((entry: { partNumber: string }) => entry.partNumber === partNumber);

    expect(item('WHEEL')).toMatchObject({ onHand: -5, negative: true, countDue: false });
    expect(item('GLUE')).toMatchObject({ negative: false, countDue: true });
    // No count and no ledger at all: nothing says what is on the shelf.
    expect(item('BOLT')).toMatchObject({ negative: false, countDue: true, lastCountedAt: null });
    // End items are built, not stocked.
    expect(item('M')).toMatchObject({ negative: false, countDue: false, lastCountedAt: null });
  });
});

describe('on-hand is the sum of the movements', () => {
  it('holds after any mix of builds, reversals, counts and scrap', async () => {
    const operation = fc.oneof(
      fc.record({ kind: fc.constant('build' as const), qty: fc.integer({ min: 1, max: 3 }) }),
      fc.record({ kind: fc.constant('reverse' as const) }),
      fc.record({ kind: fc.constant('count' as const), counted: fc.integer({ min: 0, max: 80 }) }),
      fc.record({ kind: fc.constant('scrap' as const), qty: fc.integer({ min: 1, max: 5 }) }),
    );
    let serial = 0;
    const built: string[] = [];
    await fc.assert(
      fc.asyncProperty(fc.array(operation, { minLength: 1, maxLength: 12 }), async (operations) => {
        for (const op of operations) {
          if (op.kind === 'build') {
            serial += 1;
            const name = `PROP-${serial}`;
            await context.db.write((manager) =>
              upsertSequenceEntries(manager, [
                { date: today, sequence: 100 + serial, model: 'M', serial: name, qty: op.qty },
              ]),
            );
            await request(context.app)
              .post('/api/builds')
              .set(bearer(context.tokens.planner))
              .set('Idempotency-Key', name)
              .send({ serial: name });
            built.push(name);
          } else if (op.kind === 'reverse' && built.length > 0) {
            await request(context.app)
              .delete(`/api/builds/${built.pop()}`)
              .query({ reason: 'test' })
              .set(bearer(context.tokens.planner));
          } else if (op.kind === 'count') {
            await request(context.app)
              .post('/api/stock/counts')
              .set(bearer(context.tokens.buyer))
              .send({ partNumber: 'WHEEL', counted: op.counted });
          } else if (op.kind === 'scrap') {
            await request(context.app)
              .post('/api/stock/scrap')
              .set(bearer(context.tokens.buyer))
              .send({ partNumber: 'WHEEL', qty: op.qty, reason: 'test' });
          }
        }
        const sums: { part_number: string; total: number; on_hand: number }[] = await context.dataSource.query(
          `SELECT p.part_number, p.on_hand, COALESCE(SUM(m.qty), 0) AS total
           FROM part p LEFT JOIN stock_movement m ON m.part_number = p.part_number GROUP BY p.part_number, p.on_hand`,
        );
        for (const row of sums) expect(row.on_hand).toBeCloseTo(row.total, 9);
        const wheels = await ledger('WHEEL');
        expect(wheels.closing).toBeCloseTo(wheels.onHand, 9);
      }),
      { numRuns: 15 },
    );
  });
});
