import type { IsoDate } from '../shared/domain/types';
import type { DemoBomLine, DemoSequenceSlot } from './scenario-types';

function isEffectiveOn(line: DemoBomLine, date: IsoDate): boolean {
  return (
    (line.effectiveFrom === null || line.effectiveFrom <= date) &&
    (line.effectiveTo === null || date <= line.effectiveTo)
  );
}

/**
 * Gross demand of every part per build day, exploded through all BOM levels at the build date
 * with scrap and without lead-time offsets: enough to size the demo's opening stock, not a plan.
 */
export function dailyGrossDemand(
  bom: DemoBomLine[],
  sequence: DemoSequenceSlot[],
  days: IsoDate[],
): Map<string, number[]> {
  const linesByParent = new Map<string, DemoBomLine[]>();
  for (const line of bom) {
    const lines = linesByParent.get(line.parent) ?? [];
    lines.push(line);
    linesByParent.set(line.parent, lines);
  }
  const dayIndex = new Map(days.map((day, index) => [day, index]));
  const demand = new Map<string, number[]>();
  const add = (partNumber: string, index: number, qty: number): void => {
    const perDay = demand.get(partNumber) ?? days.map(() => 0);
    perDay[index] += qty;
    demand.set(partNumber, perDay);
  };
  const explode = (parent: string, qty: number, date: IsoDate, index: number): void => {
    for (const line of linesByParent.get(parent) ?? []) {
      if (!isEffectiveOn(line, date)) continue;
      const componentQty = qty * line.qtyPer * (1 + line.scrapPct / 100);
      add(line.component, index, componentQty);
      explode(line.component, componentQty, date, index);
    }
  };
  for (const slot of sequence) {
    const index = dayIndex.get(slot.date);
    if (index === undefined) continue;
    explode(slot.model, slot.qty, slot.date, index);
  }
  return demand;
}
