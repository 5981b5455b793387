import { isoWeekKey } from './calendar';
import { roundQty } from './quantity';
import { totalsByUnit, type UnitTotal } from './unit-totals';

/** How the horizon is cut into columns: one per working day, or one per ISO 8601 week. */
export type BucketSize = 'day' | 'week';

/** One column of the demand table: a working day, or an ISO week holding the working days shown. */
export interface DemandBucket {
  /** The day itself, or the ISO week as `2026-W49`. */
  key: string;
  days: string[];
}

/** What the demand table is cut from: gross demand of bought parts per working day. */
export interface DailyDemand {
  days: readonly string[];
  rows: readonly DailyDemandRow[];
}

export interface DailyDemandRow {
  partNumber: string;
  supplierCode: string | null;
  uom: string;
  total: number;
  byDay: Readonly<Record<string, number>>;
}

export interface DemandTableRow {
  partNumber: string;
  supplierCode: string | null;
  uom: string;
  total: number;
  byBucket: Record<string, number>;
}

export const DEMAND_SORT_PROPS = ['partNumber', 'supplierCode', 'total'] as const;
export const SORT_ORDERS = ['ascending', 'descending'] as const;

/** A sort asked for by a column head; no prop or order keeps the report's own order. */
export interface DemandSort {
  prop: (typeof DEMAND_SORT_PROPS)[number] | null;
  order: (typeof SORT_ORDERS)[number] | null;
}

/** One band of the demand chart; `rest` counts the smaller bands summed into the last one. */
export interface DemandStack {
  name: string | null;
  values: number[];
  total: number;
  rest: number;
}

export type StackBy = 'supplier' | 'part';

/** Beyond this many bands the colours repeat and a legend stops helping; the rest is summed. */
export const MAX_DEMAND_STACKS = 7;

export interface DemandTableQuery {
  bucket: BucketSize;
  /** Part numbers containing this text, any case; blank for all. */
  search?: string;
  sort?: DemandSort;
  /** 1-based; a page past the end gives the last one. */
  page: number;
  pageSize: number;
  stackBy: StackBy;
}

/** One page of the demand table, with what the whole filtered table adds up to. */
export interface DemandTablePage {
  buckets: DemandBucket[];
  rows: DemandTableRow[];
  page: number;
  pageSize: number;
  /** Rows the search lets through, on every page. */
  matched: number;
  /** Rows before the search. */
  partsWithDemand: number;
  /** The part whose number is the search text, any case (the only match failing that), else null. */
  exactMatch: string | null;
  /** Per bucket key, one sum per unit of measure over every matched row. */
  bucketTotals: Record<string, UnitTotal[]>;
  grandTotal: UnitTotal[];
  /** Units among the matched rows, the most used first: the chart draws one at a time. */
  units: string[];
  /** Chart bands per unit of measure, largest first, over every matched row. */
  stacks: Record<string, DemandStack[]>;
}

/** The columns for a list of working days, day by day or grouped into ISO weeks in date order. */
export function demandBuckets(days: readonly string[], bucket: BucketSize): DemandBucket[] {
  if (bucket === 'day') return days.map((day) => ({ key: day, days: [day] }));
  const weeks = new Map<string, string[]>();
  for (const day of days) {
    const week = isoWeekKey(day);
    const weekDays = weeks.get(week);
    if (weekDays) weekDays.push(day);
    else weeks.set(week, [day]);
  }
  return [...weeks].map(([key, weekDays]) => ({ key, days: weekDays }));
}

/** The rows in the asked order (parts without a supplier last either way), stable for ties. */
export function sortDemandRows<T extends Pick<DemandTableRow, 'partNumber' | 'supplierCode' | 'total'>>(
  rows: readonly T[],
  sort: DemandSort | undefined,
): readonly T[] {
  if (!sort?.prop || !sort.order) return rows;
  const { prop } = sort;
  const sign = sort.order === 'ascending' ? 1 : -1;
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

/** Sums a row's days into the buckets, by position: `bucketOfDay[i]` is the bucket of `days[i]`. */
function bucketValues(
  row: DailyDemandRow,
  days: readonly string[],
  bucketOfDay: readonly number[],
  bucketCount: number,
): number[] {
  const values = new Array<number>(bucketCount).fill(0);
  for (let day = 0; day < days.length; day += 1) {
    const qty = row.byDay[days[day]!];
    if (qty) values[bucketOfDay[day]!] += qty;
  }
  return values.map(roundQty);
}

/** The largest `MAX_DEMAND_STACKS - 1` bands of one unit, the rest summed into one. */
function rankStacks(stacks: Iterable<DemandStack>): DemandStack[] {
  const ranked = [...stacks].sort((a, b) => b.total - a.total);
  if (ranked.length <= MAX_DEMAND_STACKS) return ranked;
  const shown = ranked.slice(0, MAX_DEMAND_STACKS - 1);
  const rest = ranked.slice(MAX_DEMAND_STACKS - 1);
  return [
    ...shown,
    {
      name: null,
      values: shown[0]!.values.map((_, index) => roundQty(rest.reduce((sum, stack) => sum + stack.values[index]!, 0))),
      total: roundQty(rest.reduce((sum, stack) => sum + stack.total, 0)),
      rest: rest.length,
    },
  ];
}

/** What a search over the daily demand adds up to, whatever page or order is shown of it. */
export interface DemandTableSummary extends Omit<DemandTablePage, 'rows' | 'page' | 'pageSize'> {
  days: readonly string[];
  /** Index into `buckets` of each of `days`. */
  bucketOfDay: number[];
  matchedRows: readonly DailyDemandRow[];
}

/**
 * Searches the daily demand and sums every row the search lets through into the buckets, per unit
 * of measure (pieces and kilograms never mix): the table's totals and the chart's bands.
 */
export function summariseDemandTable(
  demand: DailyDemand,
  query: Pick<DemandTableQuery, 'bucket' | 'search' | 'stackBy'>,
): DemandTableSummary {
  const buckets = demandBuckets(demand.days, query.bucket);
  const bucketIndex = new Map(buckets.map((bucket, index) => [bucket.key, index]));
  const bucketOfDay = demand.days.map((day) => bucketIndex.get(query.bucket === 'day' ? day : isoWeekKey(day))!);

  const needle = query.search?.trim().toLowerCase() ?? '';
  const matchedRows = needle ? demand.rows.filter((row) => row.partNumber.toLowerCase().includes(needle)) : demand.rows;
  const exact = needle ? matchedRows.find((row) => row.partNumber.toLowerCase() === needle) : undefined;
  const exactMatch = exact?.partNumber ?? (needle && matchedRows.length === 1 ? matchedRows[0]!.partNumber : null);

  const sums = new Map<string, number[]>();
  const rowCounts = new Map<string, number>();
  const bands = new Map<string, Map<string, DemandStack>>();
  for (const row of matchedRows) {
    const values = bucketValues(row, demand.days, bucketOfDay, buckets.length);
    const unitSums = sums.get(row.uom) ?? new Array<number>(buckets.length).fill(0);
    values.forEach((qty, index) => (unitSums[index] += qty));
    sums.set(row.uom, unitSums);
    rowCounts.set(row.uom, (rowCounts.get(row.uom) ?? 0) + 1);

    const name = query.stackBy === 'supplier' ? row.supplierCode : row.partNumber;
    const unitBands = bands.get(row.uom) ?? new Map<string, DemandStack>();
    bands.set(row.uom, unitBands);
    const band = unitBands.get(name ?? '') ?? {
      name,
      values: new Array<number>(buckets.length).fill(0),
      total: 0,
      rest: 0,
    };
    values.forEach((qty, index) => (band.values[index] += qty));
    band.total += row.total;
    unitBands.set(name ?? '', band);
  }
  const bucketTotals: Record<string, UnitTotal[]> = {};
  buckets.forEach((bucket, index) => {
    bucketTotals[bucket.key] = totalsByUnit(
      [...sums],
      ([, values]) => values[index]!,
      ([uom]) => uom,
    );
  });
  const stacks: Record<string, DemandStack[]> = {};
  for (const [uom, unitBands] of bands) {
    for (const band of unitBands.values()) {
      band.values = band.values.map(roundQty);
      band.total = roundQty(band.total);
    }
    stacks[uom] = rankStacks(unitBands.values());
  }

  return {
    buckets,
    days: demand.days,
    bucketOfDay,
    matchedRows,
    matched: matchedRows.length,
    partsWithDemand: demand.rows.length,
    exactMatch,
    bucketTotals,
    grandTotal: totalsByUnit(
      matchedRows,
      (row) => row.total,
      (row) => row.uom,
    ),
    units: [...rowCounts].sort((a, b) => b[1] - a[1]).map(([uom]) => uom),
    stacks,
  };
}

/**
 * One page of a searched table, its rows summed into the buckets. `sorted` is the summary's
 * matched rows in the asked order, when the caller kept them from an earlier page.
 */
export function pageOfDemandTable(
  summary: DemandTableSummary,
  query: Pick<DemandTableQuery, 'sort' | 'page' | 'pageSize'>,
  sorted: readonly DailyDemandRow[] = sortDemandRows(summary.matchedRows, query.sort),
): DemandTablePage {
  const { days: _days, bucketOfDay, matchedRows: _matched, ...totals } = summary;
  const pageCount = Math.max(1, Math.ceil(sorted.length / query.pageSize));
  const page = Math.min(Math.max(1, query.page), pageCount);
  const start = (page - 1) * query.pageSize;
  const rows = sorted.slice(start, start + query.pageSize).map((row) => {
    const values = bucketValues(row, summary.days, bucketOfDay, summary.buckets.length);
    return {
      partNumber: row.partNumber,
      supplierCode: row.supplierCode,
      uom: row.uom,
      total: row.total,
      byBucket: Object.fromEntries(summary.buckets.map((bucket, index) => [bucket.key, values[index]!])),
    };
  });
  return { ...totals, rows, page, pageSize: query.pageSize };
}

/**
 * Cuts the daily demand into one page of the table the buyer asked for: searched, sorted and
 * bucketed, with the totals and chart bands of every row the search lets through, so a plant of
 * tens of thousands of parts sends a browser only what it shows.
 */
export function demandTablePage(demand: DailyDemand, query: DemandTableQuery): DemandTablePage {
  return pageOfDemandTable(summariseDemandTable(demand, query), query);
}
