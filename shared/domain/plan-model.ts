import { BomCycleError, findBomCycle, lowLevelCodes } from './bom';
import { WorkingCalendar } from './calendar';
import { fromDayNumber, isIsoDate, toDayNumber } from './date';
import type { IsoDate, PlanInput, PlanningBomLine, PlanningPart } from './types';

/*
 * Turns a PlanInput into integer-indexed arrays so the explosion and netting loops touch only
 * typed arrays: parts are numbered in input order, working days of the horizon are bucket
 * indices 0…D-1, and BOM lines are grouped by parent (compressed rows).
 */

/** Horizons longer than this many calendar days are refused, to bound memory (parts × days). */
export const MAX_PLAN_CALENDAR_DAYS = 800;

/** Codes of PlanModel.source. */
export const PART_SOURCE_CODES: Record<string, number> = { buy: 0, make: 1, end_item: 2 };
export const BOUGHT = 0;
export const MADE = 1;
export const END_ITEM = 2;

/** Bucket index of a date before `from`. */
export const BEFORE_HORIZON = -1;
/** Bucket index of a date whose working day falls after `to`. */
export const AFTER_HORIZON = -2;

/** Raised for input the engine cannot plan: unknown parts, bad numbers, a reversed horizon. */
export class PlanInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'PlanInputError';
  }
}

export interface PlanModel {
  indexOf: Map<string, number>;
  calendar: WorkingCalendar;
  /** Working days of the horizon, the bucket dates. */
  days: IsoDate[];
  dayNumbers: Int32Array;
  lowLevelCode: Int32Array;
  /** 0 bought, 1 made, 2 end item (see PART_SOURCE_CODES). */
  source: Uint8Array;
  /**
   * Planning attributes copied at the start, so later edits of the input cannot leak into a plan.
   * An end item is planned as build orders: a unit in the sequence needs its components whatever
   * finished stock of its model exists, so end items carry no on-hand or safety stock here.
   */
  onHand: Float64Array;
  safetyStock: Float64Array;
  packQty: Float64Array;
  leadTimeDays: Int32Array;
  /** Part indices ordered by ascending low-level code: parents always before their components. */
  levelOrder: Int32Array;
  /** Lines of parent p are lineStart[p] … lineStart[p + 1] - 1. */
  lineStart: Int32Array;
  lineComponent: Int32Array;
  /** qtyPer × (1 + scrapPct / 100): what is ordered. */
  lineFactor: Float64Array;
  /** qtyPer alone: what a unit consumes (the scrap allowance is for ordering). */
  lineQtyPer: Float64Array;
  /** Effectivity as day numbers; open ends are ±Infinity. */
  lineFrom: Float64Array;
  lineTo: Float64Array;
  /** Bucket of a day number; see BEFORE_HORIZON and AFTER_HORIZON. */
  bucketOf: (dayNumber: number) => number;
  /** Day number of an ISO date, or undefined when it is not one; memoised (sequences repeat dates). */
  dayNumberOf: (date: IsoDate) => number | undefined;
  /** Day number `count` working days before the first bucket, memoised for past-due releases. */
  workingDayBeforeStart: (count: number) => number;
}

function requireFinite(value: number, where: string, field: string): void {
  if (!Number.isFinite(value)) throw new PlanInputError(`${where}: ${field} must be a finite number, got ${value}`);
}

// Checks run on every part and line of every plan, so the message is only built on failure.
function allFinite(a: number, b: number, c: number): boolean {
  return Number.isFinite(a) && Number.isFinite(b) && Number.isFinite(c);
}

function lineWhere(line: PlanningBomLine, row: number): string {
  return `BOM line ${row + 1} (${line.parent} → ${line.component})`;
}

/** The day number, or a PlanInputError naming `where` when the date was not valid. */
export function requireDate(dayNumber: number | undefined, date: unknown, where: string): number {
  if (dayNumber === undefined)
    throw new PlanInputError(`${where}: not a date in the form YYYY-MM-DD: ${JSON.stringify(date)}`);
  return dayNumber;
}

function indexParts(parts: readonly PlanningPart[]): Map<string, number> {
  const indexOf = new Map<string, number>();
  parts.forEach((part, index) => {
    if (indexOf.has(part.partNumber)) throw new PlanInputError(`Part ${part.partNumber} is listed twice`);
    if (!Number.isInteger(part.leadTimeDays) || part.leadTimeDays < 0) {
      throw new PlanInputError(
        `Part ${part.partNumber}: lead time must be a whole number of working days ≥ 0, got ${part.leadTimeDays}`,
      );
    }
    if (!allFinite(part.packQty, part.onHand, part.safetyStock)) {
      requireFinite(part.packQty, `Part ${part.partNumber}`, 'pack quantity');
      requireFinite(part.onHand, `Part ${part.partNumber}`, 'on-hand');
      requireFinite(part.safetyStock, `Part ${part.partNumber}`, 'safety stock');
    }
    indexOf.set(part.partNumber, index);
  });
  return indexOf;
}

/**
 * Low-level code of every part, from the lines grouped by parent: 0 for a part that is nobody's
 * component, otherwise the deepest level at which it appears in any structure (Kahn's topological
 * order: a part is coded once all of its parents are). Null when the structure has a cycle.
 */
function levelsOf(lineStart: Int32Array, lineComponent: Int32Array): Int32Array | null {
  const partCount = lineStart.length - 1;
  const parentsLeft = new Int32Array(partCount);
  for (const component of lineComponent) parentsLeft[component] += 1;
  const codes = new Int32Array(partCount);
  const ready: number[] = [];
  for (let part = 0; part < partCount; part += 1) if (parentsLeft[part] === 0) ready.push(part);
  let coded = 0;
  while (ready.length > 0) {
    const part = ready.pop()!;
    coded += 1;
    for (let line = lineStart[part]; line < lineStart[part + 1]; line += 1) {
      const component = lineComponent[line];
      if (codes[part] + 1 > codes[component]) codes[component] = codes[part] + 1;
      parentsLeft[component] -= 1;
      if (parentsLeft[component] === 0) ready.push(component);
    }
  }
  return coded === partCount ? codes : null;
}

/** Raises the BomCycleError that names the cycle (found by the structure functions). */
function throwBomCycle(parts: readonly PlanningPart[], bom: readonly PlanningBomLine[]): never {
  lowLevelCodes(
    parts.map((part) => part.partNumber),
    bom,
  );
  throw new BomCycleError(findBomCycle(bom) ?? []);
}

/** Part indices by ascending low-level code (a counting sort; input order within a level). */
function levelOrderOf(codes: Int32Array): Int32Array {
  let deepest = 0;
  for (const code of codes) if (code > deepest) deepest = code;
  const start = new Int32Array(deepest + 2);
  for (const code of codes) start[code + 1] += 1;
  for (let level = 0; level <= deepest; level += 1) start[level + 1] += start[level];
  const order = new Int32Array(codes.length);
  codes.forEach((code, part) => {
    order[start[code]++] = part;
  });
  return order;
}

/** What a model takes from the calendar: the horizon's working days and the lookups on them. */
type CalendarFields = Pick<PlanModel, 'calendar' | 'days' | 'dayNumbers' | 'bucketOf' | 'workingDayBeforeStart'>;

function calendarFields(plantCalendar: PlanInput['calendar'], fromDay: number, toDay: number): CalendarFields {
  const calendar = new WorkingCalendar(plantCalendar);
  // A date on a non-working day belongs to the next working day's bucket.
  const span = toDay - fromDay + 1;
  const bucketByOffset = new Int32Array(span);
  const workingDays: number[] = [];
  for (let offset = 0; offset < span; offset += 1) {
    if (calendar.isWorking(fromDay + offset)) workingDays.push(fromDay + offset);
  }
  let next = AFTER_HORIZON;
  let cursor = workingDays.length - 1;
  for (let offset = span - 1; offset >= 0; offset -= 1) {
    if (cursor >= 0 && workingDays[cursor] === fromDay + offset) {
      next = cursor;
      cursor -= 1;
    }
    bucketByOffset[offset] = next;
  }
  const bucketOf = (dayNumber: number): number => {
    if (dayNumber < fromDay) return BEFORE_HORIZON;
    if (dayNumber > toDay) return AFTER_HORIZON;
    return bucketByOffset[dayNumber - fromDay];
  };

  // Step k back from the first bucket; only reached for past-due releases, and then often.
  const beforeStart: number[] = [workingDays[0] ?? fromDay];
  const workingDayBeforeStart = (count: number): number => {
    for (let k = beforeStart.length; k <= count; k += 1) beforeStart.push(calendar.addWorking(beforeStart[k - 1], -1));
    return beforeStart[count];
  };
  return {
    calendar,
    days: workingDays.map(fromDayNumber),
    dayNumbers: Int32Array.from(workingDays),
    bucketOf,
    workingDayBeforeStart,
  };
}

/**
 * `model` on another plant calendar, for the same parts, lines and horizon: only what the working
 * days decide is worked out again. At 16 times the demo plant a whole model takes 12–25 ms; in the
 * line-risk worker, the time before a walk after a calendar change went from 20–34 to 1–3 ms.
 */
export function withCalendar(
  model: PlanModel,
  plantCalendar: PlanInput['calendar'],
  from: IsoDate,
  to: IsoDate,
): PlanModel {
  const fromDay = requireDate(model.dayNumberOf(from), from, 'Horizon start');
  const toDay = requireDate(model.dayNumberOf(to), to, 'Horizon end');
  return { ...model, ...calendarFields(plantCalendar, fromDay, toDay) };
}

/** Validates the input and lays it out in typed arrays for computePlan. */
export function buildPlanModel(input: PlanInput): PlanModel {
  const { parts, bom } = input;
  const indexOf = indexParts(parts);

  const memo = new Map<string, number>();
  const dayNumberOf = (date: IsoDate): number | undefined => {
    let day = memo.get(date);
    if (day === undefined && isIsoDate(date)) {
      day = toDayNumber(date);
      memo.set(date, day);
    }
    return day;
  };

  const fromDay = requireDate(dayNumberOf(input.from), input.from, 'Horizon start');
  const toDay = requireDate(dayNumberOf(input.to), input.to, 'Horizon end');
  if (fromDay > toDay) throw new PlanInputError(`Horizon start ${input.from} is after its end ${input.to}`);
  if (toDay - fromDay + 1 > MAX_PLAN_CALENDAR_DAYS) {
    throw new PlanInputError(`Horizon ${input.from} … ${input.to} is longer than ${MAX_PLAN_CALENDAR_DAYS} days`);
  }

  const onCalendar = calendarFields(input.calendar, fromDay, toDay);

  const partCount = parts.length;
  const lineCount = new Int32Array(partCount + 1);
  const parentOf = new Int32Array(bom.length);
  const componentOf = new Int32Array(bom.length);
  bom.forEach((line, row) => {
    const parent = indexOf.get(line.parent);
    const component = indexOf.get(line.component);
    if (parent === undefined) {
      throw new PlanInputError(`${lineWhere(line, row)} names parent ${line.parent}, which is not in the part list`);
    }
    if (component === undefined) {
      throw new PlanInputError(
        `${lineWhere(line, row)} names component ${line.component}, which is not in the part list`,
      );
    }
    if (!allFinite(line.qtyPer, line.scrapPct, 0)) {
      requireFinite(line.qtyPer, lineWhere(line, row), 'quantity per');
      requireFinite(line.scrapPct, lineWhere(line, row), 'scrap percent');
    }
    parentOf[row] = parent;
    componentOf[row] = component;
    lineCount[parent + 1] += 1;
  });

  const lineStart = new Int32Array(partCount + 1);
  for (let p = 0; p < partCount; p += 1) lineStart[p + 1] = lineStart[p] + lineCount[p + 1];
  const fill = lineStart.slice(0, partCount);
  const slotOf = new Int32Array(bom.length);
  const lineComponent = new Int32Array(bom.length);
  for (let row = 0; row < bom.length; row += 1) {
    const slot = fill[parentOf[row]]++;
    slotOf[row] = slot;
    lineComponent[slot] = componentOf[row];
  }
  const lowLevelCode = levelsOf(lineStart, lineComponent) ?? throwBomCycle(parts, bom);
  const lineFactor = new Float64Array(bom.length);
  const lineQtyPer = new Float64Array(bom.length);
  const lineFrom = new Float64Array(bom.length);
  const lineTo = new Float64Array(bom.length);
  bom.forEach((line, row) => {
    const slot = slotOf[row];
    lineFactor[slot] = line.qtyPer * (1 + line.scrapPct / 100);
    lineQtyPer[slot] = line.qtyPer;
    lineFrom[slot] =
      line.effectiveFrom == null
        ? -Infinity
        : requireDate(dayNumberOf(line.effectiveFrom), line.effectiveFrom, lineWhere(line, row));
    lineTo[slot] =
      line.effectiveTo == null
        ? Infinity
        : requireDate(dayNumberOf(line.effectiveTo), line.effectiveTo, lineWhere(line, row));
  });

  return {
    indexOf,
    ...onCalendar,
    lowLevelCode,
    // Mapped as arrays first: a typed array's `from` with a mapping function is slow.
    source: Uint8Array.from(parts.map((part) => PART_SOURCE_CODES[part.source] ?? 0)),
    onHand: Float64Array.from(parts.map((part) => (part.source === 'end_item' ? 0 : part.onHand))),
    safetyStock: Float64Array.from(parts.map((part) => (part.source === 'end_item' ? 0 : part.safetyStock))),
    packQty: Float64Array.from(parts.map((part) => part.packQty)),
    leadTimeDays: Int32Array.from(parts.map((part) => part.leadTimeDays)),
    levelOrder: levelOrderOf(lowLevelCode),
    lineStart,
    lineComponent,
    lineFactor,
    lineQtyPer,
    lineFrom,
    lineTo,
    dayNumberOf,
  };
}
