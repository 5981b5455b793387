/**
 * Rules of supplier releases that the server and the confirmation page share: how a release is
 * numbered, how far ahead a kanban line is needed, and when a supplier's answer is an exception.
 */
import type { DeliveryCycle } from './kanban-sizing';
import type { IsoDate } from './types';

/** Quantities closer than this are the same quantity (the engine snaps to the same grid). */
const QTY_TOLERANCE = 1e-9;

/**
 * Release number `R` + release date as yymmdd + `-` + supplier code, e.g. `R270301-SUP-A`. One
 * release per supplier per day makes it unique, and a person can read both facts off a label.
 */
export function releaseNumber(supplierCode: string, releaseDate: IsoDate): string {
  return `R${releaseDate.slice(2, 4)}${releaseDate.slice(5, 7)}${releaseDate.slice(8, 10)}-${supplierCode}`;
}

/**
 * Working days from releasing a kanban card to needing its container back: the supplier's
 * replenishment time T = days × (1 + delay) / deliveries of its delivery cycle, rounded up to whole
 * working days (a delivery arrives on a day, not part-way through one) and never less than one
 * (a card released today cannot come back today). Integer arithmetic, so a whole T stays whole.
 */
export function kanbanReplenishmentWorkingDays(cycle: DeliveryCycle): number {
  const { days, deliveries, delay } = cycle;
  if (![days, deliveries, delay].every(Number.isInteger) || days < 1 || deliveries < 1 || delay < 0) {
    throw new RangeError(
      `A delivery cycle needs whole days ≥ 1, deliveries ≥ 1 and delay ≥ 0, got ${days}-${deliveries}-${delay}`,
    );
  }
  // ⌈a / b⌉ for whole a, b ≥ 1 as ⌊(a + b − 1) / b⌋: no fractional division involved.
  return Math.max(1, Math.floor((days * (1 + delay) + deliveries - 1) / deliveries));
}

export interface RequestedLine {
  qty: number;
  needDate: IsoDate;
}

export interface LineAnswer {
  confirmedQty: number;
  shipDate: IsoDate;
}

/**
 * True when the supplier's answer is not what was asked: another quantity, or a ship date after
 * the need date. Shipping on the need date itself still counts as meeting it — the release cannot
 * know the transit time, and the buyer sees the ship date beside the need date anyway.
 */
export function answerDiffers(requested: RequestedLine, answer: LineAnswer): boolean {
  return quantityDiffers(requested.qty, answer.confirmedQty) || answer.shipDate > requested.needDate;
}

/** True when a confirmed quantity is not the requested one (beyond floating-point noise). */
export function quantityDiffers(requestedQty: number, confirmedQty: number): boolean {
  return Math.abs(confirmedQty - requestedQty) > QTY_TOLERANCE;
}

/** `confirmed` when every line is answered as requested, otherwise `exception` for the buyer to decide. */
export function answerStatus(pairs: { requested: RequestedLine; answer: LineAnswer }[]): 'confirmed' | 'exception' {
  return pairs.some(({ requested, answer }) => answerDiffers(requested, answer)) ? 'exception' : 'confirmed';
}
