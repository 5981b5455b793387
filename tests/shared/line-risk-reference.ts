import {
  COUNTABLE_UNITS,
  DEFAULT_FROZEN_WINDOW_DAYS,
  MAX_LINE_RISK_CALENDAR_DAYS,
  SHORTAGE_ACTIONS,
  type LineRiskInput,
  type LineRiskResult,
  type LoopSupply,
  type NeedBy,
  type PartShortage,
  type ResequenceOption,
  type ShortageAction,
  type SlotAtRisk,
  type UnitAtRisk,
  type UnitRef,
} from '../../shared/domain/line-risk';
import {
  BOUGHT,
  MADE,
  buildPlanModel,
  PlanInputError,
  requireDate,
  type PlanModel,
} from '../../shared/domain/plan-model';
import { fromDayNumber } from '../../shared/domain/date';
import { QTY_EPSILON, roundQty } from '../../shared/domain/quantity';
import type { IsoDate, ScheduledReceipt, SequenceSlot } from '../../shared/domain/types';

/*
 * The line-risk walk written the plain way, as a reference for the engine: every unit is exploded
 * afresh against the ledger as it stands at its turn, nothing is remembered between units, and
 * needs are objects in maps. Slow (it grows with units × BOM lines × days and more), but each step
 * reads as the rule it implements; the engine must give exactly the same result. Its supply
 * projection, need schedule and slot order follow the same rules as the engine's and look alike
 * line for line; they are kept here on purpose, so a change to the engine's helpers cannot change
 * the reference it is held to.
 */

/** A quantity of a part needed on a bucket, and through which made part. */
interface Need {
  part: number;
  bucket: number;
  qty: number;
  via: number;
}

interface Evaluation {
  /** Made parts taken from their stock; committed only when the unit is built. */
  takes: Need[];
  /** Needs of bought parts. */
  needs: Need[];
  /** Bought part → quantity lacking now (first need that lacks gives `via` and bucket). */
  lacks: Map<number, Need>;
}

interface OrderedSlot {
  slot: SequenceSlot;
  model: number;
  bucket: number;
}

const epsilon = QTY_EPSILON;
const NO_VIA = -1;

function compareText(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/**
 * Uncommitted quantity per part and working day, as a flat table: row p, column t holds supply up
 * to day t less what was committed for days up to t. A commitment on day b lowers every column
 * from b on; the free quantity for a need on day b is the row's least value from b on (cumulative
 * available-to-promise with look-ahead), kept ready in `least`.
 */
class StockLedger {
  private readonly cells: Float64Array;
  private readonly least: Float64Array;

  constructor(
    private readonly days: number,
    cumulativeSupply: Float64Array,
  ) {
    this.cells = cumulativeSupply.slice();
    this.least = new Float64Array(cumulativeSupply.length);
    const parts = days === 0 ? 0 : cumulativeSupply.length / days;
    for (let part = 0; part < parts; part += 1) this.refreshLeast(part);
  }

  /** Least free quantity of `part` from `bucket` on, less what this unit already holds of it (and when). */
  free(part: number, bucket: number, held: readonly Need[] | undefined): number {
    const base = part * this.days;
    if (held === undefined || held.length === 0) return this.least[base + bucket];
    // Held quantities only lower the days from their own need on.
    if (held.every((need) => need.bucket <= bucket)) {
      return roundQty(this.least[base + bucket] - held.reduce((sum, need) => sum + need.qty, 0));
    }
    let least = Infinity;
    for (let t = bucket; t < this.days; t += 1) {
      let value = this.cells[base + t];
      for (const need of held) if (need.bucket <= t) value -= need.qty;
      if (value < least) least = value;
    }
    return roundQty(least);
  }

  commit(part: number, bucket: number, qty: number): void {
    const base = part * this.days;
    let least = Infinity;
    for (let t = this.days - 1; t >= bucket; t -= 1) {
      const cell = roundQty(this.cells[base + t] - qty);
      this.cells[base + t] = cell;
      if (cell < least) least = cell;
      this.least[base + t] = least;
    }
    // Before the need's day a minimum only changes while the lowered one still reaches back.
    for (let t = bucket - 1; t >= 0; t -= 1) {
      const value = Math.min(this.cells[base + t], least);
      if (value === this.least[base + t]) break;
      this.least[base + t] = value;
      least = value;
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

/**
 * Walks the build sequence over [from, to], promising supply to units in build order; returns the
 * units that cannot be built, the short parts with their action, dated need and units stopped, and
 * a rescue per part. Throws PlanInputError for unusable input and BomCycleError for a cyclic BOM.
 */
export function referenceLineRisk(input: LineRiskInput): LineRiskResult {
  const model = buildPlanModel({ ...input, sequence: [], scheduledReceipts: [] });
  const { calendar, dayNumbers, indexOf } = model;
  const days = model.days.length;
  const { parts } = input;
  if (days > 0 && dayNumbers[days - 1] - dayNumbers[0] + 1 > MAX_LINE_RISK_CALENDAR_DAYS) {
    throw new PlanInputError(`Horizon ${input.from} … ${input.to} is longer than ${MAX_LINE_RISK_CALENDAR_DAYS} days`);
  }
  const countable = parts.map((part) => COUNTABLE_UNITS.has(part.uom ?? 'H87'));
  const wholeIfCountable = (part: number, qty: number) => (countable[part] ? Math.ceil(qty - epsilon) : roundQty(qty));
  const rankOf = new Int32Array(parts.length);
  parts
    .map((_, index) => index)
    .sort((a, b) => compareText(parts[a].partNumber, parts[b].partNumber))
    .forEach((index, rank) => (rankOf[index] = rank));

  const ordered = orderSlots(input.sequence, model);
  const { cumulativeSupply, firmReceiptQty, receiptsByDay } = firmSupply(input.firmReceipts, model, parts.length);

  // --- Explosion with pegging ---

  const toBucket = (offset: number) => Math.max(0, offset);
  /** Day number of bucket offset b, which may lie before the horizon (a subassembly started earlier). */
  const dayOfOffset = (offset: number) =>
    offset >= 0 ? dayNumbers[Math.min(offset, days - 1)] : model.workingDayBeforeStart(-offset);

  function explode(
    ledger: StockLedger,
    parent: number,
    qty: number,
    offset: number,
    via: number,
    evaluation: Evaluation,
    held: Map<number, Need[]>,
  ): void {
    const day = dayOfOffset(offset);
    const bucket = toBucket(offset);
    for (let line = model.lineStart[parent]; line < model.lineStart[parent + 1]; line += 1) {
      if (day < model.lineFrom[line] || day > model.lineTo[line]) continue;
      const need = roundQty(qty * model.lineQtyPer[line]);
      if (need <= epsilon) continue;
      const component = model.lineComponent[line];
      if (model.source[component] === BOUGHT) {
        const entry = { part: component, bucket, qty: need, via };
        evaluation.needs.push(entry);
        const free = Math.max(0, ledger.free(component, bucket, held.get(component)));
        hold(held, entry);
        const lack = need - free;
        if (lack > epsilon && !evaluation.lacks.has(component)) {
          evaluation.lacks.set(component, { part: component, bucket, qty: lack, via });
        } else if (lack > epsilon) {
          const known = evaluation.lacks.get(component)!;
          known.qty = roundQty(known.qty + Math.min(need, lack));
        }
        continue;
      }
      // A made part (or a model used as a component): from its stock first, the rest made for the unit.
      const inStock = Math.max(0, ledger.free(component, bucket, held.get(component)));
      const taken = Math.min(need, inStock);
      if (taken > epsilon) {
        const take = { part: component, bucket, qty: taken, via };
        evaluation.takes.push(take);
        hold(held, take);
      }
      const made = roundQty(need - taken);
      if (made > epsilon) {
        const start = offset - model.leadTimeDays[component];
        explode(
          ledger,
          component,
          made,
          start,
          via === NO_VIA && model.source[component] === MADE ? component : via,
          evaluation,
          held,
        );
      }
    }
  }

  function hold(held: Map<number, Need[]>, need: Need): void {
    const list = held.get(need.part);
    if (list) list.push(need);
    else held.set(need.part, [need]);
  }

  function evaluate(ledger: StockLedger, part: number, qty: number, bucket: number): Evaluation {
    const evaluation: Evaluation = { takes: [], needs: [], lacks: new Map() };
    explode(ledger, part, qty, bucket, NO_VIA, evaluation, new Map());
    return evaluation;
  }

  // --- Supply: kanban loops pull; every other part has on-hand and firm receipts ---

  const probe = new StockLedger(days, cumulativeSupply);
  const requiredByDay = new Float64Array(parts.length * days);
  // Every unit draws: made stock goes to the units in order, the rest is made and needs its parts.
  const evaluations = ordered.map((entry) => {
    const evaluation = evaluate(probe, entry.model, entry.slot.qty, entry.bucket);
    for (const take of evaluation.takes) probe.commit(take.part, take.bucket, take.qty);
    for (const need of evaluation.needs) requiredByDay[need.part * days + need.bucket] += need.qty;
    return evaluation;
  });
  const loopByPart = new Map<number, LoopSupply>();
  for (const loop of input.loops ?? []) {
    const part = indexOf.get(loop.partNumber);
    if (part !== undefined && parts[part].replenishment === 'kanban') loopByPart.set(part, loop);
  }
  for (const [part, loop] of loopByPart) {
    pullSupply(part, loop, model, parts[part].onHand, receiptsByDay, requiredByDay, cumulativeSupply);
  }
  // Made parts only supply their own stock; nothing is ordered for them here.

  // --- The walk ---

  const build = new StockLedger(days, cumulativeSupply);
  const queue = new StockLedger(days, cumulativeSupply);
  interface PartRisk {
    slots: SlotAtRisk[];
    resequence: ResequenceOption | null;
  }
  const risks = new Map<number, PartRisk>();
  const unitsAtRisk: UnitAtRisk[] = [];
  let unitsBuilt = 0;

  const evaluateForBuild = (model: number, qty: number, bucket: number) => evaluate(build, model, qty, bucket);

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
      if (evaluateForBuild(candidate.model, candidate.slot.qty, atRisk.bucket).lacks.size === 0) {
        return { slot: unitRef(atRisk.slot), candidate: unitRef(candidate.slot) };
      }
    }
    return null;
  }

  /** Queue view: each part serves this unit if it can, whatever the unit's other parts do. */
  function queueLacks(needs: Need[]): Map<number, number> {
    const lacks = new Map<number, number>();
    const byPart = new Map<number, Need[]>();
    for (const need of needs) {
      const list = byPart.get(need.part);
      if (list) list.push(need);
      else byPart.set(need.part, [need]);
    }
    for (const [part, partNeeds] of byPart) {
      let lack = 0;
      if (partNeeds.length === 1) {
        lack = Math.max(0, partNeeds[0].qty - Math.max(0, queue.free(part, partNeeds[0].bucket, undefined)));
      } else {
        partNeeds.forEach((need, index) => {
          lack += Math.max(0, need.qty - Math.max(0, queue.free(part, need.bucket, partNeeds.slice(0, index))));
        });
      }
      if (lack > epsilon) lacks.set(part, roundQty(lack));
      else for (const need of partNeeds) queue.commit(part, need.bucket, need.qty);
    }
    return lacks;
  }

  /** A slot of `part` for this unit; the first unit at risk of a part works out its resequence rescue. */
  function addSlot(
    part: number,
    entry: OrderedSlot,
    qty: number,
    via: string | null,
    resequence: () => ResequenceOption | null,
  ) {
    let risk = risks.get(part);
    if (!risk) {
      risk = { slots: [], resequence: resequence() };
      risks.set(part, risk);
    }
    // One object per slot, built in one go: a large plant has hundreds of thousands of them.
    const { date, sequence, serial, model } = entry.slot;
    risk.slots.push({ date, sequence, serial, model, lackQty: qty, via });
  }

  ordered.forEach((entry, position) => {
    // The queue view runs for every unit: a part can stop a unit that is buildable now only
    // because a unit ahead of it, short of something else, is not taking its share.
    const behind = queueLacks(evaluations[position].needs);
    // Evaluated again against the build ledger, which holds the commitments of the units built so far.
    const evaluation = evaluateForBuild(entry.model, entry.slot.qty, entry.bucket);
    // The first need of each part, looked up only for parts short behind other units.
    let firstNeeds: Map<number, Need> | null = null;
    const viaOf = (part: number, need: Need | undefined) => {
      if (!need && !firstNeeds) {
        firstNeeds = new Map();
        for (const candidate of evaluations[position].needs)
          if (!firstNeeds.has(candidate.part)) firstNeeds.set(candidate.part, candidate);
      }
      const found = need ?? firstNeeds!.get(part)!;
      return { via: found.via === NO_VIA ? null : parts[found.via].partNumber, bucket: found.bucket };
    };
    if (evaluation.lacks.size === 0) {
      for (const need of evaluation.needs) build.commit(need.part, need.bucket, need.qty);
      for (const take of evaluation.takes) build.commit(take.part, take.bucket, take.qty);
      unitsBuilt += 1;
      for (const [part, lack] of behind)
        addSlot(part, entry, wholeIfCountable(part, lack), viaOf(part, undefined).via, () => null);
      return;
    }
    const unit: UnitAtRisk = { ...unitRef(entry.slot), lacks: [] };
    // The unit took nothing, so the stock stands exactly as it did at its turn.
    const resequence = () => {
      if (unit.resequence === undefined) unit.resequence = findResequence(position);
      return unit.resequence;
    };
    const lacking = [...evaluation.lacks.keys()].sort((a, b) => rankOf[a] - rankOf[b]);
    const behindOnly = [...behind.keys()]
      .filter((part) => !evaluation.lacks.has(part))
      .sort((a, b) => rankOf[a] - rankOf[b]);
    for (const part of lacking.concat(behindOnly)) {
      const now = evaluation.lacks.get(part);
      const qty = wholeIfCountable(part, now?.qty ?? behind.get(part)!);
      const { via, bucket } = viaOf(part, now);
      unit.lacks.push({
        partNumber: parts[part].partNumber,
        qty,
        now: now !== undefined,
        via,
        neededOn: model.days[bucket],
      });
      addSlot(part, entry, qty, via, resequence);
    }
    unitsAtRisk.push(unit);
  });

  // --- Figures per short part ---

  const today = input.today ?? input.from;
  const todayDay = requireDate(model.dayNumberOf(today), today, 'Today');
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
    const projection = needSchedule(part, model.days, requiredByDay, cumulativeSupply, (qty) =>
      wholeIfCountable(part, qty),
    );
    const first =
      projection.firstShort >= 0
        ? projection.firstShort
        : Math.max(0, model.bucketOf(requireDate(model.dayNumberOf(risk.slots[0].date), risk.slots[0].date, 'Slot')));
    const shortPart = parts[part];
    const firstShortDay = dayNumbers[first];
    const needBy =
      projection.needBy.length > 0 ? projection.needBy : [{ date: model.days[first], qty: risk.slots[0].lackQty }];
    const shortQty = roundQty(needBy.reduce((sum, entry) => sum + entry.qty, 0));
    const leadTimeDays = shortPart.leadTimeDays;
    // A release sent today arrives lead time later, in time for a need on that day.
    const releasedTodayArrives = calendar.addWorking(calendar.nextWorking(todayDay), leadTimeDays);
    const loop = loopByPart.get(part);
    const action: ShortageAction = loop
      ? 'loop'
      : shortPart.countDue || shortPart.onHand < 0
        ? 'count'
        : firstShortDay < releasedTodayArrives
          ? 'expedite'
          : 'release';
    shortages.push({
      partNumber: shortPart.partNumber,
      supplierCode: shortPart.supplierCode ?? null,
      action,
      firstShortDate: model.days[first],
      shortQty,
      needBy,
      releaseBy: action === 'release' ? fromDayNumber(calendar.addWorking(firstShortDay, -leadTimeDays)) : null,
      leadTimeDays,
      slotsAtRisk: risk.slots,
      onHand: shortPart.onHand,
      firmReceiptQty: roundQty(firmReceiptQty[part]),
      daysUntilImpact: workingDaysAfterToday(firstShortDay),
      inFrozenWindow: frozenEnd !== null && firstShortDay <= frozenEnd,
      loop: loop ? { activeCards: loop.activeCards, recommendedCards: loop.recommendedCards } : null,
      rescue: { expedite: { qty: needBy[0].qty, needBy: needBy[0].date }, resequence: risk.resequence },
      requiredByDay: Array.from(requiredByDay.subarray(part * days, (part + 1) * days), (qty) => roundQty(qty)),
    });
  }
  shortages.sort(
    (a, b) =>
      SHORTAGE_ACTIONS.indexOf(a.action) - SHORTAGE_ACTIONS.indexOf(b.action) ||
      compareText(a.firstShortDate, b.firstShortDate) ||
      compareText(a.partNumber, b.partNumber),
  );

  return {
    from: input.from,
    to: input.to,
    days: model.days,
    today,
    frozenWindowDays,
    frozenUntil: frozenEnd === null ? null : fromDayNumber(frozenEnd),
    unitsInHorizon: ordered.length,
    unitsBuilt,
    unitsAtRisk,
    shortages,
  };
}

function unitRef(slot: SequenceSlot): UnitRef {
  return { date: slot.date, sequence: slot.sequence, serial: slot.serial, model: slot.model };
}

/** Units of the horizon in build order; a unit dated before it is needed now, after it is out of view. */
function orderSlots(sequence: readonly SequenceSlot[], model: PlanModel): OrderedSlot[] {
  const ordered: OrderedSlot[] = [];
  sequence.forEach((slot, row) => {
    const where = `Sequence slot ${row + 1} (${slot.date} #${slot.sequence})`;
    const part = model.indexOf.get(slot.model);
    if (part === undefined)
      throw new PlanInputError(`${where} builds model ${slot.model}, which is not in the part list`);
    if (!Number.isFinite(slot.qty)) throw new PlanInputError(`${where}: quantity must be a finite number`);
    let bucket = model.bucketOf(requireDate(model.dayNumberOf(slot.date), slot.date, where));
    if (bucket === -1 && model.days.length > 0) bucket = 0;
    if (bucket < 0 || slot.qty <= 0) return;
    ordered.push({ slot, model: part, bucket });
  });
  return ordered.sort((a, b) => compareText(a.slot.date, b.slot.date) || a.slot.sequence - b.slot.sequence);
}

/** On-hand plus firm receipts by day, cumulated per part (late receipts count on the first day). */
function firmSupply(receipts: readonly ScheduledReceipt[], model: PlanModel, partCount: number) {
  const days = model.days.length;
  const receiptsByDay = new Float64Array(partCount * days);
  const firmReceiptQty = new Float64Array(partCount);
  receipts.forEach((receipt, row) => {
    const where = `Firm receipt ${row + 1} (${receipt.partNumber} on ${receipt.date})`;
    const part = model.indexOf.get(receipt.partNumber);
    if (part === undefined)
      throw new PlanInputError(`${where} names ${receipt.partNumber}, which is not in the part list`);
    if (!Number.isFinite(receipt.qty)) throw new PlanInputError(`${where}: quantity must be a finite number`);
    let bucket = model.bucketOf(requireDate(model.dayNumberOf(receipt.date), receipt.date, where));
    if (bucket === -1 && days > 0) bucket = 0;
    if (bucket < 0) return;
    receiptsByDay[part * days + bucket] += receipt.qty;
    firmReceiptQty[part] += receipt.qty;
  });
  const cumulativeSupply = new Float64Array(partCount * days);
  for (let part = 0; part < partCount; part += 1) {
    let cumulative = model.source[part] === 2 ? 0 : model.onHand[part];
    for (let t = 0; t < days; t += 1) {
      cumulative += receiptsByDay[part * days + t];
      cumulativeSupply[part * days + t] = roundQty(cumulative);
    }
  }
  return { cumulativeSupply, firmReceiptQty, receiptsByDay };
}

/**
 * A kanban part's supply when every unit draws on it: what is on hand, the containers already on
 * their way (open lines on their arrival day, emptied cards one replenishment time after the next
 * release), and then one container back a replenishment time after each container emptied. With
 * enough cards this always keeps up; an undersized loop starves, and that is its shortage.
 */
function pullSupply(
  part: number,
  loop: LoopSupply,
  model: PlanModel,
  onHand: number,
  receiptsByDay: Float64Array,
  requiredByDay: Float64Array,
  cumulativeSupply: Float64Array,
): void {
  const days = model.days.length;
  const base = part * days;
  const arrivals = new Float64Array(days);
  for (let t = 0; t < days; t += 1) arrivals[t] = receiptsByDay[base + t];
  const container = loop.containerQty > 0 ? loop.containerQty : 1;
  const back = Math.max(1, Math.round(loop.replenishmentDays));
  // The release job orders emptied cards the next working day.
  for (let card = 0; card < loop.emptyCards; card += 1) if (1 + back < days) arrivals[1 + back] += container;
  let consumed = 0;
  let containersEmptied = 0;
  let cumulative = onHand;
  for (let t = 0; t < days; t += 1) {
    cumulative += arrivals[t];
    cumulativeSupply[base + t] = roundQty(cumulative);
    consumed += requiredByDay[base + t];
    // Containers emptied today go back tomorrow and return full a replenishment time later.
    const emptied = Math.floor((consumed + epsilon) / container);
    for (; containersEmptied < emptied; containersEmptied += 1) {
      const arrival = t + 1 + back;
      if (arrival < days) arrivals[arrival] += container;
    }
  }
}

/**
 * A part's projection against every unit's need: the first day it is short and how much must have
 * arrived by each day to keep every unit building (the running worst shortfall, as increments).
 */
function needSchedule(
  part: number,
  dates: readonly IsoDate[],
  requiredByDay: Float64Array,
  cumulativeSupply: Float64Array,
  round: (qty: number) => number,
): { firstShort: number; needBy: NeedBy[] } {
  const days = dates.length;
  const base = part * days;
  let required = 0;
  let covered = 0;
  let firstShort = -1;
  const needBy: NeedBy[] = [];
  for (let t = 0; t < days; t += 1) {
    required += requiredByDay[base + t];
    const shortfall = round(required - cumulativeSupply[base + t]);
    if (shortfall > covered + epsilon) {
      if (firstShort < 0) firstShort = t;
      needBy.push({ date: dates[t], qty: roundQty(shortfall - covered) });
      covered = shortfall;
    }
  }
  return { firstShort, needBy };
}
