import type { SequenceDay } from '@shared/schemas/sequence';
import { formatDay, formatWhen } from '@/format';

/** Units per model on a day, in the board's model order, models with no unit left out. */
export function modelMix(day: SequenceDay, modelOrder: readonly string[]): { model: string; count: number }[] {
  const counts = new Map<string, number>();
  for (const unit of day.units) counts.set(unit.model, (counts.get(unit.model) ?? 0) + unit.qty);
  const known = modelOrder.filter((model) => counts.has(model));
  const others = [...counts.keys()].filter((model) => !modelOrder.includes(model)).sort();
  return [...known, ...others].map((model) => ({ model, count: counts.get(model)! }));
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
