import { isEffective } from './bom';
import { addCalendarDays } from './date';
import type { IsoDate, PlanningBomLine } from './types';

/** A stored BOM line: a planning line with its id. */
export interface StoredBomLine extends PlanningBomLine {
  id: number;
}

/** One line of an indented BOM, with its quantity per one unit of the top parent. */
export interface IndentedBomLine {
  lineId: number;
  component: string;
  qtyPer: number;
  scrapPct: number;
  effectiveFrom: IsoDate | null;
  effectiveTo: IsoDate | null;
  level: number;
  /**
   * Ordered quantity per one top parent: the product of qtyPer × (1 + scrapPct / 100) along the
   * path, so an allowance on a subassembly also covers the scrap of its components.
   */
  extendedQty: number;
  children: IndentedBomLine[];
}

/** Quantity ordered for one parent unit: the scrap allowance is added on top of the quantity per. */
export function orderedQtyPer(line: Pick<PlanningBomLine, 'qtyPer' | 'scrapPct'>): number {
  return line.qtyPer * (1 + line.scrapPct / 100);
}

/**
 * The multi-level BOM below `parent`, level by level in line order. With a date, only the lines in
 * effect on that date (both ends inclusive); without one, every line whatever its dates, so a
 * coming engineering change shows beside the line it replaces.
 */
export function indentedBom(parent: string, lines: readonly StoredBomLine[], date: IsoDate | null): IndentedBomLine[] {
  const byParent = new Map<string, StoredBomLine[]>();
  for (const line of lines) {
    if (date !== null && !isEffective(line, date)) continue;
    const list = byParent.get(line.parent);
    if (list) list.push(line);
    else byParent.set(line.parent, [line]);
  }
  const expand = (node: string, level: number, factor: number, path: ReadonlySet<string>): IndentedBomLine[] =>
    (byParent.get(node) ?? [])
      // A stored BOM has no cycles (every change is checked); the guard keeps a bad row from looping.
      .filter((line) => !path.has(line.component))
      .map((line) => {
        const extendedQty = factor * orderedQtyPer(line);
        return {
          lineId: line.id,
          component: line.component,
          qtyPer: line.qtyPer,
          scrapPct: line.scrapPct,
          effectiveFrom: line.effectiveFrom ?? null,
          effectiveTo: line.effectiveTo ?? null,
          level,
          extendedQty,
          children: expand(line.component, level + 1, extendedQty, new Set([...path, line.component])),
        };
      });
  return expand(parent, 1, 1, new Set([parent]));
}

/** Parents that use `component` directly, and the top parents (no one's component) that reach it at any depth. */
export function whereUsed(
  component: string,
  lines: readonly PlanningBomLine[],
): { direct: PlanningBomLine[]; topParents: string[] } {
  const parentsOf = new Map<string, Set<string>>();
  const isComponent = new Set<string>();
  for (const line of lines) {
    isComponent.add(line.component);
    const set = parentsOf.get(line.component);
    if (set) set.add(line.parent);
    else parentsOf.set(line.component, new Set([line.parent]));
  }
  const seen = new Set<string>([component]);
  const queue = [component];
  const tops = new Set<string>();
  while (queue.length > 0) {
    const node = queue.pop() as string;
    for (const parent of parentsOf.get(node) ?? []) {
      if (seen.has(parent)) continue;
      seen.add(parent);
      if (!isComponent.has(parent)) tops.add(parent);
      queue.push(parent);
    }
  }
  return {
    direct: lines.filter((line) => line.component === component),
    topParents: [...tops].sort(),
  };
}

/** What an engineering change asks for: from `effectiveFrom`, `replacement` instead of `component`. */
export interface EngineeringChangeRequest {
  component: string;
  replacement: string;
  qtyPer: number;
  scrapPct: number;
  effectiveFrom: IsoDate;
}

export type EngineeringChangeOutcome =
  { ok: true; lines: PlanningBomLine[] } | { ok: false; field: 'component' | 'effectiveFrom'; message: string };

/**
 * A parent's single-level lines after an engineering change: the line of `component` in effect on
 * `effectiveFrom` ends the day before, and the replacement runs from that day to where the old
 * line would have ended. Refused when no such line is in effect, or when it starts that very day
 * (then there is nothing to end: edit the line itself).
 */
export function applyEngineeringChange(
  parentLines: readonly PlanningBomLine[],
  change: EngineeringChangeRequest,
): EngineeringChangeOutcome {
  const index = parentLines.findIndex(
    (line) => line.component === change.component && isEffective(line, change.effectiveFrom),
  );
  if (index === -1) {
    return {
      ok: false,
      field: 'component',
      message: `no line of '${change.component}' is in effect on ${change.effectiveFrom}`,
    };
  }
  const old = parentLines[index];
  if (old.effectiveFrom != null && old.effectiveFrom >= change.effectiveFrom) {
    return {
      ok: false,
      field: 'effectiveFrom',
      message: `the line of '${change.component}' starts on ${old.effectiveFrom}; a change must start after it`,
    };
  }
  const ended: PlanningBomLine = { ...old, effectiveTo: addCalendarDays(change.effectiveFrom, -1) };
  const replacement: PlanningBomLine = {
    parent: old.parent,
    component: change.replacement,
    qtyPer: change.qtyPer,
    scrapPct: change.scrapPct,
    effectiveFrom: change.effectiveFrom,
    effectiveTo: old.effectiveTo ?? null,
  };
  const lines = [...parentLines];
  lines.splice(index, 1, ended, replacement);
  return { ok: true, lines };
}
