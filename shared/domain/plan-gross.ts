import type { PlanResult } from './types';

/*
 * Gross requirements of a computed plan by part, kept beside the result rather than in it so the
 * published PlanResult shape stays as it is. Reports that need only gross demand (GET /api/demand)
 * read these rows instead of building every part's bucket objects.
 */

const grossRowsByResult = new WeakMap<PlanResult, (partNumber: string) => ArrayLike<number> | undefined>();

/** Records how to read the gross requirement row of each part of `result`. */
export function registerGrossRows(
  result: PlanResult,
  rowOf: (partNumber: string) => ArrayLike<number> | undefined,
): void {
  grossRowsByResult.set(result, rowOf);
}

/** Gross requirements of a part by bucket, without building buckets when the engine computed `result`. */
export function grossRowOf(result: PlanResult, partNumber: string): ArrayLike<number> | undefined {
  const rowOf = grossRowsByResult.get(result);
  if (rowOf) return rowOf(partNumber);
  return result.parts.get(partNumber)?.buckets.map((bucket) => bucket.gross);
}
