import { describe, expect, it } from 'vitest';
import { applyEngineeringChange, indentedBom, orderedQtyPer, whereUsed } from '../../shared/domain/bom-tree';

const line = (id: number, parent: string, component: string, qtyPer: number, scrapPct = 0, window = {}) => ({
  id,
  parent,
  component,
  qtyPer,
  scrapPct,
  effectiveFrom: null,
  effectiveTo: null,
  ...window,
});

describe('orderedQtyPer', () => {
  it('adds the scrap allowance on top of the quantity per', () => {
    // Scrap allowance as an added percentage, qty × (1 + s): 4 × 1.05 = 4.2
    // (APICS Dictionary, "scrap factor"; from memory).
    expect(orderedQtyPer({ qtyPer: 4, scrapPct: 5 })).toBeCloseTo(4.2, 12);
  });
});

describe('indentedBom', () => {
  const lines = [
    line(1, 'A', 'B', 2, 10),
    line(2, 'B', 'C', 3, 5),
    line(3, 'A', 'D', 1, 0, { effectiveTo: '2027-01-31' }),
    line(4, 'A', 'E', 1, 0, { effectiveFrom: '2027-02-01' }),
  ];

  it('compounds scrap down the levels', () => {
    const tree = indentedBom('A', lines, null);

    // 2 × 1.10 × 3 × 1.05 = 6.93 (scrap allowance per level, multiplied along the path; from memory).
    expect(tree[0].children[0]).toMatchObject({ component: 'C', level: 2 });
    expect(tree[0].children[0].extendedQty).toBeCloseTo(6.93, 12);
  });

  it('keeps only the lines in effect on the date, both ends inclusive', () => {
    expect(indentedBom('A', lines, '2027-01-31').map((node) => node.component)).toEqual(['B', 'D']);
    expect(indentedBom('A', lines, '2027-02-01').map((node) => node.component)).toEqual(['B', 'E']);
    expect(indentedBom('A', lines, null).map((node) => node.component)).toEqual(['B', 'D', 'E']);
  });
});

describe('whereUsed', () => {
  it('finds direct parents and the top parents at any depth', () => {
    const lines = [line(1, 'M1', 'SUB', 1), line(2, 'SUB', 'BOLT', 4), line(3, 'M2', 'BOLT', 2)];

    const used = whereUsed('BOLT', lines);

    expect(used.direct.map((entry) => entry.parent)).toEqual(['SUB', 'M2']);
    expect(used.topParents).toEqual(['M1', 'M2']);
  });
});

describe('applyEngineeringChange', () => {
  it('ends the old line the day before and opens the replacement from the change date to the old end', () => {
    const outcome = applyEngineeringChange([line(1, 'A', 'OLD', 2, 0, { effectiveTo: '2027-12-31' })], {
      component: 'OLD',
      replacement: 'NEW',
      qtyPer: 3,
      scrapPct: 1,
      effectiveFrom: '2027-03-01',
    });

    expect(outcome).toEqual({
      ok: true,
      lines: [
        expect.objectContaining({ component: 'OLD', effectiveFrom: null, effectiveTo: '2027-02-28' }),
        {
          parent: 'A',
          component: 'NEW',
          qtyPer: 3,
          scrapPct: 1,
          effectiveFrom: '2027-03-01',
          effectiveTo: '2027-12-31',
        },
      ],
    });
  });

  it('refuses a change on the day the line starts', () => {
    const outcome = applyEngineeringChange([line(1, 'A', 'OLD', 2, 0, { effectiveFrom: '2027-03-01' })], {
      component: 'OLD',
      replacement: 'NEW',
      qtyPer: 1,
      scrapPct: 0,
      effectiveFrom: '2027-03-01',
    });

    expect(outcome).toMatchObject({ ok: false, field: 'effectiveFrom' });
  });
});
