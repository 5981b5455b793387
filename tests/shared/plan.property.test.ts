import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { addCalendarDays, addWorkingDays, isWorkingDay } from '../../shared/domain/calendar';
import { computePlan } from '../../shared/domain/plan';
import type { PlanInput, PlanningBomLine, PlanningPart, PlantCalendar, SequenceSlot } from '../../shared/domain/types';

/*
 * Properties rather than reference numbers: they hold for every structure, calendar and sequence
 * fast-check generates, so they check the engine against the definition of MRP itself.
 */

const FROM = '2026-03-02';
const TO = '2026-04-24';

/**
 * A random acyclic structure: models M0… and components C0…; a line may only point from a model to
 * a component or from a component to a higher-numbered one, so no cycle can arise.
 */
const structureArbitrary = fc
  .record({
    models: fc.integer({ min: 1, max: 3 }),
    components: fc.integer({ min: 1, max: 8 }),
    rawLines: fc.array(fc.record({ from: fc.nat(), to: fc.nat(), qtyPer: fc.integer({ min: 1, max: 4 }) }), {
      minLength: 1,
      maxLength: 20,
    }),
  })
  .map(({ models, components, rawLines }) => {
    const names = [
      ...Array.from({ length: models }, (_, index) => `M${index}`),
      ...Array.from({ length: components }, (_, index) => `C${index}`),
    ];
    const lines: PlanningBomLine[] = [];
    const seen = new Set<string>();
    for (const raw of rawLines) {
      const parent = raw.from % names.length;
      const lowestComponent = Math.max(models, parent + 1);
      if (lowestComponent >= names.length) continue;
      const component = lowestComponent + (raw.to % (names.length - lowestComponent));
      const key = `${parent}>${component}`;
      if (seen.has(key)) continue;
      seen.add(key);
      lines.push({ parent: names[parent], component: names[component], qtyPer: raw.qtyPer, scrapPct: 0 });
    }
    return { models: names.slice(0, models), names, lines };
  });

/** Total quantity of `component` in one `parent`: the sum over every path of the product of qtyPer. */
function extendedQuantity(lines: PlanningBomLine[], parent: string, component: string): number {
  if (parent === component) return 1;
  return lines
    .filter((line) => line.parent === parent)
    .reduce((total, line) => total + line.qtyPer * extendedQuantity(lines, line.component, component), 0);
}

const slotsArbitrary = (models: string[], calendar: PlantCalendar): fc.Arbitrary<SequenceSlot[]> =>
  fc
    .array(
      fc.record({
        day: fc.integer({ min: 0, max: 50 }),
        model: fc.constantFrom(...models),
        qty: fc.integer({ min: 1, max: 5 }),
      }),
      { maxLength: 40 },
    )
    .map((raw) =>
      raw
        .map((entry, index) => ({
          date: addCalendarDays(FROM, entry.day),
          sequence: index + 1,
          model: entry.model,
          serial: `SN${index}`,
          qty: entry.qty,
        }))
        .filter((entry) => isWorkingDay(entry.date, calendar)),
    );

describe('computePlan properties', () => {
  it('conserves quantity: each component’s gross over the horizon is the sum of extended BOM quantities of the units built', () => {
    // Zero on-hand, no safety stock, packs of one, zero lead times and always-effective lines, so
    // nothing is netted away, rounded up or pushed out of the horizon.
    const calendar: PlantCalendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: ['2026-04-03', '2026-04-06'] };
    // Parts are listed in random order so that only low-level coding can put parents first.
    const scenario = structureArbitrary.chain((structure) =>
      fc
        .record({
          sequence: slotsArbitrary(structure.models, calendar),
          listed: fc.shuffledSubarray(structure.names, { minLength: structure.names.length }),
        })
        .map(({ sequence, listed }) => ({ ...structure, sequence, listed })),
    );

    fc.assert(
      fc.property(scenario, ({ names, lines, sequence, listed }) => {
        const parts: PlanningPart[] = listed.map((partNumber) => ({
          partNumber,
          source: partNumber.startsWith('M') ? 'end_item' : 'buy',
          leadTimeDays: 0,
          packQty: 1,
          onHand: 0,
          safetyStock: 0,
        }));
        const input: PlanInput = { parts, bom: lines, sequence, scheduledReceipts: [], calendar, from: FROM, to: TO };

        const result = computePlan(input);

        for (const component of names.filter((name) => name.startsWith('C'))) {
          const expected = sequence.reduce(
            (total, unit) => total + unit.qty * extendedQuantity(lines, unit.model, component),
            0,
          );
          const gross = result.parts.get(component)?.buckets.reduce((total, bucket) => total + bucket.gross, 0);
          expect(gross).toBe(expected);
        }
      }),
      { numRuns: 200 },
    );
  });

  it('releases only on working days, exactly lead time working days before each planned receipt', () => {
    const calendarArbitrary: fc.Arbitrary<PlantCalendar> = fc.record({
      workingWeekdays: fc.uniqueArray(fc.integer({ min: 1, max: 7 }), { minLength: 1, maxLength: 7 }),
      holidays: fc.uniqueArray(
        fc.integer({ min: -30, max: 60 }).map((offset) => addCalendarDays(FROM, offset)),
        { maxLength: 25 },
      ),
    });
    const scenario = fc
      .record({ calendar: calendarArbitrary, structure: structureArbitrary })
      .chain(({ calendar, structure }) =>
        fc.record({
          calendar: fc.constant(calendar),
          structure: fc.constant(structure),
          sequence: slotsArbitrary(structure.models, calendar),
          leadTimes: fc.array(fc.integer({ min: 0, max: 6 }), {
            minLength: structure.names.length,
            maxLength: structure.names.length,
          }),
          onHand: fc.array(fc.integer({ min: 0, max: 20 }), {
            minLength: structure.names.length,
            maxLength: structure.names.length,
          }),
          packQty: fc.array(fc.constantFrom(0, 1, 4, 10), {
            minLength: structure.names.length,
            maxLength: structure.names.length,
          }),
        }),
      );

    fc.assert(
      fc.property(scenario, ({ calendar, structure, sequence, leadTimes, onHand, packQty }) => {
        const parts: PlanningPart[] = structure.names.map((partNumber, index) => ({
          partNumber,
          source: partNumber.startsWith('M') ? 'end_item' : 'buy',
          leadTimeDays: leadTimes[index],
          packQty: packQty[index],
          onHand: onHand[index],
          safetyStock: 0,
        }));

        const result = computePlan({
          parts,
          bom: structure.lines,
          sequence,
          scheduledReceipts: [],
          calendar,
          from: FROM,
          to: TO,
        });

        for (const planned of parts) {
          const { buckets, pastDue } = result.parts.get(planned.partNumber)!;
          const releaseByDate = new Map<string, number>();
          for (const bucket of buckets)
            if (bucket.plannedRelease !== 0) releaseByDate.set(bucket.date, bucket.plannedRelease);
          for (const late of pastDue) {
            expect(late.date < FROM).toBe(true);
            releaseByDate.set(late.date, late.qty);
          }
          for (const [date] of releaseByDate) expect(isWorkingDay(date, calendar)).toBe(true);
          for (const bucket of buckets) {
            if (bucket.plannedReceipt === 0) continue;
            const releaseDate = addWorkingDays(bucket.date, -planned.leadTimeDays, calendar);
            expect(addWorkingDays(releaseDate, planned.leadTimeDays, calendar)).toBe(bucket.date);
            expect(releaseByDate.get(releaseDate)).toBe(bucket.plannedReceipt);
            releaseByDate.delete(releaseDate);
          }
          expect(releaseByDate.size).toBe(0);
        }
      }),
      { numRuns: 200 },
    );
  });

  it('keeps the projected-available balance: previous + receipts − gross, never below safety stock, receipts in whole packs', () => {
    const scenario = structureArbitrary.chain((structure) => {
      const count = structure.names.length;
      const calendar: PlantCalendar = { workingWeekdays: [1, 2, 3, 4, 5, 6], holidays: ['2026-03-20'] };
      return fc.record({
        structure: fc.constant(structure),
        calendar: fc.constant(calendar),
        sequence: slotsArbitrary(structure.models, calendar),
        onHand: fc.array(fc.integer({ min: 0, max: 30 }), { minLength: count, maxLength: count }),
        safetyStock: fc.array(fc.integer({ min: 0, max: 8 }), { minLength: count, maxLength: count }),
        packQty: fc.array(fc.constantFrom(1, 0.25, 6, 12.5), { minLength: count, maxLength: count }),
        scrapPct: fc.array(fc.constantFrom(0, 2.5, 10), {
          minLength: structure.lines.length,
          maxLength: structure.lines.length,
        }),
        receipts: fc.array(
          fc.record({
            part: fc.nat({ max: count - 1 }),
            day: fc.integer({ min: -10, max: 40 }),
            qty: fc.integer({ min: 1, max: 50 }),
          }),
          { maxLength: 10 },
        ),
      });
    });

    fc.assert(
      fc.property(scenario, ({ structure, calendar, sequence, onHand, safetyStock, packQty, scrapPct, receipts }) => {
        const parts: PlanningPart[] = structure.names.map((partNumber, index) => ({
          partNumber,
          source: partNumber.startsWith('M') ? 'end_item' : 'buy',
          leadTimeDays: index % 3,
          packQty: packQty[index],
          onHand: onHand[index],
          safetyStock: safetyStock[index],
        }));
        const bom = structure.lines.map((line, index) => ({ ...line, scrapPct: scrapPct[index] }));
        const scheduledReceipts = receipts.map((receipt) => ({
          partNumber: structure.names[receipt.part],
          date: addCalendarDays(FROM, receipt.day),
          qty: receipt.qty,
        }));

        const result = computePlan({ parts, bom, sequence, scheduledReceipts, calendar, from: FROM, to: TO });

        const tolerance = 1e-6;
        for (const planned of parts) {
          const pack = planned.packQty > 0 ? planned.packQty : 1;
          // A unit in the sequence is a build order: finished stock of a model is not netted.
          const endItem = planned.source === 'end_item';
          const safety = endItem ? 0 : planned.safetyStock;
          let previous = endItem ? 0 : planned.onHand;
          for (const bucket of result.parts.get(planned.partNumber)!.buckets) {
            expect(
              Math.abs(
                bucket.projectedAvailable -
                  (previous + bucket.scheduledReceipts + bucket.plannedReceipt - bucket.gross),
              ),
            ).toBeLessThan(tolerance);
            if (bucket.plannedReceipt > 0) {
              expect(bucket.projectedAvailable).toBeGreaterThanOrEqual(safety - tolerance);
              expect(bucket.plannedReceipt).toBeGreaterThanOrEqual(bucket.net - tolerance);
              expect(bucket.plannedReceipt - bucket.net).toBeLessThan(pack);
              const packs = bucket.plannedReceipt / pack;
              expect(Math.abs(packs - Math.round(packs))).toBeLessThan(tolerance);
            }
            previous = bucket.projectedAvailable;
          }
        }
      }),
      { numRuns: 200 },
    );
  });
});
