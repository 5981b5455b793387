import { unitWord } from '../schemas/master-data';

/*
 * Quantities read the way people on the floor say them, on screens, labels and e-mails alike:
 * `12 pcs`, `1 pc`, `4 sets`, `1,250.5 kg`. Unit words come from the shared table of UN/ECE
 * Recommendation 20 codes; a code is never shown in place of a known word.
 */
const QTY_FORMAT = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 3 });

/** A quantity without its unit: grouped thousands, at most three decimals (`1,250.5`). */
export function formatQty(value: number): string {
  return QTY_FORMAT.format(value);
}

/** A quantity with its unit in words: `12 pcs`, `1 pc`, `4 sets`, `1,250.5 kg`. */
export function formatQuantity(qty: number, uom: string): string {
  return `${formatQty(qty)} ${unitWord(uom, qty)}`;
}
