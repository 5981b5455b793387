import { CircleCheck, View, Warning } from '@element-plus/icons-vue';
import { addMonths } from '@shared/domain/supplier-performance';
import { DEFAULT_PERFORMANCE_MONTHS } from '@shared/schemas/supplier-performance';

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
