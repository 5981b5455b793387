import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import type {
  ConfirmAnswer,
  Confirmation,
  ConfirmResult,
  Release,
  ReleaseJobSettings,
  ReleaseStatus,
  RunReleasesResponse,
} from '@shared/schemas/releases';
import * as confirmApi from '@/api/confirm';
import type { ConfirmSource } from '@/api/confirm';
import * as releasesApi from '@/api/releases';
import { ApiError } from '@/api/http';
import { useLatestRequest } from './latest-request';

/** What the list shows: one status (or all) and one release date (or all). */
export interface ReleasesFilter {
  status: ReleaseStatus | '';
  date: string;
}

/**
 * What a buyer can do with a release. `resend` mails a new link (the old one stops working);
 * `send-notice` tries the e-mail not yet taken by the mail server again, with the same link.
 */
export type ReleaseAction = 'accept' | 'resend' | 'cancel' | 'send-notice';

export const useReleasesStore = defineStore('releases', () => {
  const releases = ref<Release[]>([]);
  /** Exceptions are listed whatever the filter: they wait for the buyer. */
  const exceptions = ref<Release[]>([]);
  const loaded = ref(false);
  const { loading, error, run: runLoad } = useLatestRequest();
  const running = ref(false);
  const lastRun = ref<RunReleasesResponse | null>(null);
  /** Release numbers with an action in flight, so their buttons spin and refuse a second click. */
  const busyNumbers = ref(new Set<string>());
  const jobSettings = ref<ReleaseJobSettings | null>(null);

  let lastFilter: ReleasesFilter = { status: '', date: '' };

  /** Loads the filtered list and the open exceptions; a failure is kept in `error`. */
  function fetchReleases(filter: ReleasesFilter = lastFilter): Promise<void> {
    lastFilter = { ...filter };
    const query = { status: filter.status || undefined, date: filter.date || undefined };
    return runLoad(
      (signal) =>
        Promise.all([
          releasesApi.listReleases(query, signal),
          releasesApi.listReleases({ status: 'exception' }, signal),
        ]),
      ([list, open]) => {
        releases.value = list;
        exceptions.value = open;
        loaded.value = true;
      },
    );
  }

  /** Runs the releases of a date and reloads the list; rethrows the ApiError for the view to report. */
  async function run(date: string): Promise<RunReleasesResponse> {
    running.value = true;
    try {
      const result = await releasesApi.runReleases(date);
      lastRun.value = result;
      await fetchReleases();
      return result;
    } finally {
      running.value = false;
    }
  }

  function replace(updated: Release): void {
    releases.value = releases.value.map((release) => (release.number === updated.number ? updated : release));
    exceptions.value =
      updated.status === 'exception'
        ? exceptions.value.map((release) => (release.number === updated.number ? updated : release))
        : exceptions.value.filter((release) => release.number !== updated.number);
  }

  const ACTIONS: Record<ReleaseAction, (number: string) => Promise<Release>> = {
    accept: releasesApi.acceptReleaseException,
    resend: releasesApi.resendRelease,
    cancel: releasesApi.cancelRelease,
    'send-notice': releasesApi.sendReleaseNoticeAgain,
  };

  /** Accepts, resends, cancels or re-mails a release; rethrows the ApiError (409 when it moved on meanwhile). */
  async function act(number: string, action: ReleaseAction): Promise<Release> {
    busyNumbers.value.add(number);
    try {
      const updated = await ACTIONS[action](number);
      replace(updated);
      return updated;
    } finally {
      busyNumbers.value.delete(number);
    }
  }

  function isBusy(number: string): boolean {
    return busyNumbers.value.has(number);
  }

  async function fetchJobSettings(): Promise<void> {
    jobSettings.value = await releasesApi.getReleaseJobSettings();
  }

  /**
   * Saves the job time on the settings as shown; rethrows the ApiError so the popover can show
   * it. When someone changed the time first (409 `stale`) the settings shown become theirs.
   */
  async function saveJobTime(jobTime: string): Promise<ReleaseJobSettings> {
    if (!jobSettings.value) await fetchJobSettings();
    try {
      jobSettings.value = await releasesApi.putReleaseJobSettings(jobTime, jobSettings.value!.version);
      return jobSettings.value;
    } catch (cause) {
      if (cause instanceof ApiError && cause.isStale) {
        const current = cause.staleCurrent<ReleaseJobSettings>();
        if (current) jobSettings.value = current;
        else await fetchJobSettings().catch(() => undefined);
      }
      throw cause;
    }
  }

  const exceptionCount = computed(() => exceptions.value.length);

  return {
    releases,
    exceptions,
    exceptionCount,
    loading,
    loaded,
    error,
    running,
    lastRun,
    jobSettings,
    fetchReleases,
    run,
    act,
    isBusy,
    fetchJobSettings,
    saveJobTime,
  };
});

/** One line of the supplier's answer while it is being filled in. */
export interface LineAnswerDraft {
  confirmedQty: number | null;
  shipDate: string;
}

/**
 * Where the supplier's confirmation page stands: reading the link, answering, answered, or one
 * of the ways a link stops working (used 409, expired or cancelled 410, unknown 404).
 */
export type ConfirmPhase = 'loading' | 'ready' | 'done' | 'used' | 'gone' | 'unknown' | 'failed';

function phaseOf(error: ApiError): ConfirmPhase {
  if (error.status === 409) return 'used';
  if (error.status === 410) return 'gone';
  if (error.status === 404) return 'unknown';
  return 'failed';
}

/** The confirmation page: one release, answered once, through its link or by the signed-in supplier. */
export const useConfirmationStore = defineStore('release-confirmation', () => {
  const confirmation = ref<Confirmation | null>(null);
  const phase = ref<ConfirmPhase>('loading');
  /** Why the link cannot be used, or why the last attempt failed. */
  const problem = ref<ApiError | null>(null);
  const result = ref<ConfirmResult | null>(null);
  const sending = ref(false);

  async function open(source: ConfirmSource): Promise<void> {
    phase.value = 'loading';
    problem.value = null;
    try {
      confirmation.value = await confirmApi.getConfirmation(source);
      phase.value = 'ready';
    } catch (cause) {
      if (!(cause instanceof ApiError)) throw cause;
      problem.value = cause;
      phase.value = phaseOf(cause);
    }
  }

  /**
   * Sends the answer. A 400 (a line the server refused) and a failure that leaves the link usable
   * (network, 429, 5xx) are rethrown for the page to show beside the form; a spent, expired or
   * unknown link ends the form.
   */
  async function send(source: ConfirmSource, answer: ConfirmAnswer): Promise<ConfirmResult> {
    sending.value = true;
    problem.value = null;
    try {
      result.value = await confirmApi.sendConfirmation(source, answer);
      phase.value = 'done';
      return result.value;
    } catch (cause) {
      if (!(cause instanceof ApiError)) throw cause;
      problem.value = cause;
      const next = phaseOf(cause);
      if (next !== 'failed') phase.value = next;
      throw cause;
    } finally {
      sending.value = false;
    }
  }

  return { confirmation, phase, problem, result, sending, open, send };
});
