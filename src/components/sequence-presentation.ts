import type { SequenceDay } from '@shared/schemas/sequence';
import type { BoardUnitAtRisk } from '@/stores/board-risk-engine';
import { countOf, formatCount, formatDay, formatQty, formatQuantity, formatWhen } from '@/format';

/** Units per model on a day, in the board's model order, models with no unit left out. */
export function modelMix(day: SequenceDay, modelOrder: readonly string[]): { model: string; count: number }[] {
  const counts = new Map<string, number>();
  for (const unit of day.units) counts.set(unit.model, (counts.get(unit.model) ?? 0) + unit.qty);
  const known = modelOrder.filter((model) => counts.has(model));
  const others = [...counts.keys()].filter((model) => !modelOrder.includes(model)).sort();
  return [...known, ...others].map((model) => ({ model, count: counts.get(model)! }));
}

/**
 * Units drawn per day before a "show more" button: a day of a large plant holds 160 units or more,
 * and ten such days drawn whole are tens of thousands of DOM nodes. Above any day's capacity on the
 * demo plant, so a day there is always drawn whole.
 */
export const DAY_UNITS_DRAWN = 60;

/** The button under a day drawn in part: how many units it hides and how many of those are at risk. */
export function hiddenUnitsText(hidden: number, atRisk: number): string {
  const units = countOf(hidden, 'more unit', 'more units');
  return atRisk > 0 ? `Show ${units} (${formatCount(atRisk)} at risk)` : `Show ${units}`;
}

/** The board lengths a planner can pick, in working days. */
export const HORIZON_CHOICES = [5, 10, 15, 20, 30] as const;

/** Who last changed a day of the sequence and when, as a 409 `stale` move names it. */
interface LastSequenceChange {
  by: string;
  at: string;
  action: string;
}

function staleDetails(details: readonly unknown[]): { dates: string[]; lastChange: LastSequenceChange | null } {
  const first = (details[0] ?? {}) as { days?: unknown; lastChange?: unknown };
  const dates = Array.isArray(first.days)
    ? first.days
        .map((day) => (day as Partial<SequenceDay> | null)?.date)
        .filter((date): date is string => typeof date === 'string')
    : [];
  const change = first.lastChange as Partial<LastSequenceChange> | null | undefined;
  const lastChange =
    change && typeof change.by === 'string' && typeof change.at === 'string'
      ? { by: change.by, at: change.at, action: String(change.action ?? '') }
      : null;
  return { dates, lastChange };
}

/**
 * Why a move was refused on a stale board, in the planner's words and local time: which days
 * changed, who changed them last and when; the server's own sentence when the details are missing.
 */
export function staleMoveMessage(error: { message: string; details: readonly unknown[] }): string {
  const { dates, lastChange } = staleDetails(error.details);
  if (dates.length === 0) return `Your move was not saved. ${error.message}`;
  const days = dates.map(formatDay).join(' and ');
  const verb = dates.length === 1 ? 'has' : 'have';
  const who = lastChange
    ? ` ${lastChange.by} changed ${dates.length === 1 ? 'it' : 'them'} at ${formatWhen(lastChange.at)}.`
    : '';
  return `Your move was not saved: ${days} ${verb} changed since your board was loaded.${who} The board now shows the current order; make your move again if it is still needed.`;
}

/** "At risk: lacks BAT-06-312 ×6 by Tue 8 Dec; STL-TUB-25 ×0.4 through FRM-32R by Mon 7 Dec." */
export function riskDescription(unit: Pick<BoardUnitAtRisk, 'lacks' | 'moreLacks'>): string {
  return `At risk: lacks ${lackList(unit)}.`;
}

/** "BAT-06-312 ×6 by Tue 8 Dec; STL-TUB-25 ×0.4 through FRM-32R by Mon 7 Dec", then "and 3 more parts". */
export function lackList(unit: Pick<BoardUnitAtRisk, 'lacks' | 'moreLacks'>): string {
  const named = unit.lacks
    .map((lack) => {
      const via = lack.via ? ` through ${lack.via}` : '';
      return `${lack.partNumber} ×${formatQty(lack.qty)}${via} by ${formatDay(lack.neededOn)}`;
    })
    .join('; ');
  const { moreLacks } = unit;
  return moreLacks > 0 ? `${named}; and ${moreLacks} more ${moreLacks === 1 ? 'part' : 'parts'}` : named;
}

/** "+6 pcs", "−2.5 kg": a change in demand with its sign and unit. */
export function formatDemandChange(change: number, uom: string): string {
  const sign = change > 0 ? '+' : '−';
  return `${sign}${formatQuantity(Math.abs(change), uom)}`;
}

/** "SN26120904 (FS-32R), Wed 9 Dec position 4". */
export function unitPlace(unit: { serial: string; model: string; date: string; sequence: number }): string {
  return `${unit.serial} (${unit.model}), ${formatDay(unit.date)} position ${unit.sequence}`;
}

/** "Worked out in 12 ms in this browser." */
export function elapsedWords(elapsedMs: number): string {
  return `Worked out in ${Math.max(1, Math.round(elapsedMs))} ms in this browser.`;
}
