import { fromDayNumber } from './date';
import { createNettingTables, netPartRow, type NettingRecord, type NettingTables } from './netting';
import { BEFORE_HORIZON, PlanInputError, buildPlanModel, requireDate, type PlanModel } from './plan-model';
import { registerGrossRows } from './plan-gross';
import { roundQty } from './quantity';
import type { PartPlan, PastDueRelease, PlanBucket, PlanInput, PlanResult } from './types';

export { BomCycleError } from './bom';
export { PlanInputError } from './plan-model';
export { grossDemandByDay, weeklyTotals } from './plan-demand';

/*
 * Conventions of the engine (one bucket = one working day of the plant calendar):
 * - Independent demand is the build sequence of units not yet built (the caller leaves built units
 *   out: their parts were backflushed): a slot's qty is a gross requirement of its model on the
 *   slot's date. A slot dated before `from` is a unit still to build, past due: it counts in the
 *   first bucket. Slots after `to` are outside the horizon, and a slot dated on a non-working day
 *   counts in the next working day's bucket (it cannot be built earlier than the line runs); if
 *   that day lies after `to` it drops out too.
 * - On-hand counts at the start of the first bucket; a scheduled receipt dated before `from` is
 *   late and counted in the first bucket, one on a non-working day in the next working bucket.
 * - Planned receipts are lot-for-lot rounded up to whole packs; the planned release lies
 *   leadTimeDays working days before the receipt. A release that would fall before the first
 *   bucket is past due: it is listed with its computed date and in no bucket.
 * - Dependent demand of a component is the parent's planned release × qtyPer × (1 + scrap %),
 *   using the lines effective on the release date. Past-due releases are exploded with the lines
 *   effective on their computed date and their components are needed now: in the first bucket.
 * - Quantities are snapped to 1e-9 (see quantity.ts); only planned receipts are rounded to packs.
 */

interface PastDueEntry {
  dayNumber: number;
  qty: number;
}

/** Accumulates the gross requirements of the models from the build sequence. */
function loadSequence(input: PlanInput, model: PlanModel, tables: NettingTables): void {
  const { days, gross } = tables;
  const { sequence } = input;
  for (let row = 0; row < sequence.length; row += 1) {
    const slot = sequence[row];
    const part = model.indexOf.get(slot.model);
    const day = model.dayNumberOf(slot.date);
    if (part === undefined || day === undefined || !Number.isFinite(slot.qty)) {
      const where = `Sequence slot ${row + 1} (${slot.date} #${slot.sequence})`;
      if (part === undefined)
        throw new PlanInputError(`${where} builds model ${slot.model}, which is not in the part list`);
      if (!Number.isFinite(slot.qty)) throw new PlanInputError(`${where}: quantity must be a finite number`);
      requireDate(day, slot.date, where);
    }
    let bucket = model.bucketOf(day as number);
    if (bucket === BEFORE_HORIZON && days > 0) bucket = 0;
    if (bucket >= 0) gross[(part as number) * days + bucket] += slot.qty;
  }
}

/** Places open receipts in their buckets, late ones in the first. */
function loadScheduledReceipts(input: PlanInput, model: PlanModel, tables: NettingTables): void {
  const { days, scheduledReceipts } = tables;
  input.scheduledReceipts.forEach((receipt, row) => {
    const where = `Scheduled receipt ${row + 1} (${receipt.partNumber} on ${receipt.date})`;
    const part = model.indexOf.get(receipt.partNumber);
    if (part === undefined) throw new PlanInputError(`${where} is for a part that is not in the part list`);
    if (!Number.isFinite(receipt.qty)) throw new PlanInputError(`${where}: quantity must be a finite number`);
    let bucket = model.bucketOf(requireDate(model.dayNumberOf(receipt.date), receipt.date, where));
    if (bucket === BEFORE_HORIZON && days > 0) bucket = 0;
    if (bucket < 0) return;
    const receiptsOfPart = (scheduledReceipts[part] ??= new Float64Array(days));
    receiptsOfPart[bucket] += receipt.qty;
  });
}

/** Offsets the part's planned receipts by its lead time into releases; early ones go past due. */
function offsetReleases(model: PlanModel, tables: NettingTables, part: number): PastDueEntry[] {
  const { days, plannedReceipt, plannedRelease } = tables;
  const leadTime = model.leadTimeDays[part];
  const base = part * days;
  const pastDue: PastDueEntry[] = [];
  for (let d = 0; d < days; d += 1) {
    const receipt = plannedReceipt[base + d];
    if (receipt === 0) continue;
    const release = d - leadTime;
    if (release >= 0) {
      plannedRelease[base + release] = roundQty(plannedRelease[base + release] + receipt);
    } else {
      // Buckets are consecutive working days, so stepping back from the first one is exact.
      pastDue.push({ dayNumber: model.workingDayBeforeStart(-release), qty: receipt });
    }
  }
  return pastDue;
}

/** Adds the parent's releases, through its effective BOM lines, to its components' gross requirements. */
function explodeReleases(model: PlanModel, tables: NettingTables, parent: number, pastDue: PastDueEntry[]): void {
  const { days, gross, plannedRelease } = tables;
  const { lineStart, lineComponent, lineFactor, lineFrom, lineTo, dayNumbers } = model;
  const parentBase = parent * days;
  for (let line = lineStart[parent]; line < lineStart[parent + 1]; line += 1) {
    const factor = lineFactor[line];
    if (factor === 0) continue;
    const componentBase = lineComponent[line] * days;
    const effectiveFrom = lineFrom[line];
    const effectiveTo = lineTo[line];
    const alwaysEffective = effectiveFrom === -Infinity && effectiveTo === Infinity;
    for (let d = 0; d < days; d += 1) {
      const release = plannedRelease[parentBase + d];
      if (release === 0) continue;
      if (!alwaysEffective && (dayNumbers[d] < effectiveFrom || dayNumbers[d] > effectiveTo)) continue;
      gross[componentBase + d] += release * factor;
    }
    for (const entry of pastDue) {
      if (entry.dayNumber < effectiveFrom || entry.dayNumber > effectiveTo) continue;
      gross[componentBase] += entry.qty * factor;
    }
  }
}

function bucketsOf(model: PlanModel, tables: NettingTables, part: number): PlanBucket[] {
  const { days, gross, plannedReceipt, plannedRelease } = tables;
  const record: NettingRecord = { projectedAvailable: new Float64Array(days), net: new Float64Array(days) };
  netPartRow(tables, part, model.onHand[part], model.safetyStock[part], model.packQty[part], record);
  const receipts = tables.scheduledReceipts[part];
  const base = part * days;
  const buckets = new Array<PlanBucket>(days);
  for (let d = 0; d < days; d += 1) {
    buckets[d] = {
      date: model.days[d],
      gross: gross[base + d],
      scheduledReceipts: receipts === undefined ? 0 : roundQty(receipts[d]),
      projectedAvailable: record.projectedAvailable[d],
      net: record.net[d],
      plannedReceipt: plannedReceipt[base + d],
      plannedRelease: plannedRelease[base + d],
    };
  }
  return buckets;
}

/*
 * Bucket objects (parts × days of them) cost more than the whole explosion and netting, and most
 * callers read one part or a few, so each part builds its buckets on first read. `buckets` is an
 * own enumerable accessor: JSON.stringify, spreading, structuredClone and deep-equality all see
 * it like a plain array property, and assigning to it replaces it.
 */
function partPlanWithLazyBuckets(
  partNumber: string,
  lowLevelCode: number,
  pastDue: PastDueRelease[],
  build: () => PlanBucket[],
): PartPlan {
  let buckets: PlanBucket[] | undefined;
  return {
    partNumber,
    lowLevelCode,
    get buckets(): PlanBucket[] {
      buckets ??= build();
      return buckets;
    },
    set buckets(value: PlanBucket[]) {
      buckets = value;
    },
    pastDue,
  };
}

/**
 * Time-phased MRP over the working days from `input.from` to `input.to`: explodes the build
 * sequence level by level through the BOM and nets every part against on-hand, scheduled
 * receipts and safety stock. Throws PlanInputError for unusable input, BomCycleError for a cycle.
 */
export function computePlan(input: PlanInput): PlanResult {
  const model = buildPlanModel(input);
  const days = model.days.length;
  const tables = createNettingTables(input.parts.length, days);
  loadSequence(input, model, tables);
  loadScheduledReceipts(input, model, tables);

  const pastDueByPart = new Array<PastDueEntry[]>(input.parts.length);
  for (const part of model.levelOrder) {
    netPartRow(tables, part, model.onHand[part], model.safetyStock[part], model.packQty[part]);
    const pastDue = offsetReleases(model, tables, part);
    pastDueByPart[part] = pastDue;
    explodeReleases(model, tables, part, pastDue);
  }

  const parts = new Map<string, PartPlan>();
  input.parts.forEach((part, index) => {
    const pastDue: PastDueRelease[] = pastDueByPart[index].map((entry) => ({
      date: fromDayNumber(entry.dayNumber),
      qty: entry.qty,
    }));
    parts.set(
      part.partNumber,
      partPlanWithLazyBuckets(part.partNumber, model.lowLevelCode[index], pastDue, () =>
        bucketsOf(model, tables, index),
      ),
    );
  });
  const result: PlanResult = { days: model.days, parts };
  registerGrossRows(result, (partNumber) => {
    const index = model.indexOf.get(partNumber);
    return index === undefined ? undefined : tables.gross.subarray(index * days, (index + 1) * days);
  });
  return result;
}
