import { defineStore } from 'pinia';
import { computed, ref, shallowRef } from 'vue';
import type { DayOrder } from '@shared/domain/sequence';
import * as lineRiskApi from '@/api/line-risk';
import type { LineRiskRange } from '@/api/line-risk';
import {
  boardRiskHandler,
  type BoardRiskAnswers,
  type BoardRiskRequest,
  type BoardUnitAtRisk,
  type BoardWhatIf,
} from './board-risk-engine';
import type { BoardRiskMessage, BoardRiskReply } from './board-risk.worker';
import { useLatestRequest } from './latest-request';

/** Sends a request to the board's line-risk engine; `transfer`: buffers handed over rather than copied. */
type BoardRiskCall = <K extends BoardRiskRequest['kind']>(
  request: Extract<BoardRiskRequest, { kind: K }>,
  transfer?: Transferable[],
) => Promise<BoardRiskAnswers[K]>;

/**
 * Line risk of the build sequence board, worked out in the browser (see board-risk-engine.ts): the
 * engine's inputs are read once per horizon (and again after a planning change), the units at risk
 * are marked on the cards, and a change is tried on them before it is saved.
 */
export const useSequenceRiskStore = defineStore('sequence-risk', () => {
  const unitsAtRisk = shallowRef<BoardUnitAtRisk[] | null>(null);
  const range = ref<LineRiskRange | null>(null);
  const { loading, error, run, cancel } = useLatestRequest();
  let started: BoardRiskEngine | null = null;
  const engine = (): BoardRiskCall => (started ??= startEngine()).call;

  /** True once the board's line risk has been worked out. */
  const loaded = computed(() => unitsAtRisk.value !== null);
  /** Units at risk on the board, by serial. */
  const atRisk = computed<ReadonlyMap<string, BoardUnitAtRisk>>(
    () => new Map((unitsAtRisk.value ?? []).map((unit) => [unit.serial, unit])),
  );

  /** Reads the engine's inputs for the board's days and works out its line risk; a failure is kept in `error`. */
  function load(next: LineRiskRange): Promise<void> {
    return run(
      async (signal) => {
        // As bytes: parsed where the engine runs, so a large plant's input never blocks the page.
        const json = await lineRiskApi.getEngineInputBytes(next, signal);
        return engine()({ kind: 'load', json }, [json]);
      },
      (answer) => {
        unitsAtRisk.value = answer;
        range.value = { ...next };
      },
      { quiet: loaded.value },
    );
  }

  /** What the new day orders would do; null while the board's line risk is not loaded. */
  async function preview(orders: readonly DayOrder[]): Promise<BoardWhatIf | null> {
    if (!loaded.value) return null;
    return engine()({ kind: 'preview', orders: plainOrders(orders) });
  }

  /** A saved change becomes the board's line risk at once, before the server's planning event reloads it. */
  async function adopt(orders: readonly DayOrder[]): Promise<void> {
    if (!loaded.value) return;
    const answer = await engine()({ kind: 'adopt', orders: plainOrders(orders) });
    // Unless the board was left meanwhile.
    if (loaded.value) unitsAtRisk.value = answer;
  }

  /**
   * Stops the engine and forgets the board's line risk, when the board is left: on a large plant
   * the engine holds tens of megabytes, and the board works its line risk out anew when opened
   * (the plan may have changed meanwhile).
   */
  function release(): void {
    cancel();
    started?.stop();
    started = null;
    unitsAtRisk.value = null;
    range.value = null;
  }

  return { unitsAtRisk, range, loading, error, loaded, atRisk, load, preview, adopt, release };
});

interface BoardRiskEngine {
  call: BoardRiskCall;
  /** Ends the engine; what it was asked and has not answered is refused. */
  stop: () => void;
}

/** The engine in a worker where the browser has them; in the page otherwise (tests). */
function startEngine(): BoardRiskEngine {
  if (typeof Worker === 'undefined') {
    const handle = boardRiskHandler();
    return { call: async (request) => handle(request), stop: () => undefined };
  }
  const waiting = new Map<number, { resolve: (value: never) => void; reject: (error: Error) => void }>();
  let nextId = 1;
  let worker: Worker | null = null;
  const start = (): Worker => {
    const started = new Worker(new URL('./board-risk.worker.ts', import.meta.url), { type: 'module' });
    started.onmessage = ({ data }: MessageEvent<BoardRiskReply>) => {
      const pending = waiting.get(data.id);
      waiting.delete(data.id);
      if (data.ok) pending?.resolve(data.value as never);
      else pending?.reject(new Error(data.message));
    };
    // A worker that failed is gone: the next request starts another, which loads again.
    started.onerror = (event) => end(started, event.message || 'The line-risk engine stopped.');
    return started;
  };
  const end = (ended: Worker, why: string): void => {
    ended.terminate();
    if (worker === ended) worker = null;
    for (const pending of waiting.values()) pending.reject(new Error(why));
    waiting.clear();
  };
  return {
    call: (request, transfer = []) =>
      new Promise((resolve, reject) => {
        const id = nextId++;
        waiting.set(id, { resolve, reject });
        const message: BoardRiskMessage = { id, request };
        (worker ??= start()).postMessage(message, transfer);
      }),
    stop: () => {
      if (worker) end(worker, 'The line-risk engine was stopped.');
    },
  };
}

/** Day orders as plain data, to be copied to the engine (the board's may be reactive). */
function plainOrders(orders: readonly DayOrder[]): DayOrder[] {
  return orders.map(({ date, serials }) => ({ date, serials: [...serials] }));
}
