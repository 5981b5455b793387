import { QTY_EPSILON, roundQty } from './quantity';
import type { IsoDate } from './types';

/*
 * Over-receipts. A supplier may deliver up to its over tolerance above what a line is ordered for
 * (supplier terms, 0 % unless set); that is received as normal. Above it the receipt is `over`
 * and the clerk decides what happens to the excess — everything above the ordered quantity:
 * - keep: the excess is stock the supplier has delivered ahead, so it is applied to the
 *   supplier's other open lines of the same part, the one due first first (first in, first out),
 *   reducing or closing them; otherwise the plan would count the same goods twice, once on hand
 *   and once as an open line. What no open line takes stays on the received line.
 * - return: the excess goes back to the supplier (a `return` movement out of stock) and the line
 *   closes at its ordered quantity.
 * Applying an over-delivery to the next open schedule lines, oldest due first, is common practice
 * in receiving (no source).
 */

export const OVER_ACTIONS = ['keep', 'return'] as const;
export type OverAction = (typeof OVER_ACTIONS)[number];

export interface OverCheckInput {
  /** What the line is ordered for: the supplier's confirmed quantity once given, else the request. */
  orderedQty: number;
  /** Usable quantity the line has received before this count. */
  receivedQty: number;
  /** Usable quantity of this count. */
  countedQty: number;
  /** The supplier's over tolerance in per cent. */
  overTolerancePct: number;
}

export interface OverCheck {
  /** The most the line may receive in all before a count is over: ordered × (1 + tolerance). */
  limitQty: number;
  /** True when the line's received quantity with this count passes the limit. */
  over: boolean;
  /** Of this count, what lies above the ordered quantity when over; 0 otherwise. */
  excessQty: number;
}

/** Whether a count takes its line over the supplier's tolerance, and by how much above the order. */
export function overCheck(input: OverCheckInput): OverCheck {
  const limitQty = roundQty(input.orderedQty * (1 + input.overTolerancePct / 100));
  const total = input.receivedQty + input.countedQty;
  const over = total > limitQty + QTY_EPSILON;
  const excessQty = over
    ? roundQty(Math.min(input.countedQty, total - Math.max(input.orderedQty, input.receivedQty)))
    : 0;
  return { limitQty, over, excessQty };
}

/** Another open line of the same part from the same supplier, with what is still to come on it. */
export interface OpenSupplyLine {
  id: number;
  /** When it is expected at the dock; the first due takes the excess first. */
  due: IsoDate;
  remainingQty: number;
}

export interface LineShare {
  lineId: number;
  qty: number;
  /** The share covers everything still to come on the line, which then closes. */
  closes: boolean;
}

export interface ExcessAllocation {
  shares: LineShare[];
  /** What no open line took: it stays on the received line as more than ordered. */
  unallocatedQty: number;
}

/** Spreads kept excess over the other open lines, first due first (ties by line id, the older first). */
export function allocateExcess(excessQty: number, lines: readonly OpenSupplyLine[]): ExcessAllocation {
  const ordered = [...lines].sort((a, b) => a.due.localeCompare(b.due) || a.id - b.id);
  const shares: LineShare[] = [];
  let left = excessQty;
  for (const line of ordered) {
    if (left <= QTY_EPSILON) break;
    if (line.remainingQty <= QTY_EPSILON) continue;
    const qty = roundQty(Math.min(left, line.remainingQty));
    shares.push({ lineId: line.id, qty, closes: qty >= line.remainingQty - QTY_EPSILON });
    left = roundQty(left - qty);
  }
  return { shares, unallocatedQty: Math.max(0, left) };
}
