import { UNIT_WORDS } from '../schemas/master-data';
import { COUNTABLE_UNITS } from './line-risk';

/*
 * A quantity a person typed (a count, scrap, a receipt, a supplier's confirmed quantity) is taken
 * as typed or refused with a reason: never clamped to a limit nor rounded to fit, since a typo
 * turned silently into 0 moves stock and can raise a line stop. Client and server judge it here,
 * so the message beside the field is the one the API gives.
 */

/** Whether a part in this UN/ECE Rec. 20 unit is counted in whole units (piece, set, pair). */
export function isCountableUnit(uom: string): boolean {
  return COUNTABLE_UNITS.has(uom);
}

/** The least a typed quantity may be: 0 (a count, a confirmed quantity) or more than 0 (scrap). */
export type QtyFloor = 'zero' | 'positive';

/**
 * What is wrong with `qty` typed for a part in `uom`, as a short sentence for beside the field
 * (`Must be 0 or more`); null when it may be taken as it is.
 */
export function typedQtyProblem(qty: number, uom: string, floor: QtyFloor = 'zero'): string | null {
  if (!Number.isFinite(qty)) return 'Type a number';
  if (floor === 'zero' && qty < 0) return 'Must be 0 or more';
  if (floor === 'positive' && qty <= 0) return 'Must be more than 0';
  if (isCountableUnit(uom) && !Number.isInteger(qty)) return `Must be a whole number of ${UNIT_WORDS[uom] ?? uom}`;
  return null;
}
