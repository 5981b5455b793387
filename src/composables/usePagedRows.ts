import { computed, ref, watch, type Ref } from 'vue';

type SortOrder = 'ascending' | 'descending' | null;

interface SortState {
  prop: string | null;
  order: SortOrder;
}

export const PAGE_SIZES = [50, 100, 200];

const collator = new Intl.Collator('en', { numeric: true });

/**
 * One page of a long list held in the browser, sorted across every page before it is cut (a table
 * of thousands of rows draws only the page shown). `keyOf` gives the sortable value of a column;
 * empty values sort last either way; `tieBreak` keeps rows of equal value in a stable order.
 */
export function usePagedRows<T>(
  rows: Ref<readonly T[]>,
  keyOf: (row: T, prop: string) => string | number | null,
  tieBreak: (a: T, b: T) => number,
) {
  const sort = ref<SortState>({ prop: null, order: null });
  const page = ref(1);
  const pageSize = ref(PAGE_SIZES[0]);

  const sorted = computed(() => {
    const { prop, order } = sort.value;
    if (!prop || !order) return rows.value;
    const direction = order === 'ascending' ? 1 : -1;
    const keyed = rows.value.map((row) => ({ row, key: keyOf(row, prop) }));
    keyed.sort((a, b) => {
      if (a.key === null || b.key === null) {
        return a.key === b.key ? tieBreak(a.row, b.row) : a.key === null ? 1 : -1;
      }
      const compared =
        typeof a.key === 'number' && typeof b.key === 'number'
          ? a.key - b.key
          : collator.compare(String(a.key), String(b.key));
      return compared * direction || tieBreak(a.row, b.row);
    });
    return keyed.map((entry) => entry.row);
  });

  const pageCount = computed(() => Math.max(1, Math.ceil(rows.value.length / pageSize.value)));
  // A reload that leaves fewer rows keeps the reader on the last page there is, not on an empty one.
  watch(pageCount, (count) => {
    if (page.value > count) page.value = count;
  });

  const paged = computed(() => sorted.value.slice((page.value - 1) * pageSize.value, page.value * pageSize.value));

  function onSortChange({ prop, order }: { prop: string | null; order: SortOrder }): void {
    sort.value = { prop: prop ?? null, order };
  }

  return { sort, page, pageSize, paged, onSortChange };
}
