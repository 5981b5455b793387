import type { IsoDate, PlanningBomLine } from './types';

/** The parent → component link of a BOM line, all the structure functions need. */
export type BomLink = Pick<PlanningBomLine, 'parent' | 'component'>;

/** Effectivity window of a BOM line; null or absent ends are open. */
export type BomEffectivity = Pick<PlanningBomLine, 'effectiveFrom' | 'effectiveTo'>;

/** Raised when a part is, through its BOM, a component of itself; `cycle` starts and ends on the same part. */
export class BomCycleError extends Error {
  readonly cycle: string[];

  constructor(cycle: string[]) {
    super(`BOM cycle: ${cycle.join(' → ')}`);
    this.name = 'BomCycleError';
    this.cycle = cycle;
  }
}

/** A pair of lines for the same parent and component whose effectivity windows share a day. */
export interface EffectivityOverlap {
  parent: string;
  component: string;
  /** Index of the earlier line in the list given. */
  firstIndex: number;
  /** Index of the later line in the list given. */
  secondIndex: number;
}

interface BomGraph {
  names: string[];
  /** Components of each node, in line order. */
  children: number[][];
}

function buildGraph(partNumbers: Iterable<string>, lines: readonly BomLink[]): BomGraph {
  const indexOf = new Map<string, number>();
  const names: string[] = [];
  const children: number[][] = [];
  const add = (name: string): number => {
    let index = indexOf.get(name);
    if (index === undefined) {
      index = names.length;
      indexOf.set(name, index);
      names.push(name);
      children.push([]);
    }
    return index;
  };
  for (const partNumber of partNumbers) add(partNumber);
  for (const line of lines) {
    const parent = add(line.parent);
    children[parent].push(add(line.component));
  }
  return { names, children };
}

const UNSEEN = 0;
const ON_PATH = 1;
const DONE = 2;

function cycleIn(graph: BomGraph): string[] | null {
  const { names, children } = graph;
  const state = new Uint8Array(names.length);
  // Explicit stacks so a deep BOM cannot overflow the call stack.
  const path: number[] = [];
  const nextChild: number[] = [];
  for (let root = 0; root < names.length; root += 1) {
    if (state[root] !== UNSEEN) continue;
    path.push(root);
    nextChild.push(0);
    state[root] = ON_PATH;
    while (path.length > 0) {
      const top = path.length - 1;
      const node = path[top];
      const position = nextChild[top];
      if (position === children[node].length) {
        state[node] = DONE;
        path.pop();
        nextChild.pop();
        continue;
      }
      nextChild[top] = position + 1;
      const child = children[node][position];
      if (state[child] === ON_PATH) {
        const start = path.indexOf(child);
        return [...path.slice(start), child].map((index) => names[index]);
      }
      if (state[child] === UNSEEN) {
        state[child] = ON_PATH;
        path.push(child);
        nextChild.push(0);
      }
    }
  }
  return null;
}

/** The first BOM cycle found, as a part path that ends where it starts (e.g. A → B → A), or null. */
export function findBomCycle(lines: readonly BomLink[]): string[] | null {
  return cycleIn(buildGraph([], lines));
}

/**
 * Low-level code of every part named in `partNumbers` or in the lines: 0 for parts that are
 * nobody's component (end items), otherwise the deepest level at which the part appears in any
 * structure. All lines count regardless of effectivity, so a code stays valid on every date.
 * Throws BomCycleError when the structure has a cycle.
 */
export function lowLevelCodes(partNumbers: Iterable<string>, lines: readonly BomLink[]): Map<string, number> {
  const graph = buildGraph(partNumbers, lines);
  const { names, children } = graph;
  const parentsLeft = new Int32Array(names.length);
  for (const list of children) for (const child of list) parentsLeft[child] += 1;

  // Kahn's topological order: a part is coded once all of its parents are.
  const codes = new Int32Array(names.length);
  const ready: number[] = [];
  for (let node = 0; node < names.length; node += 1) if (parentsLeft[node] === 0) ready.push(node);
  let coded = 0;
  while (ready.length > 0) {
    const node = ready.pop() as number;
    coded += 1;
    for (const child of children[node]) {
      if (codes[node] + 1 > codes[child]) codes[child] = codes[node] + 1;
      parentsLeft[child] -= 1;
      if (parentsLeft[child] === 0) ready.push(child);
    }
  }
  if (coded < names.length) throw new BomCycleError(cycleIn(graph) ?? []);

  const result = new Map<string, number>();
  names.forEach((name, index) => result.set(name, codes[index]));
  return result;
}

/** True when the line is in effect on `date`; both ends inclusive, a null end is open. */
export function isEffective(line: BomEffectivity, date: IsoDate): boolean {
  // ISO dates with four-digit years order correctly as strings.
  if (line.effectiveFrom != null && date < line.effectiveFrom) return false;
  if (line.effectiveTo != null && date > line.effectiveTo) return false;
  return true;
}

function windowsIntersect(a: BomEffectivity, b: BomEffectivity): boolean {
  const aStartsAfterBEnds = a.effectiveFrom != null && b.effectiveTo != null && a.effectiveFrom > b.effectiveTo;
  const bStartsAfterAEnds = b.effectiveFrom != null && a.effectiveTo != null && b.effectiveFrom > a.effectiveTo;
  return !aStartsAfterBEnds && !bStartsAfterAEnds;
}

/**
 * Pairs of lines with the same parent and component whose effectivity windows share at least one
 * day, so that an engineering change never counts a component twice on a date.
 */
export function findEffectivityOverlaps(lines: readonly PlanningBomLine[]): EffectivityOverlap[] {
  const byLink = new Map<string, number[]>();
  lines.forEach((line, index) => {
    const key = `${line.parent}\u0000${line.component}`;
    const group = byLink.get(key);
    if (group) group.push(index);
    else byLink.set(key, [index]);
  });
  const overlaps: EffectivityOverlap[] = [];
  for (const group of byLink.values()) {
    for (let i = 0; i < group.length; i += 1) {
      for (let j = i + 1; j < group.length; j += 1) {
        const first = lines[group[i]];
        if (windowsIntersect(first, lines[group[j]])) {
          overlaps.push({
            parent: first.parent,
            component: first.component,
            firstIndex: group[i],
            secondIndex: group[j],
          });
        }
      }
    }
  }
  return overlaps.sort((a, b) => a.firstIndex - b.firstIndex || a.secondIndex - b.secondIndex);
}
