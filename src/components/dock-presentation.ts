import { isCountableUnit, typedQtyProblem } from '@shared/domain/typed-quantity';
import type { DockColumn, DockItem, DockLine } from '@shared/schemas/dock';
import type { Discrepancy, OverCheckResponse, Receipt } from '@shared/schemas/receipts';
import { formatDay, formatQuantity } from '@/format';

/** Our words for the board's columns, with what each means on the floor. */
export const COLUMN_WORDS: Record<DockColumn, { title: string; hint: string }> = {
  expected: { title: 'Expected', hint: 'On its way to us' },
  at_dock: { title: 'At dock', hint: 'Unloaded, not counted' },
  counted: { title: 'Counted', hint: 'Checked in, in stock' },
  to_line: { title: 'To line', hint: 'At the point of use' },
};

export const DISCREPANCY_WORDS: Record<Discrepancy, string> = {
  short: 'Short',
  over: 'Over',
  damaged: 'Damaged',
  wrong_part: 'Wrong part',
};

/** What is still to come of a line on its card (never negative). */
export function remainingQty(line: DockLine): number {
  return Math.max(0, line.qty - line.receivedQty);
}

/**
 * What a partly counted card still awaits, once some of it came in short: "3 pcs of HNS-M20 to
 * come", or "2 lines partly counted, the rest to come"; null when nothing was counted short.
 */
export function stillToCome(item: DockItem): string | null {
  const partly = item.lines.filter((line) => line.open && line.receivedQty > 0 && remainingQty(line) > 0);
  if (partly.length === 0) return null;
  if (partly.length > 1) return `${partly.length} lines partly counted, the rest to come`;
  const [line] = partly;
  return `${formatQuantity(remainingQty(line), line.uom)} of ${line.partNumber} to come`;
}

/** The words for what a card's line brings: a shipment carries it; without a ship notice, what is expected. */
export function cardQtyWord(kind: DockItem['kind']): string {
  return kind === 'shipment' ? 'On this shipment' : 'Expected';
}

/**
 * The discrepancy a count suggests against what is still to come: short below it, else none.
 * Over is not the count's to suggest: only a count above the supplier's tolerance is over, and
 * the server's over-check says so.
 */
export function suggestDiscrepancy(counted: number, remaining: number): Discrepancy | null {
  return counted < remaining ? 'short' : null;
}

/** What keeping an over count's excess does, in the clerk's words. */
export function keepWords(check: OverCheckResponse, uom: string): string {
  const shares = check.keep.appliedTo.map(
    (share) =>
      `${formatQuantity(share.qty, uom)} go to ${share.releaseNumber}, line due ${formatDay(share.due)}${share.closes ? ' (it closes)' : ''}`,
  );
  const stays = check.keep.unallocatedQty;
  if (shares.length === 0)
    return `No later order of this part is open: all ${formatQuantity(stays, uom)} stay in stock on this line.`;
  const rest = stays > 0 ? `; ${formatQuantity(stays, uom)} no order needs stay in stock on this line` : '';
  return `Into stock, counted against later orders: ${shares.join('; ')}${rest}.`;
}

/** What returning an over count's excess does. */
export function returnWords(check: OverCheckResponse, uom: string): string {
  return `${formatQuantity(check.excessQty, uom)} go back to the supplier; this line closes at ${formatQuantity(check.orderedQty, uom)}.`;
}

/** What a recorded over receipt did with its excess; empty for any other receipt. */
export function overOutcomeWords(receipt: Receipt, uom: string): string {
  if (receipt.overAction === 'return') return `${formatQuantity(receipt.returnedQty, uom)} back to the supplier.`;
  if (receipt.overAction !== 'keep') return '';
  if (receipt.appliedTo.length === 0)
    return `${formatQuantity(receipt.excessQty, uom)} more than ordered kept on this line.`;
  const shares = receipt.appliedTo.map(
    (share) => `${formatQuantity(share.qty, uom)} to ${share.releaseNumber} (due ${formatDay(share.due)})`,
  );
  return `Kept against later orders: ${shares.join(', ')}.`;
}

/**
 * A counted quantity as typed on a tablet: digits with a decimal point or comma; null when the
 * box is empty or holds anything else.
 */
export function parseCount(typed: string): number | null {
  const text = typed.trim().replace(',', '.');
  if (!/^\d+(\.\d+)?$/.test(text)) return null;
  return Number(text);
}

/**
 * What is wrong with a count typed for a line in `uom`, as a sentence under the line; null when
 * `parseCount` reads it and the shared rule takes it. A minus sign is named as such rather than
 * as "not a number", and the example offers decimals only for units that have them.
 */
export function countProblem(typed: string, uom: string): string | null {
  const text = typed.trim().replace(',', '.');
  if (/^-\d+(\.\d+)?$/.test(text)) return `${typedQtyProblem(Number(text), uom)}.`;
  const count = parseCount(typed);
  if (count === null)
    return isCountableUnit(uom)
      ? 'Type the counted quantity as a whole number, e.g. 24.'
      : 'Type the counted quantity as a number, e.g. 24 or 12.5.';
  const problem = typedQtyProblem(count, uom);
  return problem ? `${problem}.` : null;
}
