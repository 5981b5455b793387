import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import type { BuildResponse, CloseDayResponse, Kit } from '@shared/schemas/builds';
import type { SequenceDay, SequenceUnit } from '@shared/schemas/sequence';
import * as buildsApi from '@/api/builds';
import { ApiError } from '@/api/http';
import { newIdempotencyKey } from '@/api/idempotency-key';
import { useLatestRequest } from './latest-request';

/** Whether a failed report may have reached the server, so a retry must carry the same key. */
function answerUnknown(cause: unknown): boolean {
  return !(cause instanceof ApiError) || cause.status === 0 || cause.status >= 500;
}

function sumQty(units: readonly SequenceUnit[]): number {
  return units.reduce((sum, unit) => sum + unit.qty, 0);
}

/** The end of the line: the day's units, reporting them built, undoing, closing the day, and kits. */
export const useBuildsStore = defineStore('builds', () => {
  /** The day chosen on screen; null follows the server's today. */
  const chosenDate = ref<string | null>(null);
  const today = ref<string | null>(null);
  const day = ref<SequenceDay | null>(null);
  const loaded = ref(false);
  const { loading, error, run } = useLatestRequest();
  const kit = ref<Kit | null>(null);
  const kitRequest = useLatestRequest();
  const dayKits = ref<Kit[]>([]);
  const dayKitsRequest = useLatestRequest();
  const saving = ref(false);
  // The report still waiting for a definite answer: retrying it sends the same key, so a unit
  // whose first answer was lost is never backflushed twice.
  let unanswered: { serial: string; key: string } | null = null;

  const units = computed(() => day.value?.units ?? []);
  const date = computed(() => day.value?.date ?? chosenDate.value ?? today.value);
  const totalCount = computed(() => sumQty(units.value));
  const builtCount = computed(() => sumQty(units.value.filter((unit) => unit.status === 'built')));
  const toBuildCount = computed(() => totalCount.value - builtCount.value);
  /** The unit the line builds next: the first in sequence order not yet built. */
  const nextUnit = computed(() => units.value.find((unit) => unit.status !== 'built') ?? null);
  /** The unit reported built most recently, the one "Undo last" takes back. */
  const lastBuilt = computed(() =>
    units.value
      .filter((unit) => unit.status === 'built' && unit.builtAt)
      .reduce<SequenceUnit | null>((last, unit) => (!last || unit.builtAt! > last.builtAt! ? unit : last), null),
  );

  /** Loads the day's units; `quiet` keeps them on screen while a live refresh runs. */
  function loadDay(options: { quiet?: boolean } = {}): Promise<void> {
    return run(
      (signal) => buildsApi.fetchLineDay(chosenDate.value, signal),
      (answer) => {
        today.value = answer.today;
        day.value = answer.day;
        loaded.value = true;
      },
      options,
    );
  }

  function chooseDate(next: string | null): Promise<void> {
    chosenDate.value = next;
    return loadDay();
  }

  function applyStatus(result: BuildResponse): void {
    if (!day.value) return;
    day.value = {
      ...day.value,
      units: day.value.units.map((unit) =>
        unit.serial === result.serial ? { ...unit, status: result.status, builtAt: result.builtAt } : unit,
      ),
    };
  }

  /** The serial as the sequence spells it, when a scanner sent it in another case. */
  function knownSerial(typed: string): string {
    const serial = typed.trim();
    const match = units.value.find((unit) => unit.serial.toLowerCase() === serial.toLowerCase());
    return match?.serial ?? serial;
  }

  /**
   * Reports one unit built with a fresh Idempotency-Key, or with the key of the same serial's
   * report whose answer never came. Rethrows the ApiError (409 `already_built`, 404…) for the view.
   */
  async function report(typed: string): Promise<BuildResponse> {
    const serial = knownSerial(typed);
    const key = unanswered?.serial === serial ? unanswered.key : newIdempotencyKey();
    unanswered = { serial, key };
    try {
      const result = await buildsApi.reportBuilt(serial, key);
      unanswered = null;
      applyStatus(result);
      return result;
    } catch (cause) {
      if (!answerUnknown(cause)) unanswered = null;
      throw cause;
    }
  }

  /** Undoes a build with its reason; rethrows the ApiError (403 outside the line's own 30 minutes). */
  async function undo(serial: string, reason: string): Promise<BuildResponse> {
    saving.value = true;
    try {
      const result = await buildsApi.undoBuild(serial, reason);
      applyStatus(result);
      return result;
    } finally {
      saving.value = false;
    }
  }

  /** Reports every unit of the shown day not yet built as built, then reloads the day. */
  async function closeDay(): Promise<CloseDayResponse> {
    if (!date.value) throw new Error('no day is shown');
    saving.value = true;
    try {
      const result = await buildsApi.closeDay(date.value);
      await loadDay({ quiet: true });
      return result;
    } finally {
      saving.value = false;
    }
  }

  /** Marks a unit started: its kit went to the line. */
  async function start(serial: string): Promise<BuildResponse> {
    const result = await buildsApi.startUnit(serial);
    applyStatus(result);
    if (kit.value?.serial === serial) kit.value = { ...kit.value, status: result.status };
    return result;
  }

  /** Loads one unit's kit; a failure is kept in `kitRequest.error`. */
  function loadKit(serial: string): Promise<void> {
    kit.value = null;
    return kitRequest.run(
      (signal) => buildsApi.fetchKit(serial, signal),
      (answer) => {
        kit.value = answer;
      },
    );
  }

  /** Loads the kit sheets of a whole day, in sequence order. */
  function loadDayKits(kitDate: string): Promise<void> {
    return dayKitsRequest.run(
      (signal) => buildsApi.fetchDayKits(kitDate, signal),
      (answer) => {
        dayKits.value = answer;
      },
    );
  }

  return {
    chosenDate,
    today,
    day,
    date,
    loaded,
    loading,
    error,
    saving,
    units,
    totalCount,
    builtCount,
    toBuildCount,
    nextUnit,
    lastBuilt,
    kit,
    kitLoading: kitRequest.loading,
    kitError: kitRequest.error,
    dayKits,
    dayKitsLoading: dayKitsRequest.loading,
    dayKitsError: dayKitsRequest.error,
    loadDay,
    chooseDate,
    report,
    undo,
    closeDay,
    start,
    loadKit,
    loadDayKits,
  };
});
