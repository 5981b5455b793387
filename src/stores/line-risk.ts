import { defineStore } from 'pinia';
import { computed, reactive, ref } from 'vue';
import type { LineRiskReport, ShortageDto, SlotAtRiskDto } from '@shared/schemas/line-risk';
import type { ApiError } from '@/api/http';
import * as lineRiskApi from '@/api/line-risk';
import type { LineRiskRange } from '@/api/line-risk';
import { useLatestRequest } from './latest-request';

/** The largest page the slots route gives. */
const SLOTS_PAGE = 500;

/** Every unit that lacks one short part, fetched when asked for (the report lists the first few). */
export interface PartSlotsState {
  slots: SlotAtRiskDto[] | null;
  loading: boolean;
  error: ApiError | null;
}

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
  const slotsByPart = reactive<Record<string, PartSlotsState>>({});
  const slotRequests = new Map<string, ReturnType<typeof useLatestRequest>>();

  /** Loads the report for a horizon; a failure is kept in `error`. */
  function fetchReport(next: LineRiskRange, options: FetchOptions = {}): Promise<void> {
    return run(
      (signal) => lineRiskApi.getLineRisk(next, signal),
      (answer) => {
        // A live refresh keeps a part's full list of units open: it is fetched again for the new report.
        const open = options.quiet ? Object.keys(slotsByPart).filter((part) => slotsByPart[part]!.slots) : [];
        report.value = answer;
        range.value = { ...next };
        forgetSlots();
        for (const partNumber of open) {
          const shortage = answer.shortages.find((candidate) => candidate.partNumber === partNumber);
          if (shortage && shortage.slotsAtRisk.length < shortage.slotsAtRiskCount) void fetchAllSlots(partNumber);
        }
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

  /** Loads every unit that lacks `partNumber` over the report's horizon, a page at a time; a failure is kept in the part's entry. */
  function fetchAllSlots(partNumber: string): Promise<void> {
    const horizon = range.value;
    if (!horizon) return Promise.resolve();
    let request = slotRequests.get(partNumber);
    if (!request) {
      request = useLatestRequest();
      slotRequests.set(partNumber, request);
      // The entry shows the request's own loading and error: refs unwrap inside reactive().
      slotsByPart[partNumber] = reactive({ slots: null, loading: request.loading, error: request.error });
    }
    return request.run(
      async (signal) => {
        const slots: SlotAtRiskDto[] = [];
        for (let total = Infinity; slots.length < total;) {
          const page = await lineRiskApi.getPartSlots(
            partNumber,
            horizon,
            { offset: slots.length, limit: SLOTS_PAGE },
            signal,
          );
          if (page.slots.length === 0) break;
          slots.push(...page.slots);
          total = page.total;
        }
        return slots;
      },
      (slots) => {
        slotsByPart[partNumber]!.slots = slots;
      },
    );
  }

  /** A new report: the units fetched for the old one may no longer be those at risk. */
  function forgetSlots(): void {
    for (const request of slotRequests.values()) request.cancel();
    slotRequests.clear();
    for (const partNumber of Object.keys(slotsByPart)) delete slotsByPart[partNumber];
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
    slotsByPart,
    shortages,
    alarms,
    partsInFrozenWindow,
    earliest,
    fetchReport,
    refreshLive,
    fetchAllSlots,
  };
});
