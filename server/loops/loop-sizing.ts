import { sizeKanban, type DeliveryCycle } from '../../shared/domain/kanban-sizing';
import type { LoopKind } from '../../shared/schemas/loops';

/**
 * An in-house (supermarket) loop is never sized on less than one working day: even a part made
 * with lead time 0 needs its card collected, the batch made and the container brought back, and
 * with T = 0 the formula would leave only the safety terms — often 0 cards, a loop that never signals.
 */
export const MIN_SUPERMARKET_REPLENISHMENT_DAYS = 1;

/**
 * Average demand is rounded to this many decimals before sizing, so the listed figure is exactly
 * the D the formula used: a buyer who feeds the listed numbers to POST /api/kanban/size gets the
 * same card count. Unrounded, 70 units over 30 days is 2.3333333333333335 in a double, a hair above
 * 7/3, and a loop whose exact count is whole would be sized one card too many.
 */
const DEMAND_DECIMALS = 4;

export interface LoopSizingInput {
  kind: LoopKind;
  containerQty: number;
  safetyFactor: number;
  safetyDays: number;
  safetyUnits: number;
  /** Gross demand of the part on each working day of the sizing window, in date order. */
  dailyGross: number[];
  /** The supplier's delivery cycle; used for supplier loops, null when the supplier is unknown. */
  cycle: DeliveryCycle | null;
  /** The part's lead time in working days; T of a supermarket loop (and of a supplier loop without a cycle). */
  leadTimeDays: number;
  /** A loop whose part has left kanban recommends no cards, so its cards are pulled. */
  partIsKanban: boolean;
}

export interface LoopSizing {
  averageDailyDemand: number;
  peakDailyDemand: number;
  replenishmentDays: number;
  exactCards: number;
  recommendedCards: number;
  formula: string;
}

function roundTo(value: number, decimals: number): number {
  const scale = 10 ** decimals;
  return Math.round(value * scale) / scale;
}

/** Sizes one loop from its demand over the window; a zero-demand loop with no safety units needs no cards. */
export function sizeLoop(input: LoopSizingInput): LoopSizing {
  const days = input.dailyGross.length;
  const total = input.dailyGross.reduce((sum, qty) => sum + qty, 0);
  const averageDailyDemand = days > 0 ? roundTo(total / days, DEMAND_DECIMALS) : 0;
  const peakDailyDemand = roundTo(Math.max(0, ...input.dailyGross), DEMAND_DECIMALS);
  const useCycle = input.kind === 'supplier' && input.cycle !== null;
  // A supplier loop whose supplier is gone falls back to the part's lead time, like a supermarket loop.
  const timing = useCycle
    ? { cycle: input.cycle! }
    : { leadTimeDays: Math.max(MIN_SUPERMARKET_REPLENISHMENT_DAYS, input.leadTimeDays) };
  const sizing = sizeKanban({
    dailyDemand: averageDailyDemand,
    containerQty: input.containerQty,
    ...timing,
    safetyFactor: input.safetyFactor,
    safetyDays: input.safetyDays,
    safetyStock: input.safetyUnits,
  });
  if (!input.partIsKanban) {
    return {
      averageDailyDemand,
      peakDailyDemand,
      replenishmentDays: sizing.replenishmentTime,
      exactCards: 0,
      recommendedCards: 0,
      formula: 'The part is no longer replenished by kanban: pull every card.',
    };
  }
  return {
    averageDailyDemand,
    peakDailyDemand,
    replenishmentDays: sizing.replenishmentTime,
    exactCards: sizing.exact,
    recommendedCards: sizing.cards,
    formula: sizing.formula,
  };
}
