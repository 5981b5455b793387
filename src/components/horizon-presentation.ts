import { isoWeekKey } from '@shared/domain/calendar';
import { addCalendarDays } from '@shared/domain/date';
import { weeklyTotals } from '@shared/domain/plan-demand';
import { totalsByUnit, type UnitTotal } from '@shared/domain/unit-totals';
import type { DemandResponse, PlanResponse } from '@shared/schemas/horizon';
import { formatDayMonth, formatDayRange, formatWeekday } from '@/format';

/** How the horizon is cut into columns: one per working day, or one per ISO 8601 week. */
export type BucketSize = 'day' | 'week';

/** The horizon lengths a buyer can pick, in weeks. */
export const HORIZON_WEEKS = [1, 2, 4, 6, 8, 12] as const;
export const DEFAULT_HORIZON_WEEKS = 4;

/** One column of the demand table: a working day or an ISO week holding working days. */
export interface DemandColumn {
  key: string;
  /** `Tue` for a day, `2026-W49` for a week. */
  label: string;
  /** `1 Dec` for a day, `1–4 Dec` (first to last working day shown) for a week. */
  caption: string;
  days: string[];
}

export interface DemandTableRow {
  partNumber: string;
  supplierCode: string | null;
  uom: string;
  total: number;
  byBucket: Record<string, number>;
}

/** The demand response reshaped into the buckets on screen, with column totals. */
export interface DemandTable {
  columns: DemandColumn[];
  rows: DemandTableRow[];
  /** Per column, one sum per unit of measure: quantities in different units are never added. */
  totals: Record<string, UnitTotal[]>;
  grandTotal: UnitTotal[];
}

/** The columns for a list of working days, day by day or grouped into ISO weeks in date order. */
export function demandColumns(days: readonly string[], bucket: BucketSize): DemandColumn[] {
  if (bucket === 'day') {
    return days.map((day) => ({ key: day, label: formatWeekday(day), caption: formatDayMonth(day), days: [day] }));
  }
  const weeks = new Map<string, string[]>();
  for (const day of days) {
    const week = isoWeekKey(day);
    weeks.set(week, [...(weeks.get(week) ?? []), day]);
  }
  return [...weeks].map(([week, weekDays]) => ({
    key: week,
    label: week,
    caption: formatDayRange(weekDays[0]!, weekDays[weekDays.length - 1]!),
    days: weekDays,
  }));
}

/** Reshapes GET /api/demand into the chosen buckets; weeks are summed by the shared weeklyTotals. */
export function demandTable(demand: DemandResponse, bucket: BucketSize): DemandTable {
  const columns = demandColumns(demand.days, bucket);
  const rows = demand.rows.map((row) => ({
    partNumber: row.partNumber,
    supplierCode: row.supplierCode,
    uom: row.uom,
    total: row.total,
    byBucket: bucket === 'day' ? row.byDay : weeklyTotals(row.byDay),
  }));
  const totals: Record<string, UnitTotal[]> = {};
  for (const column of columns) {
    totals[column.key] = totalsByUnit(
      rows,
      (row) => row.byBucket[column.key] ?? 0,
      (row) => row.uom,
    );
  }
  const grandTotal = totalsByUnit(
    rows,
    (row) => row.total,
    (row) => row.uom,
  );
  return { columns, rows, totals, grandTotal };
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

/** A sort the buyer asked for by clicking a column head; null order keeps the server's order. */
export interface DemandSort {
  prop: 'partNumber' | 'supplierCode' | 'total' | null;
  order: 'ascending' | 'descending' | null;
}

/** The rows in the asked order (parts without a supplier last either way), stable for ties. */
export function sortDemandRows(rows: readonly DemandTableRow[], sort: DemandSort): readonly DemandTableRow[] {
  const { prop, order } = sort;
  if (!prop || !order) return rows;
  const sign = order === 'ascending' ? 1 : -1;
  return [...rows].sort((a, b) => {
    if (prop === 'total') return sign * (a.total - b.total);
    const left = a[prop];
    const right = b[prop];
    if (left === right) return 0;
    if (left === null) return 1;
    if (right === null) return -1;
    return sign * left.localeCompare(right);
  });
}
