import { defineStore } from 'pinia';
import { computed, reactive, ref } from 'vue';
import { isCardState, type CardEvent, type CardState } from '@shared/domain/card-cycle';
import type { CardLabel, KanbanCardWithScans, KanbanLoop, UpdateKanbanLoopRequest } from '@shared/schemas/loops';
import type { KanbanSizeRequest, KanbanSizeResponse } from '@shared/schemas/loops-sizing';
import * as loopsApi from '@/api/loops';
import { ApiError } from '@/api/http';
import { useLatestRequest } from './latest-request';

/** How many scans the scan screen keeps in view. */
export const SCAN_HISTORY_LENGTH = 10;

/** Why a scan was refused, in the terms the floor needs to act on it. */
export type ScanProblem = 'bad-number' | 'unknown-card' | 'not-allowed' | 'pulled' | 'no-access' | 'failed';

interface ScanRecordBase {
  key: number;
  cardNumber: string;
  scannedAt: Date;
}

export interface ScanSuccess extends ScanRecordBase {
  ok: true;
  partNumber: string;
  event: CardEvent;
  fromState: CardState;
  toState: CardState;
}

export interface ScanFailure extends ScanRecordBase {
  ok: false;
  problem: ScanProblem;
  message: string;
  /** The card's state when the server refused a move (409), else null. */
  currentState: CardState | null;
}

export type ScanRecord = ScanSuccess | ScanFailure;

/** Cards of one loop as the expanded row shows them. */
export interface LoopCardsState {
  cards: KanbanCardWithScans[];
  loading: boolean;
  error: ApiError | null;
}

function problemOf(error: ApiError): { problem: ScanProblem; currentState: CardState | null } {
  const first = (error.details[0] ?? {}) as { currentState?: unknown; retiredAt?: unknown };
  const currentState = isCardState(first.currentState) ? first.currentState : null;
  if (error.status === 400) return { problem: 'bad-number', currentState: null };
  if (error.status === 404) return { problem: 'unknown-card', currentState: null };
  if (error.status === 403) return { problem: 'no-access', currentState: null };
  if (error.status === 409) return { problem: first.retiredAt ? 'pulled' : 'not-allowed', currentState };
  return { problem: 'failed', currentState: null };
}

export const useLoopsStore = defineStore('loops', () => {
  const loops = ref<KanbanLoop[]>([]);
  const supplierCode = ref('');
  const loaded = ref(false);
  const { loading, error, run } = useLatestRequest();
  // Rows with a change in flight, so their buttons can spin and refuse a second click.
  const busyIds = ref(new Set<number>());
  const cardsByLoop = reactive<Record<number, LoopCardsState>>({});
  const cardRequests = new Map<number, ReturnType<typeof useLatestRequest>>();
  const scans = ref<ScanRecord[]>([]);
  let scanKey = 0;
  const printLoop = ref<KanbanLoop | null>(null);
  const labels = ref<CardLabel[]>([]);
  // Only the latest label request may fill the sheet: toggling active/all twice must not show the first answer.
  const { loading: labelsLoading, error: labelsError, run: runLabels } = useLatestRequest();
  // The sizing calculator asks again on every pause in typing: only the latest answer may show.
  const sizing = ref<KanbanSizeResponse | null>(null);
  const { loading: sizingLoading, error: sizingError, run: runSizing, cancel: cancelSizing } = useLatestRequest();

  // The server's proposal is the one rule of how many cards to add or pull.
  const toAdd = computed(() => loops.value.filter((loop) => loop.proposal.action === 'add'));
  const toPull = computed(() => loops.value.filter((loop) => loop.proposal.action === 'pull'));
  const rightSized = computed(() => loops.value.filter((loop) => loop.proposal.action === 'none'));
  const cardsToAdd = computed(() => toAdd.value.reduce((sum, loop) => sum + loop.proposal.count, 0));
  const cardsToPull = computed(() => toPull.value.reduce((sum, loop) => sum + loop.proposal.count, 0));

  /** Loads the loops (of the chosen supplier); a failure is kept in `error` and the previous list stays. */
  function fetchAll(): Promise<void> {
    return run(
      (signal) => loopsApi.listLoops(supplierCode.value || undefined, signal),
      (answer) => {
        loops.value = answer;
        loaded.value = true;
      },
    );
  }

  function replaceLoop(updated: KanbanLoop): void {
    loops.value = loops.value.map((loop) => (loop.id === updated.id ? updated : loop));
  }

  async function whileBusy<T>(id: number, work: () => Promise<T>): Promise<T> {
    busyIds.value.add(id);
    try {
      return await work();
    } finally {
      busyIds.value.delete(id);
    }
  }

  /**
   * Accepts the recommendation the buyer is looking at. Rethrows the ApiError (409 when the
   * recommendation moved meanwhile) for the view to report and refresh.
   */
  async function accept(loop: KanbanLoop) {
    return whileBusy(loop.id, async () => {
      const outcome = await loopsApi.acceptLoop(loop.id, loop.recommendedCards);
      const { added: _added, retired: _retired, stillToPull: _stillToPull, ...updated } = outcome;
      replaceLoop(updated);
      if (cardsByLoop[loop.id]) void fetchCards(loop.id);
      return outcome;
    });
  }

  /**
   * Saves settings of the loop as the list shows it; rethrows the ApiError so the form can place
   * field messages. When someone changed the loop first (409 `stale`) the list shows it as it is now.
   */
  async function update(id: number, patch: UpdateKanbanLoopRequest): Promise<KanbanLoop> {
    const shown = loops.value.find((loop) => loop.id === id);
    if (!shown) throw new ApiError(404, 'not_found', 'This loop is no longer in the list; refresh it.');
    return whileBusy(id, async () => {
      try {
        const updated = await loopsApi.updateLoop(id, patch, shown.version);
        replaceLoop(updated);
        return updated;
      } catch (cause) {
        if (cause instanceof ApiError && cause.isStale) {
          const current = cause.staleCurrent<KanbanLoop>();
          if (current) replaceLoop(current);
          else void fetchAll();
        }
        throw cause;
      }
    });
  }

  /** Loads (or reloads) one loop's cards with their recent scans. */
  function fetchCards(loopId: number): Promise<void> {
    let request = cardRequests.get(loopId);
    if (!request) {
      request = useLatestRequest();
      cardRequests.set(loopId, request);
      // The entry shows the request's own loading and error: refs unwrap inside reactive().
      cardsByLoop[loopId] = reactive({
        cards: [] as KanbanCardWithScans[],
        loading: request.loading,
        error: request.error,
      });
    }
    return request.run(
      (signal) => loopsApi.listCards(loopId, signal),
      (cards) => {
        cardsByLoop[loopId]!.cards = cards;
      },
    );
  }

  /** Loads a loop and the labels of its cards for the print view; a failure is kept in `labelsError`. */
  async function fetchLabels(loopId: number, cards: loopsApi.LabelSelection): Promise<void> {
    await runLabels(
      (signal) => Promise.all([loopsApi.getLoop(loopId, signal), loopsApi.listLabels(loopId, cards, signal)]),
      ([loop, loopLabels]) => {
        printLoop.value = loop;
        labels.value = loopLabels;
      },
    );
    // A sheet of the wrong cards is worse than none.
    if (labelsError.value) labels.value = [];
  }

  /** Works out the card count for free numbers; a refusal is kept in `sizingError` and clears the answer. */
  async function size(request: KanbanSizeRequest): Promise<void> {
    await runSizing(
      (signal) => loopsApi.sizeLoopCards(request, signal),
      (answer) => {
        sizing.value = answer;
      },
    );
    // An answer for other numbers than those on screen is worse than none.
    if (sizingError.value) sizing.value = null;
  }

  /** Drops the sizing in flight and its answer, for a calculator that closes with its numbers. */
  function clearSizing(): void {
    cancelSizing();
    sizing.value = null;
  }

  function isBusy(id: number): boolean {
    return busyIds.value.has(id);
  }

  function remember(record: ScanRecord): ScanRecord {
    scans.value = [record, ...scans.value].slice(0, SCAN_HISTORY_LENGTH);
    return record;
  }

  /** Records one scan and keeps it in this session's history; never throws for a refused scan. */
  async function scan(cardNumber: string, event?: CardEvent): Promise<ScanRecord> {
    const base = { key: (scanKey += 1), cardNumber, scannedAt: new Date() };
    try {
      const { card, scan: logged } = await loopsApi.scanCard(event ? { cardNumber, event } : { cardNumber });
      return remember({
        ...base,
        ok: true,
        partNumber: card.partNumber,
        event: logged.event,
        fromState: logged.fromState,
        toState: logged.toState,
      });
    } catch (cause) {
      if (!(cause instanceof ApiError)) throw cause;
      return remember({ ...base, ok: false, message: cause.message, ...problemOf(cause) });
    }
  }

  return {
    loops,
    supplierCode,
    loading,
    loaded,
    error,
    cardsByLoop,
    scans,
    printLoop,
    labels,
    labelsLoading,
    labelsError,
    sizing,
    sizingLoading,
    sizingError,
    toAdd,
    toPull,
    rightSized,
    cardsToAdd,
    cardsToPull,
    fetchAll,
    accept,
    update,
    fetchCards,
    fetchLabels,
    size,
    clearSizing,
    isBusy,
    scan,
    downloadLabels: loopsApi.downloadLabelsPdf,
  };
});
