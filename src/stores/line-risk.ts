import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import type { LineRiskReport, ShortageDto } from '@shared/schemas/line-risk';
import * as lineRiskApi from '@/api/line-risk';
import type { LineRiskRange } from '@/api/line-risk';
import { useLatestRequest } from './latest-request';

interface FetchOptions {
  /** A refresh after a live change: keep the figures on screen until the new ones arrive. */
  quiet?: boolean;
}

export const useLineRiskStore = defineStore('line-risk', () => {
  const report = ref<LineRiskReport | null>(null);
  const range = ref<LineRiskRange | null>(null);
  const { loading, error, run } = useLatestRequest();
  /** When the figures were last replaced because the server announced a planning change. */
  const liveUpdatedAt = ref<Date | null>(null);

  /** Loads the report for a horizon; a failure is kept in `error`. */
  function fetchReport(next: LineRiskRange, options: FetchOptions = {}): Promise<void> {
    return run(
      (signal) => lineRiskApi.getLineRisk(next, signal),
      (answer) => {
        report.value = answer;
        range.value = { ...next };
      },
      options,
    );
  }

  /** Re-reads the same horizon after a planning change, without a spinner. */
  async function refreshLive(): Promise<void> {
    if (!range.value) return;
    await fetchReport(range.value, { quiet: true });
    if (!error.value) liveUpdatedAt.value = new Date();
  }

  const shortages = computed<ShortageDto[]>(() => report.value?.shortages ?? []);
  /** Shortages that need the planner now: everything but those the normal release covers. */
  const alarms = computed<ShortageDto[]>(() => shortages.value.filter((shortage) => shortage.action !== 'release'));
  const partsInFrozenWindow = computed(() => alarms.value.filter((shortage) => shortage.inFrozenWindow).length);
  /** The alarm that hits first (the list comes sorted by action, then first short date). */
  const earliest = computed<ShortageDto | null>(
    () =>
      alarms.value.reduce<ShortageDto | null>(
        (first, shortage) => (!first || shortage.firstShortDate < first.firstShortDate ? shortage : first),
        null,
      ) ?? null,
  );

  return {
    report,
    range,
    loading,
    error,
    liveUpdatedAt,
    shortages,
    alarms,
    partsInFrozenWindow,
    earliest,
    fetchReport,
    refreshLive,
  };
});
