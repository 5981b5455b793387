import { performance } from 'node:perf_hooks';
import { addWorkingDays } from '../../shared/domain/calendar';
import { planMove } from '../../shared/domain/sequence';
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
  /** One sample per move tried. */
  samples: number[];
}

const BOARD_WORKING_DAYS = 10;
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
    const input = await services.lineRisk.engineInput({ from: probe.from, to });
    const baselineStart = performance.now();
    const before = sequenceOutlook(input);
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
    for (const slot of input.sequence.slice(0, MOVES)) {
      const next = dates[dates.indexOf(slot.date) + 1];
      const move = next && planMove(days, slot.serial, next, 0);
      if (!move) continue;
      const start = performance.now();
      tryResequence(input, before, move.orders);
      samples.push(performance.now() - start);
    }
    return {
      units: input.sequence.length,
      parts: input.parts.length,
      workingDays: before.risk.days.length,
      baselineMs,
      samples,
    };
  } finally {
    await db.close();
  }
}

export function printWhatIfBench(figures: WhatIfFigures): void {
  const sorted = [...figures.samples].sort((a, b) => a - b);
  const at = (share: number) => sorted[Math.min(sorted.length - 1, Math.floor(share * sorted.length))] ?? 0;
  const ms = (value: number) => `${value.toFixed(1)} ms`;
  console.log(
    `Board what-if on the demo plant (${figures.units} units not built, ${figures.parts} parts, ${figures.workingDays} working days)`,
  );
  console.log(`  outlook of the board as it stands   ${ms(figures.baselineMs)}`);
  console.log(
    `  one move tried (line risk + plan)   median ${ms(at(0.5))}  p90 ${ms(at(0.9))}  (target < 100 ms; ${sorted.length} moves)`,
  );
}
