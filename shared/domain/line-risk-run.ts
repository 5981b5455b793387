import type { LineRiskResult, NeedBy, PartShortage, ResequenceOption, SlotAtRisk, UnitAtRisk } from './line-risk';
import { roundQty } from './quantity';
import type { IsoDate, SequenceSlot } from './types';

/**
 * A short part's figures; its slots at risk stay in the run (see LineRiskRun.slotsAtRisk), and so
 * do its need per day, which the report does not show (see LineRiskRunParts.requiredByDay), and
 * its need-by dates, from which its rescue is made (see LineRiskRunParts.needBy): a large plant has
 * thousands of short parts, and a run kept as objects costs every garbage collection after it.
 */
export type ShortPartFigures = Omit<PartShortage, 'slotsAtRisk' | 'requiredByDay' | 'needBy' | 'rescue'> & {
  /** For the first unit at risk among its slots. */
  resequence: ResequenceOption | null;
};

/**
 * What must arrive by which bucket, by short part in display order: shortage i's entries are
 * bucket/qty[start[i] … start[i + 1] - 1].
 */
export interface NeedByColumns {
  start: Int32Array;
  bucket: Int32Array;
  qty: Float64Array;
}

/**
 * What the walk found a part lacking for a unit, one record each in walk order, as flat arrays:
 * a large plant has hundreds of thousands of them, and most are only ever counted.
 */
export interface LackRecords {
  count: number;
  /** The unit's position in build order. */
  unit: Int32Array;
  part: Int32Array;
  qty: Float64Array;
  /** 1: lacking with what is free now; 0: only once the units ahead are served. */
  now: Uint8Array;
  /** Part index of the made part the need comes through, or -1. */
  via: Int32Array;
  bucket: Int32Array;
}

/** Lack records written in walk order, growing as they come; `copy` takes a range of another run's as they are. */
export class LackRecordWriter {
  count = 0;
  private unit: Int32Array;
  private part: Int32Array;
  private qty: Float64Array;
  private now: Uint8Array;
  private via: Int32Array;
  private bucket: Int32Array;

  constructor(capacity: number) {
    this.unit = new Int32Array(capacity);
    this.part = new Int32Array(capacity);
    this.qty = new Float64Array(capacity);
    this.now = new Uint8Array(capacity);
    this.via = new Int32Array(capacity);
    this.bucket = new Int32Array(capacity);
  }

  /** Appends a record; returns its index. */
  push(unit: number, part: number, qty: number, now: number, via: number, bucket: number): number {
    this.room(this.count + 1);
    const record = this.count++;
    this.unit[record] = unit;
    this.part[record] = part;
    this.qty[record] = qty;
    this.now[record] = now;
    this.via[record] = via;
    this.bucket[record] = bucket;
    return record;
  }

  /** Appends records start … end - 1 of `from`. */
  copy(from: LackRecords, start: number, end: number): void {
    if (end <= start) return;
    this.room(this.count + end - start);
    this.unit.set(from.unit.subarray(start, end), this.count);
    this.part.set(from.part.subarray(start, end), this.count);
    this.qty.set(from.qty.subarray(start, end), this.count);
    this.now.set(from.now.subarray(start, end), this.count);
    this.via.set(from.via.subarray(start, end), this.count);
    this.bucket.set(from.bucket.subarray(start, end), this.count);
    this.count += end - start;
  }

  /** The records written, without copying. */
  done(): LackRecords {
    const { count } = this;
    return {
      count,
      unit: this.unit.subarray(0, count),
      part: this.part.subarray(0, count),
      qty: this.qty.subarray(0, count),
      now: this.now.subarray(0, count),
      via: this.via.subarray(0, count),
      bucket: this.bucket.subarray(0, count),
    };
  }

  private room(size: number): void {
    if (size <= this.unit.length) return;
    const capacity = Math.max(size, this.unit.length * 2);
    const grow = <T extends Int32Array | Float64Array | Uint8Array>(values: T, make: (size: number) => T): T => {
      const grown = make(capacity);
      grown.set(values);
      return grown;
    };
    this.unit = grow(this.unit, (size) => new Int32Array(size));
    this.part = grow(this.part, (size) => new Int32Array(size));
    this.qty = grow(this.qty, (size) => new Float64Array(size));
    this.now = grow(this.now, (size) => new Uint8Array(size));
    this.via = grow(this.via, (size) => new Int32Array(size));
    this.bucket = grow(this.bucket, (size) => new Int32Array(size));
  }
}

export interface LineRiskRunParts {
  header: Omit<LineRiskResult, 'unitsAtRisk' | 'shortages'>;
  /** The units of the horizon in build order. */
  units: readonly SequenceSlot[];
  partNumbers: readonly string[];
  records: LackRecords;
  /** Unit at risk i is units[atRiskUnit[i]]; its records are atRiskFirst[i] … atRiskFirst[i] + atRiskCount[i] - 1. */
  atRiskUnit: Int32Array;
  atRiskFirst: Int32Array;
  atRiskCount: Int32Array;
  /** The resequence rescue worked out for a unit at risk (by its index), where one was. */
  resequence: ReadonlyMap<number, ResequenceOption | null>;
  /** In display order, with the part index of each. */
  shortages: readonly ShortPartFigures[];
  shortParts: Int32Array;
  /** Each short part's need per working day of the horizon, unrounded: shortage i's at i × days … (i + 1) × days - 1. */
  requiredByDay: Float64Array;
  needBy: NeedByColumns;
}

/**
 * One run of the line risk, its units and slots at risk kept as records and made into objects only
 * for the pages asked for: the summary a report shows (the first units and slots, and counts) is
 * then as quick as the walk, whatever the plant's size. `result()` gives the whole answer.
 */
export class LineRiskRun {
  readonly header: LineRiskRunParts['header'];
  readonly shortages: readonly ShortPartFigures[];
  private readonly slotsByPart: Int32Array;
  /** Slots of short part p are slotsByPart[slotStart[p]] … slotsByPart[slotStart[p + 1] - 1]. */
  private readonly slotStart: Int32Array;
  private readonly shortageOf = new Map<string, number>();

  constructor(private readonly parts: LineRiskRunParts) {
    this.header = parts.header;
    this.shortages = parts.shortages;
    // Records by part, in walk order within each (a counting sort).
    const { records, partNumbers } = parts;
    this.slotStart = new Int32Array(partNumbers.length + 1);
    for (let record = 0; record < records.count; record += 1) this.slotStart[records.part[record] + 1] += 1;
    for (let part = 0; part < partNumbers.length; part += 1) this.slotStart[part + 1] += this.slotStart[part];
    const fill = this.slotStart.slice(0, partNumbers.length);
    this.slotsByPart = new Int32Array(records.count);
    for (let record = 0; record < records.count; record += 1) this.slotsByPart[fill[records.part[record]]++] = record;
    parts.shortages.forEach((shortage, index) => this.shortageOf.set(shortage.partNumber, index));
  }

  get unitsAtRiskCount(): number {
    return this.parts.atRiskUnit.length;
  }

  /** Units at risk offset … offset + limit - 1, in build order. */
  unitsAtRisk(offset = 0, limit = Infinity): UnitAtRisk[] {
    const end = Math.min(this.unitsAtRiskCount, offset + limit);
    const units: UnitAtRisk[] = [];
    for (let index = Math.max(0, offset); index < end; index += 1) units.push(this.unitAtRisk(index));
    return units;
  }

  /** How many units lack the short part at `index` of `shortages`. */
  slotsAtRiskCount(index: number): number {
    const part = this.parts.shortParts[index];
    return this.slotStart[part + 1] - this.slotStart[part];
  }

  /** Slots offset … offset + limit - 1 of the short part at `index` of `shortages`, in build order. */
  slotsAtRisk(index: number, offset = 0, limit = Infinity): SlotAtRisk[] {
    const { records, units } = this.parts;
    const part = this.parts.shortParts[index];
    const end = Math.min(this.slotStart[part + 1], this.slotStart[part] + offset + limit);
    const slots: SlotAtRisk[] = [];
    for (let at = this.slotStart[part] + Math.max(0, offset); at < end; at += 1) {
      const record = this.slotsByPart[at];
      const { date, sequence, serial, model } = units[records.unit[record]];
      slots.push({
        date,
        sequence,
        serial,
        model,
        lackQty: records.qty[record],
        via: this.viaName(records.via[record]),
      });
    }
    return slots;
  }

  /** Index in `shortages` of a short part; undefined when the part is not short. */
  shortageIndex(partNumber: string): number | undefined {
    return this.shortageOf.get(partNumber);
  }

  /** A short part with the slots given, without its need per day (see `requiredByDay`). */
  shortageWith(index: number, slotsAtRisk: SlotAtRisk[]): Omit<PartShortage, 'requiredByDay'> {
    const figures = this.shortages[index];
    const needBy = this.needBy(index);
    return {
      partNumber: figures.partNumber,
      supplierCode: figures.supplierCode,
      action: figures.action,
      firstShortDate: figures.firstShortDate,
      shortQty: figures.shortQty,
      needBy,
      releaseBy: figures.releaseBy,
      leadTimeDays: figures.leadTimeDays,
      slotsAtRisk,
      onHand: figures.onHand,
      firmReceiptQty: figures.firmReceiptQty,
      daysUntilImpact: figures.daysUntilImpact,
      inFrozenWindow: figures.inFrozenWindow,
      loop: figures.loop,
      rescue: { expedite: { qty: needBy[0].qty, needBy: needBy[0].date }, resequence: figures.resequence },
    };
  }

  /** What must arrive by each date for the short part at `index` of `shortages`. */
  needBy(index: number): NeedBy[] {
    const { start, bucket, qty } = this.parts.needBy;
    const days = this.header.days;
    const needBy: NeedBy[] = [];
    for (let entry = start[index]; entry < start[index + 1]; entry += 1) {
      needBy.push({ date: days[bucket[entry]], qty: qty[entry] });
    }
    return needBy;
  }

  /** A short part's need per working day, made into a list only when asked for (the report leaves it out). */
  requiredByDay(index: number): number[] {
    const days = this.header.days.length;
    return Array.from(this.parts.requiredByDay.subarray(index * days, (index + 1) * days), (qty) => roundQty(qty));
  }

  /** The whole answer, every unit and slot at risk as an object. */
  result(): LineRiskResult {
    return {
      ...this.header,
      unitsAtRisk: this.unitsAtRisk(),
      shortages: this.shortages.map((_, index) =>
        Object.assign(this.shortageWith(index, this.slotsAtRisk(index)), { requiredByDay: this.requiredByDay(index) }),
      ),
    };
  }

  private unitAtRisk(index: number): UnitAtRisk {
    const { records, units, partNumbers, header } = this.parts;
    const days: readonly IsoDate[] = header.days;
    const { date, sequence, serial, model } = units[this.parts.atRiskUnit[index]];
    const unit: UnitAtRisk = { date, sequence, serial, model, lacks: [] };
    const first = this.parts.atRiskFirst[index];
    for (let record = first; record < first + this.parts.atRiskCount[index]; record += 1) {
      unit.lacks.push({
        partNumber: partNumbers[records.part[record]],
        qty: records.qty[record],
        now: records.now[record] === 1,
        via: this.viaName(records.via[record]),
        neededOn: days[records.bucket[record]],
      });
    }
    const resequence = this.parts.resequence.get(index);
    if (resequence !== undefined) unit.resequence = resequence;
    return unit;
  }

  private viaName(via: number): string | null {
    return via < 0 ? null : this.parts.partNumbers[via];
  }
}
