import type { LineRiskResult, PartShortage, SlotAtRisk, UnitAtRisk } from '../../shared/domain/line-risk';
import { SLOTS_PER_SHORTAGE, UNITS_PER_REPORT } from '../../shared/schemas/line-risk';

/** A short part with its first slots at risk and how many there are in all. */
export type ShortageSummary = PartShortage & { slotsAtRiskCount: number };

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

export function summarise(result: LineRiskResult): LineRiskSummary {
  return {
    ...result,
    unitsAtRisk: result.unitsAtRisk.slice(0, UNITS_PER_REPORT),
    unitsAtRiskCount: result.unitsAtRisk.length,
    shortages: result.shortages.map((shortage) => ({
      ...shortage,
      slotsAtRisk: shortage.slotsAtRisk.slice(0, SLOTS_PER_SHORTAGE),
      slotsAtRiskCount: shortage.slotsAtRisk.length,
    })),
  };
}

export function unitsPage(result: LineRiskResult, offset: number, limit: number) {
  return { total: result.unitsAtRisk.length, units: result.unitsAtRisk.slice(offset, offset + limit) };
}

/** Null when the part is not short over this horizon. */
export function slotsPage(
  result: LineRiskResult,
  partNumber: string,
  offset: number,
  limit: number,
): { total: number; slots: SlotAtRisk[] } | null {
  const shortage = result.shortages.find((candidate) => candidate.partNumber === partNumber);
  if (!shortage) return null;
  return { total: shortage.slotsAtRisk.length, slots: shortage.slotsAtRisk.slice(offset, offset + limit) };
}
