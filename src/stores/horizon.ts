import { defineStore } from 'pinia';
import { ref } from 'vue';
import { isoWeekKey } from '@shared/domain/calendar';
import { addCalendarDays, toDayNumber, weekdayOfDayNumber } from '@shared/domain/date';
import { weeklyTotals } from '@shared/domain/plan-demand';
import { roundQty } from '@shared/domain/quantity';
import type { DemandResponse, ForecastMailResponse, PlanResponse } from '@shared/schemas/planning';
import * as planningApi from '@/api/planning';
import type { DemandQuery } from '@/api/planning';
import { ApiError } from '@/api/http';
import { isAbort } from './latest-request';

interface FetchOptions {
  /** A refresh after a live change: keep the shown figures until the new ones arrive, no spinner. */
  quiet?: boolean;
}

export const useHorizonStore = defineStore('horizon', () => {
  const demand = ref<DemandResponse | null>(null);
  const demandQuery = ref<DemandQuery | null>(null);
  const loading = ref(false);
  const error = ref<ApiError | null>(null);

  const plan = ref<PlanResponse | null>(null);
  const planLoading = ref(false);
  const planError = ref<ApiError | null>(null);

  const exporting = ref(false);
  /** When the figures were last replaced because the server announced a planning change. */
  const liveUpdatedAt = ref<Date | null>(null);

  // Filters change faster than the server answers; only the latest request may land.
  let demandRequest: AbortController | null = null;
  let planRequest: AbortController | null = null;

  /** Loads the demand table for a horizon and supplier; a failure is kept in `error`. */
  async function fetchDemand(query: DemandQuery, options: FetchOptions = {}): Promise<void> {
    demandRequest?.abort();
    const controller = new AbortController();
    demandRequest = controller;
    if (!options.quiet) loading.value = true;
    error.value = null;
    try {
      const response = await planningApi.getDemand(query, controller.signal);
      demand.value = response;
      demandQuery.value = { ...query };
    } catch (cause) {
      if (isAbort(cause)) return;
      if (!(cause instanceof ApiError)) throw cause;
      error.value = cause;
    } finally {
      if (demandRequest === controller) {
        loading.value = false;
        demandRequest = null;
      }
    }
  }

  /** Loads one part's gross-to-net record; a failure is kept in `planError`. */
  async function fetchPlan(
    part: string,
    range: { from: string; to: string },
    options: FetchOptions = {},
  ): Promise<void> {
    planRequest?.abort();
    const controller = new AbortController();
    planRequest = controller;
    if (!options.quiet) {
      planLoading.value = true;
      if (plan.value?.part.partNumber !== part) plan.value = null;
    }
    planError.value = null;
    try {
      plan.value = await planningApi.getPlan(part, range, controller.signal);
    } catch (cause) {
      if (isAbort(cause)) return;
      if (!(cause instanceof ApiError)) throw cause;
      planError.value = cause;
      if (!options.quiet) plan.value = null;
    } finally {
      if (planRequest === controller) {
        planLoading.value = false;
        planRequest = null;
      }
    }
  }

  /** Forgets the drill-down when it closes, so reopening another part never flashes the old one. */
  function clearPlan(): void {
    planRequest?.abort();
    planRequest = null;
    plan.value = null;
    planError.value = null;
    planLoading.value = false;
  }

  /** Re-reads what is on screen after a planning change, without spinners or lost filters. */
  async function refreshLive(part: string | null): Promise<void> {
    const query = demandQuery.value;
    const jobs: Promise<void>[] = [];
    if (query) jobs.push(fetchDemand(query, { quiet: true }));
    if (part && query) jobs.push(fetchPlan(part, { from: query.from, to: query.to }, { quiet: true }));
    await Promise.all(jobs);
    if (!error.value) liveUpdatedAt.value = new Date();
  }

  /** Downloads the demand as CSV; resolves the file name, rethrows the ApiError for the view. */
  async function exportCsv(query: DemandQuery): Promise<string> {
    exporting.value = true;
    try {
      return await planningApi.downloadDemandCsv(query);
    } finally {
      exporting.value = false;
    }
  }

  const mailing = ref(false);

  /** E-mails the supplier its forecast; resolves what was queued, rethrows the ApiError for the view. */
  async function mailForecast(query: DemandQuery & { supplier: string }): Promise<ForecastMailResponse> {
    mailing.value = true;
    try {
      return await planningApi.sendForecastMail(query);
    } finally {
      mailing.value = false;
    }
  }

  return {
    demand,
    demandQuery,
    mailing,
    mailForecast,
    loading,
    error,
    plan,
    planLoading,
    planError,
    exporting,
    liveUpdatedAt,
    fetchDemand,
    fetchPlan,
    clearPlan,
    refreshLive,
    exportCsv,
  };
});

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
  total: number;
  byBucket: Record<string, number>;
}

/** The demand response reshaped into the buckets on screen, with column totals. */
export interface DemandTable {
  columns: DemandColumn[];
  rows: DemandTableRow[];
  totals: Record<string, number>;
  grandTotal: number;
}

const WEEKDAY_NAMES = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'];
const MONTH_NAMES = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** `Tue` for an ISO date (plant calendar days, so no time zone is involved). */
export function weekdayName(date: string): string {
  return WEEKDAY_NAMES[weekdayOfDayNumber(toDayNumber(date)) - 1]!;
}

/** `1 Dec` for an ISO date. */
export function shortDate(date: string): string {
  return `${Number(date.slice(8, 10))} ${MONTH_NAMES[Number(date.slice(5, 7)) - 1]}`;
}

function dayRangeCaption(days: string[]): string {
  const first = days[0]!;
  const last = days[days.length - 1]!;
  if (first === last) return shortDate(first);
  if (first.slice(0, 7) === last.slice(0, 7)) return `${Number(first.slice(8, 10))}–${shortDate(last)}`;
  return `${shortDate(first)} – ${shortDate(last)}`;
}

/** The columns for a list of working days, day by day or grouped into ISO weeks in date order. */
export function demandColumns(days: readonly string[], bucket: BucketSize): DemandColumn[] {
  if (bucket === 'day') {
    return days.map((day) => ({ key: day, label: weekdayName(day), caption: shortDate(day), days: [day] }));
  }
  const weeks = new Map<string, string[]>();
  for (const day of days) {
    const week = isoWeekKey(day);
    weeks.set(week, [...(weeks.get(week) ?? []), day]);
  }
  return [...weeks].map(([week, weekDays]) => ({
    key: week,
    label: week,
    caption: dayRangeCaption(weekDays),
    days: weekDays,
  }));
}

/** Reshapes GET /api/demand into the chosen buckets; weeks are summed by the shared weeklyTotals. */
export function demandTable(demand: DemandResponse, bucket: BucketSize): DemandTable {
  const columns = demandColumns(demand.days, bucket);
  const rows = demand.rows.map((row) => ({
    partNumber: row.partNumber,
    supplierCode: row.supplierCode,
    total: row.total,
    byBucket: bucket === 'day' ? row.byDay : weeklyTotals(row.byDay),
  }));
  const totals: Record<string, number> = {};
  for (const column of columns) {
    totals[column.key] = roundQty(rows.reduce((sum, row) => sum + (row.byBucket[column.key] ?? 0), 0));
  }
  const grandTotal = roundQty(rows.reduce((sum, row) => sum + row.total, 0));
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

/** Today's date on this computer's clock, as `YYYY-MM-DD`. */
export function localToday(now = new Date()): string {
  const pad = (value: number) => String(value).padStart(2, '0');
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`;
}

const QTY_FORMAT = new Intl.NumberFormat('en', { maximumFractionDigits: 3 });

/** A quantity for a dense table: blank for zero, grouped thousands, at most three decimals. */
export function formatQty(value: number): string {
  return value === 0 ? '' : QTY_FORMAT.format(value);
}

// A total across parts adds several units of measure, so one decimal is all it can usefully show.
const TOTAL_FORMAT = new Intl.NumberFormat('en', { maximumFractionDigits: 1 });

/** A sum across parts for a footer or a count line: always written, at most one decimal. */
export function formatTotal(value: number): string {
  return TOTAL_FORMAT.format(roundQty(value));
}
