import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import { answerDiffers, quantityDiffers } from '@shared/domain/release-rules';
import type {
  ConfirmAnswer,
  Confirmation,
  ConfirmResult,
  Release,
  ReleaseJobSettings,
  ReleaseLine,
  ReleaseStatus,
  RunReleasesResponse,
} from '@shared/schemas/releases';
import * as confirmApi from '@/api/confirm';
import * as releasesApi from '@/api/releases';
import { ApiError } from '@/api/http';
import { shortDate, weekdayName } from './horizon';
import { isAbort } from './latest-request';

/** What the list shows: one status (or all) and one release date (or all). */
export interface ReleasesFilter {
  status: ReleaseStatus | '';
  date: string;
}

export type ReleaseAction = 'accept' | 'resend' | 'cancel';

export const useReleasesStore = defineStore('releases', () => {
  const releases = ref<Release[]>([]);
  /** Exceptions are listed whatever the filter: they wait for the buyer. */
  const exceptions = ref<Release[]>([]);
  const loading = ref(false);
  const loaded = ref(false);
  const error = ref<ApiError | null>(null);
  const running = ref(false);
  const lastRun = ref<RunReleasesResponse | null>(null);
  /** Release numbers with an action in flight, so their buttons spin and refuse a second click. */
  const busyNumbers = ref(new Set<string>());
  const jobSettings = ref<ReleaseJobSettings | null>(null);

  let pending: AbortController | null = null;
  let lastFilter: ReleasesFilter = { status: '', date: '' };

  /** Loads the filtered list and the open exceptions; a failure is kept in `error`. */
  async function fetchReleases(filter: ReleasesFilter = lastFilter): Promise<void> {
    lastFilter = { ...filter };
    pending?.abort();
    const controller = new AbortController();
    pending = controller;
    loading.value = true;
    error.value = null;
    try {
      const query = { status: filter.status || undefined, date: filter.date || undefined };
      const [list, open] = await Promise.all([
        releasesApi.listReleases(query, controller.signal),
        releasesApi.listReleases({ status: 'exception' }, controller.signal),
      ]);
      releases.value = list;
      exceptions.value = open;
      loaded.value = true;
    } catch (cause) {
      if (isAbort(cause)) return;
      if (!(cause instanceof ApiError)) throw cause;
      error.value = cause;
    } finally {
      if (pending === controller) {
        loading.value = false;
        pending = null;
      }
    }
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
  };

  /** Accepts, resends or cancels a release; rethrows the ApiError (409 when it moved on meanwhile). */
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

  /** Saves the job time; rethrows the ApiError so the popover can show it. */
  async function saveJobTime(jobTime: string): Promise<ReleaseJobSettings> {
    jobSettings.value = await releasesApi.putReleaseJobSettings(jobTime);
    return jobSettings.value;
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

/**
 * Where the supplier's confirmation page stands: reading the link, answering, answered, or one
 * of the ways a link stops working (used 409, expired or cancelled 410, unknown 404).
 */
/** One line of the supplier's answer while it is being filled in. */
export interface LineAnswerDraft {
  confirmedQty: number | null;
  shipDate: string;
}

export type ConfirmPhase = 'loading' | 'ready' | 'done' | 'used' | 'gone' | 'unknown' | 'failed';

function phaseOf(error: ApiError): ConfirmPhase {
  if (error.status === 409) return 'used';
  if (error.status === 410) return 'gone';
  if (error.status === 404) return 'unknown';
  return 'failed';
}

/** The public confirmation page: one release behind one link, answered once. */
export const useConfirmationStore = defineStore('release-confirmation', () => {
  const confirmation = ref<Confirmation | null>(null);
  const phase = ref<ConfirmPhase>('loading');
  /** Why the link cannot be used, or why the last attempt failed. */
  const problem = ref<ApiError | null>(null);
  const result = ref<ConfirmResult | null>(null);
  const sending = ref(false);

  async function open(token: string): Promise<void> {
    phase.value = 'loading';
    problem.value = null;
    try {
      confirmation.value = await confirmApi.getConfirmation(token);
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
  async function send(token: string, answer: ConfirmAnswer): Promise<ConfirmResult> {
    sending.value = true;
    problem.value = null;
    try {
      result.value = await confirmApi.sendConfirmation(token, answer);
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

// --- Presentation helpers shared by the view and its components ---

/** Each status in words, in life-cycle order. */
export const STATUS_WORDS: Record<ReleaseStatus, string> = {
  draft: 'Draft',
  sent: 'Sent',
  confirmed: 'Confirmed',
  exception: 'Exception',
  shipped: 'Shipped',
  partial: 'Partly received',
  received: 'Received',
  cancelled: 'Cancelled',
};

/** What a buyer may still do with a release of this status. */
export function canResend(release: Pick<Release, 'status'>): boolean {
  return ['draft', 'sent', 'exception'].includes(release.status);
}

export function canCancel(release: Pick<Release, 'status' | 'lines'>): boolean {
  return (
    ['draft', 'sent', 'confirmed', 'exception', 'shipped'].includes(release.status) &&
    release.lines.every((line) => line.receivedQty === 0)
  );
}

/** How a supplier's answer to a line differs from the request; all false when it was not answered. */
export interface LineDifference {
  answered: boolean;
  qtyChanged: boolean;
  late: boolean;
  differs: boolean;
}

export function lineDifference(
  line: Pick<ReleaseLine, 'qty' | 'needDate' | 'confirmedQty' | 'shipDate'>,
): LineDifference {
  if (line.confirmedQty === null || line.shipDate === null)
    return { answered: false, qtyChanged: false, late: false, differs: false };
  const answer = { confirmedQty: line.confirmedQty, shipDate: line.shipDate };
  return {
    answered: true,
    qtyChanged: quantityDiffers(line.qty, line.confirmedQty),
    late: line.shipDate > line.needDate,
    differs: answerDiffers(line, answer),
  };
}

/** "3 releases sent for 2 Dec" style summary of a run. */
export function runSummary(result: RunReleasesResponse, dateWords: string): string {
  const sent = result.releases.length;
  const lines = result.releases.reduce((sum, release) => sum + release.lines.length, 0);
  const earlier = result.existing.length;
  if (sent === 0) {
    return earlier > 0
      ? `Nothing new for ${dateWords}: ${earlier === 1 ? '1 release was' : `${earlier} releases were`} already made that day.`
      : `Nothing to release for ${dateWords}: no empty cards and no planned releases due.`;
  }
  const made = `${sent === 1 ? '1 release' : `${sent} releases`} with ${lines === 1 ? '1 line' : `${lines} lines`} sent for ${dateWords}`;
  return earlier > 0 ? `${made}; ${earlier} already made earlier that day.` : `${made}.`;
}

const DATE_TIME = new Intl.DateTimeFormat('en-GB', {
  day: 'numeric',
  month: 'short',
  hour: '2-digit',
  minute: '2-digit',
});

/** A stored ISO timestamp as "2 Dec, 06:00"; blank for none. */
export function formatMoment(iso: string | null): string {
  if (!iso) return '';
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : DATE_TIME.format(date);
}

/** "Wed 3 Mar" for an ISO date; blank for none. */
export function dayWords(date: string | null): string {
  return date ? `${weekdayName(date)} ${shortDate(date)}` : '';
}
