import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { addCalendarDays, isWorkingDay } from '../../shared/domain/calendar';
import { computeLineRisk, type LineRiskInput } from '../../shared/domain/line-risk';
import { computePlan } from '../../shared/domain/plan';
import type { PlanningPart, PlantCalendar, SequenceSlot } from '../../shared/domain/types';
import { bomLine } from './builders';

/*
 * The plan and the line risk read the same plan model with the same rules, so on the same inputs
 * (no scrap allowance, lot-for-lot in single units, no safety stock, every receipt firm) they must
 * say the same: the plan's gross requirement of a bought part is what the line risk says every
 * unit needs, and the plan's planned receipts are what the line risk says must arrive by each date.
 * These are the cases where they used to disagree.
 */

const WEEKDAYS: PlantCalendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] };
const MON = '2026-03-02';
const TUE = '2026-03-03';
const WED = '2026-03-04';
const THU = '2026-03-05';
const FRI = '2026-03-06';

const part = (partNumber: string, fields: Partial<PlanningPart> = {}): PlanningPart => ({
  partNumber,
  source: 'buy',
  supplierCode: 'SUP',
  leadTimeDays: 0,
  packQty: 1,
  onHand: 0,
  safetyStock: 0,
  ...fields,
});
const slot = (date: string, sequence: number, model: string): SequenceSlot => ({
  date,
  sequence,
  model,
  serial: `${model}-${date}-${sequence}`,
  qty: 1,
});

function bothOf(input: Omit<LineRiskInput, 'calendar' | 'from' | 'to'>) {
  const common = { calendar: WEEKDAYS, from: MON, to: FRI };
  const plan = computePlan({ ...input, ...common, scheduledReceipts: input.firmReceipts });
  const risk = computeLineRisk({ ...input, ...common });
  return { plan, risk };
}

/** The plan's planned receipts of a part as {date, qty}: what must arrive by each date. */
const plannedReceipts = (plan: ReturnType<typeof computePlan>, partNumber: string) =>
  plan.parts
    .get(partNumber)!
    .buckets.filter((bucket) => bucket.plannedReceipt > 0)
    .map((bucket) => ({ date: bucket.date, qty: bucket.plannedReceipt }));

function expectAgreement(result: ReturnType<typeof bothOf>, boughtParts: string[]) {
  for (const partNumber of boughtParts) {
    const gross = result.plan.parts.get(partNumber)!.buckets.map((bucket) => bucket.gross);
    const shortage = result.risk.shortages.find((candidate) => candidate.partNumber === partNumber);
    expect(shortage?.needBy ?? []).toEqual(plannedReceipts(result.plan, partNumber));
    if (shortage) expect(shortage.requiredByDay).toEqual(gross);
  }
}

describe('the plan and the line risk agree', () => {
  it('need components for every unit in the sequence, whatever finished stock of its model exists', () => {
    // Five units, five finished machines in stock: the plan used to net them and order nothing,
    // while the line risk flagged all five.
    const result = bothOf({
      parts: [part('M', { source: 'end_item', supplierCode: null, onHand: 5 }), part('C')],
      bom: [bomLine('M', 'C', 2)],
      sequence: [MON, TUE, WED, THU, FRI].map((date) => slot(date, 1, 'M')),
      firmReceipts: [],
    });

    expect(result.risk.unitsAtRisk).toHaveLength(5);
    expect(plannedReceipts(result.plan, 'C')).toHaveLength(5);
    expectAgreement(result, ['C']);
  });

  it('read a component’s BOM line on the day it is needed: its parent’s start', () => {
    // F is made in 2 working days; it takes S1 up to Wednesday and S2 from Thursday. A unit built
    // Friday starts its F on Wednesday, so it needs S1 — in the plan and in the line risk alike.
    const result = bothOf({
      parts: [
        part('M', { source: 'end_item', supplierCode: null }),
        part('F', { source: 'make', supplierCode: null, leadTimeDays: 2 }),
        part('S1'),
        part('S2'),
      ],
      bom: [
        bomLine('M', 'F', 1),
        bomLine('F', 'S1', 1, { effectiveTo: WED }),
        bomLine('F', 'S2', 1, { effectiveFrom: THU }),
      ],
      sequence: [slot(FRI, 1, 'M')],
      firmReceipts: [],
    });

    expect(result.risk.shortages.map((shortage) => [shortage.partNumber, shortage.firstShortDate])).toEqual([
      ['S1', WED],
    ]);
    expect(result.plan.parts.get('S2')!.buckets.every((bucket) => bucket.gross === 0)).toBe(true);
    expectAgreement(result, ['S1', 'S2']);
  });

  it('count the same receipts on the same day', () => {
    const result = bothOf({
      parts: [part('M', { source: 'end_item', supplierCode: null }), part('C', { onHand: 1 })],
      bom: [bomLine('M', 'C', 1)],
      sequence: [MON, TUE, WED, THU].map((date) => slot(date, 1, 'M')),
      firmReceipts: [{ partNumber: 'C', date: WED, qty: 1 }],
    });

    expectAgreement(result, ['C']);
  });

  it('on any generated plant without scrap, packs or safety stock', () => {
    const days = Array.from({ length: 10 }, (_, index) => addCalendarDays(MON, index)).filter((date) =>
      isWorkingDay(date, WEEKDAYS),
    );
    const plant = fc.record({
      onHand: fc.array(fc.integer({ min: 0, max: 6 }), { minLength: 3, maxLength: 3 }),
      finished: fc.integer({ min: 0, max: 3 }),
      qtyPer: fc.array(fc.integer({ min: 1, max: 3 }), { minLength: 4, maxLength: 4 }),
      madeLead: fc.integer({ min: 0, max: 2 }),
      units: fc.array(fc.record({ day: fc.nat({ max: days.length - 1 }) }), { maxLength: 12 }),
      receipts: fc.array(
        fc.record({
          part: fc.nat({ max: 2 }),
          day: fc.nat({ max: days.length - 1 }),
          qty: fc.integer({ min: 1, max: 5 }),
        }),
        {
          maxLength: 4,
        },
      ),
    });
    fc.assert(
      fc.property(plant, (raw) => {
        const bought = ['B0', 'B1', 'B2'];
        const result = computeBoth(raw, bought, days);
        expectAgreement(result, bought);
      }),
      { numRuns: 200 },
    );

    function computeBoth(
      raw: {
        onHand: number[];
        finished: number;
        qtyPer: number[];
        madeLead: number;
        units: { day: number }[];
        receipts: { part: number; day: number; qty: number }[];
      },
      bought: string[],
      workingDays: string[],
    ) {
      const common = { calendar: WEEKDAYS, from: workingDays[0]!, to: workingDays[workingDays.length - 1]! };
      const input = {
        parts: [
          part('M', { source: 'end_item', supplierCode: null, onHand: raw.finished }),
          part('F', { source: 'make', supplierCode: null, leadTimeDays: raw.madeLead }),
          ...bought.map((partNumber, index) => part(partNumber, { onHand: raw.onHand[index]! })),
        ],
        bom: [
          bomLine('M', 'F', raw.qtyPer[0]!),
          bomLine('M', 'B0', raw.qtyPer[1]!),
          bomLine('F', 'B1', raw.qtyPer[2]!),
          bomLine('F', 'B2', raw.qtyPer[3]!),
        ],
        sequence: raw.units.map((unit, index) => slot(workingDays[unit.day]!, index + 1, 'M')),
        firmReceipts: raw.receipts.map((receipt) => ({
          partNumber: bought[receipt.part]!,
          date: workingDays[receipt.day]!,
          qty: receipt.qty,
        })),
      };
      return {
        plan: computePlan({ ...input, ...common, scheduledReceipts: input.firmReceipts }),
        risk: computeLineRisk({ ...input, ...common }),
      };
    }
  });
});
