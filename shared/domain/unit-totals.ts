import { roundQty } from './quantity';

/** A sum of quantities that share one unit of measure. */
export interface UnitTotal {
  uom: string;
  qty: number;
}

/** The plant's usual unit, listed first; the rest follow in code order. */
const PIECE = 'H87';

/**
 * Sums quantities per unit of measure: kilograms, metres and pieces are never added together.
 * Pieces come first, then the other units in code order, so the same data always reads the same.
 */
export function totalsByUnit<T>(
  items: readonly T[],
  qtyOf: (item: T) => number,
  uomOf: (item: T) => string,
): UnitTotal[] {
  const sums = new Map<string, number>();
  for (const item of items) {
    const uom = uomOf(item);
    sums.set(uom, (sums.get(uom) ?? 0) + qtyOf(item));
  }
  return [...sums]
    .map(([uom, qty]) => ({ uom, qty: roundQty(qty) }))
    .sort((a, b) => (a.uom === PIECE ? -1 : b.uom === PIECE ? 1 : a.uom < b.uom ? -1 : a.uom > b.uom ? 1 : 0));
}
