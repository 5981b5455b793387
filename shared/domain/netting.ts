import { QTY_EPSILON, roundQty, roundUpToPacks } from './quantity';

/*
 * The explosion needs only gross requirements, planned receipts and planned releases of every
 * part, so only those are kept as full parts × days tables. Scheduled receipts are sparse (a row
 * only for parts that have any), and projected available and net requirement are recomputed for a
 * part when its buckets are read: the netting pass is bound by memory traffic, not arithmetic.
 */

/** Working tables of a plan, one row of `days` values per part at offset part × days. */
export interface NettingTables {
  days: number;
  gross: Float64Array;
  plannedReceipt: Float64Array;
  plannedRelease: Float64Array;
  /** Scheduled receipts per part, undefined for a part with none in the horizon. */
  scheduledReceipts: (Float64Array | undefined)[];
}

/** Zero-filled tables for `partCount` parts over `days` buckets. */
export function createNettingTables(partCount: number, days: number): NettingTables {
  const size = partCount * days;
  // One allocation for the three full tables: fewer large buffers for the collector to track.
  const buffer = new Float64Array(size * 3);
  return {
    days,
    gross: buffer.subarray(0, size),
    plannedReceipt: buffer.subarray(size, 2 * size),
    plannedRelease: buffer.subarray(2 * size, 3 * size),
    scheduledReceipts: new Array<Float64Array | undefined>(partCount),
  };
}

/** Projected available and net requirement of one part, filled in when its buckets are read. */
export interface NettingRecord {
  projectedAvailable: Float64Array;
  net: Float64Array;
}

// Module-level copies: some ESM-to-CJS loaders read every imported binding through a getter,
// which costs more than the arithmetic in the loop below.
const roundToGrid = roundQty;
const packsCovering = roundUpToPacks;
const epsilon = QTY_EPSILON;

/**
 * Gross-to-net for one part's row: projected available carries on-hand forward through gross
 * requirements and scheduled receipts; whenever it would fall below safety stock the shortfall is
 * the net requirement, covered lot-for-lot by a planned receipt in whole packs in the same bucket.
 * Running it again on the same row gives the same figures, so `record` can be filled later.
 * Planned releases are left to the caller (they depend on the calendar).
 */
export function netPartRow(
  tables: NettingTables,
  part: number,
  onHand: number,
  safetyStock: number,
  packQty: number,
  record?: NettingRecord,
): void {
  const { days, gross, plannedReceipt } = tables;
  const receipts = tables.scheduledReceipts[part];
  const round = roundToGrid;
  const toPacks = packsCovering;
  const base = part * days;
  // The balance is snapped every bucket so fractional noise cannot build up over a long horizon
  // and order a phantom pack; whole-number balances skip the snapping (see roundQty).
  let available = onHand;
  for (let d = 0; d < days; d += 1) {
    const grossRequirement = round(gross[base + d]);
    gross[base + d] = grossRequirement;
    available = round(
      receipts === undefined ? available - grossRequirement : available + receipts[d] - grossRequirement,
    );
    const shortfall = safetyStock - available;
    let netRequirement = 0;
    if (shortfall > epsilon) {
      netRequirement = round(shortfall);
      const receipt = toPacks(netRequirement, packQty);
      plannedReceipt[base + d] = receipt;
      available = round(available + receipt);
    }
    if (record !== undefined) {
      record.net[d] = netRequirement;
      record.projectedAvailable[d] = available;
    }
  }
}
