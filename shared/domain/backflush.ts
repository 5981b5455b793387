import { isEffective } from './bom';
import { QTY_EPSILON, roundQty } from './quantity';
import type { IsoDate, PartSource, PlanningBomLine } from './types';

/*
 * Backflush: what building units takes out of stock. A unit consumes the components of its model
 * through the BOM lines effective on its build date, at the BOM quantity per — the scrap allowance
 * is added when ordering, not when consuming; scrap that really happens is posted on its own.
 * A made subassembly is taken from its own stock while there is some; what is not in stock was made
 * for the unit just in time, so the explosion goes on through it to its own components, down to the
 * bought parts. With no subassembly stock the consumption is exactly the exploded gross requirement.
 */

/** What the backflush needs to know of a part. */
export interface BackflushPart {
  source: PartSource;
}

/** BOM lines grouped by parent, for repeated explosions. */
export type BomByParent = ReadonlyMap<string, readonly PlanningBomLine[]>;

export function bomByParent(lines: readonly PlanningBomLine[]): BomByParent {
  const byParent = new Map<string, PlanningBomLine[]>();
  for (const line of lines) {
    const list = byParent.get(line.parent);
    if (list) list.push(line);
    else byParent.set(line.parent, [line]);
  }
  return byParent;
}

/** Quantity consumed per part number. */
export type Consumption = Map<string, number>;

function add(consumption: Consumption, partNumber: string, qty: number): void {
  consumption.set(partNumber, roundQty((consumption.get(partNumber) ?? 0) + qty));
}

/** Guards against a cyclic structure the import would have refused anyway. */
const MAX_DEPTH = 50;

/**
 * The components `qty` units of `model` built on `date` consume. `subassemblyStock` holds the
 * on-hand of made parts and is drawn down as they are taken, so units backflushed one after
 * another in build order share it the way the line does.
 */
export function backflush(
  model: string,
  qty: number,
  date: IsoDate,
  bom: BomByParent,
  parts: ReadonlyMap<string, BackflushPart>,
  subassemblyStock: Map<string, number>,
): Consumption {
  const consumption: Consumption = new Map();
  const explode = (parent: string, parentQty: number, depth: number) => {
    if (depth > MAX_DEPTH) throw new RangeError(`The BOM below ${model} is deeper than ${MAX_DEPTH} levels (a cycle?)`);
    for (const line of bom.get(parent) ?? []) {
      if (!isEffective(line, date)) continue;
      const need = roundQty(parentQty * line.qtyPer);
      if (need <= QTY_EPSILON) continue;
      const source = parts.get(line.component)?.source ?? 'buy';
      if (source === 'buy') {
        add(consumption, line.component, need);
        continue;
      }
      const inStock = Math.max(0, subassemblyStock.get(line.component) ?? 0);
      const taken = Math.min(inStock, need);
      if (taken > QTY_EPSILON) {
        add(consumption, line.component, taken);
        subassemblyStock.set(line.component, roundQty(inStock - taken));
      }
      const made = roundQty(need - taken);
      if (made > QTY_EPSILON) explode(line.component, made, depth + 1);
    }
  };
  explode(model, qty, 0);
  return consumption;
}
