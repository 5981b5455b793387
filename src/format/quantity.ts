import { roundQty } from '@shared/domain/quantity';
import type { UnitTotal } from '@shared/domain/unit-totals';
import { unitWord } from '@shared/schemas/master-data';
import { formatQty } from '@shared/format/quantity';

/* Quantities in the one style of `@shared/format/quantity`, plus the screens' cells and totals. */

export { unitWord };
export { formatQty, formatQuantity } from '@shared/format/quantity';

/** A quantity for a dense table cell: like `formatQty`, but blank for zero so figures stand out. */
export function formatQtyCell(value: number): string {
  return value === 0 ? '' : formatQty(value);
}

/**
 * A sum of one unit across parts, for a footer or a count line: always written, to the same
 * decimals as the cells it sums, so a column of one part totals to the figure in its cell.
 */
export function formatTotal(value: number): string {
  return formatQty(roundQty(value));
}

/** Sums in several units, one per unit and never added together: `1,250 pcs · 56.5 kg`; `0` when none. */
export function formatUnitTotals(totals: readonly UnitTotal[]): string {
  if (totals.length === 0) return '0';
  return totals.map((total) => `${formatTotal(total.qty)} ${unitWord(total.uom, total.qty)}`).join(' · ');
}
