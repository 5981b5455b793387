import { describe, expect, it } from 'vitest';
import { changedRows, keepEqualRows } from '../../server/line-risk/changed-rows';

describe('rows of a piece of line-risk input read again', () => {
  const before = [
    { partNumber: 'A', onHand: 1 },
    { partNumber: 'B', onHand: 2 },
    { partNumber: 'C', onHand: 3 },
  ];

  it('keeps the rows that stood as the same objects, and takes the changed one', () => {
    const after = [{ ...before[0] }, { partNumber: 'B', onHand: 5 }, { ...before[2] }];

    const kept = keepEqualRows(before, after);

    expect(kept).toEqual(after);
    expect(kept[0]).toBe(before[0]);
    expect(kept[1]).toBe(after[1]);
    expect(kept[2]).toBe(before[2]);
    // What compares the kept list with the one before finds the changed row alone.
    expect(changedRows(before, kept)).toEqual([1]);
  });

  it('keeps the list read before when no row differs, and takes a list of another length whole', () => {
    const same = before.map((row) => ({ ...row }));
    const longer = [...same, { partNumber: 'D', onHand: 4 }];

    expect(keepEqualRows(before, same)).toBe(before);
    expect(keepEqualRows(before, longer)).toBe(longer);
  });
});
