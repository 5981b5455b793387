/**
 * Rules of supplier releases that the server and the confirmation page share: how a release is
 * numbered and when a supplier's answer is an exception.
 */
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

export interface RequestedLine {
  qty: number;
  /** The ship dates that bring the goods inside the on-time window (see shipWindow in supplier-timing). */
  earliestShipDate: IsoDate;
  latestShipDate: IsoDate;
}

export interface LineAnswer {
  confirmedQty: number;
  shipDate: IsoDate;
}

export interface AnswerDifference {
  qtyChanged: boolean;
  /** Ships too late to arrive by the need date, transit counted. */
  late: boolean;
  /** Ships so early that the goods arrive before the early tolerance allows. */
  early: boolean;
  differs: boolean;
}

/**
 * How the supplier's answer departs from what was asked: another quantity, or a ship date whose
 * arrival (ship date plus transit) falls outside the on-time window around the need date.
 */
export function answerDifference(requested: RequestedLine, answer: LineAnswer): AnswerDifference {
  const qtyChanged = quantityDiffers(requested.qty, answer.confirmedQty);
  const late = answer.shipDate > requested.latestShipDate;
  const early = answer.shipDate < requested.earliestShipDate;
  return { qtyChanged, late, early, differs: qtyChanged || late || early };
}

/** True when the answer is not what was asked (see answerDifference). */
export function answerDiffers(requested: RequestedLine, answer: LineAnswer): boolean {
  return answerDifference(requested, answer).differs;
}

/** True when a confirmed quantity is not the requested one (beyond floating-point noise). */
export function quantityDiffers(requestedQty: number, confirmedQty: number): boolean {
  return Math.abs(confirmedQty - requestedQty) > QTY_TOLERANCE;
}

/** `confirmed` when every line is answered as requested, otherwise `exception` for the buyer to decide. */
export function answerStatus(pairs: { requested: RequestedLine; answer: LineAnswer }[]): 'confirmed' | 'exception' {
  return pairs.some(({ requested, answer }) => answerDiffers(requested, answer)) ? 'exception' : 'confirmed';
}
