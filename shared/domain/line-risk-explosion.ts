import { BOUGHT, MADE, type PlanModel } from './plan-model';
import { QTY_EPSILON, roundQty } from './quantity';
import { floatColumn, intColumn, TypedArena } from './typed-column';

/*
 * The two tools of the line-risk walk: a ledger of uncommitted stock per part and working day, and
 * the pegged explosion of one unit against a ledger. A large plant walks thousands of units through
 * BOMs of hundreds of lines, so both work on flat typed arrays and reuse their scratch space; an
 * explosion is kept and shared by every unit it holds for (see Explosion.version).
 */

const epsilon = QTY_EPSILON;

/** `via` of a need met through no made subassembly. */
export const NO_VIA = -1;

/**
 * Uncommitted quantity per part and working day, as a flat table: row p, column t holds supply up
 * to day t less what was committed for days up to t. A commitment on day b lowers every column
 * from b on; the free quantity for a need on day b is the row's least value from b on (cumulative
 * available-to-promise with look-ahead), kept ready in `least`.
 */
export class StockLedger {
  readonly cells: Float64Array;
  readonly least: Float64Array;
  /** Counts commitments; `changedAt[p]` is the count at the last one to part p. */
  version = 0;
  readonly changedAt: Int32Array;

  /**
   * `rowBase[p]` is where part p's row starts in `cumulativeSupply` (and so in cells and least).
   * With `only`, just the rows of the parts marked 1 are filled (the others read as zero): for
   * walking those parts alone again.
   */
  constructor(
    readonly days: number,
    cumulativeSupply: Float64Array,
    readonly rowBase: Int32Array,
    only?: Uint8Array,
  ) {
    this.least = new Float64Array(cumulativeSupply.length);
    this.changedAt = new Int32Array(rowBase.length);
    if (!only) {
      this.cells = cumulativeSupply.slice();
      for (let base = 0; base < cumulativeSupply.length; base += days) this.leastOfRow(base);
      return;
    }
    this.cells = new Float64Array(cumulativeSupply.length);
    for (let part = 0; part < rowBase.length; part += 1) {
      if (only[part] !== 1) continue;
      const base = rowBase[part];
      this.cells.set(cumulativeSupply.subarray(base, base + days), base);
      this.leastOfRow(base);
    }
  }

  private leastOfRow(base: number): void {
    let least = Infinity;
    for (let t = this.days - 1; t >= 0; t -= 1) {
      if (this.cells[base + t] < least) least = this.cells[base + t];
      this.least[base + t] = least;
    }
  }

  /** Least free quantity of `part` from `bucket` on. */
  free(part: number, bucket: number): number {
    return this.least[this.rowBase[part] + bucket];
  }

  commit(part: number, bucket: number, qty: number): void {
    this.version += 1;
    this.changedAt[part] = this.version;
    this.commitRow(this.rowBase[part], bucket, qty);
  }

  /** Commits to the row starting at `base`, without counting it in `version` (for a ledger no explosion reads). */
  commitRow(base: number, bucket: number, qty: number): void {
    const { cells, least: leastOf, days } = this;
    let least = Infinity;
    for (let t = days - 1; t >= bucket; t -= 1) {
      const cell = roundQty(cells[base + t] - qty);
      cells[base + t] = cell;
      if (cell < least) least = cell;
      leastOf[base + t] = least;
    }
    // Before the need's day a minimum only changes while the lowered one still reaches back.
    for (let t = bucket - 1; t >= 0; t -= 1) {
      const value = Math.min(cells[base + t], least);
      if (value === leastOf[base + t]) break;
      leastOf[base + t] = value;
      least = value;
    }
  }
}

/**
 * One unit's explosion against a ledger, in flat arrays: the needs of bought parts and the made
 * stock taken, in the order the BOM is walked, and (when asked for) the bought parts lacking now.
 * It depends on the ledger only through the free quantities it read, and only so far: a part taken
 * or needed whole holds while at least that much stays free, one found with none while none is. So
 * it holds for any unit of the same model, quantity and day while each read stays in its bounds.
 */
export interface Explosion {
  needCount: number;
  needPart: Int32Array;
  needBucket: Int32Array;
  needQty: Float64Array;
  /** The made part the need comes through, or NO_VIA. */
  needVia: Int32Array;
  takeCount: number;
  takePart: Int32Array;
  takeBucket: Int32Array;
  takeQty: Float64Array;
  /** Bought parts lacking now, each once, with the bucket and via of its first need that lacked. */
  lackCount: number;
  lackPart: Int32Array;
  lackBucket: Int32Array;
  lackQty: Float64Array;
  lackVia: Int32Array;
  /**
   * The reads it depends on: part, bucket, and the bounds the free quantity must stay within (low
   * NaN: the row must not change at all, for a part read again after the unit held some of it).
   */
  readPart: Int32Array;
  readBucket: Int32Array;
  readLow: Float64Array;
  readHigh: Float64Array;
  /** The ledger's version when it was made, or last found to hold. */
  version: number;
  /** Needs grouped by part, made when first asked for (see needGroups). */
  groups: NeedGroups | null;
}

/**
 * An explosion's needs by part: part g is `part[g]`, its needs (indices into the explosion's need
 * arrays, in walk order) are `needs[start[g]]` … `needs[start[g + 1] - 1]`. Parts in order of first need.
 */
export interface NeedGroups {
  count: number;
  part: Int32Array;
  start: Int32Array;
  needs: Int32Array;
  /** Each part's row start in the ledgers, and the bucket and quantity of its first need. */
  base: Int32Array;
  firstBucket: Int32Array;
  firstQty: Float64Array;
}

/** True while every free quantity the explosion read stays within its bounds (see Explosion). */
export function stillHolds(explosion: Explosion, ledger: StockLedger): boolean {
  if (explosion.version === ledger.version) return true;
  if (!readsHold(explosion, ledger, explosion.version)) return false;
  // Every row changed since was checked as it is now: later, only rows changed after this need be.
  explosion.version = ledger.version;
  return true;
}

/**
 * True when an explosion made against another ledger (the last walk's) holds against this one:
 * every free quantity it read is within its bounds here too.
 */
export function holdsAgainst(explosion: Explosion, ledger: StockLedger): boolean {
  return readsHold(explosion, ledger, -1);
}

/** Whether the reads of rows committed to after `version` (every read for -1) are within their bounds. */
function readsHold(explosion: Explosion, ledger: StockLedger, version: number): boolean {
  const { readPart, readBucket, readLow, readHigh } = explosion;
  const { changedAt } = ledger;
  for (let read = 0; read < readPart.length; read += 1) {
    const part = readPart[read];
    if (version >= 0 && changedAt[part] <= version) continue;
    const low = readLow[read];
    if (Number.isNaN(low)) return false;
    const free = ledger.free(part, readBucket[read]);
    if (free < low || free > readHigh[read]) return false;
  }
  return true;
}

/** The needs of a unit the queue view reads: an explosion's, or a copy of them in another thread. */
export type UnitNeeds = Pick<Explosion, 'needCount' | 'needPart' | 'needBucket' | 'needQty' | 'groups'>;

/** Groups units' needs by part (see NeedGroups), with scratch for `partCount` parts. */
export class NeedGrouper {
  private readonly groupStamp: Int32Array;
  private readonly groupIndex: Int32Array;
  private run = 0;

  constructor(
    partCount: number,
    private readonly ints = new TypedArena((size) => new Int32Array(size)),
    private readonly floats = new TypedArena((size) => new Float64Array(size)),
  ) {
    this.groupStamp = new Int32Array(partCount);
    this.groupIndex = new Int32Array(partCount);
  }

  /**
   * The needs grouped by part, worked out once; `rowBase` places the parts' rows in the ledgers.
   * With `only`, the needs of the parts marked 1 alone (for a walk that reads no others).
   */
  groupsOf(explosion: UnitNeeds, rowBase: Int32Array, only?: Uint8Array): NeedGroups {
    if (explosion.groups) return explosion.groups;
    const run = (this.run += 1);
    const { needCount, needPart, needBucket, needQty } = explosion;
    const { groupStamp, groupIndex } = this;
    // Group of each need, parts in order of first need, and how many needs each part has.
    const groupOf = this.ints.take(needCount);
    const partOf = this.ints.take(needCount);
    const sizes = this.ints.take(needCount + 1);
    let count = 0;
    for (let index = 0; index < needCount; index += 1) {
      const part = needPart[index];
      if (only && only[part] !== 1) {
        groupOf[index] = -1;
        continue;
      }
      if (groupStamp[part] !== run) {
        groupStamp[part] = run;
        groupIndex[part] = count;
        partOf[count] = part;
        count += 1;
      }
      const group = groupIndex[part];
      groupOf[index] = group;
      sizes[group + 1] += 1;
    }
    const start = this.ints.take(count + 1);
    for (let group = 0; group < count; group += 1) start[group + 1] = start[group] + sizes[group + 1];
    const fill = sizes;
    fill.set(start.subarray(0, count));
    const needs = this.ints.take(needCount);
    for (let index = 0; index < needCount; index += 1) if (groupOf[index] >= 0) needs[fill[groupOf[index]]++] = index;
    const groups: NeedGroups = {
      count,
      part: partOf.subarray(0, count),
      start,
      needs,
      base: this.ints.take(count),
      firstBucket: this.ints.take(count),
      firstQty: this.floats.take(count),
    };
    for (let group = 0; group < count; group += 1) {
      const first = needs[start[group]];
      groups.base[group] = rowBase[partOf[group]];
      groups.firstBucket[group] = needBucket[first];
      groups.firstQty[group] = needQty[first];
    }
    explosion.groups = groups;
    return explosion.groups;
  }
}

/**
 * Explodes units through the plan model with pegging:
 * - a bought part is needed on the day of its parent (the build date, or a subassembly's start);
 * - a made part (or a model used as a component) is taken from its own stock first, and what is
 *   not in stock is made, starting its lead time in working days earlier, through the lines
 *   effective on that start;
 * - within one unit, what the unit already holds of a part (and from when) is not free for it again.
 * Scratch per part is stamped with the explosion's number, so nothing is cleared between units.
 */
export class Exploder {
  private readonly needPart = intColumn();
  private readonly needBucket = intColumn();
  private readonly needQty = floatColumn();
  private readonly needVia = intColumn();
  private readonly takePart = intColumn();
  private readonly takeBucket = intColumn();
  private readonly takeQty = floatColumn();
  private readonly lackPart = intColumn();
  private readonly lackBucket = intColumn();
  private readonly lackQty = floatColumn();
  private readonly lackVia = intColumn();
  private readonly readPart = intColumn();
  private readonly readBucket = intColumn();
  private readonly readLow = floatColumn();
  private readonly readHigh = floatColumn();
  /** The read the last freeFor made (its index), or -1 when it read a part read before. */
  private lastRead = -1;
  /** What this unit holds of a part: a list in walk order (heldFirst → heldNext), its sum and latest bucket. */
  private readonly heldBucket = intColumn();
  private readonly heldQty = floatColumn();
  private readonly heldNext = intColumn();
  private readonly heldStamp: Int32Array;
  private readonly heldFirst: Int32Array;
  private readonly heldLast: Int32Array;
  private readonly heldSum: Float64Array;
  private readonly heldLatest: Int32Array;
  private readonly readStamp: Int32Array;
  private readonly readIndex: Int32Array;
  private readonly lackStamp: Int32Array;
  private readonly lackIndex: Int32Array;
  /** Explosions are many and small: their arrays are views into shared blocks. */
  private readonly ints = new TypedArena((size) => new Int32Array(size));
  private readonly floats = new TypedArena((size) => new Float64Array(size));
  readonly grouper: NeedGrouper;
  private stamp = 0;
  private ledger!: StockLedger;
  private withLacks = false;

  constructor(private readonly model: PlanModel) {
    const parts = model.source.length;
    this.heldStamp = new Int32Array(parts);
    this.heldFirst = new Int32Array(parts);
    this.heldLast = new Int32Array(parts);
    this.heldSum = new Float64Array(parts);
    this.heldLatest = new Int32Array(parts);
    this.readStamp = new Int32Array(parts);
    this.readIndex = new Int32Array(parts);
    this.lackStamp = new Int32Array(parts);
    this.lackIndex = new Int32Array(parts);
    this.grouper = new NeedGrouper(parts, this.ints, this.floats);
  }

  /**
   * `qty` of `part` built on `bucket`, against `ledger`. Without `withLacks` only the needs and
   * takes are worked out, and bought parts are not read: the explosion then holds until a made
   * part it read is committed to.
   */
  explode(ledger: StockLedger, part: number, qty: number, bucket: number, withLacks: boolean): Explosion {
    this.begin(ledger, withLacks);
    this.visit(part, qty, bucket, NO_VIA);
    return {
      needCount: this.needPart.length,
      needPart: this.ints.copyOf(this.needPart),
      needBucket: this.ints.copyOf(this.needBucket),
      needQty: this.floats.copyOf(this.needQty),
      needVia: this.ints.copyOf(this.needVia),
      takeCount: this.takePart.length,
      takePart: this.ints.copyOf(this.takePart),
      takeBucket: this.ints.copyOf(this.takeBucket),
      takeQty: this.floats.copyOf(this.takeQty),
      lackCount: this.lackPart.length,
      lackPart: this.ints.copyOf(this.lackPart),
      lackBucket: this.ints.copyOf(this.lackBucket),
      lackQty: this.floats.copyOf(this.lackQty),
      lackVia: this.ints.copyOf(this.lackVia),
      readPart: this.ints.copyOf(this.readPart),
      readBucket: this.ints.copyOf(this.readBucket),
      readLow: this.floats.copyOf(this.readLow),
      readHigh: this.floats.copyOf(this.readHigh),
      version: ledger.version,
      groups: null,
    };
  }

  /**
   * The lacks `explode` finds for the needs of `explosion` of the parts marked 1 in `only` (bought
   * parts), against `ledger` as it is now: a few parts walked again without exploding the unit.
   * The arrays are scratch, valid until the next call.
   */
  lacksOf(ledger: StockLedger, explosion: Explosion, only: Uint8Array) {
    this.begin(ledger, true);
    const { needCount, needPart, needBucket, needQty, needVia } = explosion;
    for (let need = 0; need < needCount; need += 1) {
      const part = needPart[need];
      if (only[part] === 1) this.lackOf(part, needBucket[need], needQty[need], needVia[need]);
    }
    return {
      count: this.lackPart.length,
      part: this.lackPart.values,
      bucket: this.lackBucket.values,
      qty: this.lackQty.values,
      via: this.lackVia.values,
    };
  }

  /** The explosion's needs grouped by part, worked out once; `rowBase` places the parts' rows in the ledgers. */
  needGroups(explosion: Explosion, rowBase: Int32Array): NeedGroups {
    return this.grouper.groupsOf(explosion, rowBase);
  }

  /** A new explosion against `ledger`: a new stamp for the per-part scratch, and empty columns. */
  private begin(ledger: StockLedger, withLacks: boolean): void {
    this.stamp += 1;
    this.ledger = ledger;
    this.withLacks = withLacks;
    for (const column of [
      this.needPart,
      this.needBucket,
      this.needQty,
      this.needVia,
      this.takePart,
      this.takeBucket,
      this.takeQty,
      this.lackPart,
      this.lackBucket,
      this.lackQty,
      this.lackVia,
      this.readPart,
      this.readBucket,
      this.readLow,
      this.readHigh,
      this.heldBucket,
      this.heldQty,
      this.heldNext,
    ])
      column.length = 0;
  }

  /** Day number of bucket offset b, which may lie before the horizon (a subassembly started earlier). */
  private dayOfOffset(offset: number): number {
    const { dayNumbers } = this.model;
    return offset >= 0
      ? dayNumbers[Math.min(offset, dayNumbers.length - 1)]
      : this.model.workingDayBeforeStart(-offset);
  }

  private visit(parent: number, qty: number, offset: number, via: number): void {
    const { lineStart, lineFrom, lineTo, lineQtyPer, lineComponent, source, leadTimeDays } = this.model;
    const day = this.dayOfOffset(offset);
    const bucket = Math.max(0, offset);
    for (let line = lineStart[parent]; line < lineStart[parent + 1]; line += 1) {
      if (day < lineFrom[line] || day > lineTo[line]) continue;
      const need = roundQty(qty * lineQtyPer[line]);
      if (need <= epsilon) continue;
      const component = lineComponent[line];
      if (source[component] === BOUGHT) {
        this.needPart.push(component);
        this.needBucket.push(bucket);
        this.needQty.push(need);
        this.needVia.push(via);
        if (this.withLacks) this.lackOf(component, bucket, need, via);
        continue;
      }
      const free = this.freeFor(component, bucket);
      const inStock = Math.max(0, free);
      const taken = Math.min(need, inStock);
      // Taken whole while at least the need is free; none taken while none is.
      if (taken === need) this.bound(need, Infinity);
      else if (inStock === 0) this.bound(-Infinity, 0);
      if (taken > epsilon) {
        this.takePart.push(component);
        this.takeBucket.push(bucket);
        this.takeQty.push(taken);
        this.hold(component, bucket, taken);
      }
      const made = roundQty(need - taken);
      if (made > epsilon) {
        const start = offset - leadTimeDays[component];
        this.visit(component, made, start, via === NO_VIA && source[component] === MADE ? component : via);
      }
    }
  }

  /** Records what of `need` is not free now; the first need that lacks gives the bucket and via. */
  private lackOf(part: number, bucket: number, need: number, via: number): void {
    const read = this.freeFor(part, bucket);
    const free = Math.max(0, read);
    this.hold(part, bucket, need);
    const lack = need - free;
    // Lacking nothing while at least as much is free; lacking the whole need while none is.
    if (lack <= epsilon) this.bound(Math.min(need, read), Infinity);
    else if (free === 0) this.bound(-Infinity, 0);
    if (lack <= epsilon) return;
    if (this.lackStamp[part] !== this.stamp) {
      this.lackStamp[part] = this.stamp;
      this.lackIndex[part] = this.lackPart.push(part);
      this.lackBucket.push(bucket);
      this.lackQty.push(lack);
      this.lackVia.push(via);
    } else {
      const index = this.lackIndex[part];
      this.lackQty.values[index] = roundQty(this.lackQty.values[index] + Math.min(need, lack));
    }
  }

  /** Least free quantity of `part` from `bucket` on, less what this unit already holds of it (and when). */
  private freeFor(part: number, bucket: number): number {
    const { ledger } = this;
    this.lastRead = -1;
    if (this.readStamp[part] !== this.stamp) {
      // A first read: exactly this free quantity, until the caller knows how much of it mattered (see bound).
      this.readStamp[part] = this.stamp;
      const free = ledger.free(part, bucket);
      this.readIndex[part] = this.readPart.push(part);
      this.readBucket.push(bucket);
      this.lastRead = this.readLow.push(free);
      this.readHigh.push(free);
      return free;
    }
    // Read again: the row must stand as it was.
    this.readLow.values[this.readIndex[part]] = NaN;
    if (this.heldStamp[part] !== this.stamp) return ledger.free(part, bucket);
    // Held quantities only lower the days from their own need on.
    if (this.heldLatest[part] <= bucket) return roundQty(ledger.free(part, bucket) - this.heldSum[part]);
    const base = ledger.rowBase[part];
    const heldBucket = this.heldBucket.values;
    const heldQty = this.heldQty.values;
    const heldNext = this.heldNext.values;
    let least = Infinity;
    for (let t = bucket; t < ledger.days; t += 1) {
      let value = ledger.cells[base + t];
      for (let held = this.heldFirst[part]; held !== -1; held = heldNext[held])
        if (heldBucket[held] <= t) value -= heldQty[held];
      if (value < least) least = value;
    }
    return roundQty(least);
  }

  /** Widens the bounds of the read the last freeFor made, when it was a first read. */
  private bound(low: number, high: number): void {
    if (this.lastRead < 0) return;
    this.readLow.values[this.lastRead] = low;
    this.readHigh.values[this.lastRead] = high;
  }

  private hold(part: number, bucket: number, qty: number): void {
    const held = this.heldBucket.push(bucket);
    this.heldQty.push(qty);
    this.heldNext.push(-1);
    if (this.heldStamp[part] !== this.stamp) {
      this.heldStamp[part] = this.stamp;
      this.heldFirst[part] = held;
      this.heldSum[part] = 0 + qty;
      this.heldLatest[part] = bucket;
    } else {
      this.heldNext.values[this.heldLast[part]] = held;
      this.heldSum[part] += qty;
      if (bucket > this.heldLatest[part]) this.heldLatest[part] = bucket;
    }
    this.heldLast[part] = held;
  }
}
