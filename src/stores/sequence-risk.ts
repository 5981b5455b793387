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
  const { loading, error, run } = useLatestRequest();
  let call: BoardRiskCall | null = null;
  const engine = (): BoardRiskCall => (call ??= startEngine());

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
    unitsAtRisk.value = await engine()({ kind: 'adopt', orders: plainOrders(orders) });
  }

  return { unitsAtRisk, range, loading, error, loaded, atRisk, load, preview, adopt };
});

/** The engine in a worker where the browser has them; in the page otherwise (tests). */
function startEngine(): BoardRiskCall {
  if (typeof Worker === 'undefined') {
    const handle = boardRiskHandler();
    return async (request) => handle(request);
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
    started.onerror = (event) => {
      started.terminate();
      if (worker === started) worker = null;
      for (const pending of waiting.values())
        pending.reject(new Error(event.message || 'The line-risk engine stopped.'));
      waiting.clear();
    };
    return started;
  };
  return (request, transfer = []) =>
    new Promise((resolve, reject) => {
      const id = nextId++;
      waiting.set(id, { resolve, reject });
      const message: BoardRiskMessage = { id, request };
      (worker ??= start()).postMessage(message, transfer);
    });
}

/** Day orders as plain data, to be copied to the engine (the board's may be reactive). */
function plainOrders(orders: readonly DayOrder[]): DayOrder[] {
  return orders.map(({ date, serials }) => ({ date, serials: [...serials] }));
}
