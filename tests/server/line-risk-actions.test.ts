import request from 'supertest';
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { PartEntity } from '../../server/master-data/part.entity';
import { replaceBomLines } from '../../server/master-data/master-data.writer';
import { upsertSequenceEntries } from '../../server/sequence/sequence.writer';
import { savePartsWithStock } from '../../server/stock/stock.service';
import type { LineRiskReport, ShortageDto } from '../../shared/schemas/line-risk';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';

/*
 * What each short part asks for, through the API, on a plant small enough to work by hand. Today
 * is Friday 18 Dec 2026; the horizon Mon 21 – Thu 31 Dec has the working days 21, 22, 23, 24, 28,
 * 29, 30 and 31 (25 Dec a holiday). A normal release sent on the next working day (Mon 21)
 * arrives its lead time in working days later. One model per story, so each stands alone.
 */

const FRIDAY_MORNING = '2026-12-18T09:00:00';

function fixToday(): void {
  vi.useFakeTimers({ toFake: ['Date'] });
  vi.setSystemTime(new Date(FRIDAY_MORNING));
}

const scheduled = { replenishment: 'scheduled' as const };
const model = (partNumber: string) =>
  testPart(partNumber, { source: 'end_item', supplierCode: null, replenishment: null });
const line = (parent: string, component: string, qtyPer: number, scrapPct = 0) => ({
  parent,
  component,
  qtyPer,
  scrapPct,
  effectiveFrom: null,
  effectiveTo: null,
});
const unit = (date: string, sequence: number, modelNumber: string, serial: string) => ({
  date,
  sequence,
  model: modelNumber,
  serial,
  qty: 1,
});

describe('GET /api/shortages and GET /api/line-risk: the action, dated need and units of each short part', () => {
  let context: TestContext;
  const horizon = { from: '2026-12-21', to: '2026-12-31' };

  beforeAll(async () => {
    fixToday();
    context = await createTestContext();
    await context.dataSource.transaction(async (manager) => {
      await writeCalendar(manager, { workingWeekdays: [1, 2, 3, 4, 5], holidays: ['2026-12-25'] });
      await savePartsWithStock(manager, [
        model('ME'),
        model('MH'),
        model('MR'),
        model('MK'),
        model('MF'),
        testPart('E', { ...scheduled, onHand: 2, leadTimeDays: 3 }),
        testPart('H', { ...scheduled, onHand: 1, leadTimeDays: 3 }),
        testPart('R', { ...scheduled, onHand: 1, leadTimeDays: 2 }),
        testPart('K', { ...scheduled, onHand: 0, leadTimeDays: 10 }),
        testPart('F', { source: 'make', supplierCode: null, replenishment: null, leadTimeDays: 2 }),
        testPart('S', { ...scheduled, onHand: 0, leadTimeDays: 1 }),
      ]);
      await replaceBomLines(manager, [
        // 10 % scrap allowance: for ordering, not for building a unit.
        line('ME', 'E', 1, 10),
        line('MH', 'H', 0.5),
        line('MR', 'R', 1),
        line('MK', 'K', 1),
        line('MF', 'F', 1),
        line('F', 'S', 1),
      ]);
      await upsertSequenceEntries(manager, [
        unit('2026-12-21', 1, 'ME', 'E1'),
        unit('2026-12-22', 1, 'ME', 'E2'),
        unit('2026-12-23', 1, 'ME', 'E3'),
        unit('2026-12-21', 2, 'MH', 'H1'),
        unit('2026-12-21', 3, 'MH', 'H2'),
        unit('2026-12-21', 4, 'MH', 'H3'),
        unit('2026-12-24', 1, 'MK', 'K1'),
        unit('2026-12-28', 1, 'MR', 'R1'),
        unit('2026-12-29', 1, 'MR', 'R2'),
        unit('2026-12-30', 1, 'MF', 'F1'),
      ]);
      // K was last counted long before the plant's count interval (90 days by default).
      await manager.update(PartEntity, { partNumber: 'K' }, { lastCountedAt: '2026-06-01T00:00:00.000Z' });
      // S has no opening stock (no ledger row, so it would be due a count too): counted empty this month.
      await manager.update(PartEntity, { partNumber: 'S' }, { lastCountedAt: '2026-12-01T00:00:00.000Z' });
    });
  });
  afterAll(async () => {
    await context.close();
    vi.useRealTimers();
  });
  beforeEach(fixToday);

  const get = (path: string) => request(context.app).get(path).query(horizon).set(bearer(context.tokens.planner));

  it('sorts alarms first, each with its action, dated need and whole-unit quantities', async () => {
    const response = await get('/api/shortages');

    expect(response.status).toBe(200);
    const byPart = new Map((response.body as ShortageDto[]).map((shortage) => [shortage.partNumber, shortage]));
    expect((response.body as ShortageDto[]).map((shortage) => [shortage.action, shortage.partNumber])).toEqual([
      // Today is Friday 18. With a lead time of 3 working days a release sent today arrives Wed 23:
      // H, short Mon 21, can only be expedited.
      ['expedite', 'H'],
      // K is due a count: that comes before any other action, even inside its lead time.
      ['count', 'K'],
      // E is needed Wed 23: a release sent today (its last day) arrives in time. S is needed Mon
      // 28, R on Tue 29: both later than their lead times allow, so a release in time covers them.
      ['release', 'E'],
      ['release', 'S'],
      ['release', 'R'],
    ]);
    // E: 1 a unit without the 10 % allowance, 2 on hand → E1 and E2 built, E3 lacks one whole piece.
    expect(byPart.get('E')).toMatchObject({
      firstShortDate: '2026-12-23',
      needBy: [{ date: '2026-12-23', qty: 1 }],
      releaseBy: '2026-12-18',
      slotsAtRisk: [expect.objectContaining({ serial: 'E3', lackQty: 1, via: null })],
    });
    // H: half a piece a unit, 1 on hand → H1 and H2 share it, H3 lacks half a piece: one whole piece.
    expect(byPart.get('H')).toMatchObject({
      firstShortDate: '2026-12-21',
      shortQty: 1,
      needBy: [{ date: '2026-12-21', qty: 1 }],
      slotsAtRisk: [expect.objectContaining({ serial: 'H3', lackQty: 1 })],
    });
    expect(byPart.get('K')).toMatchObject({ firstShortDate: '2026-12-24', needBy: [{ date: '2026-12-24', qty: 1 }] });
    // R: 1 on hand for R1 (Mon 28); R2 (Tue 29) lacks 1. Lead time 2: released by Thu 24, it arrives Tue 29.
    expect(byPart.get('R')).toMatchObject({
      firstShortDate: '2026-12-29',
      needBy: [{ date: '2026-12-29', qty: 1 }],
      releaseBy: '2026-12-24',
    });
  });

  it('pegs a made part: its bought component is needed at the made part’s start, and the unit lacks it through it', async () => {
    const shortages = await get('/api/shortages');
    const report = await get('/api/line-risk');

    // F1 builds Wed 30; F takes 2 working days, so it starts Mon 28 and needs its S then. S's lead
    // time of 1 working day: a release sent by Thu 24 arrives Mon 28.
    expect((shortages.body as ShortageDto[]).find((shortage) => shortage.partNumber === 'S')).toMatchObject({
      firstShortDate: '2026-12-28',
      needBy: [{ date: '2026-12-28', qty: 1 }],
      releaseBy: '2026-12-24',
      slotsAtRisk: [expect.objectContaining({ serial: 'F1', lackQty: 1, via: 'F' })],
    });
    expect(report.status).toBe(200);
    const f1 = (report.body as LineRiskReport).unitsAtRisk.find((entry) => entry.serial === 'F1');
    expect(f1?.lacks).toEqual([{ partNumber: 'S', qty: 1, now: true, via: 'F', neededOn: '2026-12-28' }]);
    expect((report.body as LineRiskReport).shortages).toEqual(shortages.body);
    expect((report.body as LineRiskReport).unitsAtRisk.map((entry) => entry.serial)).toEqual([
      'H3',
      'E3',
      'K1',
      'R2',
      'F1',
    ]);
  });
});
