import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { allocateExcess, overCheck } from '../../shared/domain/over-receipt';

describe('overCheck', () => {
  it('is over only above ordered × (1 + tolerance), and the excess is all above the ordered quantity', () => {
    // Over tolerance as a percentage on top of the ordered quantity, excess measured from the order:
    // common practice in receiving, no source. 10 % on 20 allows 22.
    expect([
      overCheck({ orderedQty: 20, receivedQty: 0, countedQty: 22, overTolerancePct: 10 }),
      overCheck({ orderedQty: 20, receivedQty: 0, countedQty: 23, overTolerancePct: 10 }),
      overCheck({ orderedQty: 12, receivedQty: 0, countedQty: 60, overTolerancePct: 0 }),
      overCheck({ orderedQty: 20, receivedQty: 15, countedQty: 8, overTolerancePct: 0 }),
    ]).toEqual([
      { limitQty: 22, over: false, excessQty: 0 },
      { limitQty: 22, over: true, excessQty: 3 },
      { limitQty: 12, over: true, excessQty: 48 },
      { limitQty: 20, over: true, excessQty: 3 },
    ]);
  });
});

describe('allocateExcess', () => {
  it('fills the first due line first, ties going to the older line', () => {
    // First in, first out over open schedule lines: common practice, no source.
    const allocation = allocateExcess(18, [
      { id: 7, due: '2026-12-14', remainingQty: 12 },
      { id: 9, due: '2026-12-09', remainingQty: 6 },
      { id: 8, due: '2026-12-09', remainingQty: 4 },
    ]);

    expect(allocation).toEqual({
      shares: [
        { lineId: 8, qty: 4, closes: true },
        { lineId: 9, qty: 6, closes: true },
        { lineId: 7, qty: 8, closes: false },
      ],
      unallocatedQty: 0,
    });
  });

  it('spreads exactly the excess, never more than a line still awaits', () => {
    const line = fc.record({
      id: fc.integer({ min: 1, max: 1000 }),
      due: fc.constantFrom('2026-12-07', '2026-12-08', '2026-12-09'),
      remainingQty: fc.integer({ min: 0, max: 50 }),
    });
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 200 }),
        fc.uniqueArray(line, { selector: (item) => item.id }),
        (excess, lines) => {
          const { shares, unallocatedQty } = allocateExcess(excess, lines);
          const applied = shares.reduce((sum, share) => sum + share.qty, 0);
          expect(applied + unallocatedQty).toBe(excess);
          for (const share of shares) {
            const target = lines.find((candidate) => candidate.id === share.lineId)!;
            expect(share.qty).toBeGreaterThan(0);
            expect(share.qty).toBeLessThanOrEqual(target.remainingQty);
            expect(share.closes).toBe(share.qty === target.remainingQty);
          }
          const awaited = lines.reduce((sum, candidate) => sum + candidate.remainingQty, 0);
          expect(unallocatedQty).toBe(Math.max(0, excess - awaited));
        },
      ),
    );
  });
});
