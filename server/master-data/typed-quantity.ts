import { typedQtyProblem, type QtyFloor } from '../../shared/domain/typed-quantity';
import { RefusedInputError } from '../errors';

/**
 * Refuses (422, naming the field) a typed quantity the part's unit of measure cannot take, such as
 * half a piece; zod has already refused what no part takes (negatives). Called before any write.
 */
export function refuseUnfitQty(
  qty: number,
  part: { partNumber: string; uom: string },
  path: (string | number)[],
  floor: QtyFloor = 'zero',
): void {
  const problem = typedQtyProblem(qty, part.uom, floor);
  if (!problem) return;
  throw new RefusedInputError(
    `${problem} for ${part.partNumber}; nothing was changed.`,
    [{ path, message: problem }],
    'quantity_refused',
  );
}
