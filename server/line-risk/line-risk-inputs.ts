import type { EntityManager } from 'typeorm';
import type { LineRiskPart, LoopSupply } from '../../shared/domain/line-risk';
import type { PlanningBomLine, ScheduledReceipt, SequenceSlot } from '../../shared/domain/types';
import type { Calendar } from '../../shared/schemas/master-data';
import type { KanbanLoop } from '../../shared/schemas/loops';
import { readCalendar } from '../calendar/calendar.service';
import { EXPECTED_ARRIVAL, readBomLines, readUnitsToBuild } from '../planning/plan-inputs';
import type { PlanningPiece } from '../settings/versions';
import { runSql } from '../db/sql';
import { COUNTED_AT_SQL, countDueTest, type CountedPart } from '../stock/stock.service';

/**
 * Release states whose open lines the line risk counts on: the supplier has confirmed them (or
 * shipped). Drafts, sent-but-unanswered releases and exceptions are not firm.
 */
export const FIRM_RELEASE_STATES = ['confirmed', 'shipped', 'partial'];

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
  loops: LoopSupply[];
  calendar: Calendar;
  details: Map<string, PartDetails>;
  stock: StockMark;
}

/**
 * How far the parts' stock was read: the last stock movement, and when each part was last counted
 * (in the order of `parts`). Every change of on-hand or of a count is a movement (the stock ledger
 * posts them), so a read after it needs only the parts with a later movement. Movement ids follow
 * the order writers commit in: each writer of movements also bumps the planning version row, so
 * on PostgreSQL a writer that took its ids before another committed is refused and runs again.
 */
export interface StockMark {
  lastMovement: number;
  countedAt: (string | null)[];
  /** Part number → its place in `parts`. */
  placeOf: ReadonlyMap<string, number>;
}

// The plan's part columns, with what the report shows beside them and when each was last counted:
// one pass over the part list rather than one for each.
const PARTS_SQL = `SELECT p.part_number AS "partNumber", p.description AS description, p.uom AS uom, p.source AS source,
  p.supplier_code AS "supplierCode", p.replenishment AS replenishment, p.lead_time_days AS "leadTimeDays",
  p.pack_qty AS "packQty", p.on_hand AS "onHand", p.safety_stock AS "safetyStock", p.hazardous AS hazardous,
  s.name AS "supplierName", ${COUNTED_AT_SQL} AS "countedAt"
  FROM part p LEFT JOIN supplier s ON s.code = p.supplier_code ORDER BY p.part_number`;

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

const STOCK_MARK_SQL = `SELECT (SELECT COUNT(*) FROM part) AS "partCount",
  (SELECT COALESCE(MAX(m.id), 0) FROM stock_movement m) AS "lastMovement"`;

// The part columns a change of stock moves, for the parts with a movement after a given one.
const MOVED_SQL = `SELECT p.part_number AS "partNumber", p.on_hand AS "onHand", ${COUNTED_AT_SQL} AS "countedAt"
  FROM part p WHERE p.part_number IN (SELECT m.part_number FROM stock_movement m WHERE m.id > ?)`;

/** What a read may take from the inputs read before: the pieces whose counters stood since (see PlanningPiece). */
export interface LineRiskReuse {
  before: LineRiskInputs;
  standing: ReadonlySet<PlanningPiece>;
}

/**
 * Reads the parts (with their details and whether each is due a count), the BOM, the units to
 * build, the firm receipts, the calendar, and the kanban loops as supply; the caller runs it in
 * one snapshot. With `reuse`, a standing piece is `before`'s (the same object, so what compares
 * the inputs finds it unchanged at once) and only the others are read. Standing parts still have
 * their stock read again (on-hand, when each was counted), keeping every part whose figures stand;
 * firm receipts and loops are read every time. Equal to a read without `reuse` as long as the
 * standing pieces did stand.
 */
export async function loadLineRiskInputs(
  manager: EntityManager,
  loops: readonly KanbanLoop[],
  now = new Date(),
  reuse?: LineRiskReuse,
): Promise<LineRiskInputs> {
  /** `before`'s piece when it stood; undefined when it is to be read. */
  const kept = <P extends 'bom' | 'sequence' | 'calendar'>(piece: P): LineRiskInputs[P] | undefined =>
    reuse?.standing.has(piece) ? reuse.before[piece] : undefined;
  // The clock and the count interval are read every time: whether a part is due a count moves with them.
  const isCountDue = await countDueTest(manager, now);
  const { parts, details, stock } =
    (reuse?.standing.has('parts') ? await readPartStock(manager, reuse.before, isCountDue) : null) ??
    (await readParts(manager, isCountDue));
  const bom = kept('bom') ?? (await readBomLines(manager));
  const sequence = kept('sequence') ?? (await readUnitsToBuild(manager));
  const firmReceipts = await readFirmReceipts(manager);
  const calendar = kept('calendar') ?? (await readCalendar(manager));
  return { parts, bom, sequence, firmReceipts, loops: loopSupplies(loops), calendar, details, stock };
}

/** Whether a part is due a count, at the time and interval read (see countDueTest). */
type IsCountDue = (part: CountedPart) => boolean;

/** Every part, with its details and whether it is due a count. */
async function readParts(
  manager: EntityManager,
  isCountDue: IsCountDue,
): Promise<Pick<LineRiskInputs, 'parts' | 'details' | 'stock'>> {
  const { lastMovement } = await readStockMark(manager);
  const rows: PartRow[] = await manager.query(PARTS_SQL);
  const details = new Map<string, PartDetails>();
  const parts = rows.map((row) => {
    details.set(row.partNumber, {
      description: row.description,
      uom: row.uom,
      hazardous: Boolean(row.hazardous),
      supplierName: row.supplierName,
    });
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
      countDue: isCountDue(row),
    };
  });
  const stock: StockMark = {
    lastMovement,
    countedAt: rows.map((row) => row.countedAt),
    placeOf: new Map(rows.map((row, place) => [row.partNumber, place])),
  };
  return { parts, details, stock };
}

async function readStockMark(manager: EntityManager): Promise<{ partCount: number; lastMovement: number }> {
  const [row] = (await manager.query(STOCK_MARK_SQL)) as {
    partCount: number | string;
    lastMovement: number | string;
  }[];
  return { partCount: Number(row.partCount), lastMovement: Number(row.lastMovement) };
}

/**
 * The parts of `before` with their stock read again: on-hand and when each was counted for the
 * parts with a movement since (see StockMark), and whether each part is due a count (that moves
 * with the clock). A part whose figures stand is `before`'s own object, and so are the details.
 * Null when `before`'s parts are no longer the part list (the part master changed after all): the
 * caller then reads the parts in full.
 */
async function readPartStock(
  manager: EntityManager,
  before: LineRiskInputs,
  isCountDue: IsCountDue,
): Promise<Pick<LineRiskInputs, 'parts' | 'details' | 'stock'> | null> {
  const mark = before.stock;
  const { partCount, lastMovement } = await readStockMark(manager);
  if (partCount !== before.parts.length || lastMovement < mark.lastMovement) return null;
  const moved: (Pick<PartRow, 'partNumber' | 'onHand'> & Pick<CountedPart, 'countedAt'>)[] =
    lastMovement === mark.lastMovement ? [] : await runSql(manager, MOVED_SQL, [mark.lastMovement]);
  const countedAt = moved.length > 0 ? mark.countedAt.slice() : mark.countedAt;
  const onHandOf = new Map<number, number>();
  for (const row of moved) {
    const place = mark.placeOf.get(row.partNumber);
    if (place === undefined) return null;
    countedAt[place] = row.countedAt;
    onHandOf.set(place, row.onHand);
  }
  const parts = new Array<LineRiskInputs['parts'][number]>(before.parts.length);
  for (let place = 0; place < parts.length; place += 1) {
    const part = before.parts[place];
    const onHand = onHandOf.get(place) ?? part.onHand;
    const countDue = isCountDue({ source: part.source, countedAt: countedAt[place] });
    parts[place] = onHand === part.onHand && countDue === part.countDue ? part : { ...part, onHand, countDue };
  }
  const stock =
    countedAt === mark.countedAt && lastMovement === mark.lastMovement ? mark : { ...mark, lastMovement, countedAt };
  return { parts, details: before.details, stock };
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
