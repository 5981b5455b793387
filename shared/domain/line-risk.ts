import { Exploder, holdsAgainst, StockLedger, stillHolds, type Explosion } from './line-risk-explosion';
import { LackRecordWriter, LineRiskRun, type LackRecords, type ShortPartFigures } from './line-risk-run';
import { floatColumn, intColumn, type TypedColumn } from './typed-column';
import {
  entriesOf,
  queueColumns,
  queueLack,
  walkQueueView,
  writtenStream,
  type QueueEntries,
  type QueueHelper,
  type QueueKeep,
} from './line-risk-queue';
import {
  BOUGHT,
  buildPlanModel,
  END_ITEM,
  PlanInputError,
  requireDate,
  withCalendar,
  type PlanModel,
} from './plan-model';
import { fromDayNumber } from './date';
import { QTY_EPSILON, roundQty } from './quantity';
import { leadTimeArrival } from './supplier-timing';
import type { IsoDate, PlanningBomLine, PlanningPart, PlantCalendar, ScheduledReceipt, SequenceSlot } from './types';

/*
 * Line risk: which units of the build sequence cannot be built for want of a part, and what to do
 * about each short part. It reads the same plan model as the planning engine (part index, working-
 * day buckets, BOM lines with effectivity), with the same rules:
 * - A unit in the sequence is a build order: it needs its components whatever finished stock of its
 *   model exists. Units already built are not passed in; a unit dated before `from` is still to be
 *   built and needed now (the first bucket).
 * - A unit needs its BOM quantities on its build date, without the scrap allowance (that is for
 *   ordering). A made subassembly is taken from its own stock first; what is not in stock is made
 *   for the unit, starting the subassembly's lead time in working days ahead of the day it is
 *   needed, and its components are needed at that start, through the BOM lines effective then.
 * - Supply is on-hand (at the start of the first bucket) plus firm receipts on their arrival day.
 *   A kanban part is supplied by its loop: the containers on their way, and one container coming
 *   back a replenishment time after each container emptied — so a right-sized loop is no shortage.
 *
 * Stock is promised to units first come, first served in build order, the way available-to-promise
 * is consumed by orders in sequence (APICS Dictionary, "available-to-promise"; Vollmann, Berry,
 * Whybark and Jacobs, Manufacturing Planning and Control for Supply Chain Management, chapter on
 * master production scheduling — from memory): a unit is built only if every part it needs is
 * free for it, and then takes all of them; otherwise it is at risk and takes nothing, leaving its
 * parts to later units. A countable part (pieces, sets, pairs) is never short by a fraction
 * (common practice, no source).
 *
 * Each short part then gets its own projection (every unit draws on it, whatever its other parts
 * do): when it first runs short, how much must arrive by each date to keep every unit building,
 * and what to do — expedite (short inside the supplier's lead time), release (later: the normal
 * release covers it if sent by a date), loop (the kanban loop cannot keep up), count (on-hand is
 * negative or due a count, so the shortage may not be real).
 */

/** Horizons longer than this many calendar days are refused: the line risk looks weeks ahead. */
export const MAX_LINE_RISK_CALENDAR_DAYS = 186;

/** Frozen window of the build sequence when the plant has not set one, in working days. */
export const DEFAULT_FROZEN_WINDOW_DAYS = 3;

/** UN/ECE Recommendation 20 codes counted in whole units: piece, set, pair. */
export const COUNTABLE_UNITS = new Set(['H87', 'SET', 'PR']);

export type ShortageAction = 'expedite' | 'loop' | 'count' | 'release';

/** Display and alarm order: what only an immediate action saves first. */
export const SHORTAGE_ACTIONS: readonly ShortageAction[] = ['expedite', 'loop', 'count', 'release'];

export interface LineRiskPart extends PlanningPart {
  /** UN/ECE Rec. 20 unit code; countable units are never short by a fraction. */
  uom?: string;
  replenishment?: 'kanban' | 'scheduled' | null;
  /** Not counted (nor opened in the ledger) within the plant's count interval. */
  countDue?: boolean;
}

/** A kanban loop as supply: its containers, the time one takes to come back, and those already on their way. */
export interface LoopSupply {
  partNumber: string;
  activeCards: number;
  recommendedCards: number;
  containerQty: number;
  /** Working days from a container emptied to it coming back full. */
  replenishmentDays: number;
  /** Containers emptied and not yet ordered: they come back a replenishment time after the next release. */
  emptyCards: number;
}

export interface LineRiskInput {
  parts: LineRiskPart[];
  bom: PlanningBomLine[];
  /** Units not yet built. */
  sequence: SequenceSlot[];
  /** Open quantities suppliers have firmly confirmed, dated on their expected arrival. */
  firmReceipts: ScheduledReceipt[];
  loops?: LoopSupply[];
  calendar: PlantCalendar;
  from: IsoDate;
  to: IsoDate;
  /** Day the days until impact and the lead-time test count from; defaults to `from`. */
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
  /** Quantity missing for this unit (whole for countable parts). */
  qty: number;
  /** True: missing with what is free now (it stops the unit). False: missing once the units ahead are served. */
  now: boolean;
  /** The made subassembly that needs the part, when the unit lacks it through one. */
  via: string | null;
  /** The day the part is needed: the build date, or the subassembly's start. */
  neededOn: IsoDate;
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
  via: string | null;
}

export interface NeedBy {
  date: IsoDate;
  /** What must arrive by `date`, beyond what arrived for earlier dates. */
  qty: number;
}

export interface PartShortage {
  partNumber: string;
  supplierCode: string | null;
  action: ShortageAction;
  /** First day the part's projection (on-hand + supply − every unit's need) is below zero. */
  firstShortDate: IsoDate;
  /** All that must arrive over the horizon to build every unit: the sum of needBy. */
  shortQty: number;
  /** How much must arrive by each date to keep every unit building. */
  needBy: NeedBy[];
  /** For `release`: the last day the normal release can go out and still arrive in time. */
  releaseBy: IsoDate | null;
  /** The part's lead time in working days (the supplier's, for a bought part). */
  leadTimeDays: number;
  /** Units that lack the part (in build order); the first of them lack it now. */
  slotsAtRisk: SlotAtRisk[];
  onHand: number;
  /** Firm receipts counted inside the horizon. */
  firmReceiptQty: number;
  /** Working days after `today` up to firstShortDate (0: today). */
  daysUntilImpact: number;
  inFrozenWindow: boolean;
  /** For `loop`: the loop's cards in circulation against those it needs. */
  loop: { activeCards: number; recommendedCards: number } | null;
  rescue: {
    expedite: { qty: number; needBy: IsoDate };
    /** For the first unit at risk in slotsAtRisk. */
    resequence: ResequenceOption | null;
  };
  /** Every unit's need of the part per working day of the horizon (what the plan would call gross, without scrap). */
  requiredByDay: number[];
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
  /** By action (expedite, loop, count, release), then first short date, then part number. */
  shortages: PartShortage[];
}

interface OrderedSlot {
  slot: SequenceSlot;
  model: number;
  bucket: number;
}

/** A short part's first slot (a record of the run), and the rescue worked out for the first unit at risk of it. */
interface PartRisk {
  firstRecord: number;
  resequence: ResequenceOption | null;
}

const epsilon = QTY_EPSILON;

function compareText(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/**
 * Walks the build sequence over [from, to], promising supply to units in build order; returns the
 * units that cannot be built, the short parts with their action, dated need and units stopped, and
 * a rescue per part. Throws PlanInputError for unusable input and BomCycleError for a cyclic BOM.
 */
export function computeLineRisk(input: LineRiskInput): LineRiskResult {
  return walkLineRisk(input).result();
}

/**
 * The same walk, its units and slots at risk kept as records: what the server keeps, summarises
 * and pages (a large plant's full answer runs to hundreds of thousands of slots).
 */
export function walkLineRisk(input: LineRiskInput): LineRiskRun {
  return walkAll(input).run;
}

/**
 * How a walk went: every unit walked; only the parts whose supply changed walked again; only the
 * parts whose BOM lines changed (and those whose supply changed) walked again, the units that use
 * those lines exploded again; the first units taken out as built, the rest walked on from there
 * (the parts whose supply changed walked again); every unit judged again, exploded again only
 * where the made stock it read moved ('judged'); or the last walk's units and slots kept whole.
 */
export type WalkKind = 'full' | 'parts' | 'bom' | 'built' | 'judged' | 'kept';

/**
 * Walks line risk again and again over changing planning data (the server's worker), keeping what
 * the last walk found. Most changes between two walks are stock: a count, a receipt, firm receipts
 * of a few bought parts. Units then keep their verdicts unless one of those parts decides one, so
 * only those parts' rows are walked again, against the verdicts found before. An engineering
 * change to lines of bought components is walked the same way: it changes what units need of
 * those parts alone, so only the units whose BOM passes a changed line are exploded again. Units
 * built at the head of the sequence, which the walk had found buildable, are taken out with what
 * they committed (the backflush took the same from on-hand), and the walk stands from the next
 * unit on. Any other change to the sequence, to stock, to the BOM or to the part master (a unit at
 * risk built, units moved, added or removed, made stock counted, a made component's line, a lead
 * time, a verdict changed) judges every unit again, but keeps what each needs wherever its model's
 * BOM and lead times stand and the made stock its explosion read does too. The walk is done in full
 * when a part's source or the horizon changed, when a calendar change moved a working day the walk
 * reads, and every WALKS_BEFORE_FULL walks. Either way the answer is exactly the full walk's.
 */
export class LineRiskWalker {
  private last: Walked | null = null;
  /** Walks since the last full one. */
  private sinceFull = 0;
  /** How the last walk went. */
  lastKind: WalkKind = 'full';

  /** `helper` may walk the queue view of a walk afresh in another thread (see QueueHelper). */
  constructor(private readonly helper: QueueHelper | null = null) {}

  /** The last walk's units whose needs groupAhead has grouped. */
  private groupedAhead = 0;

  /**
   * Groups by part the needs of the next `units` units of the last walk, for the next walk to find
   * them done: a walk whose queue view another thread walked leaves them to be worked out. For idle
   * time, a slice at a time, so that a request arriving meanwhile waits for one slice at most (at
   * 16 times the demo plant all of them take 20–35 ms). True while units are left.
   */
  groupAhead(units = GROUP_AHEAD_SLICE): boolean {
    const last = this.last;
    if (!last) return false;
    const end = Math.min(last.probed.length, this.groupedAhead + units);
    for (let unit = this.groupedAhead; unit < end; unit += 1) last.exploder.needGroups(last.probed[unit], last.rowBase);
    this.groupedAhead = end;
    return end < last.probed.length;
  }

  walk(input: LineRiskInput): LineRiskRun {
    const fromLastWalk = this.last && fromLast(this.last);
    const previous = this.sinceFull < WALKS_BEFORE_FULL ? this.last : null;
    // Dropped first: if this walk throws, the next one starts afresh.
    this.last = null;
    let again: ReturnType<typeof walkAgain> = null;
    try {
      again = previous && (walkAgain(previous, input) ?? judgeAgain(previous, input, this.helper));
    } catch {
      // The full walk below reports whatever is wrong with the input.
    }
    const done = again ?? { ...walkAll(input, this.helper, fromLastWalk), kind: 'full' as const };
    this.last = done.walked;
    this.groupedAhead = 0;
    this.lastKind = done.kind;
    this.sinceFull = done.kind === 'full' ? 0 : this.sinceFull + 1;
    return done.run;
  }
}

/**
 * A walk again keeps explosions of earlier walks, and with them the blocks of memory they were
 * made in; every this many walks one is done in full, so what is kept cannot grow without bound.
 */
export const WALKS_BEFORE_FULL = 100;

/** Units whose needs groupAhead groups at a time: a few milliseconds' work at 16 times the demo plant. */
export const GROUP_AHEAD_SLICE = 200;

/**
 * Explosions against one ledger, kept by model, quantity and day: a unit reuses the one made for
 * an earlier unit as long as it still holds (every free quantity it read within its bounds).
 */
class ExplosionCache {
  /** By model and day for a quantity of one (nearly every unit), found without making a key of text. */
  private readonly keptOne = new Map<number, Explosion>();
  private readonly kept = new Map<string, Explosion>();

  constructor(
    private readonly exploder: Exploder,
    private readonly ledger: StockLedger,
    private readonly withLacks: boolean,
  ) {}

  get(model: number, qty: number, bucket: number): Explosion {
    const one = qty === 1;
    const key = one ? model * this.ledger.days + bucket : `${model}:${qty}:${bucket}`;
    let explosion = one ? this.keptOne.get(key as number) : this.kept.get(key as string);
    if (explosion === undefined || !stillHolds(explosion, this.ledger)) {
      explosion = this.exploder.explode(this.ledger, model, qty, bucket, this.withLacks);
      if (one) this.keptOne.set(key as number, explosion);
      else this.kept.set(key as string, explosion);
    }
    return explosion;
  }
}

/**
 * The resequence rescue of a unit at risk, against the build ledger as it stands at the unit's
 * turn: the first later unit, same or next working day, of another model whose parts are all free.
 */
function resequenceFinder(ordered: readonly OrderedSlot[], againstBuild: ExplosionCache, partCount: number) {
  // Each model and quantity is tried once per search: the model's first quantity is kept by search
  // number, any other in a set (units of one model rarely differ in quantity).
  const triedIn = new Int32Array(partCount);
  const triedQty = new Float64Array(partCount);
  let search = 0;
  return (position: number): ResequenceOption | null => {
    const atRisk = ordered[position];
    search += 1;
    let triedOther: Set<string> | null = null;
    for (let next = position + 1; next < ordered.length; next += 1) {
      const candidate = ordered[next];
      if (candidate.bucket > atRisk.bucket + 1) break;
      const { model: candidateModel } = candidate;
      const { qty } = candidate.slot;
      if (candidateModel === atRisk.model) continue;
      if (triedIn[candidateModel] !== search) {
        triedIn[candidateModel] = search;
        triedQty[candidateModel] = qty;
      } else if (triedQty[candidateModel] === qty) continue;
      else {
        const key = `${candidateModel}:${qty}`;
        triedOther ??= new Set();
        if (triedOther.has(key)) continue;
        triedOther.add(key);
      }
      if (againstBuild.get(candidateModel, qty, atRisk.bucket).lackCount === 0) {
        return { slot: unitRef(atRisk.slot), candidate: unitRef(candidate.slot) };
      }
    }
    return null;
  };
}

/**
 * Each short part's first slot, in the order parts first fall short, with the resequence rescue
 * of its unit: worked out once per unit at risk, at its turn (the unit takes nothing, so the
 * stock stands as it did), when it first holds a part's first slot.
 */
class Risks {
  readonly byPart: (PartRisk | undefined)[];
  readonly order: number[] = [];
  /** By index among the units at risk. */
  readonly resequence = new Map<number, ResequenceOption | null>();

  constructor(
    partCount: number,
    private readonly find: (position: number) => ResequenceOption | null,
  ) {
    this.byPart = new Array(partCount);
  }

  /** Record `record` lacks `part` for the unit at `position`; `atRiskIndex` is -1 for a unit built. */
  note(part: number, record: number, position: number, atRiskIndex: number): void {
    if (this.byPart[part]) return;
    let resequence: ResequenceOption | null = null;
    if (atRiskIndex >= 0) {
      const found = this.resequence.get(atRiskIndex);
      resequence = found === undefined ? this.find(position) : found;
      this.resequence.set(atRiskIndex, resequence);
    }
    this.byPart[part] = { firstRecord: record, resequence };
    this.order.push(part);
  }
}

/** What a walk keeps for the next one (see LineRiskWalker). */
interface Walked {
  input: LineRiskInput;
  model: PlanModel;
  /** On-hand per part as this walk used it. */
  onHand: Float64Array;
  ordered: OrderedSlot[];
  rowBase: Int32Array;
  countable: Uint8Array;
  ranks: PartRanks;
  /** Each unit's explosion against made stock alone, its needs grouped by part (the queue view's). */
  probed: Explosion[];
  requiredByDay: Float64Array;
  /** Supply per part and day as walked (loops pulled). */
  supply: Float64Array;
  exploder: Exploder;
  /** Per unit in build order: the explosion its verdict came from, the verdict, its index among the units at risk (or -1). */
  judged: Explosion[];
  built: Uint8Array;
  atRiskIndex: Int32Array;
  atRiskUnit: Int32Array;
  unitsBuilt: number;
  records: LackRecords;
  /** The records of the unit at position u are unitStart[u] … unitStart[u + 1] - 1. */
  unitStart: Int32Array;
  risks: Risks;
  /** The queue view's findings, for a later walk to keep those of the parts that stood; null when unknown. */
  queueLacks: QueueLacks | null;
}

/**
 * What each unit lacks of each part only behind the units ahead of it (the queue view): the
 * entries of the unit at position u are start[u] … start[u + 1] - 1, found for the explosion
 * units[u]. The queue view of a part depends only on that part's supply and on the needs of it of
 * the units in order: as long as those stand, so do its entries. `stale` marks the parts whose
 * entries a later walk changed (a walk of those parts alone again), so they are no longer to be kept.
 */
interface QueueLacks extends QueueEntries {
  units: readonly Explosion[];
  stale: Uint8Array | null;
}

/** What judgeUnits may keep of the last walk's queue view (see QueueLacks). */
interface QueueReuse {
  last: QueueLacks;
  /** The supply per part and day the entries were found against. */
  supply: Float64Array;
  /** Per unit: its position in the last walk, or -1. */
  lastPosition: Int32Array;
  /** Parts whose needs may have changed (1): their entries are found again. */
  touched: Uint8Array;
}

/** The entries a walk keeps, without what else the arrays object carries. */
function keptOf({ start, part, qty, need }: QueueEntries): QueueEntries {
  return { start, part, qty, need };
}

/** A countable part (pieces, sets, pairs) is never short by a fraction. */
function wholeIfCountable(countable: Uint8Array, part: number, qty: number): number {
  return countable[part] === 1 ? Math.ceil(qty - epsilon) : roundQty(qty);
}

/** The kanban loops that supply their part, by part index. */
function loopSupplies(input: LineRiskInput, model: PlanModel): Map<number, LoopSupply> {
  const loopByPart = new Map<number, LoopSupply>();
  for (const loop of input.loops ?? []) {
    const part = model.indexOf.get(loop.partNumber);
    if (part !== undefined && input.parts[part].replenishment === 'kanban') loopByPart.set(part, loop);
  }
  return loopByPart;
}

/**
 * The parts (of those marked in `among`, or all) whose projection runs below zero on some day:
 * supply to date less every unit's need to date. Only these can leave a unit short in the queue
 * view. Where supply covers every unit's need to every day, a unit finds its need free however
 * much the units ahead took: they took at most their own needs, all counted in the projection.
 */
function mayRunShort(
  rowBase: Int32Array,
  days: number,
  requiredByDay: Float64Array,
  supply: Float64Array,
  among?: Uint8Array,
): Uint8Array {
  const marked = new Uint8Array(rowBase.length);
  for (let part = 0; part < rowBase.length; part += 1) {
    if (among && among[part] !== 1) continue;
    const base = rowBase[part];
    let required = 0;
    for (let t = 0; t < days; t += 1) {
      required += requiredByDay[base + t];
      if (supply[base + t] - required < 0) {
        marked[part] = 1;
        break;
      }
    }
  }
  return marked;
}

/** Each input's plan model without units or receipts: a walk that tries one way, then another, builds it once. */
const structures = new WeakMap<LineRiskInput, PlanModel>();
function structureOf(input: LineRiskInput): PlanModel {
  let model = structures.get(input);
  if (!model) {
    model = buildPlanModel({ ...input, sequence: [], scheduledReceipts: [] });
    structures.set(input, model);
  }
  return model;
}

/**
 * The last walk's model with the input's stock and calendar, when nothing else the model holds
 * changed; kept as the input's structure, so a walk in full after it finds it made. Null when an
 * on-hand is not a number.
 */
function recalendared(model: PlanModel, input: LineRiskInput): PlanModel | null {
  const stocked = withStock(model, input.parts);
  if (!stocked) return null;
  const made = withCalendar(stocked, input.calendar, input.from, input.to);
  structures.set(input, made);
  return made;
}

/** Every unit walked. */
function walkAll(
  input: LineRiskInput,
  helper: QueueHelper | null = null,
  last: FromLastWalk | null = null,
): { run: LineRiskRun; walked: Walked } {
  const model = structureOf(input);
  const { dayNumbers } = model;
  const days = model.days.length;
  if (days > 0 && dayNumbers[days - 1] - dayNumbers[0] + 1 > MAX_LINE_RISK_CALENDAR_DAYS) {
    throw new PlanInputError(`Horizon ${input.from} … ${input.to} is longer than ${MAX_LINE_RISK_CALENDAR_DAYS} days`);
  }
  const ordered = orderSlots(input.sequence, model);
  const rowBase = rowsByUse(model, ordered);
  const supply = firmSupply(input.firmReceipts, model, rowBase, model.onHand);
  const exploder = new Exploder(model);

  // Every unit draws: made stock goes to the units in order, the rest is made and needs its parts.
  // Only made stock is committed here, so a unit reuses the explosion of an earlier unit of the
  // same model, quantity and day until a made part that explosion read is taken.
  const probe = madeStockLedger(model, supply.cumulativeSupply, rowBase);
  const probed = new ExplosionCache(exploder, probe, false);
  const requiredByDay = new Float64Array(input.parts.length * days);
  const explosions = ordered.map((entry) => {
    const explosion = probed.get(entry.model, entry.slot.qty, entry.bucket);
    const { needPart, needBucket, needQty, takePart, takeBucket, takeQty } = explosion;
    for (let take = 0; take < explosion.takeCount; take += 1)
      probe.commit(takePart[take], takeBucket[take], takeQty[take]);
    for (let need = 0; need < explosion.needCount; need += 1) {
      requiredByDay[rowBase[needPart[need]] + needBucket[need]] += needQty[need];
    }
    return explosion;
  });
  return judgeUnits(
    input,
    { model, ordered, rowBase, exploder, probed: explosions, requiredByDay },
    supply,
    null,
    helper,
    last,
  );
}

/**
 * What a walk takes from the last one besides its findings:
 * - how many slot records and queue-view entries it wrote: the next walk sizes its columns by
 *   them, for a plant's walks write about as many each time (at 16 times the demo plant over half
 *   a million of each; grown by doubling, they were copied over and again, and collected);
 * - the parts in part-number order, which stand while the part numbers do (sorting 32,000 of them
 *   costs a walk about 20–25 ms at 16 times the demo plant).
 */
interface FromLastWalk {
  records: number;
  entries: number;
  ranks: PartRanks;
}

function fromLast(walked: Walked): FromLastWalk {
  return { records: walked.records.count, entries: walked.queueLacks?.part.length ?? 0, ranks: walked.ranks };
}

/** Parts by part number (`partAtRank`), and each part's place in that order (`rankOf`), for the part list `parts`. */
interface PartRanks {
  parts: readonly LineRiskPart[];
  partAtRank: Int32Array;
  rankOf: Int32Array;
}

/** The ranks of `parts`: `last`'s when every part number stands in its place. */
function partRanks(parts: readonly LineRiskPart[], last: PartRanks | undefined): PartRanks {
  if (
    last &&
    (last.parts === parts ||
      (last.parts.length === parts.length &&
        parts.every((part, index) => part.partNumber === last.parts[index].partNumber)))
  ) {
    return last.parts === parts ? last : { ...last, parts };
  }
  const partAtRank = Int32Array.from(
    parts.map((_, index) => index).sort((a, b) => compareText(parts[a].partNumber, parts[b].partNumber)),
  );
  const rankOf = new Int32Array(parts.length);
  partAtRank.forEach((part, rank) => (rankOf[part] = rank));
  return { parts, partAtRank, rankOf };
}

/** Room for about `size` values and an eighth more; a little when unknown. */
function roomFor(size: number | undefined): number {
  return size ? size + (size >> 3) + 1024 : 1024;
}

/** What every unit needs, as the probe walk found it: what a walk judges the units by. */
type UnitNeeds = Pick<Walked, 'model' | 'ordered' | 'rowBase' | 'exploder' | 'probed' | 'requiredByDay'>;

/**
 * The walk proper: each unit in build order judged against the stock promised to the units before
 * it (the build view) and against every unit before it (the queue view), with the needs found.
 */
function judgeUnits(
  input: LineRiskInput,
  needs: UnitNeeds,
  { cumulativeSupply, firmReceiptQty, receiptsByDay }: ReturnType<typeof firmSupply>,
  reuse: QueueReuse | null = null,
  helper: QueueHelper | null = null,
  last: FromLastWalk | null = null,
): { run: LineRiskRun; walked: Walked } {
  const { model, ordered, rowBase, exploder, probed: explosions, requiredByDay } = needs;
  const days = model.days.length;
  const { parts } = input;
  // --- Supply: kanban loops pull; every other part has on-hand and firm receipts ---
  const loopByPart = loopSupplies(input, model);
  for (const [part, loop] of loopByPart) {
    pullSupply(rowBase[part], loop, model, parts[part].onHand, receiptsByDay, requiredByDay, cumulativeSupply);
  }
  // Made parts only supply their own stock; nothing is ordered for them here.

  // --- The walk ---

  // The queue view first: a thread that walks it beside the judging starts as early as it can.
  // With the last walk's queue view at hand, only the parts whose needs or supply may have changed
  // (or whose entries a walk since changed) are walked in the queue view again.
  const fresh = reuse ? freshParts(reuse, rowBase, days, cumulativeSupply) : null;
  const queued = mayRunShort(rowBase, days, requiredByDay, cumulativeSupply, fresh ?? undefined);
  const keep: QueueKeep | null = reuse && {
    fresh: fresh!,
    last: reuse.last,
    lastUnits: reuse.last.units,
    lastPosition: reuse.lastPosition,
  };
  const walkHere = (): QueueEntries => {
    const columns = queueColumns(ordered.length, roomFor(last?.entries));
    const queue = new StockLedger(days, cumulativeSupply, rowBase, queued);
    walkQueueView(explosions, exploder.grouper, rowBase, queue, queued, keep, columns);
    return entriesOf(columns);
  };
  // Walked afresh on a large plant, it may be walked beside the judging, in another thread. (Walked
  // again, most of it is kept from the last walk: handing it over would save little, as the thread
  // groups every unit's needs anew.)
  const queueView =
    (keep === null && helper?.({ units: explosions, rowBase, days, supply: cumulativeSupply, queued, walkHere })) ||
    writtenStream(walkHere());

  const countable = Uint8Array.from(parts, (part) => (COUNTABLE_UNITS.has(part.uom ?? 'H87') ? 1 : 0));
  const ranks = partRanks(parts, last?.ranks);
  const { partAtRank, rankOf } = ranks;
  // A unit's explosion against the build ledger holds until a unit that shares a part with it is built.
  // These explosions are the walk's own: made apart from the needs, which the next walks may keep.
  const build = new StockLedger(days, cumulativeSupply, rowBase);
  const againstBuild = new ExplosionCache(new Exploder(model), build, true);
  const risks = new Risks(parts.length, resequenceFinder(ordered, againstBuild, parts.length));
  const records = new LackRecordWriter(roomFor(last?.records));
  const atRiskUnit = intColumn();
  const judged: Explosion[] = new Array(ordered.length);
  const built = new Uint8Array(ordered.length);
  const atRiskIndex = new Int32Array(ordered.length).fill(-1);
  const unitStart = new Int32Array(ordered.length + 1);
  let unitsBuilt = 0;

  /** Per part: its queue-view entry for the unit at hand. */
  const behindIndex = new Int32Array(parts.length);
  /** Per part: the unit (position + 1) it lacks now for, and which lack of the unit's explosion. */
  const nowStamp = new Int32Array(parts.length);
  const nowIndex = new Int32Array(parts.length);
  const rankScratch = new Int32Array(parts.length);

  /** A slot of `part` for the unit at `position` (`atRisk`: its index among the units at risk, or -1). */
  function addSlot(
    part: number,
    position: number,
    qty: number,
    now: boolean,
    via: number,
    bucket: number,
    atRisk: number,
  ) {
    risks.note(part, records.push(position, part, qty, now ? 1 : 0, via, bucket), position, atRisk);
  }

  ordered.forEach((entry, position) => {
    unitStart[position] = records.count;
    const stamp = position + 1;
    const mine = explosions[position];
    // The queue view's entries of the unit: a part can stop a unit that is buildable now only
    // because a unit ahead of it, short of something else, is not taking its share.
    const { start, part: behindPart, qty: behindQty, need: behindNeed } = queueView.ready(position);
    const behindFirst = start[position];
    const behindEnd = start[position + 1];
    // Evaluated again against the build ledger, which holds the commitments of the units built so far.
    const explosion = againstBuild.get(entry.model, entry.slot.qty, entry.bucket);
    judged[position] = explosion;
    if (explosion.lackCount === 0) {
      for (let need = 0; need < explosion.needCount; need += 1) {
        build.commit(explosion.needPart[need], explosion.needBucket[need], explosion.needQty[need]);
      }
      for (let take = 0; take < explosion.takeCount; take += 1) {
        build.commit(explosion.takePart[take], explosion.takeBucket[take], explosion.takeQty[take]);
      }
      built[position] = 1;
      unitsBuilt += 1;
      for (let behind = behindFirst; behind < behindEnd; behind += 1) {
        const part = behindPart[behind];
        const need = behindNeed[behind];
        const qty = wholeIfCountable(countable, part, behindQty[behind]);
        addSlot(part, position, qty, false, mine.needVia[need], mine.needBucket[need], -1);
      }
      return;
    }
    const unitIndex = atRiskUnit.push(position);
    atRiskIndex[position] = unitIndex;
    // What it lacks now first, then what it lacks only behind the units ahead; each by part number.
    let ranks = 0;
    for (let lack = 0; lack < explosion.lackCount; lack += 1) {
      const part = explosion.lackPart[lack];
      nowStamp[part] = stamp;
      nowIndex[part] = lack;
      rankScratch[ranks++] = rankOf[part];
    }
    const nowCount = ranks;
    for (let behind = behindFirst; behind < behindEnd; behind += 1) {
      const part = behindPart[behind];
      behindIndex[part] = behind;
      if (nowStamp[part] !== stamp) rankScratch[ranks++] = rankOf[part];
    }
    rankScratch.subarray(0, nowCount).sort();
    rankScratch.subarray(nowCount, ranks).sort();
    for (let index = 0; index < ranks; index += 1) {
      const part = partAtRank[rankScratch[index]];
      if (index < nowCount) {
        const lack = nowIndex[part];
        const qty = wholeIfCountable(countable, part, explosion.lackQty[lack]);
        addSlot(part, position, qty, true, explosion.lackVia[lack], explosion.lackBucket[lack], unitIndex);
      } else {
        const behind = behindIndex[part];
        const need = behindNeed[behind];
        const qty = wholeIfCountable(countable, part, behindQty[behind]);
        addSlot(part, position, qty, false, mine.needVia[need], mine.needBucket[need], unitIndex);
      }
    }
  });
  unitStart[ordered.length] = records.count;

  const walked: Walked = {
    input,
    model,
    onHand: model.onHand,
    ordered,
    rowBase,
    countable,
    ranks,
    probed: explosions,
    requiredByDay,
    supply: cumulativeSupply,
    exploder,
    judged,
    built,
    atRiskIndex,
    atRiskUnit: atRiskUnit.done(),
    unitsBuilt,
    records: records.done(),
    unitStart,
    risks,
    queueLacks: { ...keptOf(queueView.keep()), units: explosions, stale: null },
  };
  const run = finish(walked, { firmReceiptQty, loopByPart });
  return { run, walked };
}

/**
 * The parts whose queue view is walked again (1): those whose needs may have changed, whose
 * entries a walk since changed, or whose supply differs from that of the last queue view.
 */
function freshParts(reuse: QueueReuse, rowBase: Int32Array, days: number, supply: Float64Array): Uint8Array {
  const fresh = reuse.touched.slice();
  const { stale } = reuse.last;
  for (let part = 0; part < rowBase.length; part += 1) {
    if (fresh[part] === 1) continue;
    if (stale?.[part] === 1) {
      fresh[part] = 1;
      continue;
    }
    const base = rowBase[part];
    for (let t = 0; t < days; t += 1) {
      if (supply[base + t] !== reuse.supply[base + t]) {
        fresh[part] = 1;
        break;
      }
    }
  }
  return fresh;
}

/**
 * The walk after a change, reusing the last one when only bought parts' supply changed (their
 * on-hand, firm receipts or loops), lines of bought components, or when the first units were built
 * (their parts backflushed); null when it must be walked in full.
 */
function walkAgain(last: Walked, input: LineRiskInput): { run: LineRiskRun; walked: Walked; kind: WalkKind } | null {
  const before = last.input;
  if (
    input.from !== before.from ||
    input.to !== before.to ||
    input.calendar !== before.calendar ||
    input.parts.length !== before.parts.length
  ) {
    return null;
  }
  // One kind of change at a time beside stock: units built, or the BOM.
  const base =
    input.sequence === before.sequence ? last : input.bom === before.bom && withoutBuilt(last, input.sequence);
  if (!base) return null;
  const { rowBase } = base;
  const { parts } = input;
  let onHand = base.onHand;
  for (let part = 0; part < parts.length; part += 1) {
    const now = parts[part];
    const then = before.parts[part];
    if (now !== then && !sameBesideStock(then, now)) return null;
    // An end item's own stock is never drawn on: a unit is a build order.
    if (base.model.source[part] === END_ITEM || now.onHand === onHand[part]) continue;
    if (base.model.source[part] !== BOUGHT || !Number.isFinite(now.onHand)) return null;
    if (onHand === base.onHand) onHand = onHand.slice();
    onHand[part] = now.onHand;
  }
  const bom = input.bom === before.bom ? null : bomChangeOf(base, input);
  if (bom === undefined) return null;
  const model = bom?.model ?? base.model;
  const days = model.days.length;
  const { cumulativeSupply, firmReceiptQty, receiptsByDay } = firmSupply(input.firmReceipts, model, rowBase, onHand);
  const needs = bom
    ? needAgain(base, bom, cumulativeSupply)
    : { probed: base.probed, requiredByDay: base.requiredByDay };
  if (!needs) return null;
  const loopByPart = loopSupplies(input, model);
  for (const [part, loop] of loopByPart) {
    pullSupply(rowBase[part], loop, model, parts[part].onHand, receiptsByDay, needs.requiredByDay, cumulativeSupply);
  }
  // Made stock decides every unit's explosion: a change there is walked in full.
  const inChanged = new Uint8Array(parts.length);
  let changed = 0;
  for (const part of bom?.parts ?? []) {
    inChanged[part] = 1;
    changed += 1;
  }
  for (let part = 0; part < parts.length; part += 1) {
    const row = rowBase[part];
    for (let t = 0; t < days; t += 1) {
      if (cumulativeSupply[row + t] === base.supply[row + t]) continue;
      if (model.source[part] !== BOUGHT) return null;
      if (inChanged[part] === 0) changed += 1;
      inChanged[part] = 1;
      break;
    }
  }
  let walked: Walked = { ...base, input, onHand, supply: cumulativeSupply, ...needs };
  if (bom) walked = { ...walked, model, exploder: bom.exploder };
  if (changed > 0) {
    const replayed = replayParts(walked, inChanged, bom?.explodeAgain ?? null);
    if (!replayed) return null;
    walked = { ...walked, ...replayed, queueLacks: withStale(walked.queueLacks, inChanged) };
  }
  const run = finish(walked, { firmReceiptQty, loopByPart });
  const kind = base !== last ? 'built' : bom ? 'bom' : changed > 0 ? 'parts' : 'kept';
  return { run, walked, kind };
}

/** The queue view's entries with the parts marked in `changed` no longer to be kept. */
function withStale(lacks: QueueLacks | null, changed: Uint8Array): QueueLacks | null {
  if (!lacks) return null;
  const stale = lacks.stale ? lacks.stale.slice() : new Uint8Array(changed.length);
  for (let part = 0; part < changed.length; part += 1) if (changed[part] === 1) stale[part] = 1;
  return { ...lacks, stale };
}

/**
 * The last walk as if it had started after units built since: the first units of its order, each
 * built in the walk on the first day, so what they committed is now gone from on-hand (the
 * backflush took it) and the rest of the walk stands as it was. False when the sequence changed
 * otherwise or a unit built was not one of those.
 */
function withoutBuilt(last: Walked, sequence: SequenceSlot[]): Walked | false {
  const ordered = orderSlots(sequence, last.model);
  const gone = last.ordered.length - ordered.length;
  if (gone <= 0) return false;
  for (let position = 0; position < ordered.length; position += 1) {
    if (!sameSlot(ordered[position], last.ordered[position + gone])) return false;
  }
  const { rowBase, model, probed } = last;
  const days = model.days.length;
  const supply = last.supply.slice();
  const onHand = last.onHand.slice();
  const commit = (part: number, bucket: number, qty: number): boolean => {
    if (bucket !== 0) return false;
    const row = rowBase[part];
    for (let t = 0; t < days; t += 1) supply[row + t] = roundQty(supply[row + t] - qty);
    onHand[part] = roundQty(onHand[part] - qty);
    return true;
  };
  for (let position = 0; position < gone; position += 1) {
    if (last.built[position] !== 1) return false;
    const { needCount, needPart, needBucket, needQty, takeCount, takePart, takeBucket, takeQty } =
      last.judged[position];
    for (let need = 0; need < needCount; need += 1) {
      if (!commit(needPart[need], needBucket[need], needQty[need])) return false;
    }
    for (let take = 0; take < takeCount; take += 1) {
      if (!commit(takePart[take], takeBucket[take], takeQty[take])) return false;
    }
  }
  const requiredByDay = requiredWithout(last, gone);
  // Units built with every unit ahead of them built too lacked nothing, now or behind others (the
  // two views agree until a unit is at risk): they left no records, so the records and each part's
  // first slot keep their places, and each rescue was found against the same stock as now.
  const first = last.unitStart[gone];
  if (first !== 0) return false;
  const old = last.records;
  return {
    ...last,
    input: { ...last.input, sequence },
    onHand,
    supply,
    requiredByDay,
    ordered,
    probed: probed.slice(gone),
    judged: last.judged.slice(gone),
    built: last.built.slice(gone),
    // Units built are not at risk: the others keep their index among those at risk.
    atRiskIndex: last.atRiskIndex.slice(gone),
    atRiskUnit: last.atRiskUnit.map((position) => position - gone),
    unitsBuilt: last.unitsBuilt - gone,
    records: { ...old, unit: old.unit.map((position) => position - gone) },
    unitStart: last.unitStart.subarray(gone),
    // The same holds in the queue view: the units built took their needs there too, and left no
    // entries; the others keep theirs.
    queueLacks: last.queueLacks && {
      ...last.queueLacks,
      start: last.queueLacks.start.subarray(gone),
      units: last.queueLacks.units.slice(gone),
    },
  };
}

/**
 * What every unit needs per part and day without the first `gone` units: the rows of the parts
 * they needed summed again over the others, in the full walk's order.
 */
function requiredWithout(last: Walked, gone: number): Float64Array {
  const { rowBase, probed } = last;
  const days = last.model.days.length;
  const needed = new Uint8Array(rowBase.length);
  const requiredByDay = last.requiredByDay.slice();
  for (let position = 0; position < gone; position += 1) {
    const explosion = probed[position];
    for (let need = 0; need < explosion.needCount; need += 1) {
      const part = explosion.needPart[need];
      if (needed[part] === 1) continue;
      needed[part] = 1;
      requiredByDay.fill(0, rowBase[part], rowBase[part] + days);
    }
  }
  for (let position = gone; position < probed.length; position += 1) {
    const { needCount, needPart, needBucket, needQty } = probed[position];
    for (let need = 0; need < needCount; need += 1) {
      const part = needPart[need];
      if (needed[part] === 1) requiredByDay[rowBase[part] + needBucket[need]] += needQty[need];
    }
  }
  return requiredByDay;
}

/**
 * Every unit judged again (the build and queue views walked from the start) against the input's
 * stock, with the explosions of the last walk wherever they still hold: made stock goes to the
 * units first come, first served, so each unit's last explosion is tried against made stock as it
 * stands at the unit's turn, and the unit is exploded again only when a free quantity it read is
 * out of its bounds, or its model's explosion passes a BOM line that changed or a made part whose
 * lead time moved. For a change that leaves the horizon, each part's source and the working days
 * the walk reads as they were: units built, moved, added or removed, made stock counted, BOM lines
 * changed, lead times, units, replenishment and suppliers edited, holidays set outside the days the
 * walk reads, a verdict changed by stock. Null for any other change (the walk is then done in full).
 */
function judgeAgain(
  last: Walked,
  input: LineRiskInput,
  helper: QueueHelper | null = null,
): { run: LineRiskRun; walked: Walked; kind: 'judged' } | null {
  const before = last.input;
  const { parts } = input;
  if (input.from !== before.from || input.to !== before.to || parts.length !== before.parts.length) return null;
  // Part master edits the walk survives: anything but a part's source. A made part's lead time
  // moves the start of what it is made from.
  let partsEdited = false;
  const leadTimeMoved: number[] = [];
  for (let part = 0; part < parts.length; part += 1) {
    const now = parts[part];
    const then = before.parts[part];
    if (now === then || sameBesideStock(then, now)) continue;
    if (!sameForTheWalk(then, now)) return null;
    partsEdited = true;
    if (now.leadTimeDays !== then.leadTimeDays && last.model.source[part] !== BOUGHT) leadTimeMoved.push(part);
  }
  // After a BOM change or a lead time moved, the units of the models whose explosion passes a
  // changed line or that part are exploded anew.
  let model: PlanModel | null;
  let exploder = last.exploder;
  let explodeAgain: Uint8Array | null = null;
  const calendarEdited = input.calendar !== before.calendar;
  if (input.bom === before.bom && !partsEdited && !calendarEdited) model = withStock(last.model, parts);
  else {
    model =
      calendarEdited && input.bom === before.bom && !partsEdited ? recalendared(last.model, input) : structureOf(input);
    if (!model) return null;
    if (calendarEdited && !sameWorkingDays(last.model, model)) return null;
    exploder = new Exploder(model);
    const changedParents = input.bom === before.bom ? [] : bomDifference(last.model, model).changedParents;
    explodeAgain = reaching([...changedParents, ...leadTimeMoved], model);
  }
  if (!model) return null;
  const ordered = orderSlots(input.sequence, model);
  const { rowBase } = last;
  const days = model.days.length;
  const supply = firmSupply(input.firmReceipts, model, rowBase, model.onHand);
  const lastAt = new Map<string, number>();
  last.ordered.forEach((entry, position) => lastAt.set(entry.slot.serial, position));
  const probe = madeStockLedger(model, supply.cumulativeSupply, rowBase);
  const explosions = new ExplosionCache(exploder, probe, false);
  // Parts whose need per day may have changed: those of units gone, added, exploded again or out of
  // their last order. The others' rows are summed from the same units in the same order as before.
  const touched = new Uint8Array(parts.length);
  const touch = ({ needCount, needPart }: Explosion) => {
    for (let need = 0; need < needCount; need += 1) touched[needPart[need]] = 1;
  };
  const keptInOrder = new Uint8Array(last.ordered.length);
  let lastKept = -1;
  const probed = ordered.map((entry) => {
    const at = lastAt.get(entry.slot.serial);
    const kept = at === undefined ? undefined : last.probed[at];
    const explosion =
      kept && explodeAgain?.[entry.model] !== 1 && sameNeeds(last.ordered[at!], entry) && holdsAgainst(kept, probe)
        ? kept
        : explosions.get(entry.model, entry.slot.qty, entry.bucket);
    if (explosion === kept && at! > lastKept) {
      keptInOrder[at!] = 1;
      lastKept = at!;
    } else touch(explosion);
    const { takePart, takeBucket, takeQty } = explosion;
    for (let take = 0; take < explosion.takeCount; take += 1)
      probe.commit(takePart[take], takeBucket[take], takeQty[take]);
    return explosion;
  });
  last.probed.forEach((explosion, position) => keptInOrder[position] === 0 && touch(explosion));
  const requiredByDay = last.requiredByDay.slice();
  for (let part = 0; part < parts.length; part += 1) {
    if (touched[part] === 1) requiredByDay.fill(0, rowBase[part], rowBase[part] + days);
  }
  for (const { needCount, needPart, needBucket, needQty } of probed) {
    for (let need = 0; need < needCount; need += 1) {
      const part = needPart[need];
      if (touched[part] === 1) requiredByDay[rowBase[part] + needBucket[need]] += needQty[need];
    }
  }
  const needs: UnitNeeds = { model, ordered, rowBase, exploder, probed, requiredByDay };
  const reuse: QueueReuse | null = last.queueLacks && {
    last: last.queueLacks,
    supply: last.supply,
    lastPosition: Int32Array.from(ordered, (entry) => lastAt.get(entry.slot.serial) ?? -1),
    touched,
  };
  return { ...judgeUnits(input, needs, supply, reuse, helper, fromLast(last)), kind: 'judged' };
}

/** Two units exploded alike: the same model and quantity, on the same day. */
function sameNeeds(a: OrderedSlot, b: OrderedSlot): boolean {
  return a.model === b.model && a.bucket === b.bucket && a.slot.qty === b.slot.qty;
}

/** `model` with the on-hand of `parts`, as buildPlanModel makes it; null when an on-hand is not a number. */
function withStock(model: PlanModel, parts: readonly LineRiskPart[]): PlanModel | null {
  const onHand = new Float64Array(parts.length);
  for (let part = 0; part < parts.length; part += 1) {
    if (!Number.isFinite(parts[part].onHand)) return null;
    if (model.source[part] !== END_ITEM) onHand[part] = parts[part].onHand;
  }
  return { ...model, onHand };
}

function sameSlot(a: OrderedSlot, b: OrderedSlot): boolean {
  return (
    a.model === b.model &&
    a.bucket === b.bucket &&
    a.slot.date === b.slot.date &&
    a.slot.sequence === b.slot.sequence &&
    a.slot.serial === b.slot.serial &&
    a.slot.qty === b.slot.qty
  );
}

/** A change to the BOM that the walker can walk again part by part. */
interface BomChange {
  model: PlanModel;
  exploder: Exploder;
  /** Bought parts on lines that changed (before or after). */
  parts: number[];
  /** Per part: 1 when exploding it passes a changed line, so units of it (a model) are exploded again. */
  explodeAgain: Uint8Array;
}

/**
 * The BOM change from the last walk's lines to the input's, parent by parent, line by line in
 * order; undefined when a changed line has a made component (made stock is taken in turn, and the
 * walk is done in full), null when no line the walk reads changed (the scrap allowance is for
 * ordering, not building).
 */
function bomChangeOf(last: Walked, input: LineRiskInput): BomChange | null | undefined {
  const model = structureOf(input);
  const { changedParents, components } = bomDifference(last.model, model);
  if (components.some((component) => model.source[component] !== BOUGHT)) return undefined;
  if (changedParents.length === 0) return null;
  // Only bought components changed, so the made structure above them is the same in both.
  return { model, exploder: new Exploder(model), parts: components, explodeAgain: reaching(changedParents, model) };
}

/**
 * How the BOM of `model` differs from that of `old` (the same parts), parent by parent, line by
 * line in order: the parents whose lines changed, and the components on changed lines (before or
 * after).
 */
function bomDifference(old: PlanModel, model: PlanModel): { changedParents: number[]; components: number[] } {
  const partCount = old.source.length;
  const inComponents = new Uint8Array(partCount);
  const components: number[] = [];
  const changedParents: number[] = [];
  const sameLine = (a: number, b: number) =>
    old.lineComponent[a] === model.lineComponent[b] &&
    old.lineQtyPer[a] === model.lineQtyPer[b] &&
    old.lineFrom[a] === model.lineFrom[b] &&
    old.lineTo[a] === model.lineTo[b];
  const addComponent = (component: number) => {
    if (inComponents[component] === 0) components.push(component);
    inComponents[component] = 1;
  };
  for (let parent = 0; parent < partCount; parent += 1) {
    const oldFirst = old.lineStart[parent];
    const oldCount = old.lineStart[parent + 1] - oldFirst;
    const newFirst = model.lineStart[parent];
    const newCount = model.lineStart[parent + 1] - newFirst;
    let changed = false;
    // Line by line in order: the order of a parent's lines is the order its components are met.
    for (let at = 0; at < Math.max(oldCount, newCount); at += 1) {
      if (at < oldCount && at < newCount && sameLine(oldFirst + at, newFirst + at)) continue;
      changed = true;
      if (at < oldCount) addComponent(old.lineComponent[oldFirst + at]);
      if (at < newCount) addComponent(model.lineComponent[newFirst + at]);
    }
    if (changed) changedParents.push(parent);
  }
  return { changedParents, components };
}

/**
 * Per part: 1 when exploding it passes one of `parents` (the parents whose lines changed): the
 * parents themselves and every part above them through made parts. The structure of the new
 * model is enough: on the way down from a part to a changed parent, the first changed parent met
 * lies under lines that stood.
 */
function reaching(parents: readonly number[], model: PlanModel): Uint8Array {
  const partCount = model.source.length;
  const parentsOf: number[][] = Array.from({ length: partCount }, () => []);
  for (let parent = 0; parent < partCount; parent += 1) {
    for (let line = model.lineStart[parent]; line < model.lineStart[parent + 1]; line += 1) {
      if (model.source[model.lineComponent[line]] !== BOUGHT) parentsOf[model.lineComponent[line]].push(parent);
    }
  }
  const reached = new Uint8Array(partCount);
  const stack = [...parents];
  for (const parent of stack) reached[parent] = 1;
  while (stack.length > 0) {
    for (const parent of parentsOf[stack.pop()!]) {
      if (reached[parent] === 1) continue;
      reached[parent] = 1;
      stack.push(parent);
    }
  }
  return reached;
}

/**
 * Each unit's needs after a BOM change (the probe walk again): units of the models it reaches are
 * exploded again, the others keep theirs; the changed parts' need per day summed again in the
 * full walk's order. Null when a unit would take other made stock than before.
 */
function needAgain(
  last: Walked,
  bom: BomChange,
  cumulativeSupply: Float64Array,
): Pick<Walked, 'probed' | 'requiredByDay'> | null {
  const { ordered, rowBase } = last;
  const days = bom.model.days.length;
  const probe = madeStockLedger(bom.model, cumulativeSupply, rowBase);
  const explosions = new ExplosionCache(bom.exploder, probe, false);
  const probed = last.probed.slice();
  const inParts = new Uint8Array(rowBase.length);
  const requiredByDay = last.requiredByDay.slice();
  for (const part of bom.parts) {
    inParts[part] = 1;
    requiredByDay.fill(0, rowBase[part], rowBase[part] + days);
  }
  for (let position = 0; position < ordered.length; position += 1) {
    const entry = ordered[position];
    let explosion = last.probed[position];
    if (bom.explodeAgain[entry.model] === 1) {
      explosion = explosions.get(entry.model, entry.slot.qty, entry.bucket);
      if (!sameTakes(explosion, last.probed[position])) return null;
      probed[position] = explosion;
    }
    const { needPart, needBucket, needQty, takePart, takeBucket, takeQty } = explosion;
    for (let take = 0; take < explosion.takeCount; take += 1)
      probe.commit(takePart[take], takeBucket[take], takeQty[take]);
    for (let need = 0; need < explosion.needCount; need += 1) {
      const part = needPart[need];
      if (inParts[part] === 1) requiredByDay[rowBase[part] + needBucket[need]] += needQty[need];
    }
  }
  return { probed, requiredByDay };
}

function sameTakes(a: Explosion, b: Explosion): boolean {
  if (a.takeCount !== b.takeCount) return false;
  for (let take = 0; take < a.takeCount; take += 1) {
    if (a.takePart[take] !== b.takePart[take] || a.takeBucket[take] !== b.takeBucket[take]) return false;
    if (a.takeQty[take] !== b.takeQty[take]) return false;
  }
  return true;
}

/**
 * Two versions of a part a judged walk can take one for the other: the same fields, number and
 * source. Its unit and replenishment are read afresh at every judging (whether a lack is whole, the
 * loop's supply), its lead time where the units that pass it are exploded anew.
 */
function sameForTheWalk(before: LineRiskPart, after: LineRiskPart): boolean {
  const keys = Object.keys(after) as (keyof LineRiskPart)[];
  if (Object.keys(before).length !== keys.length || !keys.every((key) => Object.hasOwn(before, key))) return false;
  return before.partNumber === after.partNumber && before.source === after.source;
}

/**
 * Two calendars alike on every working day a walk reads: the horizon's (its buckets) and those
 * before it that a subassembly's start can reach (BOM effectivity is checked on them). A holiday
 * set weeks past the horizon, the usual calendar edit, changes none of them.
 */
function sameWorkingDays(before: PlanModel, after: PlanModel): boolean {
  const { dayNumbers } = after;
  if (before.dayNumbers.length !== dayNumbers.length) return false;
  for (let bucket = 0; bucket < dayNumbers.length; bucket += 1) {
    if (before.dayNumbers[bucket] !== dayNumbers[bucket]) return false;
  }
  const reach = Math.max(deepestStart(before), deepestStart(after));
  for (let count = 1; count <= reach; count += 1) {
    if (before.workingDayBeforeStart(count) !== after.workingDayBeforeStart(count)) return false;
  }
  return true;
}

/**
 * How many working days before its unit's day a subassembly can start, at most: the longest sum of
 * made parts' lead times down the BOM (an explosion steps back one lead time per made level).
 */
function deepestStart(model: PlanModel): number {
  const { levelOrder, lineStart, lineComponent, source, leadTimeDays } = model;
  const reach = new Int32Array(source.length);
  let deepest = 0;
  // Parents come before their components in levelOrder: each part's reach is final when met.
  for (const parent of levelOrder) {
    if (source[parent] === BOUGHT) continue;
    for (let line = lineStart[parent]; line < lineStart[parent + 1]; line += 1) {
      const component = lineComponent[line];
      if (source[component] === BOUGHT) continue;
      const start = reach[parent] + Math.max(0, leadTimeDays[component]);
      if (start > reach[component]) reach[component] = start;
      if (start > deepest) deepest = start;
    }
  }
  return deepest;
}

/** Two versions of a part alike but for its stock (on-hand, whether a count is due). */
function sameBesideStock(before: LineRiskPart, after: LineRiskPart): boolean {
  const keys = Object.keys(after) as (keyof LineRiskPart)[];
  // The same fields (an absent uom means pieces), then equal values beside stock.
  if (Object.keys(before).length !== keys.length || !keys.every((key) => Object.hasOwn(before, key))) return false;
  return keys.every((key) => key === 'onHand' || key === 'countDue' || before[key] === after[key]);
}

/**
 * The queue and build views of the changed parts walked again, every unit keeping its verdict, and
 * the records made again with theirs; each resequence search made again at its unit's turn; units
 * of the models marked in `explodeAgain` exploded again against the build ledger at their turn.
 * Null when a changed part would change a verdict.
 */
function replayParts(
  walked: Walked,
  inChanged: Uint8Array,
  explodeAgain: Uint8Array | null,
): Pick<Walked, 'records' | 'unitStart' | 'risks' | 'judged'> | null {
  const { model, rowBase, ordered, probed, built, countable, supply } = walked;
  const { rankOf } = walked.ranks;
  const old = walked.records;
  const days = model.days.length;
  // The queue view is per part: the rows of the changed parts that may run short alone. The build
  // ledger holds every row: resequence searches read every part.
  const queued = mayRunShort(rowBase, days, walked.requiredByDay, supply, inChanged);
  const queue = new StockLedger(days, supply, rowBase, queued);
  const build = new StockLedger(days, supply, rowBase);
  const partCount = model.source.length;
  // The build view's explosions apart from the needs (see judgeUnits).
  const builder = new Exploder(model);
  const againstBuild = new ExplosionCache(builder, build, true);
  const risks = new Risks(partCount, resequenceFinder(ordered, againstBuild, partCount));
  const judged = explodeAgain ? walked.judged.slice() : walked.judged;
  const records = new LackRecordWriter(old.count + 1024);
  const unitStart = new Int32Array(ordered.length + 1);
  const behindGroup: number[] = [];
  const behindQty: number[] = [];
  const groupOf = new Int32Array(model.source.length);
  for (let position = 0; position < ordered.length; position += 1) {
    unitStart[position] = records.count;
    const mine = probed[position];
    const groups = walked.exploder.needGroups(mine, rowBase);
    behindGroup.length = 0;
    behindQty.length = 0;
    for (let group = 0; group < groups.count; group += 1) {
      if (queued[groups.part[group]] !== 1) continue;
      const lack = queueLack(queue, groups, group, mine);
      if (lack === 0) continue;
      behindGroup.push(group);
      behindQty.push(roundQty(lack));
    }
    const entry = ordered[position];
    if (explodeAgain?.[entry.model] === 1)
      judged[position] = againstBuild.get(entry.model, entry.slot.qty, entry.bucket);
    const explosion = judged[position];
    const lacks = builder.lacksOf(build, explosion, inChanged);
    const oldFirst = walked.unitStart[position];
    const oldEnd = walked.unitStart[position + 1];
    if (built[position] === 1) {
      if (lacks.count > 0) return null;
      for (let need = 0; need < explosion.needCount; need += 1) {
        build.commit(explosion.needPart[need], explosion.needBucket[need], explosion.needQty[need]);
      }
      for (let take = 0; take < explosion.takeCount; take += 1) {
        build.commit(explosion.takePart[take], explosion.takeBucket[take], explosion.takeQty[take]);
      }
    } else {
      let lacking = lacks.count;
      for (let record = oldFirst; record < oldEnd && lacking === 0; record += 1) {
        if (old.now[record] === 1 && inChanged[old.part[record]] !== 1) lacking += 1;
      }
      if (lacking === 0) return null;
    }
    let touched = behindGroup.length > 0 || lacks.count > 0;
    for (let record = oldFirst; record < oldEnd && !touched; record += 1) touched = inChanged[old.part[record]] === 1;
    if (!touched) {
      const first = records.count;
      records.copy(old, oldFirst, oldEnd);
      for (let record = oldFirst; record < oldEnd; record += 1) {
        risks.note(old.part[record], first + record - oldFirst, position, walked.atRiskIndex[position]);
      }
      continue;
    }
    // The unit's records in the walk's order: a built unit's by its need groups; a unit at risk's
    // those it lacks now, then those it lacks behind, each by part number.
    const atRisk = built[position] === 0;
    for (let group = 0; group < groups.count; group += 1) groupOf[groups.part[group]] = group;
    const partCount = model.source.length;
    const keyOf = (part: number, now: number) => (atRisk ? (1 - now) * partCount + rankOf[part] : groupOf[part]);
    const entries: { key: number; part: number; qty: number; now: number; via: number; bucket: number }[] = [];
    for (let record = oldFirst; record < oldEnd; record += 1) {
      const part = old.part[record];
      if (inChanged[part] === 1) continue;
      const now = old.now[record];
      entries.push({
        key: keyOf(part, now),
        part,
        qty: old.qty[record],
        now,
        via: old.via[record],
        bucket: old.bucket[record],
      });
    }
    const lacksNow = new Set<number>();
    for (let lack = 0; lack < lacks.count; lack += 1) {
      const part = lacks.part[lack];
      lacksNow.add(part);
      const qty = wholeIfCountable(countable, part, lacks.qty[lack]);
      entries.push({ key: keyOf(part, 1), part, qty, now: 1, via: lacks.via[lack], bucket: lacks.bucket[lack] });
    }
    behindGroup.forEach((group, index) => {
      const part = groups.part[group];
      if (lacksNow.has(part)) return;
      const need = groups.needs[groups.start[group]];
      const qty = wholeIfCountable(countable, part, behindQty[index]);
      entries.push({ key: keyOf(part, 0), part, qty, now: 0, via: mine.needVia[need], bucket: mine.needBucket[need] });
    });
    entries.sort((a, b) => a.key - b.key);
    for (const entry of entries) {
      const record = records.push(position, entry.part, entry.qty, entry.now, entry.via, entry.bucket);
      risks.note(entry.part, record, position, walked.atRiskIndex[position]);
    }
  }
  unitStart[ordered.length] = records.count;
  return { records: records.done(), unitStart, risks, judged };
}

/** The short parts' figures, and the run. */
function finish(
  walked: Walked,
  found: { firmReceiptQty: Float64Array; loopByPart: Map<number, LoopSupply> },
): LineRiskRun {
  const { input, model, ordered, records, rowBase, requiredByDay, supply, countable, unitStart } = walked;
  const { parts } = input;
  const { calendar, dayNumbers } = model;
  const days = model.days.length;
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

  // Need-by entries in walk order, gathered by part in display order once the parts are sorted.
  const needBy = { bucket: intColumn(), qty: floatColumn() };
  const shortages: { figures: ShortPartFigures; part: number; needByAt: number; needByEnd: number }[] = [];
  const { risks } = walked;
  for (const part of risks.order) {
    const risk = risks.byPart[part]!;
    const firstSlot = ordered[records.unit[risk.firstRecord]].slot;
    const needByAt = needBy.bucket.length;
    const firstShort = needSchedule(
      rowBase[part],
      days,
      requiredByDay,
      supply,
      (qty) => wholeIfCountable(countable, part, qty),
      needBy,
    );
    const first =
      firstShort >= 0
        ? firstShort
        : Math.max(0, model.bucketOf(requireDate(model.dayNumberOf(firstSlot.date), firstSlot.date, 'Slot')));
    if (needBy.bucket.length === needByAt) {
      needBy.bucket.push(first);
      needBy.qty.push(records.qty[risk.firstRecord]);
    }
    const shortPart = parts[part];
    const firstShortDay = dayNumbers[first];
    let needed = 0;
    for (let entry = needByAt; entry < needBy.qty.length; entry += 1) needed += needBy.qty.values[entry];
    const shortQty = roundQty(needed);
    const leadTimeDays = shortPart.leadTimeDays;
    const loop = found.loopByPart.get(part);
    // Released today, it arrives lead time later: in time for a shortage from that day on, which
    // is then a release to send by the last day that still makes it (today at the latest).
    const action: ShortageAction = loop
      ? 'loop'
      : shortPart.countDue || shortPart.onHand < 0
        ? 'count'
        : firstShortDay < leadTimeArrival(todayDay, leadTimeDays, calendar)
          ? 'expedite'
          : 'release';
    const figures: ShortPartFigures = {
      partNumber: shortPart.partNumber,
      supplierCode: shortPart.supplierCode ?? null,
      action,
      firstShortDate: model.days[first],
      shortQty,
      releaseBy: action === 'release' ? fromDayNumber(calendar.addWorking(firstShortDay, -leadTimeDays)) : null,
      leadTimeDays,
      onHand: shortPart.onHand,
      firmReceiptQty: roundQty(found.firmReceiptQty[part]),
      daysUntilImpact: workingDaysAfterToday(firstShortDay),
      inFrozenWindow: frozenEnd !== null && firstShortDay <= frozenEnd,
      loop: loop ? { activeCards: loop.activeCards, recommendedCards: loop.recommendedCards } : null,
      resequence: risk.resequence,
    };
    shortages.push({ figures, part, needByAt, needByEnd: needBy.bucket.length });
  }
  shortages.sort(
    ({ figures: a }, { figures: b }) =>
      SHORTAGE_ACTIONS.indexOf(a.action) - SHORTAGE_ACTIONS.indexOf(b.action) ||
      compareText(a.firstShortDate, b.firstShortDate) ||
      compareText(a.partNumber, b.partNumber),
  );

  const shortRequired = new Float64Array(shortages.length * days);
  shortages.forEach(({ part }, index) =>
    shortRequired.set(requiredByDay.subarray(rowBase[part], rowBase[part] + days), index * days),
  );
  const needByStart = new Int32Array(shortages.length + 1);
  shortages.forEach(({ needByAt, needByEnd }, index) => {
    needByStart[index + 1] = needByStart[index] + needByEnd - needByAt;
  });
  const needByBucket = new Int32Array(needByStart[shortages.length]);
  const needByQty = new Float64Array(needByStart[shortages.length]);
  shortages.forEach(({ needByAt, needByEnd }, index) => {
    needByBucket.set(needBy.bucket.values.subarray(needByAt, needByEnd), needByStart[index]);
    needByQty.set(needBy.qty.values.subarray(needByAt, needByEnd), needByStart[index]);
  });
  const { atRiskUnit } = walked;
  return new LineRiskRun({
    header: {
      from: input.from,
      to: input.to,
      days: model.days,
      today,
      frozenWindowDays,
      frozenUntil: frozenEnd === null ? null : fromDayNumber(frozenEnd),
      unitsInHorizon: ordered.length,
      unitsBuilt: walked.unitsBuilt,
    },
    units: ordered.map((entry) => entry.slot),
    partNumbers: parts.map((part) => part.partNumber),
    records,
    atRiskUnit,
    atRiskFirst: atRiskUnit.map((position) => unitStart[position]),
    atRiskCount: atRiskUnit.map((position) => unitStart[position + 1] - unitStart[position]),
    resequence: risks.resequence,
    shortages: shortages.map((shortage) => shortage.figures),
    shortParts: Int32Array.from(shortages.map((shortage) => shortage.part)),
    requiredByDay: shortRequired,
    needBy: { start: needByStart, bucket: needByBucket, qty: needByQty },
  });
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

/**
 * Where each part's row starts in the tables by part and working day (supply, need, ledgers):
 * parts in the order a walk through the sequence's models and their BOMs first meets them, so the
 * rows one unit touches lie together in memory rather than scattered over the whole part list.
 */
function rowsByUse(model: PlanModel, ordered: readonly OrderedSlot[]): Int32Array {
  const { lineStart, lineComponent } = model;
  const days = model.days.length;
  const row = new Int32Array(model.source.length).fill(-1);
  let next = 0;
  const visit = (parent: number): void => {
    for (let line = lineStart[parent]; line < lineStart[parent + 1]; line += 1) {
      const component = lineComponent[line];
      if (row[component] !== -1) continue;
      row[component] = next++;
      visit(component);
    }
  };
  for (const { model: unitModel } of ordered) {
    if (row[unitModel] !== -1) continue;
    row[unitModel] = next++;
    visit(unitModel);
  }
  return row.map((index) => (index === -1 ? next++ : index) * days);
}

/** A ledger of the rows of made parts (and models) alone: all the probe walk reads and commits. */
function madeStockLedger(model: PlanModel, cumulativeSupply: Float64Array, rowBase: Int32Array): StockLedger {
  const days = model.days.length;
  const madeRowBase = new Int32Array(rowBase.length);
  let rows = 0;
  for (let part = 0; part < rowBase.length; part += 1) if (model.source[part] !== BOUGHT) rows += 1;
  const supply = new Float64Array(rows * days);
  let row = 0;
  for (let part = 0; part < rowBase.length; part += 1) {
    if (model.source[part] === BOUGHT) continue;
    madeRowBase[part] = row * days;
    supply.set(cumulativeSupply.subarray(rowBase[part], rowBase[part] + days), row * days);
    row += 1;
  }
  return new StockLedger(days, supply, madeRowBase);
}

/** On-hand plus firm receipts by day, cumulated per part (late receipts count on the first day). */
function firmSupply(
  receipts: readonly ScheduledReceipt[],
  model: PlanModel,
  rowBase: Int32Array,
  onHand: Float64Array,
) {
  const days = model.days.length;
  const partCount = rowBase.length;
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
    receiptsByDay[rowBase[part] + bucket] += receipt.qty;
    firmReceiptQty[part] += receipt.qty;
  });
  const cumulativeSupply = new Float64Array(partCount * days);
  for (let part = 0; part < partCount; part += 1) {
    const base = rowBase[part];
    let cumulative = model.source[part] === END_ITEM ? 0 : onHand[part];
    for (let t = 0; t < days; t += 1) {
      cumulative += receiptsByDay[base + t];
      cumulativeSupply[base + t] = roundQty(cumulative);
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
  base: number,
  loop: LoopSupply,
  model: PlanModel,
  onHand: number,
  receiptsByDay: Float64Array,
  requiredByDay: Float64Array,
  cumulativeSupply: Float64Array,
): void {
  const days = model.days.length;
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
 * A part's projection against every unit's need: the first day it is short (returned, or -1) and
 * how much must have arrived by each day to keep every unit building (the running worst shortfall,
 * as increments), pushed to `needBy`.
 */
function needSchedule(
  base: number,
  days: number,
  requiredByDay: Float64Array,
  cumulativeSupply: Float64Array,
  round: (qty: number) => number,
  needBy: { bucket: TypedColumn<Int32Array>; qty: TypedColumn<Float64Array> },
): number {
  let required = 0;
  let covered = 0;
  let firstShort = -1;
  for (let t = 0; t < days; t += 1) {
    required += requiredByDay[base + t];
    const shortfall = round(required - cumulativeSupply[base + t]);
    if (shortfall > covered + epsilon) {
      if (firstShort < 0) firstShort = t;
      needBy.bucket.push(t);
      needBy.qty.push(roundQty(shortfall - covered));
      covered = shortfall;
    }
  }
  return firstShort;
}
