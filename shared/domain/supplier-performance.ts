import { addWorkingDays, type WorkingCalendar } from './calendar';
import { addCalendarDays, isIsoDate } from './date';
import type { IsoDate, PlantCalendar } from './types';

/*
 * Supplier performance, per supplier and calendar month of the date first asked for.
 *
 * Two questions are kept apart, as delivery metrics keep "to request date" apart from "to commit
 * date" (SCOR model, delivery performance to customer request date / to commit date, and
 * "% orders delivered in full" — from memory):
 * - Did the supplier deliver what we first asked, when we first asked? On-time and fill rate are
 *   measured against the line's original request (`requested_qty`, `requested_date`), whatever the
 *   supplier answered later: asked 48, confirmed 36, delivered 36 fills 75 %.
 * - Did it keep its word? Promise-kept measures the same line against the supplier's answer
 *   (confirmed quantity and arrival date), beside the first two and never instead of them.
 *
 * On-time window: goods count as on time when they are received from `earlyToleranceDays` working
 * days before the requested arrival date to `lateToleranceDays` working days after it (supplier
 * terms; defaults 1 and 0). Early is not on time: goods nine days early take dock space and stock
 * the plan did not ask for.
 *
 * On-time (line count based): a line is on time when usable goods were received and every usable
 * receipt fell inside the window; it is early when one came before the window and late when one
 * came after it or nothing usable came at all. On-time rate = on-time lines ÷ measured lines.
 *
 * Fill rate (quantity based): Σ min(usable received, requested) ÷ Σ requested; an over-delivery on
 * one line never makes up for a short one elsewhere ("fill rate", the share of the quantity asked
 * that was delivered; Chopra & Meindl, Supply Chain Management, 6th ed., ch. 3 inventory metrics —
 * from memory). Timing is the on-time figure's business, so a late receipt still fills.
 *
 * Promise kept: of the lines the supplier answered, those whose usable quantity reached the
 * confirmed quantity with every usable receipt inside the same window around the confirmed arrival.
 *
 * Which lines are measured: lines of releases that are not cancelled, whose window has closed (its
 * last day is before `today`, the plant's current day). A promise is measured once its own window
 * has closed. Usable: receipts whose discrepancy adds to on-hand (not damaged, not the wrong part).
 *
 * Confirmation latency: hours from `sentAt` (the latest send, a resend restarts the clock) to
 * `confirmedAt` (the supplier's answer, a plain confirmation or a proposal), per release sent;
 * median and mean over the answered releases. Releases sent but never answered are counted as
 * unanswered and stay out of the latency figures. Releases never sent are not counted.
 *
 * Every rate is null when there is nothing to measure, never NaN.
 */
/** `YYYY-MM`, a calendar month. */
export type YearMonth = string;

const YEAR_MONTH = /^(\d{4})-(0[1-9]|1[0-2])$/;
const MS_PER_HOUR = 3_600_000;

/** True when `value` is a calendar month written `YYYY-MM` (year 0100 or later). */
export function isYearMonth(value: unknown): value is YearMonth {
  return typeof value === 'string' && YEAR_MONTH.test(value) && Number(value.slice(0, 4)) >= 100;
}

/** The month `YYYY-MM` a plant date falls in. */
export function monthOf(date: IsoDate): YearMonth {
  return date.slice(0, 7);
}

function monthIndex(month: YearMonth): number {
  return Number(month.slice(0, 4)) * 12 + Number(month.slice(5, 7)) - 1;
}

function monthFromIndex(index: number): YearMonth {
  return `${String(Math.floor(index / 12)).padStart(4, '0')}-${String((index % 12) + 1).padStart(2, '0')}`;
}

/** `month` moved by `months` (negative moves back). */
export function addMonths(month: YearMonth, months: number): YearMonth {
  return monthFromIndex(monthIndex(month) + months);
}

/** How many calendar months `from` through `to` spans, both included (0 or less when `to` is before `from`). */
export function monthSpan(from: YearMonth, to: YearMonth): number {
  return monthIndex(to) - monthIndex(from) + 1;
}

/** The first plant date of a month. */
export function firstDayOf(month: YearMonth): IsoDate {
  return `${month}-01`;
}

/** The last plant date of a month. */
export function lastDayOf(month: YearMonth): IsoDate {
  return addCalendarDays(firstDayOf(addMonths(month, 1)), -1);
}

/** One count at the dock against a line, its instant already turned into the plant's day. */
export interface PerformanceReceipt {
  qty: number;
  /** Plant date the goods were counted. */
  receivedOn: IsoDate;
  /** False for damaged goods and the wrong part. */
  usable: boolean;
}

/** What the supplier answered for a line. */
export interface PerformancePromise {
  qty: number;
  arrivalDate: IsoDate;
}

export interface PerformanceLine {
  supplierCode: string;
  /** What the release first asked, before any answer changed the line. */
  requestedQty: number;
  /** The arrival date first asked for. */
  requestedDate: IsoDate;
  /** The supplier's answer; null when it never answered. */
  promise: PerformancePromise | null;
  receipts: readonly PerformanceReceipt[];
}

/** A supplier's on-time window around a date, in working days. */
export interface DeliveryTolerance {
  earlyToleranceDays: number;
  lateToleranceDays: number;
}

/** Window of a supplier with no terms of its own: one working day early, none late. */
export const DEFAULT_TOLERANCE: DeliveryTolerance = { earlyToleranceDays: 1, lateToleranceDays: 0 };

export interface PerformanceRelease {
  supplierCode: string;
  /** Earliest requested date among the release's lines. */
  firstNeedDate: IsoDate;
  /** ISO instants; null when never sent / never answered. */
  sentAt: string | null;
  confirmedAt: string | null;
}

export interface PerformanceInput {
  from: YearMonth;
  to: YearMonth;
  /** The plant's current day; windows that have not closed before it are not measured yet. */
  today: IsoDate;
  calendar: PlantCalendar | WorkingCalendar;
  /** Tolerances by supplier code; a supplier missing here gets DEFAULT_TOLERANCE. */
  tolerances: ReadonlyMap<string, DeliveryTolerance>;
  /** Lines of releases that are not cancelled. */
  lines: readonly PerformanceLine[];
  /** Releases that are not cancelled. */
  releases: readonly PerformanceRelease[];
}

export interface SupplierMonthPerformance {
  supplierCode: string;
  month: YearMonth;
  lines: number;
  onTimeLines: number;
  earlyLines: number;
  lateLines: number;
  onTimeRate: number | null;
  requestedQty: number;
  filledQty: number;
  fillRate: number | null;
  promisedLines: number;
  promiseKeptLines: number;
  promiseKeptRate: number | null;
  releases: number;
  confirmedReleases: number;
  unansweredReleases: number;
  confirmationHoursMedian: number | null;
  confirmationHoursMean: number | null;
}

/** The days goods may arrive and count as on time for `date`: [date − early, date + late] in working days. */
export function onTimeWindow(
  date: IsoDate,
  tolerance: DeliveryTolerance,
  calendar: PlantCalendar | WorkingCalendar,
): { from: IsoDate; to: IsoDate } {
  return {
    from: addWorkingDays(date, -tolerance.earlyToleranceDays, calendar),
    to: addWorkingDays(date, tolerance.lateToleranceDays, calendar),
  };
}

export type ArrivalTiming = 'on-time' | 'early' | 'late';

/** How a line's usable receipts fell against a window; nothing usable received counts as late. */
export function arrivalTiming(
  receipts: readonly PerformanceReceipt[],
  window: { from: IsoDate; to: IsoDate },
): ArrivalTiming {
  const usable = receipts.filter((receipt) => receipt.usable);
  if (usable.length === 0 || usable.some((receipt) => receipt.receivedOn > window.to)) return 'late';
  return usable.some((receipt) => receipt.receivedOn < window.from) ? 'early' : 'on-time';
}

/** Usable quantity received against a line, whenever it came. */
export function usableReceived(receipts: readonly PerformanceReceipt[]): number {
  return receipts.reduce((sum, receipt) => (receipt.usable ? sum + receipt.qty : sum), 0);
}

/** Hours from sending a release to the supplier's answer; null when either instant is missing. */
export function confirmationHours(release: Pick<PerformanceRelease, 'sentAt' | 'confirmedAt'>): number | null {
  if (!release.sentAt || !release.confirmedAt) return null;
  const sent = Date.parse(release.sentAt);
  const answered = Date.parse(release.confirmedAt);
  if (Number.isNaN(sent) || Number.isNaN(answered)) return null;
  return (answered - sent) / MS_PER_HOUR;
}

/** Middle value of a list (mean of the two middle values for an even count); null for none. */
export function median(values: readonly number[]): number | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}

/** Arithmetic mean; null for none. */
export function mean(values: readonly number[]): number | null {
  if (values.length === 0) return null;
  return values.reduce((sum, value) => sum + value, 0) / values.length;
}

/** `part ÷ whole`, or null when the whole is zero (nothing to measure). */
export function ratio(part: number, whole: number): number | null {
  return whole > 0 ? part / whole : null;
}

interface Bucket {
  supplierCode: string;
  month: YearMonth;
  lines: number;
  onTimeLines: number;
  earlyLines: number;
  lateLines: number;
  requestedQty: number;
  filledQty: number;
  promisedLines: number;
  promiseKeptLines: number;
  releases: number;
  unansweredReleases: number;
  hours: number[];
}

function inRange(date: IsoDate, input: PerformanceInput): boolean {
  if (!isIsoDate(date)) return false;
  const month = monthOf(date);
  return month >= input.from && month <= input.to;
}

/** On-time, fill, promise kept and confirmation latency per supplier and month of the requested date; rows with nothing measured are left out. */
export function supplierPerformance(input: PerformanceInput): SupplierMonthPerformance[] {
  const buckets = new Map<string, Bucket>();
  const bucketOf = (supplierCode: string, date: IsoDate): Bucket => {
    const month = monthOf(date);
    const key = `${supplierCode}\u0000${month}`;
    let bucket = buckets.get(key);
    if (!bucket) {
      bucket = {
        supplierCode,
        month,
        lines: 0,
        onTimeLines: 0,
        earlyLines: 0,
        lateLines: 0,
        requestedQty: 0,
        filledQty: 0,
        promisedLines: 0,
        promiseKeptLines: 0,
        releases: 0,
        unansweredReleases: 0,
        hours: [],
      };
      buckets.set(key, bucket);
    }
    return bucket;
  };
  const toleranceOf = (code: string) => input.tolerances.get(code) ?? DEFAULT_TOLERANCE;

  for (const line of input.lines) {
    if (!inRange(line.requestedDate, input)) continue;
    const tolerance = toleranceOf(line.supplierCode);
    const window = onTimeWindow(line.requestedDate, tolerance, input.calendar);
    if (window.to >= input.today) continue;
    const bucket = bucketOf(line.supplierCode, line.requestedDate);
    const usable = usableReceived(line.receipts);
    const timing = arrivalTiming(line.receipts, window);
    bucket.lines += 1;
    if (timing === 'on-time') bucket.onTimeLines += 1;
    else if (timing === 'early') bucket.earlyLines += 1;
    else bucket.lateLines += 1;
    bucket.requestedQty += line.requestedQty;
    bucket.filledQty += Math.min(usable, line.requestedQty);

    if (!line.promise) continue;
    const promised = onTimeWindow(line.promise.arrivalDate, tolerance, input.calendar);
    if (promised.to >= input.today) continue;
    bucket.promisedLines += 1;
    if (usable >= line.promise.qty && arrivalTiming(line.receipts, promised) === 'on-time')
      bucket.promiseKeptLines += 1;
  }

  for (const release of input.releases) {
    if (!release.sentAt || !inRange(release.firstNeedDate, input) || release.firstNeedDate >= input.today) continue;
    const bucket = bucketOf(release.supplierCode, release.firstNeedDate);
    bucket.releases += 1;
    const hours = confirmationHours(release);
    if (hours === null) bucket.unansweredReleases += 1;
    else bucket.hours.push(hours);
  }

  return [...buckets.values()]
    .sort((a, b) =>
      a.supplierCode === b.supplierCode ? a.month.localeCompare(b.month) : a.supplierCode.localeCompare(b.supplierCode),
    )
    .map(({ hours, ...bucket }) => ({
      ...bucket,
      onTimeRate: ratio(bucket.onTimeLines, bucket.lines),
      fillRate: ratio(bucket.filledQty, bucket.requestedQty),
      promiseKeptRate: ratio(bucket.promiseKeptLines, bucket.promisedLines),
      confirmedReleases: hours.length,
      confirmationHoursMedian: median(hours),
      confirmationHoursMean: mean(hours),
    }));
}

export interface SupplierPerformanceSummary {
  supplierCode: string;
  months: number;
  lines: number;
  onTimeLines: number;
  earlyLines: number;
  lateLines: number;
  onTimeRate: number | null;
  requestedQty: number;
  filledQty: number;
  fillRate: number | null;
  promisedLines: number;
  promiseKeptLines: number;
  promiseKeptRate: number | null;
  releases: number;
  confirmedReleases: number;
  unansweredReleases: number;
  confirmationHoursMean: number | null;
}

const SUMMED = [
  'lines',
  'onTimeLines',
  'earlyLines',
  'lateLines',
  'requestedQty',
  'filledQty',
  'promisedLines',
  'promiseKeptLines',
  'releases',
  'confirmedReleases',
  'unansweredReleases',
] as const;

/**
 * One supplier's figures over the whole range, from its monthly rows. Rates are re-weighted from
 * the counts (on-time and promise kept by lines, fill rate by quantity, latency mean by answered
 * releases), never an average of monthly rates, so a quiet month weighs no more than its few lines.
 * A median cannot be rebuilt from monthly medians, so the summary carries the mean only.
 */
export function summarisePerformance(rows: readonly SupplierMonthPerformance[]): SupplierPerformanceSummary[] {
  const bySupplier = new Map<string, SupplierPerformanceSummary & { hoursTotal: number }>();
  for (const row of rows) {
    let total = bySupplier.get(row.supplierCode);
    if (!total) {
      total = {
        supplierCode: row.supplierCode,
        months: 0,
        lines: 0,
        onTimeLines: 0,
        earlyLines: 0,
        lateLines: 0,
        onTimeRate: null,
        requestedQty: 0,
        filledQty: 0,
        fillRate: null,
        promisedLines: 0,
        promiseKeptLines: 0,
        promiseKeptRate: null,
        releases: 0,
        confirmedReleases: 0,
        unansweredReleases: 0,
        confirmationHoursMean: null,
        hoursTotal: 0,
      };
      bySupplier.set(row.supplierCode, total);
    }
    total.months += 1;
    for (const key of SUMMED) total[key] += row[key];
    total.hoursTotal += (row.confirmationHoursMean ?? 0) * row.confirmedReleases;
  }
  return [...bySupplier.values()].map(({ hoursTotal, ...total }) => ({
    ...total,
    onTimeRate: ratio(total.onTimeLines, total.lines),
    fillRate: ratio(total.filledQty, total.requestedQty),
    promiseKeptRate: ratio(total.promiseKeptLines, total.promisedLines),
    confirmationHoursMean: ratio(hoursTotal, total.confirmedReleases),
  }));
}
