import { NeedGrouper, type NeedGroups, StockLedger, type UnitNeeds } from './line-risk-explosion';
import { QTY_EPSILON, roundQty } from './quantity';
import { floatColumn, intColumn, TypedColumn } from './typed-column';

/*
 * The queue view: each part serves the units in build order, a unit taking its need of a part if
 * the units ahead left enough, whatever its other parts do. What a unit lacks there it lacks only
 * behind the units ahead of it. A part's queue view depends on nothing but its supply and the
 * needs of it of the units in order, so it is walked apart from the build view (which judges
 * each unit whole), before it or, on a large plant, beside it in another thread.
 */

const epsilon = QTY_EPSILON;

/**
 * What each unit lacks of each part behind the units ahead of it: the entries of the unit at
 * position u are start[u] … start[u + 1] - 1, each a part, the quantity it lacks and the index of
 * the unit's first need of it among its needs (which gives the slot's via and day).
 */
export interface QueueEntries {
  start: Int32Array;
  part: Int32Array;
  qty: Float64Array;
  need: Int32Array;
}

/** Columns a queue view is written into; `start` holds a place for every unit and one more. */
export interface QueueColumns {
  start: Int32Array;
  part: TypedColumn<Int32Array>;
  qty: TypedColumn<Float64Array>;
  need: TypedColumn<Int32Array>;
}

/** Columns for `units` units, with room for `room` entries before they grow. */
export function queueColumns(units: number, room = 1024): QueueColumns {
  return { start: new Int32Array(units + 1), part: intColumn(room), qty: floatColumn(room), need: intColumn(room) };
}

export function entriesOf(columns: QueueColumns): QueueEntries {
  return {
    start: columns.start,
    part: columns.part.done(),
    qty: columns.qty.done(),
    need: columns.need.done(),
  };
}

/**
 * The last walk's queue view lent to this one: the entries of the parts not marked in `fresh` are
 * kept as they were for the same unit (its position then in `lastPosition`, or -1). `lastUnits`:
 * the explosions the entries were found for, by position then (an entry's first need indexes its
 * unit's explosion).
 */
export interface QueueKeep {
  fresh: Uint8Array;
  last: QueueEntries;
  lastUnits: readonly UnitNeeds[];
  lastPosition: Int32Array;
}

/**
 * Walks the queue view of the units' needs (in build order) against `queue`, a ledger holding the
 * rows of the parts marked in `queued` (the others never run short), into `out`. `done(n)` is
 * told each time the first n units are written. `groupQueuedOnly`: the units' needs are grouped for
 * this walk alone (a walk afresh reads no other part's), not for later walks to keep. A unit's
 * entries come in no particular order of parts.
 */
export function walkQueueView(
  units: readonly UnitNeeds[],
  grouper: NeedGrouper,
  rowBase: Int32Array,
  queue: StockLedger,
  queued: Uint8Array,
  keep: QueueKeep | null,
  out: QueueColumns,
  done?: (units: number) => void,
  groupQueuedOnly = false,
): void {
  const { start, part: outPart, qty: outQty, need: outNeed } = out;
  const keptStamp = keep ? new Int32Array(rowBase.length) : null;
  const keptQty = keep ? new Float64Array(rowBase.length) : null;
  /** Per explosion: its groups of the parts walked afresh that may run short (most units share an explosion). */
  const freshGroups = new Map<UnitNeeds, number[]>();
  const push = (part: number, qty: number, need: number) => {
    outPart.push(part);
    outQty.push(qty);
    outNeed.push(need);
  };
  for (let position = 0; position < units.length; position += 1) {
    const explosion = units[position];
    start[position] = outPart.length;
    const last = keep ? keep.lastPosition[position] : -1;
    if (last >= 0 && keep!.lastUnits[last] === explosion) {
      // The same explosion as then: its entries of the parts that stand are copied as they are,
      // and only the parts walked afresh are looked for among its needs.
      const kept = keep!.last;
      const from = kept.start[last];
      const to = kept.start[last + 1];
      // Written straight into the columns, with room made once: most entries of a walk come here.
      let at = outPart.length;
      outPart.reserve(at + to - from);
      outQty.reserve(at + to - from);
      outNeed.reserve(at + to - from);
      const { values: parts } = outPart;
      const { values: qtys } = outQty;
      const { values: needs } = outNeed;
      for (let entry = from; entry < to; entry += 1) {
        const part = kept.part[entry];
        if (keep!.fresh[part] === 1) continue;
        parts[at] = part;
        qtys[at] = kept.qty[entry];
        needs[at] = kept.need[entry];
        at += 1;
      }
      outPart.length = outQty.length = outNeed.length = at;
      const groups = grouper.groupsOf(explosion, rowBase);
      let walked = freshGroups.get(explosion);
      if (!walked) {
        walked = [];
        for (let group = 0; group < groups.count; group += 1) {
          const part = groups.part[group];
          if (keep!.fresh[part] === 1 && queued[part] === 1) walked.push(group);
        }
        freshGroups.set(explosion, walked);
      }
      for (const group of walked) {
        const lack = queueLack(queue, groups, group, explosion);
        if (lack !== 0) push(groups.part[group], roundQty(lack), groups.needs[groups.start[group]]);
      }
    } else {
      const groups = grouper.groupsOf(explosion, rowBase, groupQueuedOnly && keep === null ? queued : undefined);
      if (last >= 0) {
        const kept = keep!.last;
        for (let entry = kept.start[last]; entry < kept.start[last + 1]; entry += 1) {
          keptStamp![kept.part[entry]] = position + 1;
          keptQty![kept.part[entry]] = kept.qty[entry];
        }
      }
      for (let group = 0; group < groups.count; group += 1) {
        const part = groups.part[group];
        let qty: number;
        if (keep === null || keep.fresh[part] === 1) {
          if (queued[part] === 0) continue;
          const lack = queueLack(queue, groups, group, explosion);
          if (lack === 0) continue;
          qty = roundQty(lack);
        } else {
          if (keptStamp![part] !== position + 1) continue;
          qty = keptQty![part];
        }
        push(part, qty, groups.needs[groups.start[group]]);
      }
    }
    start[position + 1] = outPart.length;
    done?.(position + 1);
  }
}

/**
 * The queue view of one part a unit needs (group `group` of its needs): what it lacks once the
 * units ahead are served, whatever the unit's other parts do; 0 when it lacks nothing, and then
 * its needs are committed.
 */
export function queueLack(queue: StockLedger, groups: NeedGroups, group: number, explosion: UnitNeeds): number {
  const { cells, least: leastOf, days } = queue;
  const first = groups.start[group];
  const end = groups.start[group + 1];
  const base = groups.base[group];
  if (end - first === 1) {
    // Most parts are needed once per unit.
    const qty = groups.firstQty[group];
    const bucket = groups.firstBucket[group];
    const lack = Math.max(0, qty - Math.max(0, leastOf[base + bucket]));
    if (lack > epsilon) return lack;
    queue.commitRow(base, bucket, qty);
    return 0;
  }
  // Each need of the part after the first finds the unit's earlier needs of it already held.
  const { needBucket, needQty } = explosion;
  let lack = 0;
  let heldSum = 0;
  let heldLatest = -1;
  for (let index = first; index < end; index += 1) {
    const need = groups.needs[index];
    const bucket = needBucket[need];
    let free: number;
    if (index === first) free = leastOf[base + bucket];
    else if (heldLatest <= bucket) free = roundQty(leastOf[base + bucket] - heldSum);
    else {
      let least = Infinity;
      for (let t = bucket; t < days; t += 1) {
        let value = cells[base + t];
        for (let held = first; held < index; held += 1)
          if (needBucket[groups.needs[held]] <= t) value -= needQty[groups.needs[held]];
        if (value < least) least = value;
      }
      free = roundQty(least);
    }
    lack += Math.max(0, needQty[need] - Math.max(0, free));
    heldSum += needQty[need];
    if (bucket > heldLatest) heldLatest = bucket;
  }
  if (lack > epsilon) return lack;
  for (let index = first; index < end; index += 1) {
    const need = groups.needs[index];
    queue.commitRow(base, needBucket[need], needQty[need]);
  }
  return 0;
}

/** The queue view's entries as another thread writes them (see QueueHelper). */
export interface QueueStream {
  /** The entries, once those of the units up to `position` are written. */
  ready(position: number): QueueEntries;
  /** The entries, every array its own (for the next walk to keep), once all are written. */
  keep(): QueueEntries;
}

/** What a walk hands a helper that walks its queue view afresh in another thread. */
export interface QueueJob {
  units: readonly UnitNeeds[];
  rowBase: Int32Array;
  days: number;
  supply: Float64Array;
  queued: Uint8Array;
  /** Walks it in this thread instead: for a helper that finds it cannot. */
  walkHere(): QueueEntries;
}

/**
 * Walks the queue view of a walk in another thread while the walk judges the units, or answers
 * null to have it walked in this one. Walking in this thread must give the same entries.
 */
export type QueueHelper = (job: QueueJob) => QueueStream | null;

/** Entries all written already. */
export function writtenStream(entries: QueueEntries): QueueStream {
  return { ready: () => entries, keep: () => entries };
}

/**
 * A queue job laid out in flat typed arrays, for another thread: the units' needs once per
 * explosion (units of a model on a day share one), each unit naming its explosion.
 */
export interface FlatQueueJob {
  days: number;
  rowBase: Int32Array;
  supply: Float64Array;
  queued: Uint8Array;
  /** Per unit in build order: its explosion. */
  unitExplosion: Int32Array;
  /** The needs of explosion e are needStart[e] … needStart[e + 1] - 1. */
  needStart: Int32Array;
  needPart: Int32Array;
  needBucket: Int32Array;
  needQty: Float64Array;
}

/** Memory for a flat job or its entries: an ArrayBuffer, or a SharedArrayBuffer to share with a thread. */
export type Memory = (bytes: number) => ArrayBufferLike;

/** The job's arrays copied into memory from `memory`. */
export function flattenQueueJob(job: QueueJob, memory: Memory): FlatQueueJob {
  const ints = (length: number) => new Int32Array(memory(length * 4));
  const floats = (length: number) => new Float64Array(memory(length * 8));
  const explosionOf = new Map<UnitNeeds, number>();
  const distinct: UnitNeeds[] = [];
  const unitExplosion = ints(job.units.length);
  let needs = 0;
  job.units.forEach((unit, position) => {
    let index = explosionOf.get(unit);
    if (index === undefined) {
      index = distinct.push(unit) - 1;
      explosionOf.set(unit, index);
      needs += unit.needCount;
    }
    unitExplosion[position] = index;
  });
  const needStart = ints(distinct.length + 1);
  const needPart = ints(needs);
  const needBucket = ints(needs);
  const needQty = floats(needs);
  distinct.forEach((unit, index) => {
    const at = needStart[index];
    needPart.set(unit.needPart.subarray(0, unit.needCount), at);
    needBucket.set(unit.needBucket.subarray(0, unit.needCount), at);
    needQty.set(unit.needQty.subarray(0, unit.needCount), at);
    needStart[index + 1] = at + unit.needCount;
  });
  const rowBase = ints(job.rowBase.length);
  rowBase.set(job.rowBase);
  const supply = floats(job.supply.length);
  supply.set(job.supply);
  const queued = new Uint8Array(memory(job.queued.length));
  queued.set(job.queued);
  return { days: job.days, rowBase, supply, queued, unitExplosion, needStart, needPart, needBucket, needQty };
}

/** Entries of a flat job, in arrays of a fixed size: room for an entry per part each unit needs. */
export function flatEntries(flat: FlatQueueJob, memory: Memory): QueueEntries {
  let room = 0;
  for (const explosion of flat.unitExplosion) room += flat.needStart[explosion + 1] - flat.needStart[explosion];
  return {
    start: new Int32Array(memory((flat.unitExplosion.length + 1) * 4)),
    part: new Int32Array(memory(room * 4)),
    qty: new Float64Array(memory(room * 8)),
    need: new Int32Array(memory(room * 4)),
  };
}

/** Walks a flat job's queue view into `entries` (see flatEntries); `done` as for walkQueueView. */
export function walkFlatQueueJob(flat: FlatQueueJob, entries: QueueEntries, done?: (units: number) => void): void {
  const { needStart } = flat;
  const explosions: UnitNeeds[] = [];
  for (let index = 0; index + 1 < needStart.length; index += 1) {
    const from = needStart[index];
    const to = needStart[index + 1];
    explosions.push({
      needCount: to - from,
      needPart: flat.needPart.subarray(from, to),
      needBucket: flat.needBucket.subarray(from, to),
      needQty: flat.needQty.subarray(from, to),
      groups: null,
    });
  }
  const units = Array.from(flat.unitExplosion, (explosion) => explosions[explosion]);
  const full = (): never => {
    throw new RangeError('Queue view entries overflow their room');
  };
  const columns: QueueColumns = {
    start: entries.start,
    part: new TypedColumn(entries.part, full),
    qty: new TypedColumn(entries.qty, full),
    need: new TypedColumn(entries.need, full),
  };
  const queue = new StockLedger(flat.days, flat.supply, flat.rowBase, flat.queued);
  const grouper = new NeedGrouper(flat.rowBase.length);
  walkQueueView(units, grouper, flat.rowBase, queue, flat.queued, null, columns, done, true);
}

/** The first `start[units]` entries as a walk keeps them, in arrays of their own. */
export function ownEntries(entries: QueueEntries): QueueEntries {
  const count = entries.start[entries.start.length - 1];
  return {
    start: entries.start.slice(),
    part: entries.part.slice(0, count),
    qty: entries.qty.slice(0, count),
    need: entries.need.slice(0, count),
  };
}
