import { describe, expect, it } from 'vitest';
import {
  BomCycleError,
  findBomCycle,
  findEffectivityOverlaps,
  isEffective,
  lowLevelCodes,
} from '../../shared/domain/bom';
import type { PlanningBomLine } from '../../shared/domain/types';

const line = (parent: string, component: string, window: Partial<PlanningBomLine> = {}): PlanningBomLine => ({
  parent,
  component,
  qtyPer: 1,
  scrapPct: 0,
  ...window,
});

describe('lowLevelCodes', () => {
  it('codes each part at the deepest level it appears in the speaker-kit structure', () => {
    // Heizer & Render, "Operations Management", chapter "Material Requirements Planning (MRP) and
    // ERP", Speaker Kits example (from memory): A = 2 B + 3 C; B = 2 D + 2 E; C = 2 E + 2 F;
    // F = 2 D + 1 G. D sits at level 2 under B and level 3 under F, so low-level coding puts it at 3.
    const structure = [
      line('A', 'B'),
      line('A', 'C'),
      line('B', 'D'),
      line('B', 'E'),
      line('C', 'E'),
      line('C', 'F'),
      line('F', 'D'),
      line('F', 'G'),
    ];

    const codes = lowLevelCodes(['A', 'B', 'C', 'D', 'E', 'F', 'G'], structure);

    expect(Object.fromEntries(codes)).toEqual({ A: 0, B: 1, C: 1, D: 3, E: 2, F: 2, G: 3 });
  });

  it('gives parts outside every structure code 0 and includes parts named only in lines', () => {
    const codes = lowLevelCodes(['LOOSE'], [line('M', 'X')]);

    expect(Object.fromEntries(codes)).toEqual({ LOOSE: 0, M: 0, X: 1 });
  });

  it('counts lines of every effectivity window so codes hold on any date', () => {
    const codes = lowLevelCodes(
      [],
      [line('M', 'S'), line('S', 'P', { effectiveTo: '2026-01-31' }), line('M', 'P', { effectiveFrom: '2026-02-01' })],
    );

    expect(codes.get('P')).toBe(2);
  });

  it('throws a BomCycleError carrying the cycle path', () => {
    const lines = [line('M', 'A'), line('A', 'B'), line('B', 'C'), line('C', 'A')];

    let caught: unknown;
    try {
      lowLevelCodes(['M'], lines);
    } catch (error) {
      caught = error;
    }

    expect(caught).toBeInstanceOf(BomCycleError);
    expect((caught as BomCycleError).cycle).toEqual(['A', 'B', 'C', 'A']);
    expect((caught as BomCycleError).message).toContain('A → B → C → A');
  });

  it('handles a 20,000-level chain without exhausting the call stack', () => {
    const chain = Array.from({ length: 20_000 }, (_, index) => line(`P${index}`, `P${index + 1}`));

    const codes = lowLevelCodes([], chain);

    expect(codes.get('P20000')).toBe(20_000);
  });
});

describe('findBomCycle', () => {
  it('returns null for a structure with shared components but no cycle', () => {
    expect(findBomCycle([line('M', 'A'), line('M', 'B'), line('A', 'C'), line('B', 'C')])).toBeNull();
  });

  it('reports a part that is its own component', () => {
    expect(findBomCycle([line('M', 'X'), line('X', 'X')])).toEqual(['X', 'X']);
  });

  it('finds a cycle closed deep inside a long chain', () => {
    const chain = Array.from({ length: 5_000 }, (_, index) => line(`P${index}`, `P${index + 1}`));
    chain.push(line('P5000', 'P4998'));

    expect(findBomCycle(chain)).toEqual(['P4998', 'P4999', 'P5000', 'P4998']);
  });
});

describe('isEffective', () => {
  const window = line('M', 'X', { effectiveFrom: '2026-03-01', effectiveTo: '2026-03-31' });

  it('includes both ends of the window', () => {
    expect(isEffective(window, '2026-03-01')).toBe(true);
    expect(isEffective(window, '2026-03-31')).toBe(true);
  });

  it('excludes the days just outside it', () => {
    expect(isEffective(window, '2026-02-28')).toBe(false);
    expect(isEffective(window, '2026-04-01')).toBe(false);
  });

  it('treats a null or missing end as open', () => {
    expect(isEffective(line('M', 'X', { effectiveFrom: null, effectiveTo: null }), '1999-01-01')).toBe(true);
    expect(isEffective(line('M', 'X', { effectiveFrom: '2026-03-01' }), '2099-12-31')).toBe(true);
    expect(isEffective(line('M', 'X', { effectiveTo: '2026-03-01' }), '2026-03-02')).toBe(false);
  });
});

describe('findEffectivityOverlaps', () => {
  it('accepts an engineering change where the new line starts the day after the old one ends', () => {
    const lines = [line('M', 'X', { effectiveTo: '2026-03-31' }), line('M', 'X', { effectiveFrom: '2026-04-01' })];

    expect(findEffectivityOverlaps(lines)).toEqual([]);
  });

  it('reports windows that share a single day', () => {
    const lines = [line('M', 'X', { effectiveTo: '2026-04-01' }), line('M', 'X', { effectiveFrom: '2026-04-01' })];

    expect(findEffectivityOverlaps(lines)).toEqual([{ parent: 'M', component: 'X', firstIndex: 0, secondIndex: 1 }]);
  });

  it('reports every overlapping pair, including two open-ended lines', () => {
    const lines = [
      line('M', 'X'),
      line('M', 'Y'),
      line('N', 'X', { effectiveFrom: '2026-01-01', effectiveTo: '2026-01-31' }),
      line('M', 'X', { effectiveFrom: '2026-06-01', effectiveTo: '2026-06-30' }),
      line('N', 'X', { effectiveFrom: '2026-02-01' }),
    ];

    expect(findEffectivityOverlaps(lines)).toEqual([{ parent: 'M', component: 'X', firstIndex: 0, secondIndex: 3 }]);
  });
});
