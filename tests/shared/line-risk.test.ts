import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { addCalendarDays, addWorkingDays, isWorkingDay, workingDaysBetween } from '../../shared/domain/calendar';
import { BomCycleError } from '../../shared/domain/bom';
import {
  computeLineRisk,
  type LineRiskInput,
  type LineRiskPart,
  type LineRiskResult,
} from '../../shared/domain/line-risk';
import { PlanInputError } from '../../shared/domain/plan-model';
import type {
  PlanningBomLine,
  PlanningPart,
  PlantCalendar,
  ScheduledReceipt,
  SequenceSlot,
} from '../../shared/domain/types';

/*
 * Hand-worked cases first: each states its inputs and the arithmetic in a comment, so every
 * expected figure follows from the rule of first come, first served allocation (a unit that
 * cannot be built takes nothing) and from projected on-hand = on-hand + firm receipts − needs,
 * cumulated by day (Vollmann, Berry, Whybark and Jacobs, Manufacturing Planning and Control for
 * Supply Chain Management, 5th ed., ch. 6, the MPS record's projected available balance — from
 * memory). Properties at the end check the same rules on generated plants.
 */

const MONDAY_TO_FRIDAY: PlantCalendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] };
// Monday 2 March 2026 … Friday 6 March 2026.
const MON = '2026-03-02';
const TUE = '2026-03-03';
const WED = '2026-03-04';
const THU = '2026-03-05';
const FRI = '2026-03-06';

function part(partNumber: string, fields: Partial<LineRiskPart> = {}): LineRiskPart {
  return {
    partNumber,
    source: 'buy',
    supplierCode: 'SUP',
    leadTimeDays: 0,
    packQty: 1,
    onHand: 0,
    safetyStock: 0,
    ...fields,
  };
}

const model = (partNumber: string) => part(partNumber, { source: 'end_item', supplierCode: null });
const made = (partNumber: string, leadTimeDays: number, onHand = 0) =>
  part(partNumber, { source: 'make', supplierCode: null, leadTimeDays, onHand });

function line(
  parent: string,
  component: string,
  qtyPer: number,
  fields: Partial<PlanningBomLine> = {},
): PlanningBomLine {
  return { parent, component, qtyPer, scrapPct: 0, effectiveFrom: null, effectiveTo: null, ...fields };
}

function slot(date: string, sequence: number, modelNumber: string, serial = `U-${date}-${sequence}`): SequenceSlot {
  return { date, sequence, model: modelNumber, serial, qty: 1 };
}

function lineRisk(input: Partial<LineRiskInput> & Pick<LineRiskInput, 'parts' | 'bom' | 'sequence'>): LineRiskResult {
  return computeLineRisk({ firmReceipts: [], calendar: MONDAY_TO_FRIDAY, from: MON, to: FRI, ...input });
}

const serialsAtRisk = (result: LineRiskResult) => result.unitsAtRisk.map((unit) => unit.serial);

describe('computeLineRisk — hand-worked cases', () => {
  it('builds units in sequence until the part runs out, then flags the unit that lacks it', () => {
    // M takes 2 × C; 5 C on hand. Mon #1: 5 − 2 = 3 left. Mon #2: 3 − 2 = 1. Tue #1 needs 2 with
    // 1 free: at risk, lacking 1. Projected on-hand of C: Mon 5 − 4 = 1, Tue 1 − 2 = −1 → first
    // short Tuesday, 1 short in all.
    const result = lineRisk({
      parts: [model('M'), part('C', { onHand: 5 })],
      bom: [line('M', 'C', 2)],
      sequence: [slot(MON, 1, 'M', 'S1'), slot(MON, 2, 'M', 'S2'), slot(TUE, 1, 'M', 'S3')],
    });

    expect(result.unitsBuilt).toBe(2);
    expect(result.unitsAtRisk).toEqual([
      {
        date: TUE,
        sequence: 1,
        serial: 'S3',
        model: 'M',
        lacks: [{ partNumber: 'C', qty: 1, now: true, via: null, neededOn: TUE }],
        resequence: null,
      },
    ]);
    expect(result.shortages).toHaveLength(1);
    expect(result.shortages[0]).toMatchObject({
      partNumber: 'C',
      firstShortDate: TUE,
      shortQty: 1,
      needBy: [{ date: TUE, qty: 1 }],
      slotsAtRisk: [{ date: TUE, sequence: 1, serial: 'S3', model: 'M', lackQty: 1, via: null }],
      rescue: { expedite: { qty: 1, needBy: TUE } },
    });
  });

  it('promises stock to units in order like discrete available-to-promise with look-ahead', () => {
    // The method of the MPS record's available-to-promise row (Vollmann, Berry, Whybark and Jacobs,
    // Manufacturing Planning and Control for Supply Chain Management, 5th ed., ch. 6 — from
    // memory; the figures are worked here by that method, not taken from the book): on hand 10,
    // a firm receipt of 20 on Wednesday, orders of 5 Mon, 8 Tue, 12 Wed, 5 Thu. Monday's 5 are
    // promised (5 left); Tuesday's 8 cannot be (5 free until the receipt) and take nothing;
    // Wednesday's 12 and Thursday's 5 come out of 5 + 20 = 25. The running shortfall is 3 on
    // Tuesday and never more, so 3 must arrive by Tuesday.
    const orders = [
      { date: MON, qty: 5 },
      { date: TUE, qty: 8 },
      { date: WED, qty: 12 },
      { date: THU, qty: 5 },
    ];
    const result = lineRisk({
      parts: [model('M'), part('C', { onHand: 10 })],
      bom: [line('M', 'C', 1)],
      sequence: orders.map((order, index) => ({ ...slot(order.date, 1, 'M', `O${index + 1}`), qty: order.qty })),
      firmReceipts: [{ partNumber: 'C', date: WED, qty: 20 }],
    });

    expect(serialsAtRisk(result)).toEqual(['O2']);
    expect(result.unitsBuilt).toBe(3);
    expect(result.shortages[0]).toMatchObject({
      partNumber: 'C',
      firstShortDate: TUE,
      needBy: [{ date: TUE, qty: 3 }],
    });
  });

  it('promises no more than the textbook’s available-to-promise, period by period', () => {
    // The industrial-pump master schedule of W. J. Stevenson, Operations Management, chapter
    // "Aggregate Planning and Master Scheduling" (book and chapter from memory). The figures as
    // quoted at https://studymode.com/essays/Ops-571-Week-4-49373664.html: 64 pumps on hand,
    // committed orders 33 and 20 in weeks 1 and 2 (then 10, 4, 2 in weeks 3–5), lot size 70
    // scheduled when projected on-hand would go negative, so MPS in weeks 3, 5, 7 and 8, and ATP
    // with look-ahead (orders summed until the next MPS) of 64 − (33 + 20) = 11 in week 1. The
    // same quoted rule gives week 3 70 − (10 + 4) = 56, week 5 70 − 2 = 68, weeks 7 and 8 70 each.
    // Weeks become working days here, the MPS quantities firm receipts. Walking orders first come,
    // first served, a new order placed last before the next MPS may take exactly the cumulative
    // ATP so far — 11, 67, 135, 205, 275 — and one more leaves it (and it alone) at risk, 1 short.
    // Weeks 1–8 as the working days Mon 2 … Wed 11 March.
    const period = [MON, TUE, WED, THU, FRI, '2026-03-09', '2026-03-10', '2026-03-11'];
    const committed = [33, 20, 10, 4, 2].map((qty, week) => ({
      ...slot(period[week]!, 1, 'PUMP', `ORDER-${week + 1}`),
      qty,
    }));
    const mps = [3, 5, 7, 8].map((week) => ({ partNumber: 'P', date: period[week - 1]!, qty: 70 }));
    const withNewOrder = (week: number, qty: number) =>
      lineRisk({
        parts: [model('PUMP'), part('P', { onHand: 64 })],
        bom: [line('PUMP', 'P', 1)],
        sequence: [...committed, { ...slot(period[week - 1]!, 9, 'PUMP', 'NEW'), qty }],
        firmReceipts: mps,
        to: period[7],
      });
    const discreteAtp = [
      { week: 1, atp: 11, lastWeekBeforeNextMps: 2 },
      { week: 3, atp: 56, lastWeekBeforeNextMps: 4 },
      { week: 5, atp: 68, lastWeekBeforeNextMps: 6 },
      { week: 7, atp: 70, lastWeekBeforeNextMps: 7 },
      { week: 8, atp: 70, lastWeekBeforeNextMps: 8 },
    ];

    let cumulative = 0;
    for (const { atp, lastWeekBeforeNextMps: week } of discreteAtp) {
      cumulative += atp;
      const promised = withNewOrder(week, cumulative);
      const oneMore = withNewOrder(week, cumulative + 1);

      expect(promised.unitsAtRisk).toEqual([]);
      expect(serialsAtRisk(oneMore)).toEqual(['NEW']);
      expect(oneMore.shortages[0]!.needBy).toEqual([{ date: period[week - 1], qty: 1 }]);
    }
    expect(cumulative).toBe(275);
  });

  it('walks by date and position whatever order the slots arrive in', () => {
    // Same plant as above with the slots listed backwards: Tuesday's unit still comes last.
    const result = lineRisk({
      parts: [model('M'), part('C', { onHand: 5 })],
      bom: [line('M', 'C', 2)],
      sequence: [slot(TUE, 1, 'M', 'S3'), slot(MON, 2, 'M', 'S2'), slot(MON, 1, 'M', 'S1')],
    });

    expect(serialsAtRisk(result)).toEqual(['S3']);
  });

  it('counts a firm receipt from the start of its date, and not before', () => {
    // As the first case, plus 2 C confirmed. Arriving Tuesday morning: Tue has 1 + 2 = 3 ≥ 2, built.
    // Arriving Wednesday: Tuesday's unit lacks 1; projection Tue −1, Wed −1 + 2 = 1 → 1 short by Tue.
    const base = {
      parts: [model('M'), part('C', { onHand: 5 })],
      bom: [line('M', 'C', 2)],
      sequence: [slot(MON, 1, 'M', 'S1'), slot(MON, 2, 'M', 'S2'), slot(TUE, 1, 'M', 'S3')],
    };
    const onTuesday: ScheduledReceipt[] = [{ partNumber: 'C', date: TUE, qty: 2 }];
    const onWednesday: ScheduledReceipt[] = [{ partNumber: 'C', date: WED, qty: 2 }];

    const early = lineRisk({ ...base, firmReceipts: onTuesday });
    const late = lineRisk({ ...base, firmReceipts: onWednesday });

    expect(early.unitsAtRisk).toEqual([]);
    expect(early.shortages).toEqual([]);
    expect(serialsAtRisk(late)).toEqual(['S3']);
    expect(late.shortages[0]).toMatchObject({ firstShortDate: TUE, shortQty: 1, firmReceiptQty: 2 });
  });

  it('lets a unit that cannot be built take nothing, so a later unit gets the part', () => {
    // M1 takes A + B, M2 takes A alone; 1 A and no B on hand. Mon #1 (M1) lacks B: at risk, its A
    // stays. Mon #2 (M2) takes the one A and is built. B is short 1 by Monday — and so is A: once
    // U1 gets its B it takes the A, and U2 would lack it (2 A needed, 1 on hand).
    const result = lineRisk({
      parts: [model('M1'), model('M2'), part('A', { onHand: 1 }), part('B')],
      bom: [line('M1', 'A', 1), line('M1', 'B', 1), line('M2', 'A', 1)],
      sequence: [slot(MON, 1, 'M1', 'U1'), slot(MON, 2, 'M2', 'U2')],
    });

    expect(serialsAtRisk(result)).toEqual(['U1']);
    expect(result.unitsBuilt).toBe(1);
    expect(
      result.shortages.map((shortage) => [shortage.partNumber, shortage.firstShortDate, shortage.shortQty]),
    ).toEqual([
      ['A', MON, 1],
      ['B', MON, 1],
    ]);
    expect(result.shortages[0]!.slotsAtRisk.map((entry) => entry.serial)).toEqual(['U2']);
  });

  it('looks through a made part to its bought components, needed its lead time earlier', () => {
    // Frame F is made in 2 working days from 3 × S; 1 F on hand; M takes 1 F. 3 S confirmed for
    // Tuesday. Mon unit: F from stock. Wed unit: F must be made, so its 3 S are needed Wed − 2
    // working days = Monday, when no S is free → at risk. Projection of S: Mon 0 − 3 = −3,
    // Tue −3 + 3 = 0 → first short Monday, 3 short. F itself is never reported.
    const result = lineRisk({
      parts: [model('M'), made('F', 2, 1), part('S')],
      bom: [line('M', 'F', 1), line('F', 'S', 3)],
      sequence: [slot(MON, 1, 'M', 'U1'), slot(WED, 1, 'M', 'U2')],
      firmReceipts: [{ partNumber: 'S', date: TUE, qty: 3 }],
    });

    expect(serialsAtRisk(result)).toEqual(['U2']);
    expect(result.unitsAtRisk[0]!.lacks).toEqual([{ partNumber: 'S', qty: 3, now: true, via: 'F', neededOn: MON }]);
    expect(result.shortages.map((shortage) => shortage.partNumber)).toEqual(['S']);
    expect(result.shortages[0]).toMatchObject({ firstShortDate: MON, shortQty: 3 });
  });

  it('needs the BOM quantity without the scrap allowance, through the lines effective on the build date', () => {
    // C at 2 per unit (its 10 % scrap allowance is for ordering, not consumption), effective up to
    // Tuesday; D from Wednesday. 4 C on hand covers Mon and Tue exactly; Wednesday's unit needs D
    // (none) and no C → lacks 1 D only.
    const result = lineRisk({
      parts: [model('M'), part('C', { onHand: 4 }), part('D')],
      bom: [line('M', 'C', 2, { scrapPct: 10, effectiveTo: TUE }), line('M', 'D', 1, { effectiveFrom: WED })],
      sequence: [slot(MON, 1, 'M', 'U1'), slot(TUE, 1, 'M', 'U2'), slot(WED, 1, 'M', 'U3')],
    });

    expect(result.unitsBuilt).toBe(2);
    expect(result.unitsAtRisk.map((unit) => [unit.serial, unit.lacks])).toEqual([
      ['U3', [{ partNumber: 'D', qty: 1, now: true, via: null, neededOn: WED }]],
    ]);
    expect(result.shortages.map((shortage) => shortage.partNumber)).toEqual(['D']);
  });

  it('never promises stock a unit ahead already holds for a later day', () => {
    // Cumulative available-to-promise looks ahead over later periods (APICS Dictionary,
    // "available-to-promise", cumulative with look-ahead — from memory). 5 P confirmed for
    // Wednesday. Thu #1 (M1, 5 P on Thu) takes all 5. Thu #2 (M2) needs a G made in 1 day from
    // 2 P, so 2 P on Wednesday: Wednesday still shows 5, but all 5 are promised for Thursday →
    // at risk. Projection of P: Wed 5 − 2 = 3, Thu 3 − 5 = −2 → first short Thursday, 2 short.
    const result = lineRisk({
      parts: [model('M1'), model('M2'), made('G', 1), part('P')],
      bom: [line('M1', 'P', 5), line('M2', 'G', 1), line('G', 'P', 2)],
      sequence: [slot(THU, 1, 'M1', 'U1'), slot(THU, 2, 'M2', 'U2')],
      firmReceipts: [{ partNumber: 'P', date: WED, qty: 5 }],
    });

    expect(serialsAtRisk(result)).toEqual(['U2']);
    expect(result.shortages[0]).toMatchObject({ partNumber: 'P', firstShortDate: THU, shortQty: 2 });
  });

  it('also names a part that would stop a unit once the units ahead of it are served', () => {
    // M takes A + B; 1 A and 2 B on hand; one unit a day Mon–Thu. Mon: built (A 0, B 1 left).
    // Tue, Wed, Thu lack A now. If every unit ahead were served, B would serve Mon and Tue
    // (2 − 1 − 1 = 0) and Wed and Thu would lack 1 B each. Projections: A Mon 0, Tue −1, Wed −2,
    // Thu −3 → short Tue, 3; B Tue 0, Wed −1, Thu −2 → short Wed, 2.
    const result = lineRisk({
      parts: [model('M'), part('A', { onHand: 1 }), part('B', { onHand: 2 })],
      bom: [line('M', 'A', 1), line('M', 'B', 1)],
      sequence: [slot(MON, 1, 'M', 'U1'), slot(TUE, 1, 'M', 'U2'), slot(WED, 1, 'M', 'U3'), slot(THU, 1, 'M', 'U4')],
    });

    expect(
      result.shortages.map((shortage) => [shortage.partNumber, shortage.firstShortDate, shortage.shortQty]),
    ).toEqual([
      ['A', TUE, 3],
      ['B', WED, 2],
    ]);
    expect(result.shortages[1]!.slotsAtRisk.map((entry) => entry.serial)).toEqual(['U3', 'U4']);
    expect(result.unitsAtRisk.find((unit) => unit.serial === 'U3')!.lacks).toEqual([
      { partNumber: 'A', qty: 1, now: true, via: null, neededOn: WED },
      { partNumber: 'B', qty: 1, now: false, via: null, neededOn: WED },
    ]);
  });

  it('suggests moving up a unit of the next working day whose parts are all present', () => {
    // M1 takes A (none on hand), M2 takes B (1 on hand). Mon #1 and #2 are M1, Tue #1 is M2.
    // Mon #1 lacks A; Mon #2 is the same model; Tue #1 (M2) finds its B → it can take the slot.
    const result = lineRisk({
      parts: [model('M1'), model('M2'), part('A'), part('B', { onHand: 1 })],
      bom: [line('M1', 'A', 1), line('M2', 'B', 1)],
      sequence: [slot(MON, 1, 'M1', 'U1'), slot(MON, 2, 'M1', 'U2'), slot(TUE, 1, 'M2', 'U3')],
    });

    expect(result.shortages[0]!.rescue.resequence).toEqual({
      slot: { date: MON, sequence: 1, serial: 'U1', model: 'M1' },
      candidate: { date: TUE, sequence: 1, serial: 'U3', model: 'M2' },
    });
  });

  it('suggests no resequence when the only unit that fits is two working days away or lacks parts too', () => {
    const parts = [model('M1'), model('M2'), part('A'), part('B', { onHand: 1 })];
    const bom = [line('M1', 'A', 1), line('M2', 'B', 1)];

    const tooFar = lineRisk({ parts, bom, sequence: [slot(MON, 1, 'M1', 'U1'), slot(WED, 1, 'M2', 'U3')] });
    const alsoShort = lineRisk({
      parts: [model('M1'), model('M2'), part('A'), part('B')],
      bom,
      sequence: [slot(MON, 1, 'M1', 'U1'), slot(TUE, 1, 'M2', 'U3')],
    });

    expect(tooFar.shortages[0]!.rescue.resequence).toBeNull();
    expect(alsoShort.shortages.every((shortage) => shortage.rescue.resequence === null)).toBe(true);
  });

  it('counts days until impact in working days and flags the frozen window', () => {
    // Today is Saturday 28 Feb; Tuesday 3 Mar is a holiday. A frozen window of 3 working days
    // starts on the next working day: Mon 2, Wed 4, Thu 5. Part W runs out Wednesday (2 working
    // days after today: Mon, Wed), X Thursday (3), Y Friday 6 (4, outside the window).
    const calendar: PlantCalendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: [TUE] };
    const result = lineRisk({
      calendar,
      today: '2026-02-28',
      frozenWindowDays: 3,
      parts: [model('MW'), model('MX'), model('MY'), part('W'), part('X'), part('Y')],
      bom: [line('MW', 'W', 1), line('MX', 'X', 1), line('MY', 'Y', 1)],
      sequence: [slot(WED, 1, 'MW'), slot(THU, 1, 'MX'), slot(FRI, 1, 'MY')],
    });

    expect(result.frozenUntil).toBe(THU);
    expect(result.days).toEqual([MON, WED, THU, FRI]);
    expect(
      result.shortages.map((shortage) => [shortage.partNumber, shortage.daysUntilImpact, shortage.inFrozenWindow]),
    ).toEqual([
      ['W', 2, true],
      ['X', 3, true],
      ['Y', 4, false],
    ]);
  });

  it('needs an unbuilt unit dated before the horizon now, and builds a weekend slot on the next working day', () => {
    // Units already built are not passed in: the Friday-before unit is still to build, so it needs
    // C on the first day. The Saturday unit is built Monday 9th, outside a horizon that ends
    // Friday 6th.
    const result = lineRisk({
      parts: [model('M'), part('C')],
      bom: [line('M', 'C', 1)],
      sequence: [slot('2026-02-27', 1, 'M', 'LATE'), slot('2026-03-07', 1, 'M', 'SAT')],
    });

    expect(result.unitsInHorizon).toBe(1);
    expect(serialsAtRisk(result)).toEqual(['LATE']);
    expect(result.shortages[0]).toMatchObject({ partNumber: 'C', firstShortDate: MON, shortQty: 1 });
  });

  it('refuses a reversed or overlong horizon, an unknown model and a BOM cycle', () => {
    const parts = [model('M'), part('C')];

    expect(() => lineRisk({ parts, bom: [], sequence: [], from: FRI, to: MON })).toThrow(PlanInputError);
    expect(() => lineRisk({ parts, bom: [], sequence: [], to: '2026-12-31' })).toThrow(PlanInputError);
    expect(() => lineRisk({ parts, bom: [], sequence: [slot(MON, 1, 'NOPE')] })).toThrow(PlanInputError);
    expect(() => lineRisk({ parts, bom: [line('M', 'C', 1), line('C', 'M', 1)], sequence: [] })).toThrow(BomCycleError);
  });
});

// --- Properties ---

const FROM = '2026-03-02';
const TO = '2026-03-20';
const CALENDAR: PlantCalendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: ['2026-03-10'] };
const DAYS = workingDaysBetween(FROM, TO, CALENDAR);

/**
 * A generated plant: models M0…, made parts F0… (no stock, so a unit's needs do not depend on
 * the walk), bought parts B0…; lines run model → made/bought and made → bought only.
 */
const plantArbitrary = fc
  .record({
    models: fc.integer({ min: 1, max: 3 }),
    madeCount: fc.integer({ min: 0, max: 2 }),
    // Lead times shift needs earlier than units ahead of them hold stock for, the case look-ahead is for.
    boughtCount: fc.integer({ min: 1, max: 5 }),
    links: fc.array(fc.record({ from: fc.nat(), to: fc.nat(), qtyPer: fc.integer({ min: 1, max: 3 }) }), {
      minLength: 1,
      maxLength: 14,
    }),
    leadTimes: fc.array(fc.integer({ min: 0, max: 3 }), { minLength: 2, maxLength: 2 }),
    stock: fc.array(fc.integer({ min: 0, max: 8 }), { minLength: 5, maxLength: 5 }),
    slots: fc.array(fc.record({ day: fc.integer({ min: 0, max: 11 }), model: fc.nat() }), { maxLength: 30 }),
    receipts: fc.array(
      fc.record({ part: fc.nat(), day: fc.integer({ min: -2, max: 14 }), qty: fc.integer({ min: 1, max: 6 }) }),
      { maxLength: 8 },
    ),
  })
  .map((raw) => {
    const models = Array.from({ length: raw.models }, (_, index) => `M${index}`);
    const madeParts = Array.from({ length: raw.madeCount }, (_, index) => `F${index}`);
    const boughtParts = Array.from({ length: raw.boughtCount }, (_, index) => `B${index}`);
    const parents = [...models, ...madeParts];
    const seen = new Set<string>();
    const bom: PlanningBomLine[] = [];
    for (const link of raw.links) {
      const parent = parents[link.from % parents.length]!;
      const targets = parent.startsWith('F') ? boughtParts : [...madeParts, ...boughtParts];
      const component = targets[link.to % targets.length]!;
      if (seen.has(`${parent}>${component}`)) continue;
      seen.add(`${parent}>${component}`);
      bom.push(line(parent, component, link.qtyPer));
    }
    const parts: PlanningPart[] = [
      ...models.map(model),
      ...madeParts.map((partNumber, index) => made(partNumber, raw.leadTimes[index]!)),
      ...boughtParts.map((partNumber, index) => part(partNumber, { onHand: raw.stock[index]! })),
    ];
    const sequence = raw.slots
      .map((entry, index) =>
        slot(addCalendarDays(FROM, entry.day), index + 1, models[entry.model % models.length]!, `SN${index}`),
      )
      .filter((entry) => isWorkingDay(entry.date, CALENDAR));
    const firmReceipts = raw.receipts.map((receipt) => ({
      partNumber: boughtParts[receipt.part % boughtParts.length]!,
      date: addCalendarDays(FROM, receipt.day),
      qty: receipt.qty,
    }));
    return { parts, bom, sequence, firmReceipts, boughtParts };
  });

type Plant = {
  parts: PlanningPart[];
  bom: PlanningBomLine[];
  sequence: SequenceSlot[];
  firmReceipts: ScheduledReceipt[];
  boughtParts: string[];
};

function run(plant: Plant): LineRiskResult {
  return computeLineRisk({ ...plant, calendar: CALENDAR, from: FROM, to: TO });
}

/** Independent explosion: bought needs of one unit by part and need day (first working day of the horizon at the earliest). */
function needsOf(
  plant: Plant,
  modelNumber: string,
  buildDate: string,
): { partNumber: string; date: string; qty: number }[] {
  const needs: { partNumber: string; date: string; qty: number }[] = [];
  const visit = (parent: string, qty: number, date: string): void => {
    for (const bomLine of plant.bom.filter((candidate) => candidate.parent === parent)) {
      const component = plant.parts.find((candidate) => candidate.partNumber === bomLine.component)!;
      const componentQty = qty * bomLine.qtyPer;
      if (component.source === 'buy')
        needs.push({ partNumber: component.partNumber, date: date < DAYS[0]! ? DAYS[0]! : date, qty: componentQty });
      else visit(component.partNumber, componentQty, addWorkingDays(date, -component.leadTimeDays, CALENDAR));
    }
  };
  visit(modelNumber, 1, buildDate);
  return needs;
}

/** On-hand plus firm receipts of a part up to and including `day` (late receipts count on the first day). */
function supplyThrough(plant: Plant, partNumber: string, day: string): number {
  const onHand = plant.parts.find((candidate) => candidate.partNumber === partNumber)!.onHand;
  const arrived = plant.firmReceipts
    .filter((receipt) => receipt.partNumber === partNumber && receipt.date <= day)
    .reduce((sum, receipt) => sum + receipt.qty, 0);
  return onHand + arrived;
}

function inBuildOrder(sequence: SequenceSlot[]): SequenceSlot[] {
  return [...sequence].sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : a.sequence - b.sequence));
}

/** Cumulative need of `partNumber` through `day` over the given units. */
function cumulativeNeed(plant: Plant, units: SequenceSlot[], partNumber: string, day: string): number {
  return units
    .flatMap((unit) => needsOf(plant, unit.model, unit.date))
    .filter((need) => need.partNumber === partNumber && need.date <= day)
    .reduce((sum, need) => sum + need.qty, 0);
}

describe('computeLineRisk — properties', () => {
  it('puts nothing at risk when every bought part is on hand in plenty', () => {
    fc.assert(
      fc.property(plantArbitrary, (plant) => {
        const ample = {
          ...plant,
          parts: plant.parts.map((entry) => (entry.source === 'buy' ? { ...entry, onHand: 10_000 } : entry)),
        };

        const result = run(ample);

        expect(result.unitsAtRisk).toEqual([]);
        expect(result.shortages).toEqual([]);
        expect(result.unitsBuilt).toBe(plant.sequence.length);
      }),
    );
  });

  it('conserves stock: what built units need never exceeds on-hand plus firm receipts, day by day', () => {
    fc.assert(
      fc.property(plantArbitrary, (plant) => {
        const result = run(plant);
        const atRisk = new Set(serialsAtRisk(result));
        const built = plant.sequence.filter((unit) => !atRisk.has(unit.serial));

        expect(built).toHaveLength(result.unitsBuilt);
        for (const partNumber of plant.boughtParts) {
          for (const day of DAYS) {
            expect(cumulativeNeed(plant, built, partNumber, day)).toBeLessThanOrEqual(
              supplyThrough(plant, partNumber, day) + 1e-9,
            );
          }
        }
      }),
    );
  });

  it('never puts another unit at risk when a unit at risk is taken out of the sequence', () => {
    fc.assert(
      fc.property(plantArbitrary, fc.nat(), (plant, pick) => {
        const before = run(plant);
        fc.pre(before.unitsAtRisk.length > 0);
        const removed = before.unitsAtRisk[pick % before.unitsAtRisk.length]!.serial;

        const after = run({ ...plant, sequence: plant.sequence.filter((unit) => unit.serial !== removed) });

        const stillAtRisk = serialsAtRisk(before).filter((serial) => serial !== removed);
        expect(serialsAtRisk(after).every((serial) => stillAtRisk.includes(serial))).toBe(true);
        expect(after.unitsBuilt).toBe(before.unitsBuilt);
      }),
    );
  });

  it('puts a unit at risk exactly when, at its turn, some part it needs is not free for it', () => {
    fc.assert(
      fc.property(plantArbitrary, (plant) => {
        const result = run(plant);
        const atRisk = new Set(serialsAtRisk(result));
        const builtAhead: SequenceSlot[] = [];

        for (const unit of inBuildOrder(plant.sequence)) {
          const own = [unit];
          // Short at its turn: on some day from its need on, built units ahead plus itself exceed supply.
          const short = plant.boughtParts.some((partNumber) =>
            DAYS.some(
              (day) =>
                cumulativeNeed(plant, builtAhead, partNumber, day) + cumulativeNeed(plant, own, partNumber, day) >
                supplyThrough(plant, partNumber, day) + 1e-9,
            ),
          );
          expect(atRisk.has(unit.serial), unit.serial).toBe(short);
          if (!short) builtAhead.push(unit);
        }
      }),
      { numRuns: 400 },
    );
  });

  it('dates each shortage where the projected on-hand of every unit’s need first falls below zero', () => {
    fc.assert(
      fc.property(plantArbitrary, (plant) => {
        const result = run(plant);

        for (const shortage of result.shortages) {
          const deficits = DAYS.map(
            (day) =>
              cumulativeNeed(plant, plant.sequence, shortage.partNumber, day) -
              supplyThrough(plant, shortage.partNumber, day),
          );
          const first = deficits.findIndex((deficit) => deficit > 1e-9);
          expect(shortage.firstShortDate).toBe(DAYS[first]);
          expect(shortage.shortQty).toBeCloseTo(Math.max(...deficits), 9);
          // What must have arrived by each day is the worst shortfall so far; needBy lists its increases.
          let arrived = 0;
          let worst = 0;
          DAYS.forEach((day, index) => {
            arrived += shortage.needBy.filter((entry) => entry.date === day).reduce((sum, entry) => sum + entry.qty, 0);
            worst = Math.max(worst, deficits[index]!);
            expect(arrived).toBeCloseTo(worst, 9);
          });
          expect(shortage.rescue.expedite).toEqual({ qty: shortage.needBy[0]!.qty, needBy: shortage.firstShortDate });
        }
      }),
    );
  });

  it('only suggests moving up a later unit of another model, within a working day, whose parts are free at that moment', () => {
    fc.assert(
      fc.property(plantArbitrary, (plant) => {
        const result = run(plant);
        const order = inBuildOrder(plant.sequence);
        const atRisk = new Set(serialsAtRisk(result));

        for (const shortage of result.shortages) {
          const option = shortage.rescue.resequence;
          if (!option) continue;
          const slotIndex = order.findIndex((unit) => unit.serial === option.slot.serial);
          const candidateIndex = order.findIndex((unit) => unit.serial === option.candidate.serial);
          expect(candidateIndex).toBeGreaterThan(slotIndex);
          expect(option.candidate.model).not.toBe(option.slot.model);
          expect(DAYS.indexOf(option.candidate.date) - DAYS.indexOf(option.slot.date)).toBeLessThanOrEqual(1);
          const builtAhead = order.slice(0, slotIndex).filter((unit) => !atRisk.has(unit.serial));
          const moved = [{ ...order[candidateIndex]!, date: option.slot.date }];
          for (const partNumber of plant.boughtParts) {
            for (const day of DAYS) {
              expect(
                cumulativeNeed(plant, builtAhead, partNumber, day) + cumulativeNeed(plant, moved, partNumber, day),
              ).toBeLessThanOrEqual(supplyThrough(plant, partNumber, day) + 1e-9);
            }
          }
        }
      }),
    );
  });
});

describe('computeLineRisk — what to do about each short part', () => {
  const oneUnitADay = (modelNumber: string) => [
    slot(MON, 1, modelNumber, 'D1'),
    slot(TUE, 1, modelNumber, 'D2'),
    slot(WED, 1, modelNumber, 'D3'),
    slot(THU, 1, modelNumber, 'D4'),
    slot(FRI, 1, modelNumber, 'D5'),
  ];

  it('asks to expedite inside the supplier lead time, and only to release in time beyond it', () => {
    // Today Monday; every part has a lead time of 2 working days, so an order released today
    // arrives Wednesday, in time for Wednesday's build (lead-time offsetting: the release date is
    // the need date less the lead time; Orlicky, Material Requirements Planning, 1975, ch. on
    // time-phasing — from memory).
    // E runs out Tuesday: no release can arrive by then, it is an expedite.
    // W runs out Wednesday: released today (its send-by day) it still arrives in time.
    // R runs out Friday: a release sent by Wednesday (Friday − 2) arrives in time.
    const result = lineRisk({
      today: MON,
      parts: [
        model('ME'),
        model('MW'),
        model('MR'),
        part('E', { onHand: 1, leadTimeDays: 2 }),
        part('W', { onHand: 2, leadTimeDays: 2 }),
        part('R', { onHand: 4, leadTimeDays: 2 }),
      ],
      bom: [line('ME', 'E', 1), line('MW', 'W', 1), line('MR', 'R', 1)],
      sequence: [
        ...oneUnitADay('ME'),
        ...oneUnitADay('MW').map((unit) => ({ ...unit, sequence: 2, serial: `W-${unit.date}` })),
        ...oneUnitADay('MR').map((unit) => ({ ...unit, sequence: 3, serial: `R-${unit.date}` })),
      ],
    });

    const byPart = Object.fromEntries(result.shortages.map((shortage) => [shortage.partNumber, shortage]));
    expect(byPart.E).toMatchObject({ action: 'expedite', firstShortDate: TUE, releaseBy: null });
    expect(byPart.W).toMatchObject({ action: 'release', firstShortDate: WED, releaseBy: MON });
    expect(byPart.R).toMatchObject({ action: 'release', firstShortDate: FRI, releaseBy: WED });
    expect(result.shortages.map((shortage) => shortage.action)).toEqual(['expedite', 'release', 'release']);
  });

  it('says how much must arrive by each date, not one lump on the first', () => {
    // 1 on hand, one unit a day needing 2: short 1 on Monday, then 2 more each day.
    const result = lineRisk({
      parts: [model('M'), part('C', { onHand: 1 })],
      bom: [line('M', 'C', 2)],
      sequence: oneUnitADay('M'),
    });

    expect(result.shortages[0]!.needBy).toEqual([
      { date: MON, qty: 1 },
      { date: TUE, qty: 2 },
      { date: WED, qty: 2 },
      { date: THU, qty: 2 },
      { date: FRI, qty: 2 },
    ]);
    expect(result.shortages[0]!.shortQty).toBe(9);
    expect(result.shortages[0]!.rescue.expedite).toEqual({ qty: 1, needBy: MON });
  });

  it('asks for a count first when on-hand is negative or due a count', () => {
    const negative = lineRisk({
      parts: [model('M'), part('C', { onHand: -2, leadTimeDays: 5 })],
      bom: [line('M', 'C', 1)],
      sequence: [slot(TUE, 1, 'M')],
    });
    const stale = lineRisk({
      parts: [model('M'), { ...part('C', { onHand: 0, leadTimeDays: 5 }), countDue: true }],
      bom: [line('M', 'C', 1)],
      sequence: [slot(TUE, 1, 'M')],
    });

    expect(negative.shortages[0]).toMatchObject({ action: 'count', shortQty: 3 });
    expect(stale.shortages[0]).toMatchObject({ action: 'count' });
  });

  it('counts a kanban loop as supply: a right-sized loop is no shortage, an undersized one is a loop shortage', () => {
    // 10 a day, containers of 10, back 2 working days after emptied (ordered the next day). With
    // 3 cards (2 full on hand, 1 on its way for Tuesday) every day's need arrives in time: each
    // container emptied on day t is back on day t + 3. With 1 card, Monday empties it and it is back
    // Thursday: Tuesday and Wednesday starve.
    const kanban = (onHand: number) => ({ ...part('K', { onHand }), replenishment: 'kanban' as const });
    const loop = (activeCards: number) => ({
      partNumber: 'K',
      activeCards,
      recommendedCards: 3,
      containerQty: 10,
      replenishmentDays: 2,
      emptyCards: 0,
    });
    const base = { bom: [line('M', 'K', 10)], sequence: oneUnitADay('M') };

    const rightSized = lineRisk({
      ...base,
      parts: [model('M'), kanban(20)],
      loops: [loop(3)],
      firmReceipts: [{ partNumber: 'K', date: TUE, qty: 10 }],
    });
    const undersized = lineRisk({ ...base, parts: [model('M'), kanban(10)], loops: [loop(1)] });

    expect(rightSized.shortages).toEqual([]);
    expect(rightSized.unitsAtRisk).toEqual([]);
    expect(undersized.shortages[0]).toMatchObject({
      partNumber: 'K',
      action: 'loop',
      firstShortDate: TUE,
      loop: { activeCards: 1, recommendedCards: 3 },
    });
    expect(serialsAtRisk(undersized)).toEqual(['D2', 'D3']);
  });

  // Whole units: a countable part is counted in whole pieces (common practice, no source).
  it('never reports a piece part short by a fraction, and leaves kilograms as they are', () => {
    // Half a bracket per unit, 1 bracket on hand: units 1 and 2 share it, unit 3 lacks half a
    // bracket — one whole bracket. Steel at 0.3 kg per unit with 0.5 kg: unit 2 lacks 0.1 kg.
    const result = lineRisk({
      parts: [
        model('M'),
        part('BRACKET', { onHand: 1, uom: 'H87' }),
        model('S'),
        part('STEEL', { onHand: 0.5, uom: 'KGM' }),
      ],
      bom: [line('M', 'BRACKET', 0.5), line('S', 'STEEL', 0.3)],
      sequence: [
        slot(MON, 1, 'M', 'B1'),
        slot(MON, 2, 'M', 'B2'),
        slot(MON, 3, 'M', 'B3'),
        slot(TUE, 1, 'S', 'S1'),
        slot(TUE, 2, 'S', 'S2'),
      ],
    });

    const bracket = result.unitsAtRisk.find((unit) => unit.serial === 'B3')!;
    const steel = result.unitsAtRisk.find((unit) => unit.serial === 'S2')!;
    expect(bracket.lacks[0]).toMatchObject({ partNumber: 'BRACKET', qty: 1 });
    expect(steel.lacks[0]!.qty).toBeCloseTo(0.1, 9);
    expect(result.shortages.find((shortage) => shortage.partNumber === 'BRACKET')!.shortQty).toBe(1);
  });
});
