import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { backflush, bomByParent, type BackflushPart } from '../../shared/domain/backflush';
import { computePlan } from '../../shared/domain/plan';
import type { PartSource } from '../../shared/domain/types';
import { bomLine } from './builders';

const partsOf = (sources: Record<string, PartSource>) =>
  new Map<string, BackflushPart>(Object.entries(sources).map(([partNumber, source]) => [partNumber, { source }]));

/*
 * Heizer & Render, "Operations Management", chapter "Material Requirements Planning (MRP) and ERP",
 * Speaker Kits, Inc. (from memory; edition not verified here): A = 2 B + 3 C; B = 2 D + 2 E;
 * C = 2 E + 2 F; F = 2 D + 1 G. For 50 kits the book's gross requirements are B 100, C 150,
 * D 800 (200 through B, 600 through F), E 500 (200 through B, 300 through C), F 300, G 300.
 * B, C and F are assemblies made in-house; D, E and G are bought.
 */
const speakerKit = bomByParent([
  bomLine('A', 'B', 2),
  bomLine('A', 'C', 3),
  bomLine('B', 'D', 2),
  bomLine('B', 'E', 2),
  bomLine('C', 'E', 2),
  bomLine('C', 'F', 2),
  bomLine('F', 'D', 2),
  bomLine('F', 'G', 1),
]);
const speakerParts = partsOf({ A: 'end_item', B: 'make', C: 'make', F: 'make', D: 'buy', E: 'buy', G: 'buy' });

describe('backflush', () => {
  it('consumes the bought parts of 50 speaker kits at the exploded gross requirement', () => {
    const consumed = backflush('A', 50, '2027-03-01', speakerKit, speakerParts, new Map());

    expect(Object.fromEntries(consumed)).toEqual({ D: 800, E: 500, G: 300 });
  });

  it('takes a made subassembly from its stock first and explodes only the rest', () => {
    // 20 of C in stock: C 130 still made → E 200 + 260 = 460, F 260 → D 200 + 520 = 720, G 260.
    const stock = new Map([['C', 20]]);

    const consumed = backflush('A', 50, '2027-03-01', speakerKit, speakerParts, stock);

    expect(Object.fromEntries(consumed)).toEqual({ C: 20, D: 720, E: 460, G: 260 });
    expect(stock.get('C')).toBe(0);
  });

  it('consumes the BOM quantity without the scrap allowance, through the lines effective on the build date', () => {
    const bom = bomByParent([
      bomLine('M', 'BOLT', 8, { scrapPct: 5 }),
      bomLine('M', 'OLD-DECAL', 1, { effectiveTo: '2027-03-01' }),
      bomLine('M', 'NEW-DECAL', 1, { effectiveFrom: '2027-03-02' }),
    ]);
    const parts = partsOf({ M: 'end_item', BOLT: 'buy', 'OLD-DECAL': 'buy', 'NEW-DECAL': 'buy' });

    const before = backflush('M', 2, '2027-03-01', bom, parts, new Map());
    const after = backflush('M', 2, '2027-03-02', bom, parts, new Map());

    expect(Object.fromEntries(before)).toEqual({ BOLT: 16, 'OLD-DECAL': 2 });
    expect(Object.fromEntries(after)).toEqual({ BOLT: 16, 'NEW-DECAL': 2 });
  });

  // With no subassembly stock and no scrap, what a built unit consumes of each bought part is what
  // the planning engine explodes as its gross requirement (lead times 0, one bucket).
  it('agrees with the planning engine’s gross requirements of bought parts', () => {
    const names = ['P0', 'P1', 'P2', 'P3', 'P4', 'P5'];
    const structure = fc
      .array(
        fc.record({
          parent: fc.integer({ min: 0, max: 4 }),
          offset: fc.integer({ min: 1, max: 5 }),
          qtyPer: fc.integer({ min: 1, max: 4 }),
        }),
        { minLength: 1, maxLength: 10 },
      )
      .map((edges) => {
        const seen = new Set<string>();
        return edges
          .map(({ parent, offset, qtyPer }) => ({ parent, child: Math.min(parent + offset, 5), qtyPer }))
          .filter(
            ({ parent, child }) => child > parent && !seen.has(`${parent}-${child}`) && seen.add(`${parent}-${child}`),
          )
          .map(({ parent, child, qtyPer }) => bomLine(names[parent], names[child], qtyPer));
      });
    fc.assert(
      fc.property(structure, fc.integer({ min: 1, max: 9 }), (lines, units) => {
        const parents = new Set(lines.map((candidate) => candidate.parent));
        const sources = Object.fromEntries(
          names.map((name, index) => [name, index === 0 ? 'end_item' : parents.has(name) ? 'make' : 'buy']),
        ) as Record<string, PartSource>;
        const consumed = backflush('P0', units, '2027-03-01', bomByParent(lines), partsOf(sources), new Map());
        const plan = computePlan({
          parts: names.map((partNumber) => ({
            partNumber,
            source: sources[partNumber],
            leadTimeDays: 0,
            packQty: 1,
            onHand: 0,
            safetyStock: 0,
          })),
          bom: lines,
          sequence: [{ date: '2027-03-01', sequence: 1, model: 'P0', serial: 'S1', qty: units }],
          scheduledReceipts: [],
          calendar: { workingWeekdays: [1, 2, 3, 4, 5, 6, 7], holidays: [] },
          from: '2027-03-01',
          to: '2027-03-01',
        });
        for (const name of names.filter((candidate) => sources[candidate] === 'buy')) {
          expect(consumed.get(name) ?? 0).toBe(plan.parts.get(name)!.buckets[0].gross);
        }
      }),
    );
  });
});
