import { createAppContext, demoUsers, mountInApp } from './helpers';
import { afterEach, describe, expect, it } from 'vitest';
import { getISOWeek, getISOWeekYear } from 'date-fns';
import { weeklyTotals } from '@shared/domain/plan-demand';
import type { DemandResponse } from '@shared/schemas/horizon';
import HorizonTable from '@/components/HorizonTable.vue';
import { demandTablePage } from '@shared/domain/demand-table';
import { demandColumns, labelledColumns } from '@/components/horizon-presentation';

// A demand response across the 2009/2010 year boundary, as GET /api/demand sends it (every
// horizon day a key of byDay). The quantities are arbitrary: the checks below are ISO week
// labels from the standard and conservation of quantity, not specific totals.
const days = ['2009-12-28', '2009-12-29', '2009-12-30', '2009-12-31', '2010-01-04', '2010-01-05'];
const demand: DemandResponse = {
  days,
  sequenceEnds: null,
  rows: [
    {
      partNumber: 'TNK-R60',
      supplierCode: 'SRM',
      uom: 'H87',
      total: 44,
      byDay: { '2009-12-28': 8, '2009-12-29': 7, '2009-12-30': 0, '2009-12-31': 9, '2010-01-04': 12, '2010-01-05': 8 },
    },
    {
      partNumber: 'WIR-25-BK',
      supplierCode: 'BHC',
      uom: 'MTR',
      total: 151.75,
      byDay: {
        '2009-12-28': 37.5,
        '2009-12-29': 37.25,
        '2009-12-30': 0,
        '2009-12-31': 0,
        '2010-01-04': 40,
        '2010-01-05': 37,
      },
    },
  ],
};

function isoWeekOf(day: string): string {
  const [year, month, date] = day.split('-').map(Number);
  const local = new Date(year!, month! - 1, date!);
  return `${getISOWeekYear(local)}-W${String(getISOWeek(local)).padStart(2, '0')}`;
}

function cellTexts(row: Element): string[] {
  return [...row.querySelectorAll('.cell')].map((cell) => cell.textContent?.trim() ?? '');
}

async function mountTable(bucket: 'day' | 'week') {
  const context = await createAppContext({ user: demoUsers.buyer, path: '/' });
  const table = demandTablePage(demand, { bucket, page: 1, pageSize: 50, stackBy: 'supplier' });
  const wrapper = await mountInApp(HorizonTable, context, {
    props: {
      columns: labelledColumns(table.buckets, bucket),
      rows: table.rows,
      totals: { byBucket: table.bucketTotals, grand: table.grandTotal },
      sort: { prop: null, order: null },
      bucket,
      loading: false,
      emptyText: 'No demand',
    },
  });
  return { wrapper, table };
}

describe('demandColumns', () => {
  it('groups working days into ISO 8601 weeks in date order, labelled YYYY-Www', () => {
    const columns = demandColumns(days, 'week');

    // ISO 8601-1:2019 week dates: 2009-12-31 falls in 2009-W53 and 2010-01-04 opens 2010-W01
    // (values from memory, re-derived from the first-Thursday rule) — cross-checked against
    // the date-fns reference implementation.
    expect(columns.map((column) => column.label)).toEqual(['2009-W53', '2010-W01']);
    expect(columns.map((column) => column.label)).toEqual([...new Set(days.map(isoWeekOf))]);
    expect(columns.map((column) => column.days)).toEqual([days.slice(0, 4), days.slice(4)]);
  });

  it('keeps one column per working day in day mode', () => {
    expect(demandColumns(days, 'day').map((column) => column.key)).toEqual(days);
  });
});

describe('HorizonTable', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
  });

  it('shows one column per ISO week with the sums of the shared weeklyTotals', async () => {
    const { wrapper } = await mountTable('week');

    const header = cellTexts(wrapper.get('.el-table__header-wrapper tr').element);
    expect(header.slice(2, 4).map((text) => text.slice(0, 8))).toEqual(['2009-W53', '2010-W01']);
    const bodyRows = wrapper.findAll('.el-table__body-wrapper tbody tr');
    for (const [index, row] of demand.rows.entries()) {
      const weeks = weeklyTotals(row.byDay);
      const cells = cellTexts(bodyRows[index]!.element);
      expect(cells[0]).toBe(row.partNumber);
      expect(cells.slice(2, 4).map(Number)).toEqual([weeks['2009-W53'], weeks['2010-W01']]);
    }
  });

  it('conserves quantity per unit: week cells add up to each row total and the footer to the day sums of each unit', async () => {
    const { table, wrapper } = await mountTable('week');
    const dayTotal = (week: string[], uom: string) =>
      demand.rows
        .filter((row) => row.uom === uom)
        .reduce((sum, row) => sum + week.reduce((inner, day) => inner + row.byDay[day]!, 0), 0);

    for (const row of table.rows) {
      const weekSum = Object.values(row.byBucket).reduce((sum, qty) => sum + qty, 0);
      expect(weekSum).toBeCloseTo(row.total, 9);
    }
    // Pieces and metres are summed apart, never into one number.
    expect(table.bucketTotals['2009-W53']!.map((total) => total.uom)).toEqual(['H87', 'MTR']);
    expect(table.bucketTotals['2009-W53']![0]!.qty).toBeCloseTo(dayTotal(days.slice(0, 4), 'H87'), 9);
    expect(table.bucketTotals['2009-W53']![1]!.qty).toBeCloseTo(dayTotal(days.slice(0, 4), 'MTR'), 9);
    expect(table.bucketTotals['2010-W01']![1]!.qty).toBeCloseTo(dayTotal(days.slice(4), 'MTR'), 9);
    expect(table.grandTotal.map((total) => total.qty)).toEqual([dayTotal(days, 'H87'), dayTotal(days, 'MTR')]);
    // The footer shows one decimal per unit, so it may differ from the exact sum by half a tenth.
    const footer = wrapper.get('.el-table__footer-wrapper tr');
    const lines = (cell: number) =>
      [...footer.element.querySelectorAll('.cell')][cell]!.querySelectorAll('.horizon-table__unit-totals > span');
    const shown = (text: string | null) => Number((text ?? '').replace(/,/g, '').split(' ')[0]);
    expect(cellTexts(footer.element)[0]).toBe('Total');
    for (const [cell, week] of [
      [2, days.slice(0, 4)],
      [3, days.slice(4)],
      [4, days],
    ] as const) {
      const [pieces, metres] = [...lines(cell)].map((line) => line.textContent);
      expect(pieces).toMatch(/ pcs$/);
      expect(metres).toMatch(/ m$/);
      expect(Math.abs(shown(pieces!) - dayTotal([...week], 'H87'))).toBeLessThanOrEqual(0.05 + 1e-9);
      expect(Math.abs(shown(metres!) - dayTotal([...week], 'MTR'))).toBeLessThanOrEqual(0.05 + 1e-9);
    }
  });

  it('leaves a day without demand blank rather than writing 0', async () => {
    const { wrapper } = await mountTable('day');

    const firstRow = cellTexts(wrapper.get('.el-table__body-wrapper tbody tr').element);
    // Columns: part, supplier, then the six days; 2009-12-30 is the third day and has no demand.
    expect(firstRow[4]).toBe('');
    expect(firstRow[2]).toBe('8');
  });

  it('asks to open the drill-down when a part is clicked', async () => {
    const { wrapper } = await mountTable('day');

    await wrapper.get('.el-table__body-wrapper tbody tr button').trigger('click');

    expect(wrapper.emitted('open-part')).toEqual([['TNK-R60']]);
  });
});
