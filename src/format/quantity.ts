import { roundQty } from '@shared/domain/quantity';
import type { UnitTotal } from '@shared/domain/unit-totals';
import { unitWord } from '@shared/schemas/master-data';

/*
 * Quantities read the way people on the floor say them: `12 pcs`, `1 pc`, `4 sets`, `1,250.5 kg`.
 * Unit words come from the shared table of UN/ECE Recommendation 20 codes (the server prints the
 * same words on card labels and mails); a code is never shown in place of a known word.
 */

const QTY_FORMAT = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 3 });

export { unitWord };

/** A quantity without its unit: grouped thousands, at most three decimals (`1,250.5`). */
export function formatQty(value: number): string {
  return QTY_FORMAT.format(value);
}

/** A quantity for a dense table cell: like `formatQty`, but blank for zero so figures stand out. */
export function formatQtyCell(value: number): string {
  return value === 0 ? '' : formatQty(value);
}

/**
 * A sum of one unit across parts, for a footer or a count line: always written, to the same
 * decimals as the cells it sums, so a column of one part totals to the figure in its cell.
 */
export function formatTotal(value: number): string {
  return QTY_FORMAT.format(roundQty(value));
}

/** A quantity with its unit in words: `12 pcs`, `1 pc`, `4 sets`, `1,250.5 kg`. */
export function formatQuantity(qty: number, uom: string): string {
  return `${formatQty(qty)} ${unitWord(uom, qty)}`;
}

/** Sums in several units, one per unit and never added together: `1,250 pcs · 56.5 kg`; `0` when none. */
export function formatUnitTotals(totals: readonly UnitTotal[]): string {
  if (totals.length === 0) return '0';
  return totals.map((total) => `${formatTotal(total.qty)} ${unitWord(total.uom, total.qty)}`).join(' · ');
}
