import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { AuditEventEntity } from '../../server/audit/audit-event.entity';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { CardScanEntity } from '../../server/loops/card-scan.entity';
import { KanbanCardEntity } from '../../server/loops/kanban-card.entity';
import { syncLoops } from '../../server/loops/loop-sync';
import { replaceBomLines } from '../../server/master-data/master-data.writer';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { SupplierEntity } from '../../server/master-data/supplier.entity';
import { upsertSequenceEntries } from '../../server/sequence/sequence.writer';
import { readPlanningVersion } from '../../server/settings/versions';
import { cardNumber } from '../../shared/domain/gs1';
import type { Part } from '../../shared/schemas/master-data';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';

let context: TestContext;

const part = (partNumber: string, overrides: Partial<Part>): Part =>
  testPart(partNumber, { pointOfUse: 'L1-ST01', ...overrides });

interface LoopRow {
  id: number;
  partNumber: string;
  recommendedCards: number;
  activeCards: number;
  proposal: { action: string; count: number };
  containerQty: number;
  cardStates: Record<string, number>;
  [field: string]: unknown;
}

async function listLoops(): Promise<LoopRow[]> {
  const response = await request(context.app).get('/api/kanban/loops').set(bearer(context.tokens.buyer));
  expect(response.status).toBe(200);
  return response.body as LoopRow[];
}

async function loopOf(partNumber: string): Promise<LoopRow> {
  const loop = (await listLoops()).find((row) => row.partNumber === partNumber);
  if (!loop) throw new Error(`no loop for ${partNumber}`);
  return loop;
}

type RoleName = keyof TestContext['tokens'];

function accept(loopId: number, body: object = {}, role: RoleName = 'buyer') {
  return request(context.app).post(`/api/kanban/loops/${loopId}/accept`).set(bearer(context.tokens[role])).send(body);
}

function patchLoop(loopId: number, body: object, role: RoleName = 'buyer') {
  return request(context.app).patch(`/api/kanban/loops/${loopId}`).set(bearer(context.tokens[role])).send(body);
}

function loopAudit(partNumber: string, action: string) {
  return context.dataSource
    .getRepository(AuditEventEntity)
    .findBy({ entity: 'kanban_loop', action, entityKey: partNumber });
}

/** Puts a card where a release line, a ship notice or a receipt would (scans may not). */
async function setCardState(number: string, state: string): Promise<void> {
  await context.dataSource.getRepository(KanbanCardEntity).update({ cardNumber: number }, { state });
}

function scan(number: string, event?: string, role: RoleName = 'receiving') {
  return request(context.app)
    .post('/api/kanban/scans')
    .set(bearer(context.tokens[role]))
    .send(event ? { cardNumber: number, event } : { cardNumber: number });
}

// The clock stands on Sunday 20 Dec 2026, so the sizing window starts on Monday 21 Dec. It is set
// before the test users sign in so their tokens are issued on the same clock.
//
// Fixture: one end item M on a Monday–Friday calendar without holidays. Per unit of M: 2 × C
// (bought from SUP-A, packs of 2), 1 × D (bought from SUP-B, packs of 1), 1 × S (made in-house,
// lead time 0, packs of 1); X is bought but scheduled, so it gets no loop. M is built: 2 on Mon
// 21 Dec, 3 on Tue 22 Dec, 5 on Mon 4 Jan, 10 on Mon 11 Jan — 20 units within the 20 working days
// 21 Dec … 15 Jan — and 40 on Mon 18 Jan, the 21st working day, outside the window.
beforeAll(async () => {
  vi.useFakeTimers({ toFake: ['Date'] });
  vi.setSystemTime(new Date('2026-12-20T12:00:00'));
  context = await createTestContext();
  await context.dataSource.transaction(async (manager) => {
    await writeCalendar(manager, { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] });
    // SUP-B states its cycle 5-2-1 (two deliveries a week, each one delivery after its signal: 2.5
    // working days), which its 2-day lead time allows.
    await manager.update(
      SupplierEntity,
      { code: 'SUP-B' },
      { leadTimeDays: 2, cycleDays: 5, deliveriesPerCycle: 2, deliveryDelay: 1 },
    );
    await savePartsWithStock(manager, [
      part('M', { source: 'end_item', supplierCode: null, replenishment: null, pointOfUse: null }),
      part('C', { packQty: 2, description: 'Caster 100 mm' }),
      part('D', { supplierCode: 'SUP-B' }),
      part('S', { source: 'make', supplierCode: null }),
      part('X', { replenishment: 'scheduled' }),
    ]);
    await syncLoops(manager);
    const line = (component: string, qtyPer: number) => ({
      parent: 'M',
      component,
      qtyPer,
      scrapPct: 0,
      effectiveFrom: null,
      effectiveTo: null,
    });
    await replaceBomLines(manager, [line('C', 2), line('D', 1), line('S', 1), line('X', 1)]);
    await upsertSequenceEntries(manager, [
      { date: '2026-12-21', sequence: 1, model: 'M', serial: 'U1', qty: 2 },
      { date: '2026-12-22', sequence: 1, model: 'M', serial: 'U2', qty: 3 },
      { date: '2027-01-04', sequence: 1, model: 'M', serial: 'U3', qty: 5 },
      { date: '2027-01-11', sequence: 1, model: 'M', serial: 'U4', qty: 10 },
      { date: '2027-01-18', sequence: 1, model: 'M', serial: 'U5', qty: 40 },
    ]);
  });
});
afterAll(async () => {
  await context.close();
  vi.useRealTimers();
});

describe('POST /api/kanban/size', () => {
  it('sizes a textbook loop with the safety allowance in days', async () => {
    // Heizer & Render, "Operations Management", ch. 16 "JIT, TPS, and Lean Operations", example on
    // determining the number of kanbans: daily demand 500, lead time 2 days, safety stock ½ day,
    // container 250 → (1,000 + 250) / 250 = 5 kanbans (from memory).
    const response = await request(context.app)
      .post('/api/kanban/size')
      .set(bearer(context.tokens.viewer))
      .send({ dailyDemand: 500, leadTimeDays: 2, safetyDays: 0.5, containerQty: 250 });

    expect(response.status).toBe(200);
    expect(response.body).toEqual({
      exact: 5,
      cards: 5,
      replenishmentTime: 2,
      formula: '⌈(500 × (2 × (1 + 0) + 0.5) + 0) / 250⌉ = ⌈5⌉ = 5',
    });
  });

  it('turns a delivery cycle into the replenishment time', async () => {
    // Monden, "Toyota Production System", chapter on supplier kanban (from memory): cycle 1-4-2,
    // four deliveries a day, each bringing the cards collected two deliveries earlier →
    // T = 1 × (1 + 2) / 4 = 0.75 day.
    const response = await request(context.app)
      .post('/api/kanban/size')
      .set(bearer(context.tokens.buyer))
      .send({ dailyDemand: 400, containerQty: 50, cycle: { days: 1, deliveries: 4, delay: 2 } });

    expect(response.status).toBe(200);
    expect(response.body.replenishmentTime).toBe(0.75);
    // 400 × 0.75 / 50 = 6 containers.
    expect(response.body.cards).toBe(6);
  });

  it('answers 400 with the field path for a zero container quantity', async () => {
    const response = await request(context.app)
      .post('/api/kanban/size')
      .set(bearer(context.tokens.buyer))
      .send({ dailyDemand: 10, leadTimeDays: 1, containerQty: 0 });

    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('invalid_input');
    expect(response.body.error.details).toEqual([
      expect.objectContaining({ path: ['containerQty'], message: 'must be greater than 0' }),
    ]);
    expect(response.body.error.message).toBe('containerQty: must be greater than 0');
  });

  it('reports a sizing rule the schema cannot see in the same error shape', async () => {
    // Property: a count beyond Number.MAX_SAFE_INTEGER cannot be reported exactly, so it is refused.
    const response = await request(context.app)
      .post('/api/kanban/size')
      .set(bearer(context.tokens.buyer))
      .send({ dailyDemand: 1e300, leadTimeDays: 1, containerQty: 1 });

    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('invalid_input');
    expect(response.body.error.details).toEqual([
      { path: ['dailyDemand'], message: expect.stringMatching(/more cards/) },
    ]);
  });

  it('is refused to a supplier account', async () => {
    const response = await request(context.app)
      .post('/api/kanban/size')
      .set(bearer(context.tokens.supplier))
      .send({ dailyDemand: 1, leadTimeDays: 1, containerQty: 1 });

    expect(response.status).toBe(403);
  });
});

describe('GET /api/kanban/loops', () => {
  it('lists one loop per kanban part with the published fields, sized by hand', async () => {
    const loops = await listLoops();

    // Sizing by N = ⌈D · T · (1 + α) / C⌉ (Krajewski, Ritzman & Malhotra, "Operations Management:
    // Processes and Supply Chains", ch. "Lean Systems"; Stevenson, "Operations Management", ch. 14 —
    // from memory), α = 0.1 by default. Worked by hand from the fixture above:
    // C: D = 2 × 20 units / 20 days = 2/day, peak 2 × 10 = 20 on 11 Jan; SUP-A states no cycle and
    //    delivers every working day, so with lead time 0 its cycle is 5-5-1 (the least delay is one
    //    delivery) → T = 5 × (1 + 1) / 5 = 2 days; N = ⌈2 × 2 × 1.1 / 2⌉ = ⌈2.2⌉ = 3.
    // D: D = 20 / 20 = 1/day, peak 10; SUP-B cycle 5-2-1 → T = 5 × (1 + 1) / 2 = 5 days;
    //    N = ⌈1 × 5 × 1.1 / 1⌉ = ⌈5.5⌉ = 6.
    // S: made in-house, lead time 0 raised to the 1-day minimum; N = ⌈1 × 1 × 1.1 / 1⌉ = ⌈1.1⌉ = 2.
    // The 40 units on 18 Jan lie outside the window; counted, they would triple every average.
    expect(loops.map((loop) => loop.partNumber)).toEqual(['C', 'D', 'S']);
    const published = [
      'partNumber',
      'supplierCode',
      'containerQty',
      'safetyFactor',
      'averageDailyDemand',
      'replenishmentDays',
      'recommendedCards',
      'activeCards',
    ];
    const pick = (loop: LoopRow) => Object.fromEntries(published.map((field) => [field, loop[field]]));
    const fresh = { safetyFactor: 0.1, activeCards: 0 };
    expect(loops.map(pick)).toEqual([
      {
        ...fresh,
        partNumber: 'C',
        supplierCode: 'SUP-A',
        containerQty: 2,
        averageDailyDemand: 2,
        replenishmentDays: 2,
        recommendedCards: 3,
      },
      {
        ...fresh,
        partNumber: 'D',
        supplierCode: 'SUP-B',
        containerQty: 1,
        averageDailyDemand: 1,
        replenishmentDays: 5,
        recommendedCards: 6,
      },
      {
        ...fresh,
        partNumber: 'S',
        supplierCode: null,
        containerQty: 1,
        averageDailyDemand: 1,
        replenishmentDays: 1,
        recommendedCards: 2,
      },
    ]);
    expect(loops.map((loop) => [loop.kind, loop.peakDailyDemand])).toEqual([
      ['supplier', 20],
      ['supplier', 10],
      ['supermarket', 10],
    ]);
    expect(loops[0]).toMatchObject({
      description: 'Caster 100 mm',
      pointOfUse: 'L1-ST01',
      sizingWindowDays: 20,
      windowFrom: '2026-12-21',
      windowTo: '2027-01-15',
      proposal: { action: 'add', count: 3 },
      cardStates: { full: 0, empty: 0, ordered: 0, shipped: 0 },
    });
  });

  it('filters by supplier and answers 404 for an unknown one', async () => {
    const supplierB = await request(context.app)
      .get('/api/kanban/loops')
      .query({ supplier: 'SUP-B' })
      .set(bearer(context.tokens.viewer));
    const unknown = await request(context.app)
      .get('/api/kanban/loops')
      .query({ supplier: 'NOPE' })
      .set(bearer(context.tokens.viewer));

    expect(supplierB.body.map((loop: LoopRow) => loop.partNumber)).toEqual(['D']);
    expect(unknown.status).toBe(404);
  });

  it('is refused to a supplier account', async () => {
    const response = await request(context.app).get('/api/kanban/loops').set(bearer(context.tokens.supplier));

    expect(response.status).toBe(403);
  });
});

describe('accepting a loop’s recommendation', () => {
  it('adds the recommended cards with GS1 card numbers and one audit entry', async () => {
    const loop = await loopOf('D');

    const response = await accept(loop.id, { expectedRecommended: 6 });

    expect(response.status).toBe(200);
    expect(response.body.added).toEqual([1, 2, 3, 4, 5, 6].map((index) => cardNumber(loop.id, index)));
    expect(response.body).toMatchObject({
      retired: [],
      stillToPull: 0,
      activeCards: 6,
      proposal: { action: 'none', count: 0 },
    });
    const audit = await loopAudit('D', 'accept');
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({
      actorEmail: 'buyer@example.com',
      changes: expect.objectContaining({ activeBefore: 0, activeAfter: 6 }),
    });
  });

  it('changes nothing when the proposal is none', async () => {
    const loop = await loopOf('D');

    const response = await accept(loop.id, {});

    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ added: [], retired: [], activeCards: 6 });
  });

  it('refuses a stale recommendation with 409 and the current figure, changing no card', async () => {
    const loop = await loopOf('D');
    // Without the safety factor: N = ⌈1 × 5 × 1 / 1⌉ = 5.
    const patched = await patchLoop(loop.id, { safetyFactor: 0 });

    const stale = await accept(loop.id, { expectedRecommended: 6 });

    expect(patched.status).toBe(200);
    expect(patched.body).toMatchObject({
      safetyFactor: 0,
      recommendedCards: 5,
      proposal: { action: 'pull', count: 1 },
    });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details).toEqual([{ expectedRecommended: 6, recommendedCards: 5 }]);
    expect((await loopOf('D')).activeCards).toBe(6);
  });

  it('pulls only cards in hand, full before empty, and reports the rest as still to pull', async () => {
    const loop = await loopOf('D');
    const number = (index: number) => cardNumber(loop.id, index);
    // Card 1 goes to the supplier (ordered), card 2 is on its way (shipped), card 3 waits empty.
    await setCardState(number(1), 'ordered');
    await setCardState(number(2), 'shipped');
    expect((await scan(number(3))).status).toBe(201);
    // Containers of 5: N = ⌈1 × 5 × 1 / 5⌉ = 1, so 5 of the 6 cards are to be pulled.
    await patchLoop(loop.id, { containerQty: 5 });

    const response = await accept(loop.id, { expectedRecommended: 1 });

    expect(response.status).toBe(200);
    expect(response.body.retired).toEqual([number(6), number(5), number(4), number(3)]);
    expect(response.body).toMatchObject({
      added: [],
      stillToPull: 1,
      activeCards: 2,
      cardStates: { full: 0, empty: 0, ordered: 1, shipped: 1 },
      proposal: { action: 'pull', count: 1 },
    });
    const audit = await loopAudit('D', 'accept');
    expect(audit.at(-1)?.changes).toMatchObject({ activeBefore: 6, activeAfter: 2, stillToPull: 1 });
  });

  it('pulls the rest once a card is back in hand, and refuses scans of a pulled card', async () => {
    const loop = await loopOf('D');
    await setCardState(cardNumber(loop.id, 2), 'full');

    const response = await accept(loop.id, {});
    const pulledScan = await scan(cardNumber(loop.id, 2), 'consume');

    expect(response.body).toMatchObject({ retired: [cardNumber(loop.id, 2)], stillToPull: 0, activeCards: 1 });
    expect(pulledScan.status).toBe(409);
  });

  it('numbers added cards after every card ever issued', async () => {
    const loop = await loopOf('D');
    // Containers of 1 again, still without safety factor: N = ⌈1 × 5 / 1⌉ = 5, one active → add 4.
    await patchLoop(loop.id, { containerQty: 1 });

    const response = await accept(loop.id, { expectedRecommended: 5 });

    expect(response.body.added).toEqual([7, 8, 9, 10].map((index) => cardNumber(loop.id, index)));
    expect(response.body.activeCards).toBe(5);
  });

  it('records loop changes in the audit log and validates them', async () => {
    const loop = await loopOf('S');

    const invalid = await patchLoop(loop.id, { containerQty: 0 });
    // A percentage typed as a whole number: 10 for 10 %.
    const tenfold = await patchLoop(loop.id, { safetyFactor: 10 });
    const changed = await patchLoop(loop.id, { safetyUnits: 3 }, 'admin');

    expect(invalid.status).toBe(400);
    expect(invalid.body.error.details[0].path).toEqual(['containerQty']);
    expect(tenfold.status).toBe(400);
    expect(tenfold.body.error.details[0]).toMatchObject({
      path: ['safetyFactor'],
      message: 'must be at most 1 (100 %); 0.1 = 10 %',
    });
    // Safety allowance in units added to the demand over T (as in Heizer & Render, "Operations
    // Management", ch. 16, from memory): N = ⌈(1 × 1 × 1.1 + 3) / 1⌉ = ⌈4.1⌉ = 5.
    expect(changed.body).toMatchObject({ safetyUnits: 3, recommendedCards: 5 });
    const audit = await loopAudit('S', 'update');
    expect(audit.map((event) => event.changes)).toEqual([{ before: { safetyUnits: 0 }, after: { safetyUnits: 3 } }]);
  });

  it('moves the planning version, so the line risk counts on the loop as it now is', async () => {
    const loop = await loopOf('S');
    const loopSupply = async () =>
      (await context.services.lineRisk.engineInput()).loops?.find((supply) => supply.partNumber === 'S');
    const versionBefore = await context.db.read(readPlanningVersion);
    const before = await loopSupply();

    const changed = await patchLoop(loop.id, { containerQty: loop.containerQty + 4 });

    expect(changed.status).toBe(200);
    expect(await context.db.read(readPlanningVersion)).toBeGreaterThan(versionBefore);
    expect(before?.containerQty).toBe(loop.containerQty);
    expect((await loopSupply())?.containerQty).toBe(loop.containerQty + 4);
  });

  it('is refused to viewers and planners', async () => {
    const loop = await loopOf('C');

    const viewerAccept = await accept(loop.id, {}, 'viewer');
    const plannerPatch = await patchLoop(loop.id, { safetyFactor: 0.2 }, 'planner');

    expect(viewerAccept.status).toBe(403);
    expect(plannerPatch.status).toBe(403);
  });
});

describe('POST /api/kanban/scans', () => {
  let loopId = 0;
  beforeAll(async () => {
    loopId = (await loopOf('C')).id;
    await accept(loopId, { expectedRecommended: 3 });
  });

  it('empties a full card with a bare scan and logs it', async () => {
    const number = cardNumber(loopId, 1);

    // A keyboard-wedge scanner types the number and Enter; a bare scan of a full card is the signal.
    const consumed = await scan(` ${number}\r\n`);

    expect(consumed.status).toBe(201);
    expect(consumed.body.card.state).toBe('empty');
    expect(consumed.body.scan).toMatchObject({
      event: 'consume',
      fromState: 'full',
      toState: 'empty',
      userEmail: 'receiving@example.com',
    });
    const detail = await request(context.app).get(`/api/kanban/cards/${number}`).set(bearer(context.tokens.viewer));
    expect(detail.body.scans.map((row: { event: string }) => row.event)).toEqual(['consume']);
  });

  it.each([
    ['release', 'empty', /ordered only by a release line/],
    ['ship', 'ordered', /ship notice/],
    ['receive', 'shipped', /counted in at the dock/],
  ])(
    'refuses a "%s" scan of a %s card (409), saying where it happens, and changes nothing',
    async (event, state, why) => {
      const number = cardNumber(loopId, 1);
      await setCardState(number, state);
      const scansBefore = await context.dataSource.getRepository(CardScanEntity).count();

      const response = await scan(number, event);

      expect(response.status).toBe(409);
      expect(response.body.error.message).toMatch(why);
      expect(response.body.error.details).toEqual([{ currentState: state, event }]);
      const card = await context.dataSource.getRepository(KanbanCardEntity).findOneByOrFail({ cardNumber: number });
      expect(card.state).toBe(state);
      expect(await context.dataSource.getRepository(CardScanEntity).count()).toBe(scansBefore);
      await setCardState(number, 'empty');
    },
  );

  it('lists a loop’s cards with their latest scans', async () => {
    const response = await request(context.app)
      .get(`/api/kanban/loops/${loopId}/cards`)
      .set(bearer(context.tokens.viewer));

    expect(response.status).toBe(200);
    expect(response.body.map((card: { cardIndex: number }) => card.cardIndex)).toEqual([1, 2, 3]);
    expect(response.body[0]).toMatchObject({ cardNumber: cardNumber(loopId, 1), state: 'empty', retired: false });
    expect(response.body[0].scans.map((row: { event: string }) => row.event)).toEqual(['consume']);
    expect(response.body[1].scans).toEqual([]);
  });

  it('answers 409 naming the current state for an event the card cannot take', async () => {
    const response = await scan(cardNumber(loopId, 1), 'consume');

    expect(response.status).toBe(409);
    expect(response.body.error.message).toMatch(/is empty/);
    expect(response.body.error.details).toEqual([{ currentState: 'empty', event: 'consume' }]);
  });

  it('answers 409 for a bare scan of a card that is not full', async () => {
    expect((await scan(cardNumber(loopId, 3))).status).toBe(201);

    const response = await scan(cardNumber(loopId, 3));

    expect(response.status).toBe(409);
    expect(response.body.error.message).toMatch(/is empty/);
  });

  it('answers 400 for a wrong check digit and 404 for a valid number of no card', async () => {
    const good = cardNumber(loopId, 2);
    const mistyped = `${good.slice(0, -1)}${(Number(good.at(-1)) + 1) % 10}`;

    const badDigit = await scan(mistyped);
    const unknown = await scan(cardNumber(9_999_999, 1));

    expect(badDigit.status).toBe(400);
    expect(badDigit.body.error.message).toMatch(/check digit/);
    expect(badDigit.body.error.details).toEqual([{ path: ['cardNumber'], message: expect.any(String) }]);
    expect(unknown.status).toBe(404);
  });

  it('is refused to viewers and suppliers', async () => {
    const viewer = await scan(cardNumber(loopId, 2), undefined, 'viewer');
    const supplier = await scan(cardNumber(loopId, 2), undefined, 'supplier');

    expect(viewer.status).toBe(403);
    expect(supplier.status).toBe(403);
  });
});

describe('card labels', () => {
  it('prints a PDF of the loop’s cards', async () => {
    const loop = await loopOf('C');

    const response = await request(context.app)
      .get(`/api/kanban/loops/${loop.id}/labels.pdf`)
      .query({ cards: 'active' })
      .set(bearer(context.tokens.viewer))
      .buffer(true)
      .responseType('blob');

    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toBe('application/pdf');
    expect(response.headers['content-disposition']).toMatch(/^attachment; filename="?kanban-cards-C\.pdf"?$/);
    expect((response.body as Buffer).subarray(0, 5).toString('latin1')).toBe('%PDF-');
  });

  it('gives a print view every card’s label with its QR code as SVG', async () => {
    const loop = await loopOf('C');

    const response = await request(context.app)
      .get(`/api/kanban/loops/${loop.id}/labels`)
      .set(bearer(context.tokens.viewer));

    expect(response.status).toBe(200);
    expect(response.body).toHaveLength(3);
    expect(response.body[2]).toMatchObject({
      cardNumber: cardNumber(loop.id, 3),
      position: 3,
      count: 3,
      partNumber: 'C',
      description: 'Caster 100 mm',
      pointOfUse: 'L1-ST01',
      supplierCode: 'SUP-A',
      supplierName: 'Supplier A',
      containerQty: 2,
      uom: 'H87',
    });
    expect(response.body[2].qrSvg).toContain('<svg');
  });

  it('includes pulled cards only when asked for all', async () => {
    const loop = await loopOf('D');

    const active = await request(context.app)
      .get(`/api/kanban/loops/${loop.id}/labels`)
      .set(bearer(context.tokens.viewer));
    const all = await request(context.app)
      .get(`/api/kanban/loops/${loop.id}/labels`)
      .query({ cards: 'all' })
      .set(bearer(context.tokens.viewer));

    // D issued cards 1–10 and pulled 2–6.
    expect(active.body.map((label: { cardIndex: number }) => label.cardIndex)).toEqual([1, 7, 8, 9, 10]);
    expect(all.body).toHaveLength(10);
    expect(all.body.filter((label: { retired: boolean }) => label.retired)).toHaveLength(5);
  });
});
