import type { EntityManager } from 'typeorm';
import type { PlanningBomLine, PlanningPart, ScheduledReceipt, SequenceSlot } from '../../shared/domain/types';
import type { Calendar } from '../../shared/schemas/master-data';
import { readCalendar } from '../calendar/calendar.service';
import type { RevisedList } from '../db/revised-rows';

/** Release states whose open lines count as scheduled receipts. */
export const OPEN_RELEASE_STATES = ['sent', 'confirmed', 'exception', 'shipped', 'partial'];

export interface PlanInputs {
  parts: (PlanningPart & { description: string; uom: string; replenishment: string | null })[];
  bom: PlanningBomLine[];
  sequence: SequenceSlot[];
  scheduledReceipts: ScheduledReceipt[];
  calendar: Calendar;
}

interface PartRow {
  partNumber: string;
  description: string;
  uom: string;
  source: PlanningPart['source'];
  supplierCode: string | null;
  replenishment: string | null;
  leadTimeDays: number;
  packQty: number;
  onHand: number;
  safetyStock: number;
}

// Raw selects rather than entity hydration: the plan reads every part, line and slot, and this
// halves the time of a cold plan.
const PARTS_SQL = `SELECT part_number AS "partNumber", description, uom, source, supplier_code AS "supplierCode",
  replenishment, lead_time_days AS "leadTimeDays", pack_qty AS "packQty", on_hand AS "onHand", safety_stock AS "safetyStock"
  FROM part ORDER BY part_number`;
/**
 * The BOM lines, as a list a reader can read again where it changed (see readRowsAgain). In the
 * order the lines were written, on both engines (PostgreSQL moves an updated row): a parent's lines
 * are exploded in that order, and the line risk compares a BOM with the last one line by line.
 */
export const BOM_LIST: RevisedList<PlanningBomLine> = {
  table: 'bom_line',
  columns: `parent, component, qty_per AS "qtyPer", scrap_pct AS "scrapPct", effective_from AS "effectiveFrom",
    effective_to AS "effectiveTo"`,
  where: '1 = 1',
  orderBy: 'id',
  compare: (_a, aId, _b, bId) => aId - bId,
};
const BOM_SQL = `SELECT ${BOM_LIST.columns} FROM bom_line ORDER BY ${BOM_LIST.orderBy}`;
/**
 * The units to build, in build order (the id orders units that share a place, as a board being
 * moved may leave them for a moment). Built units consumed their parts already (the backflush);
 * only the rest is demand.
 */
export const UNITS_TO_BUILD_LIST: RevisedList<SequenceSlot> = {
  table: 'sequence_entry',
  columns: 'date, sequence, model, serial, qty',
  where: `status <> 'built'`,
  orderBy: 'date, sequence, id',
  compare: (a, aId, b, bId) => (a.date < b.date ? -1 : a.date > b.date ? 1 : a.sequence - b.sequence || aId - bId),
};
const SEQUENCE_SQL = `SELECT ${UNITS_TO_BUILD_LIST.columns} FROM sequence_entry WHERE ${UNITS_TO_BUILD_LIST.where}
  ORDER BY ${UNITS_TO_BUILD_LIST.orderBy}`;
// Once the buyer has a confirmed answer, the supplier's quantity is what will come.
const EXPECTED_QTY = `CASE WHEN r.status IN ('confirmed', 'shipped', 'partial') AND l.confirmed_qty IS NOT NULL
  THEN l.confirmed_qty ELSE l.qty END`;
/**
 * When an open line is expected at the dock: once the supplier's answer is firm (confirmed as
 * asked, or accepted by the buyer, which also moves the need date), the arrival it implies — ship
 * date plus transit; otherwise the date asked for. The plan, line risk and the dock read this one date.
 */
export const EXPECTED_ARRIVAL = `CASE WHEN r.status IN ('confirmed', 'shipped', 'partial') AND l.arrival_date IS NOT NULL
  THEN l.arrival_date ELSE l.need_date END`;
const OPEN_LINES_SQL = `SELECT l.part_number AS "partNumber", ${EXPECTED_ARRIVAL} AS date, ${EXPECTED_QTY} - l.received_qty AS qty
  FROM release_line l JOIN release r ON r.id = l.release_id
  WHERE NOT l.closed AND ${EXPECTED_QTY} > l.received_qty AND r.status IN (${OPEN_RELEASE_STATES.map((state) => `'${state}'`).join(', ')})`;

/** Every BOM line, as the engines read them. */
export const readBomLines = (manager: EntityManager): Promise<PlanningBomLine[]> => manager.query(BOM_SQL);

/** The units not yet built, in build order. */
export const readUnitsToBuild = (manager: EntityManager): Promise<SequenceSlot[]> => manager.query(SEQUENCE_SQL);

/** Reads everything the engine needs; the caller runs it in one snapshot (a unit of work). */
export async function loadPlanInputs(manager: EntityManager): Promise<PlanInputs> {
  const parts: PartRow[] = await manager.query(PARTS_SQL);
  const bom = await readBomLines(manager);
  const sequence = await readUnitsToBuild(manager);
  const scheduledReceipts: ScheduledReceipt[] = await manager.query(OPEN_LINES_SQL);
  const calendar = await readCalendar(manager);
  return { parts, bom, sequence, scheduledReceipts, calendar };
}
