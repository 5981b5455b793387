import { performance } from 'node:perf_hooks';
import { pathToFileURL } from 'node:url';
import { lowLevelCodes } from '../../shared/domain/bom';
import { computePlan, grossDemandByDay } from '../../shared/domain/plan';
import type { PlanInput } from '../../shared/domain/types';
import { generatePlanFixture } from './plan-fixture';

/*
 * Times computePlan on the synthetic plant of plan-fixture.ts, and beside it the floor: the same
 * level-by-level explosion of gross requirements on bare typed arrays with all look-ups prepared
 * beforehand and no netting, lead times, effectivity or result objects.
 */

const WARM_UPS = 5;
const RUNS = 30;

export interface PlanBenchFigures {
  parts: number;
  bomLines: number;
  sequenceSlots: number;
  workingDays: number;
  runs: number;
  /** computePlan alone; buckets are built lazily, so this excludes the bucket objects. */
  medianMs: number;
  p90Ms: number;
  /** computePlan and then reading the buckets of every part, as a full export would. */
  allBucketsMedianMs: number;
  allBucketsP90Ms: number;
  /** computePlan and the gross demand report of every bought part (GET /api/demand). */
  demandMedianMs: number;
  demandP90Ms: number;
  floorMedianMs: number;
  floorP90Ms: number;
}

function percentile(sortedMs: number[], fraction: number): number {
  const rank = Math.ceil(fraction * sortedMs.length) - 1;
  return sortedMs[Math.min(sortedMs.length - 1, Math.max(0, rank))];
}

function time(run: () => unknown): { median: number; p90: number } {
  for (let i = 0; i < WARM_UPS; i += 1) run();
  const samples: number[] = [];
  for (let i = 0; i < RUNS; i += 1) {
    const start = performance.now();
    run();
    samples.push(performance.now() - start);
  }
  samples.sort((a, b) => a - b);
  return { median: percentile(samples, 0.5), p90: percentile(samples, 0.9) };
}

/** Prepares the floor: integer part indices, level order, compressed BOM rows, model demand by day. */
function prepareFloor(input: PlanInput, days: string[]): () => Float64Array {
  const indexOf = new Map(input.parts.map((part, index) => [part.partNumber, index]));
  const codes = lowLevelCodes(
    input.parts.map((part) => part.partNumber),
    input.bom,
  );
  const order = Int32Array.from(input.parts.keys()).sort(
    (a, b) => (codes.get(input.parts[a].partNumber) ?? 0) - (codes.get(input.parts[b].partNumber) ?? 0),
  );
  const partCount = input.parts.length;
  const lineStart = new Int32Array(partCount + 1);
  for (const line of input.bom) lineStart[(indexOf.get(line.parent) as number) + 1] += 1;
  for (let p = 0; p < partCount; p += 1) lineStart[p + 1] += lineStart[p];
  const fill = lineStart.slice(0, partCount);
  const lineComponent = new Int32Array(input.bom.length);
  const lineFactor = new Float64Array(input.bom.length);
  for (const line of input.bom) {
    const slot = fill[indexOf.get(line.parent) as number]++;
    lineComponent[slot] = indexOf.get(line.component) as number;
    lineFactor[slot] = line.qtyPer * (1 + line.scrapPct / 100);
  }
  const dayIndex = new Map(days.map((day, index) => [day, index]));
  const dayCount = days.length;
  const independent = new Float64Array(partCount * dayCount);
  for (const slot of input.sequence) {
    const d = dayIndex.get(slot.date);
    if (d !== undefined) independent[(indexOf.get(slot.model) as number) * dayCount + d] += slot.qty;
  }

  return () => {
    const gross = independent.slice();
    for (const parent of order) {
      const parentBase = parent * dayCount;
      for (let line = lineStart[parent]; line < lineStart[parent + 1]; line += 1) {
        const componentBase = lineComponent[line] * dayCount;
        const factor = lineFactor[line];
        for (let d = 0; d < dayCount; d += 1) gross[componentBase + d] += gross[parentBase + d] * factor;
      }
    }
    return gross;
  };
}

/** Runs the planning benchmark and returns its figures in milliseconds. */
export async function runPlanBench(): Promise<PlanBenchFigures> {
  const input = generatePlanFixture();
  const days = computePlan(input).days;
  const plan = time(() => computePlan(input));
  const allBuckets = time(() => {
    let count = 0;
    for (const partPlan of computePlan(input).parts.values()) count += partPlan.buckets.length;
    return count;
  });
  const demand = time(() => grossDemandByDay(computePlan(input), input.parts));
  const floor = time(prepareFloor(input, days));
  return {
    parts: input.parts.length,
    bomLines: input.bom.length,
    sequenceSlots: input.sequence.length,
    workingDays: days.length,
    runs: RUNS,
    medianMs: plan.median,
    p90Ms: plan.p90,
    allBucketsMedianMs: allBuckets.median,
    allBucketsP90Ms: allBuckets.p90,
    demandMedianMs: demand.median,
    demandP90Ms: demand.p90,
    floorMedianMs: floor.median,
    floorP90Ms: floor.p90,
  };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const figures = await runPlanBench();
  const ms = (value: number): string => `${value.toFixed(2)} ms`;
  console.log(
    `plan: ${figures.parts} parts, ${figures.bomLines} BOM lines, ${figures.sequenceSlots} sequence slots, ${figures.workingDays} working days`,
  );
  console.log(
    `computePlan      median ${ms(figures.medianMs)}  p90 ${ms(figures.p90Ms)}  (${figures.runs} runs after ${WARM_UPS} warm-ups)`,
  );
  console.log(`+ every bucket   median ${ms(figures.allBucketsMedianMs)}  p90 ${ms(figures.allBucketsP90Ms)}`);
  console.log(`+ demand report median ${ms(figures.demandMedianMs)}  p90 ${ms(figures.demandP90Ms)}`);
  console.log(`explosion floor  median ${ms(figures.floorMedianMs)}  p90 ${ms(figures.floorP90Ms)}`);
}
