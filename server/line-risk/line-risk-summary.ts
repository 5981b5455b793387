import type { LineRiskResult, PartShortage, SlotAtRisk, UnitAtRisk } from '../../shared/domain/line-risk';
import { LineRiskRun } from '../../shared/domain/line-risk-run';
import { SLOTS_PER_SHORTAGE, UNITS_PER_REPORT } from '../../shared/schemas/line-risk';

/** A short part with its first slots at risk and how many there are in all (the report shows no need per day). */
export type ShortageSummary = Omit<PartShortage, 'requiredByDay'> & { slotsAtRiskCount: number };

/**
 * The line risk as the report needs it: every short part, but only the first units at risk and
 * the first slots of each part, with counts. A large plant's full result runs to millions of slots;
 * the rest is fetched a page at a time.
 */
export interface LineRiskSummary extends Omit<LineRiskResult, 'unitsAtRisk' | 'shortages'> {
  unitsAtRisk: UnitAtRisk[];
  unitsAtRiskCount: number;
  shortages: ShortageSummary[];
}

/** The summary of a run (as the worker keeps it), or of a whole answer. */
export function summarise(result: LineRiskRun | LineRiskResult): LineRiskSummary {
  if (result instanceof LineRiskRun) {
    return {
      ...result.header,
      unitsAtRisk: result.unitsAtRisk(0, UNITS_PER_REPORT),
      unitsAtRiskCount: result.unitsAtRiskCount,
      // Each shortage is a new object already: the count is added to it rather than copied over.
      shortages: result.shortages.map((_, index) =>
        Object.assign(result.shortageWith(index, result.slotsAtRisk(index, 0, SLOTS_PER_SHORTAGE)), {
          slotsAtRiskCount: result.slotsAtRiskCount(index),
        }),
      ),
    };
  }
  return {
    ...result,
    unitsAtRisk: result.unitsAtRisk.slice(0, UNITS_PER_REPORT),
    unitsAtRiskCount: result.unitsAtRisk.length,
    shortages: result.shortages.map(({ requiredByDay: _, ...shortage }) => ({
      ...shortage,
      slotsAtRisk: shortage.slotsAtRisk.slice(0, SLOTS_PER_SHORTAGE),
      slotsAtRiskCount: shortage.slotsAtRisk.length,
    })),
  };
}

export function unitsPage(run: LineRiskRun, offset: number, limit: number) {
  return { total: run.unitsAtRiskCount, units: run.unitsAtRisk(offset, limit) };
}

/** Null when the part is not short over this horizon. */
export function slotsPage(
  run: LineRiskRun,
  partNumber: string,
  offset: number,
  limit: number,
): { total: number; slots: SlotAtRisk[] } | null {
  const index = run.shortageIndex(partNumber);
  if (index === undefined) return null;
  return { total: run.slotsAtRiskCount(index), slots: run.slotsAtRisk(index, offset, limit) };
}
