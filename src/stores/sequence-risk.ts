import { defineStore } from 'pinia';
import { computed, ref, shallowRef } from 'vue';
import { LineRiskWalker, type LineRiskInput, type UnitAtRisk } from '@shared/domain/line-risk';
import type { DayOrder } from '@shared/domain/sequence';
import {
  resequenced,
  sequenceOutlook,
  tryResequence,
  type SequenceOutlook,
  type WhatIfResult,
} from '@shared/domain/sequence-what-if';
import * as lineRiskApi from '@/api/line-risk';
import type { LineRiskRange } from '@/api/line-risk';
import { useLatestRequest } from './latest-request';

/** A what-if with the time the browser took to work it out. */
export interface TimedWhatIf extends WhatIfResult {
  elapsedMs: number;
}

/**
 * Line risk of the build sequence board, worked out in the browser: the engine's inputs are read
 * once per horizon (and again after a planning change), the units at risk are marked on the
 * cards, and a change is tried on them before it is saved.
 */
export const useSequenceRiskStore = defineStore('sequence-risk', () => {
  // Large and never edited in place: not made deeply reactive.
  const input = shallowRef<LineRiskInput | null>(null);
  const outlook = shallowRef<SequenceOutlook | null>(null);
  const range = ref<LineRiskRange | null>(null);
  const { loading, error, run } = useLatestRequest();
  // Keeps its last walk: a what-if then walks only what the move changed. Not reactive state.
  const walker = new LineRiskWalker();

  /** Units at risk on the board, by serial. */
  const atRisk = computed<ReadonlyMap<string, UnitAtRisk>>(
    () => new Map((outlook.value?.unitsAtRisk ?? []).map((unit) => [unit.serial, unit])),
  );

  /** Reads the engine's inputs for the board's days and works out its line risk; a failure is kept in `error`. */
  function load(next: LineRiskRange): Promise<void> {
    return run(
      (signal) => lineRiskApi.getEngineInput(next, signal),
      (answer) => {
        input.value = answer;
        outlook.value = sequenceOutlook(answer, walker);
        range.value = { ...next };
      },
      { quiet: input.value !== null },
    );
  }

  /** What the new day orders would do, or null while the inputs are not loaded. */
  function preview(orders: readonly DayOrder[]): TimedWhatIf | null {
    if (!input.value || !outlook.value) return null;
    const started = performance.now();
    const result = tryResequence(input.value, outlook.value, orders, walker);
    return { ...result, elapsedMs: performance.now() - started };
  }

  /** A saved change becomes the board's line risk at once, before the server's planning event reloads it. */
  function adopt(orders: readonly DayOrder[], result: WhatIfResult): void {
    if (!input.value) return;
    input.value = { ...input.value, sequence: resequenced(input.value.sequence, orders) };
    outlook.value = result.after;
  }

  return { input, outlook, range, loading, error, atRisk, load, preview, adopt };
});
