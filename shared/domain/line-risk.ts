import { lowLevelCodes } from './bom';
import { WorkingCalendar } from './calendar';
import { fromDayNumber, isIsoDate, toDayNumber } from './date';
import { PlanInputError } from './plan-model';
import { QTY_EPSILON, roundQty } from './quantity';
import type { IsoDate, PlanningBomLine, PlanningPart, PlantCalendar, ScheduledReceipt, SequenceSlot } from './types';

/*
 * Line risk: which units of the build sequence cannot be built for want of a bought part, counting
 * only what is on hand and what suppliers have firmly confirmed. Nothing new is ordered: stock is
 * promised to units first come, first served in build order, the way available-to-promise is
 * consumed by orders in sequence (APICS Dictionary, "available-to-promise"; Vollmann, Berry,
 * Whybark and Jacobs, Manufacturing Planning and Control for Supply Chain Management, chapter on
 * master production scheduling — from memory).
 *
 * Conventions (one bucket = one working day of the horizon):
 * - On-hand counts at the start of `from`; slots dated before `from` are taken as built, a slot on
 *   a non-working day is built on the next working day, slots after `to` are out of view.
 * - A firm receipt arrives at the start of its date (a non-working date: the next working day; a
 *   date before `from`: late, counted on the first day; after `to`: out of view).
 * - Slots are walked by date, then position. A slot (one serial) is built whole or not at all; its
 *   requirement is its BOM exploded at its build date with effectivity and scrap
 *   (qtyPer × (1 + scrap % / 100)).
 * - A made (or end-item) component is taken from its own on-hand first; what is not on hand is
 *   made in-house in time, so the explosion goes on to its components, needed on the parent's day
 *   minus the made part's lead time in working days (never before the first day), with the lines
 *   effective on that day. Made parts are never reported short: the line risk is about bought
 *   parts, the ones the plant cannot make more of.
 * - "Free" for a need on day d is the least uncommitted quantity on any day from d on, so a unit
 *   never takes stock already promised to an earlier unit for a later day.
 *
 * Two views come out of one walk:
 * - The build view decides which units are at risk: a unit whose every bought part is free is
 *   built and takes its parts; otherwise it is at risk, takes nothing (its parts stay for later
 *   units) and records what it lacks now.
 * - The queue view gives each bought part its own figures, independent of the other parts: its
 *   projected on-hand when every unit of the horizon draws on it (first day below zero = first
 *   short date, deepest shortfall = quantity to expedite), and which units would still lack it if
 *   every unit ahead of them were served first. Without it, a part that runs out a day after
 *   another part on the same model would stay hidden until the first one is rescued.
 * A part is reported when at least one unit at risk lacks it in either view.
 */

/** Horizons longer than this many calendar days are refused: the line risk looks weeks ahead. */
export const MAX_LINE_RISK_CALENDAR_DAYS = 186;

/** Frozen window of the build sequence when the plant has not set one, in working days. */
export const DEFAULT_FROZEN_WINDOW_DAYS = 3;

export interface LineRiskInput {
  parts: PlanningPart[];
  bom: PlanningBomLine[];
  sequence: SequenceSlot[];
  /** Open quantities suppliers have confirmed, dated when they are expected in. */
  firmReceipts: ScheduledReceipt[];
  calendar: PlantCalendar;
  from: IsoDate;
  to: IsoDate;
  /** Day the days until impact count from; defaults to `from`. */
  today?: IsoDate;
  /** Working days of frozen sequence, from the first working day on or after `today`. */
  frozenWindowDays?: number;
}

/** One slot of the sequence, named as on the line. */
export interface UnitRef {
  date: IsoDate;
  sequence: number;
  serial: string;
  model: string;
}

export interface UnitLack {
  partNumber: string;
  /** Quantity missing for this unit. */
  qty: number;
  /** True: missing with what is free now (it stops the unit). False: missing once the units ahead are served. */
  now: boolean;
}

/** A later unit that could take the at-risk unit's slot: every part it needs is free at that moment. */
export interface ResequenceOption {
  slot: UnitRef;
  candidate: UnitRef;
}

export interface UnitAtRisk extends UnitRef {
  lacks: UnitLack[];
  /** Worked out for the first unit at risk of each short part; null when no later unit fits. */
  resequence?: ResequenceOption | null;
}

export interface SlotAtRisk extends UnitRef {
  /** Quantity of this part the unit lacks. */
  lackQty: number;
}

export interface PartShortage {
  partNumber: string;
  supplierCode: string | null;
  /** First day the projected on-hand (on-hand + firm receipts − every unit's need) is below zero. */
  firstShortDate: IsoDate;
  /** Deepest shortfall of that projection: what must arrive by firstShortDate to build the horizon. */
  shortQty: number;
  slotsAtRisk: SlotAtRisk[];
  onHand: number;
  /** Firm receipts counted inside the horizon. */
  firmReceiptQty: number;
  /** Working days after `today` up to firstShortDate (0: today). */
  daysUntilImpact: number;
  inFrozenWindow: boolean;
  rescue: {
    expedite: { qty: number; needBy: IsoDate };
    /** For the first unit at risk in slotsAtRisk. */
    resequence: ResequenceOption | null;
  };
}

export interface LineRiskResult {
  from: IsoDate;
  to: IsoDate;
  /** Working days of the horizon. */
  days: IsoDate[];
  today: IsoDate;
  frozenWindowDays: number;
  /** Last working day of the frozen window; null for a window of zero days. */
  frozenUntil: IsoDate | null;
  unitsInHorizon: number;
  unitsBuilt: number;
  /** In build order. */
  unitsAtRisk: UnitAtRisk[];
  /** Sorted by firstShortDate, then partNumber. */
  shortages: PartShortage[];
}

interface Line {
  component: number;
  factor: number;
  effectiveFrom: IsoDate | null;
  effectiveTo: IsoDate | null;
}

/** A quantity of a part needed on a bucket (index into the horizon's working days). */
interface Need {
  part: number;
  bucket: number;
  qty: number;
}

interface Evaluation {
  /** What the unit would take, made-part stock included; committed only when it is built. */
  takes: Need[];
  /** The same takes by part, for the free quantity seen by the unit's next lines. */
  held: Map<number, Need[]>;
  /** Needs of bought parts alone, for the queue view. */
  boughtNeeds: Need[];
  /** Bought part → quantity lacking now. */
  lacks: Map<number, number>;
}

interface OrderedSlot {
  slot: SequenceSlot;
  model: number;
  bucket: number;
}

const epsilon = QTY_EPSILON;

function unitRef(slot: SequenceSlot): UnitRef {
  return { date: slot.date, sequence: slot.sequence, serial: slot.serial, model: slot.model };
}

function compareText(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

function requireIsoDate(date: unknown, where: string): number {
  if (!isIsoDate(date))
    throw new PlanInputError(`${where}: not a date in the form YYYY-MM-DD: ${JSON.stringify(date)}`);
  return toDayNumber(date);
}

/**
 * Uncommitted quantity per part and working day, as a flat table: row p, column t holds on-hand
 * plus receipts up to day t less what was committed for days up to t. A commitment on day b
 * lowers every column from b on; the free quantity for a need on day b is the row's least value
 * from b on (cumulative available-to-promise with look-ahead), kept ready in `least`.
 */
class StockLedger {
  private readonly cells: Float64Array;
  private readonly least: Float64Array;

  constructor(
    private readonly days: number,
    supplyByDay: Float64Array,
    onHand: readonly number[],
  ) {
    this.cells = new Float64Array(supplyByDay.length);
    this.least = new Float64Array(supplyByDay.length);
    onHand.forEach((opening, part) => {
      let cumulative = opening;
      for (let t = 0; t < days; t += 1) {
        cumulative += supplyByDay[part * days + t];
        this.cells[part * days + t] = roundQty(cumulative);
      }
      this.refreshLeast(part);
    });
  }

  /** Least free quantity of `part` from `bucket` on, less what `held` (same part) already claims. */
  free(part: number, bucket: number, held: readonly Need[] | undefined): number {
    const base = part * this.days;
    if (held === undefined) return this.least[base + bucket];
    let least = Infinity;
    for (let t = bucket; t < this.days; t += 1) {
      let value = this.cells[base + t];
      for (const need of held) if (need.bucket <= t) value -= need.qty;
      if (value < least) least = value;
    }
    return roundQty(least);
  }

  commit(needs: readonly Need[]): void {
    for (const need of needs) {
      const base = need.part * this.days;
      let least = Infinity;
      for (let t = this.days - 1; t >= need.bucket; t -= 1) {
        const cell = roundQty(this.cells[base + t] - need.qty);
        this.cells[base + t] = cell;
        if (cell < least) least = cell;
        this.least[base + t] = least;
      }
      // Before the need's day a minimum only changes while the lowered one still reaches back.
      for (let t = need.bucket - 1; t >= 0; t -= 1) {
        const value = Math.min(this.cells[base + t], least);
        if (value === this.least[base + t]) break;
        this.least[base + t] = value;
        least = value;
      }
    }
  }

  private refreshLeast(part: number): void {
    const base = part * this.days;
    let least = Infinity;
    for (let t = this.days - 1; t >= 0; t -= 1) {
      if (this.cells[base + t] < least) least = this.cells[base + t];
      this.least[base + t] = least;
    }
  }
}

/** The working days of the horizon and a look-up of the first working day on or after a day. */
function horizonDays(calendar: WorkingCalendar, from: IsoDate, to: IsoDate) {
  const fromDay = requireIsoDate(from, 'Horizon start');
  const toDay = requireIsoDate(to, 'Horizon end');
  if (fromDay > toDay) throw new PlanInputError(`Horizon start ${from} is after its end ${to}`);
  if (toDay - fromDay + 1 > MAX_LINE_RISK_CALENDAR_DAYS) {
    throw new PlanInputError(`Horizon ${from} … ${to} is longer than ${MAX_LINE_RISK_CALENDAR_DAYS} days`);
  }
  const dayNumbers: number[] = [];
  for (let day = fromDay; day <= toDay; day += 1) if (calendar.isWorking(day)) dayNumbers.push(day);
  /** Bucket of the first working day on or after `day`: 0 before the horizon, -1 after it. */
  const bucketOf = (day: number): number => {
    if (dayNumbers.length === 0 || day > toDay) return -1;
    let low = 0;
    let high = dayNumbers.length;
    while (low < high) {
      const middle = (low + high) >> 1;
      if (dayNumbers[middle] < day) low = middle + 1;
      else high = middle;
    }
    return low < dayNumbers.length ? low : -1;
  };
  return { fromDay, dayNumbers, dates: dayNumbers.map(fromDayNumber), bucketOf };
}

/**
 * Walks the build sequence over [from, to], promising on-hand and firm receipts to units in build
 * order; returns the units that cannot be built, the bought parts short (first short date,
 * shortfall, units stopped, days until impact, frozen window) and a rescue per part: expedite,
 * or move up a later unit whose parts are all free. Throws PlanInputError for unusable input and
 * BomCycleError for a cyclic BOM.
 */
export function computeLineRisk(input: LineRiskInput): LineRiskResult {
  const calendar = new WorkingCalendar(input.calendar);
  const { fromDay, dayNumbers, dates, bucketOf } = horizonDays(calendar, input.from, input.to);
  const days = dayNumbers.length;
  const { parts } = input;

  const indexOf = new Map<string, number>();
  parts.forEach((part, index) => {
    if (indexOf.has(part.partNumber)) throw new PlanInputError(`Part ${part.partNumber} is listed twice`);
    if (!Number.isInteger(part.leadTimeDays) || part.leadTimeDays < 0) {
      throw new PlanInputError(`Part ${part.partNumber}: lead time must be a whole number of working days ≥ 0`);
    }
    if (!Number.isFinite(part.onHand))
      throw new PlanInputError(`Part ${part.partNumber}: on-hand must be a finite number`);
    indexOf.set(part.partNumber, index);
  });
  const partIndex = (partNumber: string, where: string): number => {
    const index = indexOf.get(partNumber);
    if (index === undefined) throw new PlanInputError(`${where} names ${partNumber}, which is not in the part list`);
    return index;
  };
  const bought = parts.map((part) => part.source === 'buy');
  // Rank of each part in part-number order, so listing a unit's lacks compares numbers, not strings.
  const rankOf = new Int32Array(parts.length);
  parts
    .map((_, index) => index)
    .sort((a, b) => compareText(parts[a].partNumber, parts[b].partNumber))
    .forEach((index, rank) => (rankOf[index] = rank));

  // Refuses a cyclic structure before an explosion could recurse forever.
  lowLevelCodes(
    parts.map((part) => part.partNumber),
    input.bom,
  );
  const linesOf: Line[][] = parts.map(() => []);
  input.bom.forEach((line, row) => {
    const where = `BOM line ${row + 1} (${line.parent} → ${line.component})`;
    if (!Number.isFinite(line.qtyPer) || !Number.isFinite(line.scrapPct)) {
      throw new PlanInputError(`${where}: quantity per and scrap must be finite numbers`);
    }
    linesOf[partIndex(line.parent, where)].push({
      component: partIndex(line.component, where),
      factor: line.qtyPer * (1 + line.scrapPct / 100),
      effectiveFrom: line.effectiveFrom ?? null,
      effectiveTo: line.effectiveTo ?? null,
    });
  });

  const receiptsByDay = new Float64Array(parts.length * days);
  const firmReceiptQty = new Float64Array(parts.length);
  input.firmReceipts.forEach((receipt, row) => {
    const where = `Firm receipt ${row + 1} (${receipt.partNumber} on ${receipt.date})`;
    const part = partIndex(receipt.partNumber, where);
    if (!Number.isFinite(receipt.qty)) throw new PlanInputError(`${where}: quantity must be a finite number`);
    const bucket = bucketOf(requireIsoDate(receipt.date, where));
    if (bucket < 0) return;
    receiptsByDay[part * days + bucket] += receipt.qty;
    firmReceiptQty[part] += receipt.qty;
  });
  const onHand = parts.map((part) => part.onHand);
  const build = new StockLedger(days, receiptsByDay, onHand);
  const queue = new StockLedger(days, receiptsByDay, onHand);

  const ordered: OrderedSlot[] = [];
  input.sequence.forEach((slot, row) => {
    const where = `Sequence slot ${row + 1} (${slot.date} #${slot.sequence})`;
    const model = partIndex(slot.model, where);
    if (!Number.isFinite(slot.qty)) throw new PlanInputError(`${where}: quantity must be a finite number`);
    const day = requireIsoDate(slot.date, where);
    const bucket = bucketOf(day);
    if (day < fromDay || bucket < 0 || slot.qty <= 0) return;
    ordered.push({ slot, model, bucket });
  });
  ordered.sort((a, b) => compareText(a.slot.date, b.slot.date) || a.slot.sequence - b.slot.sequence);

  // --- Explosion against the build view ---

  const startDays = new Map<string, number>();
  const startDay = (day: number, leadTime: number): number => {
    if (leadTime === 0) return day;
    const key = `${day}:${leadTime}`;
    let start = startDays.get(key);
    if (start === undefined) {
      start = calendar.addWorking(day, -leadTime);
      startDays.set(key, start);
    }
    return start;
  };
  const dateMemo = new Map<number, IsoDate>();
  const dateOf = (day: number): IsoDate => {
    let date = dateMemo.get(day);
    if (date === undefined) {
      date = fromDayNumber(day);
      dateMemo.set(day, date);
    }
    return date;
  };

  function hold(evaluation: Evaluation, part: number, bucket: number, qty: number): void {
    const take = { part, bucket, qty };
    evaluation.takes.push(take);
    const held = evaluation.held.get(part);
    if (held) held.push(take);
    else evaluation.held.set(part, [take]);
  }

  function explode(parent: number, qty: number, day: number, evaluation: Evaluation): void {
    const date = dateOf(day);
    const bucket = Math.max(0, bucketOf(day));
    for (const line of linesOf[parent]) {
      if (line.effectiveFrom !== null && date < line.effectiveFrom) continue;
      if (line.effectiveTo !== null && date > line.effectiveTo) continue;
      const need = roundQty(qty * line.factor);
      if (need <= epsilon) continue;
      const component = line.component;
      const freeQty = Math.max(0, build.free(component, bucket, evaluation.held.get(component)));
      const fromStock = Math.min(need, freeQty);
      if (fromStock > epsilon) hold(evaluation, component, bucket, fromStock);
      const rest = roundQty(need - fromStock);
      if (bought[component]) {
        evaluation.boughtNeeds.push({ part: component, bucket, qty: need });
        if (rest > epsilon) evaluation.lacks.set(component, roundQty((evaluation.lacks.get(component) ?? 0) + rest));
      } else if (rest > epsilon) {
        explode(component, rest, startDay(day, parts[component].leadTimeDays), evaluation);
      }
    }
  }

  function evaluate(model: number, qty: number, bucket: number): Evaluation {
    const evaluation: Evaluation = { takes: [], held: new Map(), boughtNeeds: [], lacks: new Map() };
    explode(model, qty, dayNumbers[bucket], evaluation);
    return evaluation;
  }

  /** The first later unit, same or next working day, of another model whose parts are all free now. */
  function findResequence(position: number): ResequenceOption | null {
    const atRisk = ordered[position];
    const tried = new Set<string>();
    for (let next = position + 1; next < ordered.length; next += 1) {
      const candidate = ordered[next];
      if (candidate.bucket > atRisk.bucket + 1) break;
      const key = `${candidate.model}:${candidate.slot.qty}`;
      if (candidate.model === atRisk.model || tried.has(key)) continue;
      tried.add(key);
      if (evaluate(candidate.model, candidate.slot.qty, atRisk.bucket).lacks.size === 0) {
        return { slot: unitRef(atRisk.slot), candidate: unitRef(candidate.slot) };
      }
    }
    return null;
  }

  /** Queue view: each bought part serves this unit if it can, whatever the unit's other parts do. */
  function queueLacks(boughtNeeds: Need[]): Map<number, number> | null {
    let lacks: Map<number, number> | null = null;
    // Sorted by part, so the needs of one part (direct and through made parts) sit together.
    const needs =
      boughtNeeds.length > 1 ? boughtNeeds.slice().sort((a, b) => a.part - b.part || a.bucket - b.bucket) : boughtNeeds;
    for (let first = 0; first < needs.length;) {
      const part = needs[first].part;
      let end = first + 1;
      while (end < needs.length && needs[end].part === part) end += 1;
      let lack = 0;
      for (let index = first; index < end; index += 1) {
        const held = index > first ? needs.slice(first, index) : undefined;
        lack += Math.max(0, needs[index].qty - Math.max(0, queue.free(part, needs[index].bucket, held)));
      }
      lack = roundQty(lack);
      if (lack > epsilon) (lacks ??= new Map()).set(part, lack);
      else queue.commit(needs.slice(first, end));
      first = end;
    }
    return lacks;
  }

  // --- The walk ---

  interface PartRisk {
    slots: SlotAtRisk[];
    resequence: ResequenceOption | null;
  }
  const risks = new Map<number, PartRisk>();
  const requiredByDay = new Float64Array(parts.length * days);
  const unitsAtRisk: UnitAtRisk[] = [];
  let unitsBuilt = 0;

  ordered.forEach((entry, position) => {
    const evaluation = evaluate(entry.model, entry.slot.qty, entry.bucket);
    for (const need of evaluation.boughtNeeds) requiredByDay[need.part * days + need.bucket] += need.qty;
    const behind = queueLacks(evaluation.boughtNeeds);
    if (evaluation.lacks.size === 0) {
      build.commit(evaluation.takes);
      unitsBuilt += 1;
      return;
    }
    const unit: UnitAtRisk = { ...unitRef(entry.slot), lacks: [] };
    // Parts that stop the unit now first, then those it would lack behind the units ahead.
    const lacking = [...evaluation.lacks.keys()].sort((a, b) => rankOf[a] - rankOf[b]);
    const behindOnly = [...(behind?.keys() ?? [])]
      .filter((part) => !evaluation.lacks.has(part))
      .sort((a, b) => rankOf[a] - rankOf[b]);
    for (const part of lacking.concat(behindOnly)) {
      const now = evaluation.lacks.get(part);
      const qty = now ?? (behind?.get(part) as number);
      unit.lacks.push({ partNumber: parts[part].partNumber, qty, now: now !== undefined });
      let risk = risks.get(part);
      if (!risk) {
        // The unit took nothing, so the stock stands exactly as it did at its turn.
        if (unit.resequence === undefined) unit.resequence = findResequence(position);
        risk = { slots: [], resequence: unit.resequence };
        risks.set(part, risk);
      }
      const { date, sequence, serial, model } = entry.slot;
      risk.slots.push({ date, sequence, serial, model, lackQty: qty });
    }
    unitsAtRisk.push(unit);
  });

  // --- Figures per short part ---

  const today = input.today ?? input.from;
  const todayDay = requireIsoDate(today, 'Today');
  const frozenWindowDays = Math.max(0, Math.floor(input.frozenWindowDays ?? DEFAULT_FROZEN_WINDOW_DAYS));
  // The window starts on the first working day on or after today: today's own build is frozen too.
  const frozenEnd =
    frozenWindowDays > 0 ? calendar.addWorking(calendar.nextWorking(todayDay), frozenWindowDays - 1) : null;
  const workingDaysAfterToday = (day: number): number => {
    let count = 0;
    for (let d = todayDay + 1; d <= day; d += 1) if (calendar.isWorking(d)) count += 1;
    for (let d = day + 1; d <= todayDay; d += 1) if (calendar.isWorking(d)) count -= 1;
    return count;
  };

  const shortages: PartShortage[] = [];
  for (const [part, risk] of risks) {
    let required = 0;
    let supplied = onHand[part];
    let firstShort = -1;
    let deepest = 0;
    for (let t = 0; t < days; t += 1) {
      required += requiredByDay[part * days + t];
      supplied += receiptsByDay[part * days + t];
      const shortfall = roundQty(required - supplied);
      if (shortfall > epsilon && firstShort < 0) firstShort = t;
      if (shortfall > deepest) deepest = shortfall;
    }
    // A lack in either view implies the projection dips below zero; the fallback is only a guard.
    if (firstShort < 0) firstShort = bucketOf(requireIsoDate(risk.slots[0].date, 'Slot'));
    const shortPart = parts[part];
    const firstShortDate = dates[firstShort];
    shortages.push({
      partNumber: shortPart.partNumber,
      supplierCode: shortPart.supplierCode ?? null,
      firstShortDate,
      shortQty: deepest,
      slotsAtRisk: risk.slots,
      onHand: shortPart.onHand,
      firmReceiptQty: roundQty(firmReceiptQty[part]),
      daysUntilImpact: workingDaysAfterToday(dayNumbers[firstShort]),
      inFrozenWindow: frozenEnd !== null && dayNumbers[firstShort] <= frozenEnd,
      rescue: { expedite: { qty: deepest, needBy: firstShortDate }, resequence: risk.resequence },
    });
  }
  shortages.sort((a, b) => compareText(a.firstShortDate, b.firstShortDate) || compareText(a.partNumber, b.partNumber));

  return {
    from: input.from,
    to: input.to,
    days: dates,
    today,
    frozenWindowDays,
    frozenUntil: frozenEnd === null ? null : fromDayNumber(frozenEnd),
    unitsInHorizon: ordered.length,
    unitsBuilt,
    unitsAtRisk,
    shortages,
  };
}
