import { addCalendarDays, isIsoDate } from './date';
import type { IsoDate } from './types';

/*
 * Supplier performance, per supplier and calendar month.
 *
 * Which month: a release line belongs to the month of its need date (the day the plant asked for
 * the goods), whatever day it was released or received. A release belongs to the month of the
 * earliest need date among its lines, so a month's row speaks about what was due in that month.
 *
 * Which lines are measured: lines of releases that are not cancelled, whose need date falls in the
 * month and is over — before `today` (the plant's current day). A line due today is not yet
 * decided: goods may still arrive before the shift ends.
 *
 * Ordered quantity: what the supplier confirmed (`confirmedQty`), or the requested `qty` when the
 * supplier has not answered.
 *
 * Usable quantity: receipts whose discrepancy adds to on-hand (not `damaged`, not `wrong_part`),
 * received on or before the need date in plant time.
 *
 * On-time (line count based): a line is on time when its usable quantity received by the need
 * date reaches the ordered quantity; on-time rate = on-time lines ÷ measured lines. This follows
 * the usual "on-time delivery" measure — the share of deliveries received on or before the date
 * required (APICS Dictionary, "on-time delivery", from memory) — counted on time-and-in-full.
 *
 * Fill rate (quantity based): Σ min(usable received by need date, ordered) ÷ Σ ordered over the
 * measured lines; an over-delivery on one line never makes up for a short one elsewhere. The
 * usual definition is the share of the ordered quantity delivered (APICS Dictionary, "fill rate",
 * from memory); here "delivered" means usable and by the need date.
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

export interface PerformanceLine {
  supplierCode: string;
  needDate: IsoDate;
  /** Confirmed quantity, else the requested quantity. */
  orderedQty: number;
  receipts: readonly PerformanceReceipt[];
}

export interface PerformanceRelease {
  supplierCode: string;
  /** Earliest need date among the release's lines. */
  firstNeedDate: IsoDate;
  /** ISO instants; null when never sent / never answered. */
  sentAt: string | null;
  confirmedAt: string | null;
}

export interface PerformanceInput {
  from: YearMonth;
  to: YearMonth;
  /** The plant's current day; need dates from this day on are not measured yet. */
  today: IsoDate;
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
  onTimeRate: number | null;
  orderedQty: number;
  filledQty: number;
  fillRate: number | null;
  releases: number;
  confirmedReleases: number;
  unansweredReleases: number;
  confirmationHoursMedian: number | null;
  confirmationHoursMean: number | null;
}

/** Usable quantity of a line received on or before its need date. */
export function usableByNeedDate(line: Pick<PerformanceLine, 'needDate' | 'receipts'>): number {
  return line.receipts.reduce(
    (sum, receipt) => (receipt.usable && receipt.receivedOn <= line.needDate ? sum + receipt.qty : sum),
    0,
  );
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
  orderedQty: number;
  filledQty: number;
  releases: number;
  unansweredReleases: number;
  hours: number[];
}

function isMeasured(date: IsoDate, input: PerformanceInput): boolean {
  if (!isIsoDate(date) || date >= input.today) return false;
  const month = monthOf(date);
  return month >= input.from && month <= input.to;
}

/** On-time, fill rate and confirmation latency per supplier and month of need date; rows with nothing measured are left out. */
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
        orderedQty: 0,
        filledQty: 0,
        releases: 0,
        unansweredReleases: 0,
        hours: [],
      };
      buckets.set(key, bucket);
    }
    return bucket;
  };

  for (const line of input.lines) {
    if (!isMeasured(line.needDate, input)) continue;
    const bucket = bucketOf(line.supplierCode, line.needDate);
    const usable = usableByNeedDate(line);
    bucket.lines += 1;
    if (usable >= line.orderedQty) bucket.onTimeLines += 1;
    bucket.orderedQty += line.orderedQty;
    bucket.filledQty += Math.min(usable, line.orderedQty);
  }

  for (const release of input.releases) {
    if (!release.sentAt || !isMeasured(release.firstNeedDate, input)) continue;
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
    .map((bucket) => ({
      supplierCode: bucket.supplierCode,
      month: bucket.month,
      lines: bucket.lines,
      onTimeLines: bucket.onTimeLines,
      onTimeRate: ratio(bucket.onTimeLines, bucket.lines),
      orderedQty: bucket.orderedQty,
      filledQty: bucket.filledQty,
      fillRate: ratio(bucket.filledQty, bucket.orderedQty),
      releases: bucket.releases,
      confirmedReleases: bucket.hours.length,
      unansweredReleases: bucket.unansweredReleases,
      confirmationHoursMedian: median(bucket.hours),
      confirmationHoursMean: mean(bucket.hours),
    }));
}

export interface SupplierPerformanceSummary {
  supplierCode: string;
  months: number;
  lines: number;
  onTimeLines: number;
  onTimeRate: number | null;
  orderedQty: number;
  filledQty: number;
  fillRate: number | null;
  releases: number;
  confirmedReleases: number;
  unansweredReleases: number;
  confirmationHoursMean: number | null;
}

/**
 * One supplier's figures over the whole range, from its monthly rows. Rates are re-weighted from
 * the counts (on-time by lines, fill rate by quantity, latency mean by answered releases), never an
 * average of monthly rates, so a quiet month weighs no more than its few lines. A median cannot be
 * rebuilt from monthly medians, so the summary carries the mean only.
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
        onTimeRate: null,
        orderedQty: 0,
        filledQty: 0,
        fillRate: null,
        releases: 0,
        confirmedReleases: 0,
        unansweredReleases: 0,
        confirmationHoursMean: null,
        hoursTotal: 0,
      };
      bySupplier.set(row.supplierCode, total);
    }
    total.months += 1;
    total.lines += row.lines;
    total.onTimeLines += row.onTimeLines;
    total.orderedQty += row.orderedQty;
    total.filledQty += row.filledQty;
    total.releases += row.releases;
    total.confirmedReleases += row.confirmedReleases;
    total.unansweredReleases += row.unansweredReleases;
    total.hoursTotal += (row.confirmationHoursMean ?? 0) * row.confirmedReleases;
  }
  return [...bySupplier.values()].map(({ hoursTotal, ...total }) => ({
    ...total,
    onTimeRate: ratio(total.onTimeLines, total.lines),
    fillRate: ratio(total.filledQty, total.orderedQty),
    confirmationHoursMean: ratio(hoursTotal, total.confirmedReleases),
  }));
}
