/*
 * Quantities may be fractional (kilograms, metres) and are built from products such as
 * qtyPer × (1 + scrapPct / 100), so binary floating point leaves noise like 71.50000000000001.
 * The engine snaps every stored quantity to a grid of 1e-9, far below any unit of measure a
 * plant counts in, so that equal quantities compare equal and no phantom pack is ordered.
 * The grid holds for fractional quantities up to about a million per bucket; above ~10^7 the
 * spacing of doubles itself exceeds 1e-9 (whole numbers stay exact far beyond that).
 */

/** Smallest quantity difference the engine treats as real. */
export const QTY_EPSILON = 1e-9;

const QTY_SCALE = 1e9;

/** `value` snapped to the 1e-9 grid (never negative zero). */
export function roundQty(value: number): number {
  // Whole numbers (most piece counts, and every zero bucket) are already on the grid.
  if (Math.floor(value) === value) return value === 0 ? 0 : value;
  const rounded = Math.round(value * QTY_SCALE) / QTY_SCALE;
  return rounded === 0 ? 0 : rounded;
}

/** Smallest whole number of packs covering `net`, as a quantity; a pack size ≤ 0 counts as 1. */
export function roundUpToPacks(net: number, packQty: number): number {
  if (net <= QTY_EPSILON) return 0;
  const pack = packQty > 0 ? packQty : 1;
  // A net only noise above a whole number of packs must not trigger one more pack.
  const packs = Math.ceil(net / pack - QTY_EPSILON);
  return roundQty(packs * pack);
}
