import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import { CircleCheck, View, Warning } from '@element-plus/icons-vue';
import { addMonths, summarisePerformance, type SupplierPerformanceSummary } from '@shared/domain/supplier-performance';
import { DEFAULT_PERFORMANCE_MONTHS, type SupplierMonthPerformanceDto } from '@shared/schemas/supplier-performance';
import * as performanceApi from '@/api/performance';
import type { PerformanceFilter } from '@/api/performance';
import { useLatestRequest } from './latest-request';

export const usePerformanceStore = defineStore('performance', () => {
  const rows = ref<SupplierMonthPerformanceDto[]>([]);
  const filter = ref<PerformanceFilter | null>(null);
  const { loading, error, run } = useLatestRequest();

  /** Loads the figures for a range (and supplier); a failure is kept in `error`. */
  function fetchPerformance(next: PerformanceFilter): Promise<void> {
    return run(async (signal) => {
      rows.value = await performanceApi.getSupplierPerformance(next, signal);
      filter.value = { ...next };
    });
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

// --- Presentation helpers shared by the view and its components ---

/** The default range: the current month and the five before it, as `YYYY-MM`. */
export function defaultMonthRange(today: string): [string, string] {
  const to = today.slice(0, 7);
  return [addMonths(to, -(DEFAULT_PERFORMANCE_MONTHS - 1)), to];
}

/*
 * Bands for reading a rate at a glance. Thresholds: common practice, no source — plants commonly
 * aim at 95 % and act below 85 %; change them here only.
 */
export const ON_TARGET_THRESHOLD = 0.95;
export const WATCH_THRESHOLD = 0.85;

export type RateBand = 'on-target' | 'watch' | 'act';

/** Which band a rate falls in; null when there was nothing to measure. */
export function rateBand(rate: number | null): RateBand | null {
  if (rate === null) return null;
  if (rate >= ON_TARGET_THRESHOLD) return 'on-target';
  return rate >= WATCH_THRESHOLD ? 'watch' : 'act';
}

export const BAND_WORDS: Record<RateBand, string> = { 'on-target': 'On target', watch: 'Watch', act: 'Act' };
export const BAND_ICONS = { 'on-target': CircleCheck, watch: View, act: Warning } as const;

/** `96.5 %`; an em dash when there was nothing to measure. */
export function formatRate(rate: number | null): string {
  return rate === null ? '—' : `${(Math.round(rate * 1000) / 10).toFixed(1)} %`;
}

/** `12.5 h`; an em dash when no release was answered. */
export function formatHours(hours: number | null): string {
  return hours === null ? '—' : `${(Math.round(hours * 10) / 10).toFixed(1)} h`;
}

const MONTH_FORMAT = new Intl.DateTimeFormat('en', { month: 'short', year: 'numeric', timeZone: 'UTC' });

/** `Mar 2026` for `2026-03`. */
export function monthLabel(month: string): string {
  return MONTH_FORMAT.format(new Date(`${month}-01T00:00:00Z`));
}
