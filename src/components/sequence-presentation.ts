import type { SequenceDay } from '@shared/schemas/sequence';

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
