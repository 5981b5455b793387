import { describe, expect, it } from 'vitest';
import { totalsByUnit } from '../../shared/domain/unit-totals';

describe('totalsByUnit', () => {
  it('never adds different units of measure: one sum per unit, pieces first', () => {
    const rows = [
      { qty: 2.5, uom: 'KGM' },
      { qty: 12, uom: 'H87' },
      { qty: 0.1, uom: 'KGM' },
      { qty: 0.2, uom: 'KGM' },
      { qty: 3, uom: 'MTR' },
      { qty: 8, uom: 'H87' },
    ];

    const totals = totalsByUnit(
      rows,
      (row) => row.qty,
      (row) => row.uom,
    );

    // 2.5 + 0.1 + 0.2 is 2.8000000000000003 in binary floating point (IEEE 754); the sum is snapped.
    expect(totals).toEqual([
      { uom: 'H87', qty: 20 },
      { uom: 'KGM', qty: 2.8 },
      { uom: 'MTR', qty: 3 },
    ]);
  });

  it('gives nothing for no rows', () => {
    expect(
      totalsByUnit(
        [],
        () => 1,
        () => 'H87',
      ),
    ).toEqual([]);
  });
});
