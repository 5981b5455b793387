import { describe, expect, it } from 'vitest';
import { nextTick, ref } from 'vue';
import { usePagedRows } from '@/composables/usePagedRows';

interface Row {
  id: string;
  qty: number;
  where: string | null;
}

const rowsOf = (count: number): Row[] =>
  Array.from({ length: count }, (_, index) => ({
    id: `P-${String(index + 1).padStart(3, '0')}`,
    qty: (index * 37) % 101,
    where: index % 3 === 0 ? null : `ST${(index % 7) + 1}`,
  }));

const keyOf = (row: Row, prop: string) => (prop === 'qty' ? row.qty : prop === 'where' ? row.where : row.id);
const byId = (a: Row, b: Row) => a.id.localeCompare(b.id);

describe('usePagedRows', () => {
  it('draws one page of 50 rows and moves to the next', () => {
    const rows = ref(rowsOf(120));
    const { page, paged } = usePagedRows(rows, keyOf, byId);
    expect(paged.value.map((row) => row.id)).toEqual(rows.value.slice(0, 50).map((row) => row.id));
    page.value = 3;
    expect(paged.value.map((row) => row.id)).toEqual(rows.value.slice(100, 120).map((row) => row.id));
  });

  it('sorts across every page before cutting one, numbers as numbers, ties by the tie-break', () => {
    const rows = ref(rowsOf(120));
    const { page, paged, onSortChange } = usePagedRows(rows, keyOf, byId);
    onSortChange({ prop: 'qty', order: 'descending' });
    // Checked against the platform's own sort of the whole list (Array.prototype.sort, ECMA-262).
    const expected = [...rows.value].sort((a, b) => b.qty - a.qty || a.id.localeCompare(b.id));
    expect(paged.value).toEqual(expected.slice(0, 50));
    page.value = 2;
    expect(paged.value).toEqual(expected.slice(50, 100));
  });

  it('puts empty values last in both directions', () => {
    const rows = ref(rowsOf(9));
    const { pageSize, paged, onSortChange } = usePagedRows(rows, keyOf, byId);
    pageSize.value = 100;
    onSortChange({ prop: 'where', order: 'ascending' });
    expect(paged.value.slice(-3).map((row) => row.where)).toEqual([null, null, null]);
    onSortChange({ prop: 'where', order: 'descending' });
    expect(paged.value.slice(-3).map((row) => row.where)).toEqual([null, null, null]);
    expect(paged.value[0]!.where).toBe('ST6');
  });

  it('keeps the reader on the last page there is when a reload leaves fewer rows', async () => {
    const rows = ref(rowsOf(200));
    const { page, paged } = usePagedRows(rows, keyOf, byId);
    page.value = 4;
    rows.value = rowsOf(60);
    await nextTick();
    expect(page.value).toBe(2);
    expect(paged.value).toHaveLength(10);
  });
});
