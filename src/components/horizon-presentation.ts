import { addCalendarDays } from '@shared/domain/date';
import { demandBuckets, type BucketSize, type DemandBucket, type DemandStack } from '@shared/domain/demand-table';
import { weeklyTotals } from '@shared/domain/plan-demand';
import type { PlanResponse } from '@shared/schemas/horizon';
import { formatDayMonth, formatDayRange, formatWeekday } from '@/format';

export type { BucketSize, DemandSort, DemandTableRow } from '@shared/domain/demand-table';

/** The horizon lengths a buyer can pick, in weeks. */
export const HORIZON_WEEKS = [1, 2, 4, 6, 8, 12] as const;
export const DEFAULT_HORIZON_WEEKS = 4;

/** One column of the demand table: a working day or an ISO week holding working days. */
export interface DemandColumn extends DemandBucket {
  /** `Tue` for a day, `2026-W49` for a week. */
  label: string;
  /** `1 Dec` for a day, `1–4 Dec` (first to last working day shown) for a week. */
  caption: string;
}

/** Names the buckets of a table or chart as their column heads show them. */
export function labelledColumns(buckets: readonly DemandBucket[], bucket: BucketSize): DemandColumn[] {
  return buckets.map(({ key, days }) =>
    bucket === 'day'
      ? { key, days, label: formatWeekday(key), caption: formatDayMonth(key) }
      : { key, days, label: key, caption: formatDayRange(days[0]!, days[days.length - 1]!) },
  );
}

/** The columns for a list of working days, day by day or grouped into ISO weeks in date order. */
export function demandColumns(days: readonly string[], bucket: BucketSize): DemandColumn[] {
  return labelledColumns(demandBuckets(days, bucket), bucket);
}

/** A chart band's legend name: the supplier or part, or what the summed smaller bands are. */
export function stackName(stack: DemandStack, stackBy: 'supplier' | 'part'): string {
  if (stack.rest > 0) return stackBy === 'supplier' ? `Other suppliers (${stack.rest})` : `Other parts (${stack.rest})`;
  return stack.name ?? 'No supplier';
}

/** One part's plan in the chosen buckets, as chart series. */
export interface PlanSeries {
  columns: DemandColumn[];
  gross: number[];
  scheduledReceipts: number[];
  plannedReceipts: number[];
  /** At the end of each bucket: what is left on the last working day of a week. */
  projectedAvailable: number[];
}

/** The chart series of a part's gross-to-net record, summed into weeks where asked. */
export function planSeries(plan: PlanResponse, bucket: BucketSize): PlanSeries {
  const columns = demandColumns(
    plan.buckets.map((row) => row.date),
    bucket,
  );
  const byDate = new Map(plan.buckets.map((row) => [row.date, row]));
  const sumOf = (field: 'gross' | 'scheduledReceipts' | 'plannedReceipt') => {
    const byDay = Object.fromEntries(plan.buckets.map((row) => [row.date, row[field]]));
    const summed = bucket === 'day' ? byDay : weeklyTotals(byDay);
    return columns.map((column) => summed[column.key] ?? 0);
  };
  return {
    columns,
    gross: sumOf('gross'),
    scheduledReceipts: sumOf('scheduledReceipts'),
    plannedReceipts: sumOf('plannedReceipt'),
    projectedAvailable: columns.map((column) => byDate.get(column.days[column.days.length - 1]!)!.projectedAvailable),
  };
}

/**
 * The dates a "next N weeks" view asks for: from today through the day before the same weekday
 * N weeks on, so the horizon spans exactly N × 7 calendar days.
 */
export function horizonRange(today: string, weeks: number): { from: string; to: string } {
  return { from: today, to: addCalendarDays(today, weeks * 7 - 1) };
}

/** Rows of the demand table shown at once; the rest are a page away, so a large plant opens fast. */
export const HORIZON_PAGE_SIZE = 50;
