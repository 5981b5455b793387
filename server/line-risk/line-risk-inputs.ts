import { isDeepStrictEqual } from 'node:util';
import type { EntityManager } from 'typeorm';
import type { LineRiskPart, LoopSupply } from '../../shared/domain/line-risk';
import type { PlanningBomLine, ScheduledReceipt, SequenceSlot } from '../../shared/domain/types';
import type { Calendar } from '../../shared/schemas/master-data';
import type { KanbanLoop } from '../../shared/schemas/loops';
import { readCalendar } from '../calendar/calendar.service';
import { BOM_LIST, EXPECTED_ARRIVAL, UNITS_TO_BUILD_LIST } from '../planning/plan-inputs';
import type { PlanningPiece } from '../settings/versions';
import { runSql } from '../db/sql';
import { readRows, readRowsAgain, type RevisedList, type RowsMark } from '../db/revised-rows';
import { COUNTED_AT_SQL, countDueTest, type CountedPart } from '../stock/stock.service';

/**
 * Release states whose open lines the line risk counts on: the supplier has confirmed them (or
 * shipped). Drafts, sent-but-unanswered releases and exceptions are not firm.
 */
export const FIRM_RELEASE_STATES = ['confirmed', 'shipped', 'partial'];

/**
 * An open line of a release sent to the supplier and not yet confirmed: unanswered, or answered
 * with changes the buyer has still to accept. Asked for, not yet supply.
 */
export interface AwaitingLine {
  partNumber: string;
  releaseNumber: string;
  qty: number;
}

/** Part facts the screen shows beside the figures (the engine reads none of them but the unit, which it also has). */
export interface PartDetails {
  description: string;
  uom: string;
  hazardous: boolean;
  supplierName: string | null;
}

export interface LineRiskInputs {
  parts: (LineRiskPart & { uom: string })[];
  bom: PlanningBomLine[];
  sequence: SequenceSlot[];
  firmReceipts: ScheduledReceipt[];
  /** Shown beside a short part; the engine does not count them. */
  awaiting: AwaitingLine[];
  loops: LoopSupply[];
  calendar: Calendar;
  details: Map<string, PartDetails>;
  partsMark: PartsMark;
  /** How far the BOM and the units to build were read (see RowsMark). */
  bomMark: RowsMark;
  sequenceMark: RowsMark;
}

/**
 * How far the parts were read, so a read after a change needs only the parts it touched:
 * - the last part revision: every change to a part's planned columns gives it a new, higher
 *   revision (database triggers keep them; see the planning-revisions migration);
 * - the last stock movement, and when each part was last counted (in the order of `parts`): every
 *   change of on-hand or of a count is a movement (the stock ledger posts them);
 * - the supplier names, which join into the details.
 * Revisions and movement ids follow the order writers commit in: on SQLite one writer commits at a
 * time, and on PostgreSQL every writer of parts or movements also bumps the planning version row,
 * so a writer that took its numbers before another committed is refused and runs again.
 */
export interface PartsMark {
  lastRevision: number;
  lastMovement: number;
  countedAt: (string | null)[];
  /** Part number → its place in `parts`. */
  placeOf: ReadonlyMap<string, number>;
  supplierNames: ReadonlyMap<string, string>;
}

// The plan's part columns, with what the report shows beside them and when each was last counted:
// one pass over the part list rather than one for each.
const PART_COLUMNS = `p.part_number AS "partNumber", p.description AS description, p.uom AS uom, p.source AS source,
  p.supplier_code AS "supplierCode", p.replenishment AS replenishment, p.lead_time_days AS "leadTimeDays",
  p.pack_qty AS "packQty", p.on_hand AS "onHand", p.safety_stock AS "safetyStock", p.hazardous AS hazardous,
  s.name AS "supplierName", ${COUNTED_AT_SQL} AS "countedAt"`;
const PARTS_SQL = `SELECT ${PART_COLUMNS} FROM part p LEFT JOIN supplier s ON s.code = p.supplier_code ORDER BY p.part_number`;
// The same, for the parts revised after a given revision.
const REVISED_SQL = `SELECT ${PART_COLUMNS} FROM part p LEFT JOIN supplier s ON s.code = p.supplier_code WHERE p.revision > ?`;

interface PartRow extends CountedPart {
  partNumber: string;
  description: string;
  uom: string;
  source: LineRiskPart['source'];
  supplierCode: string | null;
  replenishment: LineRiskPart['replenishment'];
  leadTimeDays: number;
  packQty: number;
  onHand: number;
  safetyStock: number;
  hazardous: boolean | number;
  supplierName: string | null;
}

// The same expected arrival as the plan's; only the firm (confirmed or shipped) lines count here.
const FIRM_LINES_SQL = `SELECT l.part_number AS "partNumber", ${EXPECTED_ARRIVAL} AS date,
  COALESCE(l.confirmed_qty, l.qty) - l.received_qty AS qty
  FROM release_line l JOIN release r ON r.id = l.release_id
  WHERE NOT l.closed AND COALESCE(l.confirmed_qty, l.qty) > l.received_qty
  AND r.status IN (${FIRM_RELEASE_STATES.map((state) => `'${state}'`).join(', ')})`;

const AWAITING_LINES_SQL = `SELECT l.part_number AS "partNumber", r.number AS "releaseNumber", l.qty - l.received_qty AS qty
  FROM release_line l JOIN release r ON r.id = l.release_id
  WHERE NOT l.closed AND l.qty > l.received_qty AND r.status IN ('sent', 'exception')
  ORDER BY r.number, l.part_number`;

const MARK_SQL = `SELECT (SELECT COUNT(*) FROM part) AS "partCount",
  (SELECT COALESCE(MAX(p.revision), 0) FROM part p) AS "lastRevision",
  (SELECT COALESCE(MAX(m.id), 0) FROM stock_movement m) AS "lastMovement"`;

// The part columns a change of stock moves, for the parts with a movement after a given one (but
// for those revised after a given revision: read in full).
const MOVED_SQL = `SELECT p.part_number AS "partNumber", p.on_hand AS "onHand", ${COUNTED_AT_SQL} AS "countedAt"
  FROM part p WHERE p.part_number IN (SELECT m.part_number FROM stock_movement m WHERE m.id > ?) AND p.revision <= ?`;

const SUPPLIERS_SQL = `SELECT code, name FROM supplier`;

/** What a read may take from the inputs read before: the pieces whose counters stood since (see PlanningPiece). */
export interface LineRiskReuse {
  before: LineRiskInputs;
  standing: ReadonlySet<PlanningPiece>;
}

/**
 * Reads the parts (with their details and whether each is due a count), the BOM, the units to
 * build, the firm receipts and the lines not yet confirmed, the calendar, and the
 * kanban loops as supply; the caller runs it in one snapshot. With `reuse`, a standing piece is
 * `before`'s (the same object, so what compares the inputs finds it unchanged at once) and only
 * the others are read. The parts are read again from `before`'s: only those revised or with a
 * stock movement since (see PartsMark), keeping every part whose figures stand; so are a BOM and
 * units to build that changed, only their rows revised since (see RowsMark); firm receipts,
 * awaiting lines and loops are read every time. Equal to a read without `reuse` as long as the
 * standing pieces did stand.
 */
export async function loadLineRiskInputs(
  manager: EntityManager,
  loops: readonly KanbanLoop[],
  now = new Date(),
  reuse?: LineRiskReuse,
): Promise<LineRiskInputs> {
  /** `before`'s piece when it stood; undefined when it is to be read. */
  const kept = <P extends 'calendar'>(piece: P): LineRiskInputs[P] | undefined =>
    reuse?.standing.has(piece) ? reuse.before[piece] : undefined;
  /** A list piece: `before`'s when it stood, read again where it changed, or read in full. */
  const listOf = <T>(piece: 'bom' | 'sequence', list: RevisedList<T>, before?: { rows: T[]; mark: RowsMark }) =>
    !before ? readRows(manager, list) : reuse!.standing.has(piece) ? before : readRowsAgain(manager, list, before);
  // The clock and the count interval are read every time: whether a part is due a count moves with them.
  const isCountDue = await countDueTest(manager, now);
  const { parts, details, partsMark } =
    (reuse ? await readChangedParts(manager, reuse, isCountDue) : null) ?? (await readParts(manager, isCountDue));
  const before = reuse?.before;
  const { rows: bom, mark: bomMark } = await listOf(
    'bom',
    BOM_LIST,
    before && { rows: before.bom, mark: before.bomMark },
  );
  const { rows: sequence, mark: sequenceMark } = await listOf(
    'sequence',
    UNITS_TO_BUILD_LIST,
    before && { rows: before.sequence, mark: before.sequenceMark },
  );
  const firmReceipts = await readFirmReceipts(manager);
  const awaiting: AwaitingLine[] = await manager.query(AWAITING_LINES_SQL);
  const calendar = kept('calendar') ?? (await readCalendar(manager));
  return {
    parts,
    bom,
    sequence,
    firmReceipts,
    awaiting,
    loops: loopSupplies(loops),
    calendar,
    details,
    partsMark,
    bomMark,
    sequenceMark,
  };
}

/** Whether a part is due a count, at the time and interval read (see countDueTest). */
type IsCountDue = (part: CountedPart) => boolean;

type PartsRead = Pick<LineRiskInputs, 'parts' | 'details' | 'partsMark'>;

/** Every part, with its details and whether it is due a count. */
async function readParts(manager: EntityManager, isCountDue: IsCountDue): Promise<PartsRead> {
  const { lastRevision, lastMovement } = await readMark(manager);
  const rows: PartRow[] = await manager.query(PARTS_SQL);
  const details = new Map<string, PartDetails>();
  const parts = rows.map((row) => {
    details.set(row.partNumber, detailsOf(row));
    return partOf(row, isCountDue(row));
  });
  const partsMark: PartsMark = {
    lastRevision,
    lastMovement,
    countedAt: rows.map((row) => row.countedAt),
    placeOf: new Map(rows.map((row, place) => [row.partNumber, place])),
    supplierNames: await readSupplierNames(manager),
  };
  return { parts, details, partsMark };
}

function partOf(row: PartRow, countDue: boolean): LineRiskInputs['parts'][number] {
  return {
    partNumber: row.partNumber,
    uom: row.uom,
    source: row.source,
    supplierCode: row.supplierCode,
    replenishment: row.replenishment,
    leadTimeDays: row.leadTimeDays,
    packQty: row.packQty,
    onHand: row.onHand,
    safetyStock: row.safetyStock,
    countDue,
  };
}

function detailsOf(row: PartRow): PartDetails {
  return {
    description: row.description,
    uom: row.uom,
    hazardous: Boolean(row.hazardous),
    supplierName: row.supplierName,
  };
}

async function readMark(manager: EntityManager) {
  const [row] = (await manager.query(MARK_SQL)) as Record<
    'partCount' | 'lastRevision' | 'lastMovement',
    number | string
  >[];
  return {
    partCount: Number(row.partCount),
    lastRevision: Number(row.lastRevision),
    lastMovement: Number(row.lastMovement),
  };
}

async function readSupplierNames(manager: EntityManager): Promise<Map<string, string>> {
  const rows: { code: string; name: string }[] = await manager.query(SUPPLIERS_SQL);
  return new Map(rows.map((row) => [row.code, row.name]));
}

/**
 * The parts of `before` read again where they changed: the parts revised since, on-hand and when
 * each was counted for the parts with a stock movement since (see PartsMark), and whether each part
 * is due a count (that moves with the clock). A part whose figures stand is `before`'s own object,
 * and so are the details while no part's changed. Null when the parts are better read in full: the
 * part list is no longer `before`'s, or a supplier was renamed.
 */
async function readChangedParts(
  manager: EntityManager,
  { before, standing }: LineRiskReuse,
  isCountDue: IsCountDue,
): Promise<PartsRead | null> {
  const mark = before.partsMark;
  const { partCount, lastRevision, lastMovement } = await readMark(manager);
  if (partCount !== before.parts.length || lastRevision < mark.lastRevision || lastMovement < mark.lastMovement) {
    return null;
  }
  // Supplier names join into the details: when one changed, every part of that supplier did.
  const supplierNames = standing.has('parts') ? mark.supplierNames : await readSupplierNames(manager);
  if (supplierNames !== mark.supplierNames && !isDeepStrictEqual(supplierNames, mark.supplierNames)) return null;
  const revised: PartRow[] =
    lastRevision === mark.lastRevision ? [] : await runSql(manager, REVISED_SQL, [mark.lastRevision]);
  const moved: (Pick<PartRow, 'partNumber' | 'onHand'> & Pick<CountedPart, 'countedAt'>)[] =
    lastMovement === mark.lastMovement ? [] : await runSql(manager, MOVED_SQL, [mark.lastMovement, mark.lastRevision]);

  const countedAt = moved.length + revised.length > 0 ? mark.countedAt.slice() : mark.countedAt;
  const onHandOf = new Map<number, number>();
  const revisedAt = new Map<number, PartRow>();
  let details = before.details;
  for (const row of [...revised, ...moved]) {
    const place = mark.placeOf.get(row.partNumber);
    if (place === undefined) return null;
    countedAt[place] = row.countedAt;
    onHandOf.set(place, row.onHand);
  }
  for (const row of revised) {
    const place = mark.placeOf.get(row.partNumber)!;
    revisedAt.set(place, row);
    const rowDetails = detailsOf(row);
    if (!isDeepStrictEqual(rowDetails, details.get(row.partNumber))) {
      if (details === before.details) details = new Map(details);
      (details as Map<string, PartDetails>).set(row.partNumber, rowDetails);
    }
  }
  const parts = new Array<LineRiskInputs['parts'][number]>(before.parts.length);
  for (let place = 0; place < parts.length; place += 1) {
    const part = before.parts[place];
    const countDue = isCountDue({ source: part.source, countedAt: countedAt[place] });
    const row = revisedAt.get(place);
    const onHand = onHandOf.get(place) ?? part.onHand;
    if (row) {
      const read = partOf(row, countDue);
      parts[place] = isDeepStrictEqual(read, part) ? part : read;
    } else {
      parts[place] = onHand === part.onHand && countDue === part.countDue ? part : { ...part, onHand, countDue };
    }
  }
  const changed =
    countedAt !== mark.countedAt || lastMovement !== mark.lastMovement || lastRevision !== mark.lastRevision;
  return { parts, details, partsMark: changed ? { ...mark, lastRevision, lastMovement, countedAt } : mark };
}

const readFirmReceipts = (manager: EntityManager): Promise<ScheduledReceipt[]> => manager.query(FIRM_LINES_SQL);

/** The kanban loops of kanban parts, as the supply the line risk counts on. */
function loopSupplies(loops: readonly KanbanLoop[]): LoopSupply[] {
  return loops
    .filter((loop) => loop.partIsKanban)
    .map((loop) => ({
      partNumber: loop.partNumber,
      activeCards: loop.activeCards,
      recommendedCards: loop.recommendedCards,
      containerQty: loop.containerQty,
      replenishmentDays: loop.replenishmentDays,
      emptyCards: loop.cardStates.empty,
    }));
}
