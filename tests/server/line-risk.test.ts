import request from 'supertest';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { buildDemoScenario } from '../../seed/scenario';
import { MADE } from '../../seed/scenario-parts';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { replaceBomLines, upsertSuppliers } from '../../server/master-data/master-data.writer';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { upsertSequenceEntries } from '../../server/sequence/sequence.writer';
import { LineRiskRunner } from '../../server/line-risk/line-risk-runner';
import { PartEntity } from '../../server/master-data/part.entity';
import { ReleaseLineEntity } from '../../server/releases/release-line.entity';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { writeSetting } from '../../server/settings/settings';
import { bumpPlanningVersion } from '../../server/settings/versions';
import { addWorkingDays } from '../../shared/domain/calendar';
import type { LineRiskReport, ShortageDto } from '../../shared/schemas/line-risk';
import { bearer, createTestContext, signIn, TEST_PASSWORD, testPart, type TestContext } from './helpers';

// Only Date is faked, so "today" is fixed while supertest's timers run normally. Contexts are
// created after it, so their sign-in tokens are issued (and still valid) on the fixed day.
function fixToday(localDateTime: string): void {
  vi.useFakeTimers({ toFake: ['Date'] });
  vi.setSystemTime(new Date(localDateTime));
}

const FRIDAY_MORNING = '2026-12-18T09:00:00';

describe('GET /api/shortages on a plant small enough to work by hand', () => {
  let context: TestContext;
  const horizon = { from: '2026-12-21', to: '2026-12-24' };

  // M takes 2 × C (supplier A, 5 on hand) and 1 × D (supplier B, plenty). Mon 21 Dec: S1, S2;
  // Tue 22 Dec: S3; 25 Dec is a holiday. S1 and S2 take 4 C, S3 needs 2 with 1 left → at risk.
  beforeAll(async () => {
    fixToday(FRIDAY_MORNING);
    context = await createTestContext();
    await context.dataSource.transaction(async (manager) => {
      await writeCalendar(manager, { workingWeekdays: [1, 2, 3, 4, 5], holidays: ['2026-12-25'] });
      await savePartsWithStock(manager, [
        testPart('M', { source: 'end_item', supplierCode: null, replenishment: null, description: 'Model M' }),
        testPart('C', { onHand: 5, description: 'Battery pack', hazardous: true, leadTimeDays: 3 }),
        testPart('D', { supplierCode: 'SUP-B', onHand: 100 }),
      ]);
      await replaceBomLines(manager, [
        { parent: 'M', component: 'C', qtyPer: 2, scrapPct: 0, effectiveFrom: null, effectiveTo: null },
        { parent: 'M', component: 'D', qtyPer: 1, scrapPct: 0, effectiveFrom: null, effectiveTo: null },
      ]);
      await upsertSequenceEntries(manager, [
        { date: '2026-12-21', sequence: 1, model: 'M', serial: 'S1', qty: 1 },
        { date: '2026-12-21', sequence: 2, model: 'M', serial: 'S2', qty: 1 },
        { date: '2026-12-22', sequence: 1, model: 'M', serial: 'S3', qty: 1 },
      ]);
    });
  });
  afterAll(async () => {
    await context.close();
    vi.useRealTimers();
  });
  beforeEach(() => fixToday(FRIDAY_MORNING));
  afterEach(async () => {
    await context.dataSource.transaction(async (manager) => {
      await manager.clear(ReleaseLineEntity);
      await manager.clear(ReleaseEntity);
      await bumpPlanningVersion(manager);
    });
  });

  let releases = 0;

  /** Adds one release (one per supplier and day) with a line for C, and bumps the planning version. */
  async function releaseLineForC(status: string, line: Partial<ReleaseLineEntity>): Promise<void> {
    releases += 1;
    await context.dataSource.transaction(async (manager) => {
      const release = await manager.save(
        ReleaseEntity,
        manager.create(ReleaseEntity, {
          number: `R-${releases}`,
          supplierCode: 'SUP-A',
          releaseDate: `2026-11-${String(releases).padStart(2, '0')}`,
          status,
        }),
      );
      await manager.insert(ReleaseLineEntity, {
        releaseId: release.id,
        partNumber: 'C',
        qty: 10,
        needDate: '2026-12-21',
        origin: 'plan',
        ...line,
      });
      await bumpPlanningVersion(manager);
    });
  }

  const getShortages = (query: Record<string, string> = horizon) =>
    request(context.app).get('/api/shortages').query(query).set(bearer(context.tokens.planner));

  it('lists the short part with its first short date, shortfall and the exact unit it stops', async () => {
    const response = await getShortages();

    expect(response.status).toBe(200);
    // Projected on-hand of C: Mon 5 − 4 = 1, Tue 1 − 2 = −1 → short Tuesday, 1 in all.
    // Today is Friday 18 Dec: Mon 21 and Tue 22 are the 1st and 2nd working days after it,
    // both inside the default frozen window of 3 working days (Mon, Tue, Wed).
    expect(response.body).toEqual([
      {
        partNumber: 'C',
        firstShortDate: '2026-12-22',
        shortQty: 1,
        slotsAtRisk: [{ date: '2026-12-22', sequence: 1, serial: 'S3', model: 'M', lackQty: 1, via: null }],
        slotsAtRiskCount: 1,
        // Lead time 3 working days: released today, C arrives Wednesday 23 — too late for Tuesday.
        action: 'expedite',
        needBy: [{ date: '2026-12-22', qty: 1 }],
        releaseBy: null,
        leadTimeDays: 3,
        loop: null,
        description: 'Battery pack',
        uom: 'H87',
        supplierCode: 'SUP-A',
        supplierName: 'Supplier A',
        hazardous: true,
        onHand: 5,
        firmReceiptQty: 0,
        awaitingConfirmation: null,
        daysUntilImpact: 2,
        inFrozenWindow: true,
        rescue: { expedite: { qty: 1, needBy: '2026-12-22' }, resequence: null },
      },
    ]);
  });

  it('counts a confirmed line on the arrival its ship date implies, with its confirmed open quantity', async () => {
    await releaseLineForC('confirmed', { confirmedQty: 2, shipDate: '2026-12-21', arrivalDate: '2026-12-22' });
    const onTime = await getShortages();
    await context.dataSource.transaction(async (manager) => {
      await manager.update(
        ReleaseLineEntity,
        { partNumber: 'C' },
        { shipDate: '2026-12-22', arrivalDate: '2026-12-23' },
      );
      await bumpPlanningVersion(manager);
    });
    const shippedLate = await getShortages();

    // 2 arriving Tuesday morning cover S3 (1 + 2 ≥ 2); arriving Wednesday they come too late.
    expect(onTime.body).toEqual([]);
    expect(shippedLate.body).toHaveLength(1);
    expect(shippedLate.body[0]).toMatchObject({
      partNumber: 'C',
      firstShortDate: '2026-12-22',
      shortQty: 1,
      firmReceiptQty: 2,
    });
  });

  it('leaves out releases the supplier has not confirmed, closed lines and what was already received', async () => {
    await releaseLineForC('sent', {});
    await releaseLineForC('draft', {});
    await releaseLineForC('exception', { confirmedQty: 10, shipDate: '2026-12-21' });
    await releaseLineForC('confirmed', { confirmedQty: 10, shipDate: '2026-12-21', closed: true });
    await releaseLineForC('shipped', { confirmedQty: 10, receivedQty: 10, shipDate: '2026-12-21' });
    const nothingFirm = await getShortages();
    await releaseLineForC('partial', { confirmedQty: 10, receivedQty: 9, shipDate: '2026-12-21' });
    const oneOpen = await getShortages();

    // None of the first five brings a piece: still 1 short. The partial line has 10 − 9 = 1
    // open from Monday, so Tuesday has 1 + 1 = 2 for S3.
    expect(
      nothingFirm.body.map((shortage: ShortageDto) => [
        shortage.partNumber,
        shortage.shortQty,
        shortage.firmReceiptQty,
      ]),
    ).toEqual([['C', 1, 0]]);
    expect(oneOpen.body).toEqual([]);
  });

  it('names the releases sent and not yet answered beside the short part, without counting them as supply', async () => {
    await releaseLineForC('sent', {});
    const first = `R-${releases}`;
    await releaseLineForC('sent', { receivedQty: 3 });
    const second = `R-${releases}`;
    await releaseLineForC('draft', {});
    const twoAsked = await getShortages();
    await context.dataSource.transaction(async (manager) => {
      await manager.update(ReleaseEntity, { number: first }, { status: 'cancelled' });
      await manager.update(ReleaseEntity, { number: second }, { status: 'exception' });
      await bumpPlanningVersion(manager);
    });
    const oneAsked = await getShortages();

    // Neither sent release is supply until confirmed: still 1 short with nothing firm. What they
    // ask for is 10 and 10 − 3 open; the draft has not gone out. A cancelled release asks for
    // nothing; one the supplier answered with changes still waits for the buyer to accept them.
    expect(twoAsked.body).toHaveLength(1);
    expect(twoAsked.body[0]).toMatchObject({
      shortQty: 1,
      firmReceiptQty: 0,
      awaitingConfirmation: { qty: 17, releaseNumbers: [first, second] },
    });
    expect(oneAsked.body[0].awaitingConfirmation).toEqual({ qty: 7, releaseNumbers: [second] });
  });

  it('serves a horizon from the cache until the planning version moves', async () => {
    const before = await getShortages();
    await context.dataSource
      .getRepository(ReleaseEntity)
      .insert({ number: 'R-quiet', supplierCode: 'SUP-A', releaseDate: '2026-12-17', status: 'confirmed' });
    const release = await context.dataSource.getRepository(ReleaseEntity).findOneByOrFail({ number: 'R-quiet' });
    await context.dataSource
      .getRepository(ReleaseLineEntity)
      .insert({ releaseId: release.id, partNumber: 'C', qty: 5, needDate: '2026-12-21', origin: 'plan' });
    const unannounced = await getShortages();
    await context.dataSource.transaction((manager) => bumpPlanningVersion(manager));
    const announced = await getShortages();

    expect(before.body).toHaveLength(1);
    expect(unannounced.body).toEqual(before.body);
    expect(announced.body).toEqual([]);
  });

  it('keeps its result over a planning change that leaves its inputs as they were, and walks again once they differ', async () => {
    const warm = await getShortages();
    const walks = vi.spyOn(LineRiskRunner.prototype, 'compute');
    try {
      // A draft release feeds the plan, not the line risk.
      await releaseLineForC('draft', {});
      const afterDraft = await getShortages();
      const walksAfterDraft = walks.mock.calls.length;
      await context.dataSource.transaction(async (manager) => {
        await manager.update(PartEntity, { partNumber: 'C' }, { onHand: 6 });
        await bumpPlanningVersion(manager);
      });
      const afterCount = await getShortages();

      expect(afterDraft.body).toEqual(warm.body);
      expect(walksAfterDraft).toBe(0);
      expect(walks).toHaveBeenCalledTimes(1);
      // 6 C on hand: S1 and S2 take 4, S3 its 2.
      expect(afterCount.body).toEqual([]);
    } finally {
      walks.mockRestore();
      await context.dataSource.transaction(async (manager) => {
        await manager.update(PartEntity, { partNumber: 'C' }, { onHand: 5 });
        await bumpPlanningVersion(manager);
      });
    }
  });

  it('reads the frozen window the sequence screen sets', async () => {
    await context.dataSource.transaction((manager) => writeSetting(manager, 'sequence.frozenWindowDays', 1));

    const response = await getShortages();

    // One frozen working day (Mon 21); the shortage on Tue 22 is outside it.
    expect(response.body[0]).toMatchObject({ daysUntilImpact: 2, inFrozenWindow: false });
    await context.dataSource.transaction((manager) => writeSetting(manager, 'sequence.frozenWindowDays', 3));
  });

  it('defaults to 20 working days from the next working day', async () => {
    fixToday('2026-12-19T09:00:00');
    const viewer = await signIn(context.app, 'viewer@example.com', TEST_PASSWORD);

    const response = await request(context.app).get('/api/line-risk').set(bearer(viewer));

    // Saturday 19 Dec → from Monday 21; 20 working days, skipping Friday 25 Dec, end Monday 18 Jan.
    expect(response.status).toBe(200);
    const report = response.body as LineRiskReport;
    expect(report.from).toBe('2026-12-21');
    expect(report.days).toHaveLength(20);
    expect(report.to).toBe('2027-01-18');
    expect(report.unitsInHorizon).toBe(3);
    expect(report.unitsAtRisk.map((unit) => unit.serial)).toEqual(['S3']);
    expect(report.frozenUntil).toBe('2026-12-23');
  });

  it('answers 400 for a reversed, overlong or malformed horizon', async () => {
    const reversed = await getShortages({ from: '2026-12-24', to: '2026-12-21' });
    const overlong = await getShortages({ from: '2026-12-21', to: '2027-12-21' });
    const malformed = await getShortages({ from: '2026-13-01' });

    expect(reversed.status).toBe(400);
    expect(overlong.status).toBe(400);
    expect(overlong.body.error.details).toEqual([expect.objectContaining({ path: ['to'] })]);
    expect(malformed.status).toBe(400);
  });

  it('is open to every signed-in role but supplier, and closed without a sign-in', async () => {
    const statuses: Record<string, number> = {};
    for (const role of ['admin', 'planner', 'buyer', 'receiving', 'viewer', 'supplier'] as const) {
      statuses[role] = (
        await request(context.app).get('/api/shortages').query(horizon).set(bearer(context.tokens[role]))
      ).status;
    }
    const anonymous = await request(context.app).get('/api/shortages').query(horizon);

    expect(statuses).toEqual({ admin: 200, planner: 200, buyer: 200, receiving: 200, viewer: 200, supplier: 403 });
    expect(anonymous.status).toBe(401);
  });
});

describe('GET /api/shortages on the demo plant', () => {
  const SEED_DAY = '2026-03-02';
  const scenario = buildDemoScenario(SEED_DAY);
  const firstDay = scenario.sequence[0]!.date;
  let context: TestContext;

  beforeAll(async () => {
    fixToday(`${SEED_DAY}T07:00:00`);
    context = await createTestContext();
    await context.dataSource.transaction(async (manager) => {
      await writeCalendar(manager, scenario.calendar);
      await upsertSuppliers(manager, scenario.suppliers);
      await savePartsWithStock(manager, scenario.parts);
      await replaceBomLines(manager, scenario.bom);
      await upsertSequenceEntries(manager, scenario.sequence);
    });
  });
  afterAll(async () => {
    await context.close();
    vi.useRealTimers();
  });

  async function shortages(workingDays: number): Promise<ShortageDto[]> {
    const to = addWorkingDays(firstDay, workingDays - 1, scenario.calendar);
    const response = await request(context.app)
      .get('/api/shortages')
      .query({ from: firstDay, to })
      .set(bearer(context.tokens.planner));
    expect(response.status).toBe(200);
    return response.body as ShortageDto[];
  }

  it('shows exactly the part the demo runs short within its first two working weeks', async () => {
    // seed/scenario-stock.ts: ordinary bought parts hold at least 10 days of demand; the battery
    // holds 4 days and a half, so it alone runs short inside the first ten working days.
    const twoWeeks = await shortages(10);

    expect(twoWeeks.map((shortage) => shortage.partNumber).sort()).toEqual(['BAT-06-312']);
    for (const shortage of twoWeeks) {
      expect(shortage.slotsAtRisk.length).toBeGreaterThan(0);
      expect(shortage.shortQty).toBeGreaterThan(0);
    }
    expect(twoWeeks.find((shortage) => shortage.partNumber === 'BAT-06-312')).toMatchObject({
      hazardous: true,
      supplierCode: 'FBS',
    });
    // Listed by action (what only an expedite saves first), then by first short date.
    const order = ['expedite', 'loop', 'count', 'release'];
    const keys = twoWeeks.map((shortage) => `${order.indexOf(shortage.action)}|${shortage.firstShortDate}`);
    expect(keys).toEqual([...keys].sort());
  });

  it('never reports a part made in-house, however far it looks', async () => {
    const madeInHouse = new Set(MADE.map((entry) => entry.partNumber));

    const fourWeeks = await shortages(20);

    expect(fourWeeks.length).toBeGreaterThan(4);
    expect(fourWeeks.filter((shortage) => madeInHouse.has(shortage.partNumber))).toEqual([]);
    expect(fourWeeks.every((shortage) => shortage.supplierCode !== null)).toBe(true);
  });

  it('offers a rescue for the first short part: expedite by its first short date and a unit to move up', async () => {
    const [first] = await shortages(10);

    expect(first!.rescue.expedite).toEqual({ qty: first!.needBy[0]!.qty, needBy: first!.firstShortDate });
    expect(first!.needBy.reduce((sum, entry) => sum + entry.qty, 0)).toBeCloseTo(first!.shortQty, 9);
    expect(first!.rescue.resequence?.slot).toEqual(expect.objectContaining({ serial: first!.slotsAtRisk[0]!.serial }));
    expect(first!.rescue.resequence?.candidate.model).not.toBe(first!.slotsAtRisk[0]!.model);
  });
});
