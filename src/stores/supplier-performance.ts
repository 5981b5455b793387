import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import { summarisePerformance, type SupplierPerformanceSummary } from '@shared/domain/supplier-performance';
import type { SupplierMonthPerformanceDto } from '@shared/schemas/supplier-performance';
import * as supplierPerformanceApi from '@/api/supplier-performance';
import type { PerformanceFilter } from '@/api/supplier-performance';
import { useLatestRequest } from './latest-request';

export const useSupplierPerformanceStore = defineStore('supplier-performance', () => {
  const rows = ref<SupplierMonthPerformanceDto[]>([]);
  const filter = ref<PerformanceFilter | null>(null);
  const { loading, error, run } = useLatestRequest();

  /** Loads the figures for a range (and supplier); a failure is kept in `error`. */
  function fetchPerformance(next: PerformanceFilter): Promise<void> {
    return run(
      (signal) => supplierPerformanceApi.getSupplierPerformance(next, signal),
      (answer) => {
        rows.value = answer;
        filter.value = { ...next };
      },
    );
  }

  /** Each supplier over the whole range, re-weighted from the monthly counts, with its name. */
  const summaries = computed<(SupplierPerformanceSummary & { supplierName: string })[]>(() => {
    const names = new Map(rows.value.map((row) => [row.supplierCode, row.supplierName]));
    return summarisePerformance(rows.value).map((summary) => ({
      ...summary,
      supplierName: names.get(summary.supplierCode) ?? summary.supplierCode,
    }));
  });
  const measuredLines = computed(() => rows.value.reduce((sum, row) => sum + row.lines, 0));

  return { rows, filter, loading, error, summaries, measuredLines, fetchPerformance };
});
