import { describe, expect, it } from 'vitest';
import { isCountableUnit, typedQtyProblem } from '../../shared/domain/typed-quantity';

describe('typedQtyProblem', () => {
  // UN/ECE Recommendation 20 (Codes for Units of Measure Used in International Trade), Annex:
  // H87 piece, SET set and PR pair are counted units; KGM kilogram and MTR metre are measures.
  it('takes whole numbers only for pieces, sets and pairs, and decimals for measures', () => {
    expect(['H87', 'SET', 'PR'].map(isCountableUnit)).toEqual([true, true, true]);
    expect(['KGM', 'MTR', 'LTR'].map(isCountableUnit)).toEqual([false, false, false]);
    expect(typedQtyProblem(399.5, 'H87')).toBe('Must be a whole number of pcs');
    expect(typedQtyProblem(2.5, 'SET')).toBe('Must be a whole number of sets');
    expect(typedQtyProblem(400, 'H87')).toBeNull();
    expect(typedQtyProblem(12.5, 'KGM')).toBeNull();
  });

  it('says a negative is below 0 whatever the unit, and scrap must be more than 0', () => {
    expect(typedQtyProblem(-3, 'H87')).toBe('Must be 0 or more');
    expect(typedQtyProblem(-0.5, 'KGM')).toBe('Must be 0 or more');
    expect(typedQtyProblem(0, 'H87')).toBeNull();
    expect(typedQtyProblem(0, 'H87', 'positive')).toBe('Must be more than 0');
    expect(typedQtyProblem(Number.NaN, 'KGM')).toBe('Type a number');
  });
});
