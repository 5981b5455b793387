import { isoWeekKey } from './calendar';
import { grossRowOf } from './plan-gross';
import { roundQty } from './quantity';
import type { IsoDate, PlanResult, PlanningPart } from './types';

/** Gross demand of one bought part by day, as published by GET /api/demand. */
export interface DemandRow {
  partNumber: string;
  supplierCode: string | null;
  /** Unit of measure of every quantity in the row (UN/ECE Recommendation 20 code). */
  uom: string;
  total: number;
  /** Every horizon day as a key, zero where nothing is needed. */
  byDay: Record<IsoDate, number>;
}

/** The body of GET /api/demand. */
export interface DemandReport {
  days: IsoDate[];
  rows: DemandRow[];
}

export interface DemandOptions {
  /** Only parts bought from this supplier. */
  supplierCode?: string;
  /** Keep parts with no demand in the horizon (left out by default). */
  includeZero?: boolean;
}

// Code-point order, independent of the host locale; parts without a supplier sort last.
function compareText(a: string | null, b: string | null): number {
  if (a === b) return 0;
  if (a === null) return 1;
  if (b === null) return -1;
  return a < b ? -1 : 1;
}

/** Gross requirements of bought parts per day from a computed plan, ordered by supplier then part. */
export function grossDemandByDay(
  result: PlanResult,
  parts: readonly (PlanningPart & { uom?: string })[],
  options: DemandOptions = {},
): DemandReport {
  const rows: DemandRow[] = [];
  for (const part of parts) {
    if (part.source !== 'buy') continue;
    const supplierCode = part.supplierCode ?? null;
    if (options.supplierCode !== undefined && supplierCode !== options.supplierCode) continue;
    const gross = grossRowOf(result, part.partNumber);
    if (!gross) continue;
    const byDay: Record<IsoDate, number> = {};
    let total = 0;
    result.days.forEach((date, index) => {
      byDay[date] = gross[index];
      total += gross[index];
    });
    total = roundQty(total);
    if (total === 0 && !options.includeZero) continue;
    rows.push({ partNumber: part.partNumber, supplierCode, uom: part.uom ?? 'H87', total, byDay });
  }
  rows.sort((a, b) => compareText(a.supplierCode, b.supplierCode) || compareText(a.partNumber, b.partNumber));
  return { days: result.days, rows };
}

/** Sums a by-day record into ISO 8601 weeks (`YYYY-Www` keys, in date order). */
export function weeklyTotals(byDay: Record<IsoDate, number>): Record<string, number> {
  const weeks: Record<string, number> = {};
  for (const date of Object.keys(byDay).sort()) {
    const week = isoWeekKey(date);
    weeks[week] = roundQty((weeks[week] ?? 0) + byDay[date]);
  }
  return weeks;
}
