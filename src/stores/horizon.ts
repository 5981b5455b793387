import { defineStore } from 'pinia';
import { ref, shallowRef } from 'vue';
import type { DemandTableResponse, ForecastMailResponse, PlanResponse } from '@shared/schemas/horizon';
import * as horizonApi from '@/api/horizon';
import type { DemandQuery, DemandTableRequest } from '@/api/horizon';
import { useLatestRequest } from './latest-request';

interface FetchOptions {
  /** A refresh after a live change: keep the shown figures until the new ones arrive, no spinner. */
  quiet?: boolean;
}

export const useHorizonStore = defineStore('horizon', () => {
  // One page of the table, replaced whole on every answer: no deep reactivity over its rows.
  const table = shallowRef<DemandTableResponse | null>(null);
  const tableRequest = ref<DemandTableRequest | null>(null);
  // Filters change faster than the server answers; only the latest request may land.
  const { loading, error, run: runTable } = useLatestRequest();

  const plan = ref<PlanResponse | null>(null);
  const { loading: planLoading, error: planError, run: runPlan, cancel: cancelPlan } = useLatestRequest();

  const exporting = ref(false);
  /** When the figures were last replaced because the server announced a planning change. */
  const liveUpdatedAt = ref<Date | null>(null);

  /** Loads one page of the demand table; a failure is kept in `error`. */
  function fetchTable(request: DemandTableRequest, options: FetchOptions = {}): Promise<void> {
    return runTable(
      (signal) => horizonApi.getDemandTable(request, signal),
      (answer) => {
        // A live refresh that found nothing changed on this page leaves the screen untouched:
        // no table layout, no chart redraw.
        const unchanged = options.quiet && table.value && JSON.stringify(table.value) === JSON.stringify(answer);
        if (!unchanged) table.value = answer;
        tableRequest.value = { ...request };
      },
      options,
    );
  }

  /** Loads one part's gross-to-net record; a failure is kept in `planError`. */
  async function fetchPlan(
    part: string,
    range: { from: string; to: string },
    options: FetchOptions = {},
  ): Promise<void> {
    if (!options.quiet && plan.value?.part.partNumber !== part) plan.value = null;
    await runPlan(
      (signal) => horizonApi.getPlan(part, range, signal),
      (answer) => {
        plan.value = answer;
      },
      options,
    );
    // A failed quiet refresh keeps the record on screen; a failed first load shows none.
    if (planError.value && !options.quiet) plan.value = null;
  }

  /** Forgets the drill-down when it closes, so reopening another part never flashes the old one. */
  function clearPlan(): void {
    cancelPlan();
    plan.value = null;
  }

  /** Re-reads what is on screen after a planning change, without spinners or lost filters. */
  async function refreshLive(part: string | null): Promise<void> {
    const request = tableRequest.value;
    const jobs: Promise<void>[] = [];
    if (request) jobs.push(fetchTable(request, { quiet: true }));
    if (part && request) jobs.push(fetchPlan(part, { from: request.from, to: request.to }, { quiet: true }));
    await Promise.all(jobs);
    if (!error.value) liveUpdatedAt.value = new Date();
  }

  /** Downloads the demand as CSV; resolves the file name, rethrows the ApiError for the view. */
  async function exportCsv(query: DemandQuery): Promise<string> {
    exporting.value = true;
    try {
      return await horizonApi.downloadDemandCsv(query);
    } finally {
      exporting.value = false;
    }
  }

  const mailing = ref(false);

  /** E-mails the supplier its forecast; resolves what was queued, rethrows the ApiError for the view. */
  async function mailForecast(query: DemandQuery & { supplier: string }): Promise<ForecastMailResponse> {
    mailing.value = true;
    try {
      return await horizonApi.sendForecastMail(query);
    } finally {
      mailing.value = false;
    }
  }

  return {
    table,
    tableRequest,
    mailing,
    mailForecast,
    loading,
    error,
    plan,
    planLoading,
    planError,
    exporting,
    liveUpdatedAt,
    fetchTable,
    fetchPlan,
    clearPlan,
    refreshLive,
    exportCsv,
  };
});
