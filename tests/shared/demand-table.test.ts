import { getISOWeek, getISOWeekYear } from 'date-fns';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { demandBuckets, demandTablePage, MAX_DEMAND_STACKS, type DailyDemand } from '../../shared/domain/demand-table';

// ISO 8601-1:2019 week dates, checked against the date-fns reference implementation rather than
// against values of our own.
function isoWeekOf(day: string): string {
  const [year, month, date] = day.split('-').map(Number);
  const local = new Date(year!, month! - 1, date!);
  return `${getISOWeekYear(local)}-W${String(getISOWeek(local)).padStart(2, '0')}`;
}

const dayArbitrary = fc
  .integer({ min: 0, max: 3000 })
  .map((offset) => new Date(Date.UTC(2024, 0, 1) + offset * 86_400_000).toISOString().slice(0, 10));

/** A daily demand report with a sorted, distinct list of days and rows in two or three units. */
const demandArbitrary = fc
  .uniqueArray(dayArbitrary, { minLength: 1, maxLength: 25 })
  .chain((unsorted) => {
    const days = [...unsorted].sort();
    const row = fc.record({
      supplierCode: fc.constantFrom('SA', 'SB', 'SC', null),
      uom: fc.constantFrom('H87', 'KGM', 'MTR'),
      quantities: fc.array(
        fc.integer({ min: 0, max: 400 }).map((tenths) => tenths / 10),
        {
          minLength: days.length,
          maxLength: days.length,
        },
      ),
    });
    return fc.tuple(fc.constant(days), fc.array(row, { maxLength: 40 }));
  })
  .map(([days, rows]): DailyDemand => ({
    days,
    rows: rows.map((row, index) => {
      const byDay = Object.fromEntries(days.map((day, at) => [day, row.quantities[at]!]));
      const total = Math.round(row.quantities.reduce((sum, qty) => sum + qty, 0) * 1e6) / 1e6;
      return {
        partNumber: `P-${String(index).padStart(3, '0')}`,
        supplierCode: row.supplierCode,
        uom: row.uom,
        total,
        byDay,
      };
    }),
  }));

describe('demandBuckets', () => {
  it('puts each working day in its ISO 8601 week, weeks in date order', () => {
    fc.assert(
      fc.property(demandArbitrary, ({ days }) => {
        const buckets = demandBuckets(days, 'week');
        expect(buckets.flatMap((bucket) => bucket.days)).toEqual(days);
        for (const bucket of buckets) for (const day of bucket.days) expect(bucket.key).toBe(isoWeekOf(day));
        expect(buckets.map((bucket) => bucket.key)).toEqual([...new Set(days.map(isoWeekOf))]);
      }),
    );
  });
});

describe('demandTablePage', () => {
  it('conserves quantity: each row, column total and chart band adds up to the days it holds, per unit', () => {
    fc.assert(
      fc.property(demandArbitrary, fc.constantFrom('day' as const, 'week' as const), (demand, bucket) => {
        const page = demandTablePage(demand, { bucket, page: 1, pageSize: 1000, stackBy: 'supplier' });
        for (const row of page.rows) {
          const source = demand.rows.find((candidate) => candidate.partNumber === row.partNumber)!;
          for (const column of page.buckets) {
            const days = column.days.reduce((sum, day) => sum + source.byDay[day]!, 0);
            expect(row.byBucket[column.key]).toBeCloseTo(days, 6);
          }
        }
        for (const uom of ['H87', 'KGM', 'MTR']) {
          const rows = demand.rows.filter((row) => row.uom === uom);
          const grand = page.grandTotal.find((total) => total.uom === uom)?.qty ?? 0;
          expect(grand).toBeCloseTo(
            rows.reduce((sum, row) => sum + row.total, 0),
            6,
          );
          page.buckets.forEach((column, index) => {
            const expected = rows.reduce(
              (sum, row) => sum + column.days.reduce((inner, day) => inner + row.byDay[day]!, 0),
              0,
            );
            const total = page.bucketTotals[column.key]!.find((entry) => entry.uom === uom)?.qty ?? 0;
            expect(total).toBeCloseTo(expected, 6);
            const bands = page.stacks[uom] ?? [];
            expect(bands.reduce((sum, band) => sum + band.values[index]!, 0)).toBeCloseTo(expected, 6);
          });
          expect((page.stacks[uom] ?? []).length).toBeLessThanOrEqual(MAX_DEMAND_STACKS);
        }
      }),
    );
  });

  it('pages the searched and sorted rows: every match exactly once across pages, in order', () => {
    fc.assert(
      fc.property(
        demandArbitrary,
        fc.integer({ min: 1, max: 12 }),
        fc.constantFrom('', '0', 'p-01', 'P-0'),
        (demand, pageSize, search) => {
          const ask = (page: number) =>
            demandTablePage(demand, {
              bucket: 'day',
              search,
              sort: { prop: 'total', order: 'descending' },
              page,
              pageSize,
              stackBy: 'supplier',
            });
          const first = ask(1);
          const pages = Math.max(1, Math.ceil(first.matched / pageSize));
          const seen = Array.from({ length: pages }, (_, index) => ask(index + 1).rows).flat();
          const expected = demand.rows.filter((row) => row.partNumber.toLowerCase().includes(search.toLowerCase()));
          expect(seen.map((row) => row.partNumber).sort()).toEqual(expected.map((row) => row.partNumber).sort());
          for (let index = 1; index < seen.length; index += 1)
            expect(seen[index - 1]!.total).toBeGreaterThanOrEqual(seen[index]!.total);
          // A page past the end gives the last one.
          expect(ask(pages + 5).page).toBe(pages);
        },
      ),
    );
  });

  it('names the part a search stands for: its exact number in any case, else the only match', () => {
    const demand: DailyDemand = {
      days: ['2026-12-01'],
      rows: ['AB-1', 'AB-10', 'CD-2'].map((partNumber) => ({
        partNumber,
        supplierCode: 'SA',
        uom: 'H87',
        total: 1,
        byDay: { '2026-12-01': 1 },
      })),
    };
    const exact = (search: string) =>
      demandTablePage(demand, { bucket: 'day', search, page: 1, pageSize: 10, stackBy: 'supplier' }).exactMatch;

    expect(exact('ab-1')).toBe('AB-1');
    expect(exact('cd')).toBe('CD-2');
    expect(exact('ab')).toBeNull();
    expect(exact('')).toBeNull();
  });
});
