import { performance } from 'node:perf_hooks';
import { BuildsService } from '../../server/builds/builds.service';
import { openDatabase, type Database } from '../../server/db/database';
import { PlanningService } from '../../server/planning/planning.service';
import { plantToday } from '../../server/planning/plan-dates';
import { SequenceEntryEntity } from '../../server/sequence/sequence-entry.entity';
import { upsertSequenceEntries } from '../../server/sequence/sequence.writer';
import { seedDemoScenario } from '../../seed/seed-demo';
import { generatePlanFixture } from './plan-fixture';
import { writeFixture } from './plan-fixture-db';

export interface CloseDayFigures {
  label: string;
  units: number;
  bomLinesPerModel: number;
  /** Milliseconds per day closed, one sample per day. */
  samples: number[];
  /** GET /api/demand's work (inputs read and plan computed) right after a close. */
  planAfterCloseMs: number[];
}

const DAYS = 5;

/** Closes `DAYS` days one after another, each in one write unit, timing each; then plans afresh. */
async function closeDays(db: Database, dates: string[]): Promise<{ samples: number[]; planAfterCloseMs: number[] }> {
  const builds = new BuildsService(db);
  const samples: number[] = [];
  const planAfterCloseMs: number[] = [];
  for (const date of dates) {
    const start = performance.now();
    await builds.closeDay(date, null);
    samples.push(performance.now() - start);
    // A fresh service has no cache: this is the first plan after the close, as a request sees it.
    const planStart = performance.now();
    await db.read(() => new PlanningService(db).demand({}));
    planAfterCloseMs.push(performance.now() - planStart);
  }
  return { samples, planAfterCloseMs };
}

/** The demo plant, each of its first days filled to 26 units (the demo line's capacity). */
async function demoPlant(): Promise<CloseDayFigures> {
  const db = await openDatabase(':memory:');
  try {
    await seedDemoScenario(db, plantToday());
    const entries = await db.manager.find(SequenceEntryEntity, { order: { date: 'ASC', sequence: 'ASC' } });
    const planned = entries.filter((entry) => entry.status !== 'built');
    const dates = [...new Set(planned.map((entry) => entry.date))].slice(0, DAYS);
    const extra = dates.flatMap((date) => {
      const day = planned.filter((entry) => entry.date === date);
      return Array.from({ length: Math.max(0, 26 - day.length) }, (_, index) => ({
        date,
        sequence: day.length + index + 1,
        model: day[index % day.length].model,
        serial: `BENCH-${date}-${index}`,
        qty: 1,
      }));
    });
    await db.write((manager) => upsertSequenceEntries(manager, extra));
    const lines: { parent: string; count: number }[] = await db.manager.query(
      `SELECT parent, COUNT(*) AS count FROM bom_line WHERE parent IN (SELECT part_number FROM part WHERE source = 'end_item') GROUP BY parent`,
    );
    const { samples, planAfterCloseMs } = await closeDays(db, dates);
    return {
      label: 'demo plant',
      units: 26,
      bomLinesPerModel: Math.max(...lines.map((row) => Number(row.count))),
      samples,
      planAfterCloseMs,
    };
  } finally {
    await db.close();
  }
}

/** The 16× benchmark plant: 600-line three-level structures, 160 units a day. */
async function sixteenTimesPlant(): Promise<CloseDayFigures> {
  const fixture = generatePlanFixture({ scale: 16, workingDays: 20 });
  const db = await openDatabase(':memory:');
  try {
    await writeFixture(db, fixture);
    const dates = [...new Set(fixture.sequence.map((slot) => slot.date))].slice(0, DAYS);
    const perModel = new Map<string, number>();
    for (const line of fixture.bom) perModel.set(line.parent, (perModel.get(line.parent) ?? 0) + 1);
    const models = fixture.parts.filter((part) => part.source === 'end_item').map((part) => part.partNumber);
    // Lines of the whole three-level structure below one model.
    const structure = (model: string): number => {
      const direct = fixture.bom.filter((line) => line.parent === model);
      return (
        direct.length +
        direct.reduce((sum, line) => sum + (perModel.has(line.component) ? structure(line.component) : 0), 0)
      );
    };
    const { samples, planAfterCloseMs } = await closeDays(db, dates);
    return {
      label: '16× plant',
      units: fixture.sequence.filter((slot) => slot.date === dates[0]).length,
      bomLinesPerModel: structure(models[0]),
      samples,
      planAfterCloseMs,
    };
  } finally {
    await db.close();
  }
}

export async function runCloseDayBench(): Promise<CloseDayFigures[]> {
  return [await demoPlant(), await sixteenTimesPlant()];
}

const median = (samples: number[]) => [...samples].sort((a, b) => a - b)[Math.floor(samples.length / 2)];

export function printCloseDayBench(figures: CloseDayFigures[]): void {
  const targets: Record<string, string> = { 'demo plant': '< 200 ms', '16× plant': '< 1 s' };
  for (const figure of figures) {
    console.log(
      `close a day, ${figure.label}: ${figure.units} units × ${figure.bomLinesPerModel}-line BOM  ` +
        `median ${median(figure.samples).toFixed(1)} ms  max ${Math.max(...figure.samples).toFixed(1)} ms  ` +
        `(target ${targets[figure.label]}; ${figure.samples.length} days)`,
    );
    console.log(
      `  first demand report after the close  median ${median(figure.planAfterCloseMs).toFixed(1)} ms  ` +
        `max ${Math.max(...figure.planAfterCloseMs).toFixed(1)} ms`,
    );
  }
}
