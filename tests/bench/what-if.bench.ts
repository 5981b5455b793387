import { performance } from 'node:perf_hooks';
import { addWorkingDays } from '../../shared/domain/calendar';
import { planMove } from '../../shared/domain/sequence';
import { LineRiskWalker, type LineRiskInput } from '../../shared/domain/line-risk';
import { sequenceOutlook, tryResequence } from '../../shared/domain/sequence-what-if';
import type { SequenceDay } from '../../shared/schemas/sequence';
import { openDatabase } from '../../server/db/database';
import { plantToday } from '../../server/planning/plan-dates';
import { createServices } from '../../server/services';
import { seedDemoScenario } from '../../seed/seed-demo';

export interface WhatIfFigures {
  units: number;
  parts: number;
  workingDays: number;
  baselineMs: number;
  /** One sample per move tried, walked from the last walk as the board does. */
  samples: number[];
  /** The same moves walked afresh (the baseline). */
  afreshSamples: number[];
}

/** The board's default horizon. */
export const BOARD_WORKING_DAYS = 10;
const MOVES = 30;

/**
 * The board's what-if on the demo plant: the engine input the browser reads for the default board
 * (ten working days), then one preview per move, each unit of the first days moved to the next day.
 */
export async function runWhatIfBench(): Promise<WhatIfFigures> {
  const db = await openDatabase(':memory:');
  try {
    const today = plantToday();
    await seedDemoScenario(db, today);
    const services = createServices(db, { jwtSecret: 'bench-secret-bench-secret-bench-secret-00' });
    const probe = await services.lineRisk.engineInput({});
    const to = addWorkingDays(probe.from, BOARD_WORKING_DAYS - 1, probe.calendar);
    return boardWhatIf(await services.lineRisk.engineInput({ from: probe.from, to }));
  } finally {
    await db.close();
  }
}

/** The board's what-if for an engine input: its outlook, then one preview per move (see runWhatIfBench). */
export function boardWhatIf(input: LineRiskInput, moves = MOVES): WhatIfFigures {
  // As the board holds it: one walker, whose last walk each move is walked from.
  const walker = new LineRiskWalker();
  const baselineStart = performance.now();
  const before = sequenceOutlook(input, walker);
  const baselineMs = performance.now() - baselineStart;
  // The board's days as planMove sees them: units not built, by day and place.
  const dates = [...new Set(input.sequence.map((slot) => slot.date))].sort();
  const days = dates.map(
    (date) =>
      ({
        date,
        units: input.sequence
          .filter((slot) => slot.date === date)
          .sort((a, b) => a.sequence - b.sequence)
          .map((slot) => ({ ...slot, status: 'planned' })),
      }) as unknown as SequenceDay,
  );
  const samples: number[] = [];
  const afreshSamples: number[] = [];
  for (const slot of input.sequence.slice(0, moves)) {
    const next = dates[dates.indexOf(slot.date) + 1];
    const move = next && planMove(days, slot.serial, next, 0);
    if (!move) continue;
    const start = performance.now();
    tryResequence(input, before, move.orders, walker);
    samples.push(performance.now() - start);
    // The baseline: the same move walked afresh.
    const afreshStart = performance.now();
    tryResequence(input, before, move.orders);
    afreshSamples.push(performance.now() - afreshStart);
  }
  return {
    units: input.sequence.length,
    parts: input.parts.length,
    workingDays: before.days.length,
    baselineMs,
    samples,
    afreshSamples,
  };
}

export function printWhatIfBench(figures: WhatIfFigures, plant = 'the demo plant'): void {
  const at = (samples: number[], share: number) => {
    const sorted = [...samples].sort((a, b) => a - b);
    return sorted[Math.min(sorted.length - 1, Math.floor(share * sorted.length))] ?? 0;
  };
  const ms = (value: number) => `${value.toFixed(1)} ms`;
  console.log(
    `Board what-if on ${plant} (${figures.units} units not built, ${figures.parts} parts, ${figures.workingDays} working days)`,
  );
  console.log(`  outlook of the board as it stands   ${ms(figures.baselineMs)}`);
  console.log(
    `  one move tried (line risk + plan)   median ${ms(at(figures.samples, 0.5))}  p90 ${ms(at(figures.samples, 0.9))}  ` +
      `| walked afresh median ${ms(at(figures.afreshSamples, 0.5))}  (target < 100 ms; ${figures.samples.length} moves)`,
  );
}
