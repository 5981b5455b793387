import type { DockColumn, DockItem, DockLine } from '@shared/schemas/dock';
import type { Discrepancy } from '@shared/schemas/receipts';

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

/** The words for what a card's line brings: a shipment carries it, the rest is still to be shipped. */
export function cardQtyWord(kind: DockItem['kind']): string {
  return kind === 'shipment' ? 'On this shipment' : 'Not yet shipped';
}

/** The discrepancy a count suggests against what is still to come; null when it matches. */
export function suggestDiscrepancy(counted: number, remaining: number): Discrepancy | null {
  if (counted < remaining) return 'short';
  if (counted > remaining) return 'over';
  return null;
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
