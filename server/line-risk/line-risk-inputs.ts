import type { EntityManager } from 'typeorm';
import type { LineRiskPart, LoopSupply } from '../../shared/domain/line-risk';
import type { ScheduledReceipt } from '../../shared/domain/types';
import type { KanbanLoop } from '../../shared/schemas/loops';
import { EXPECTED_ARRIVAL, loadPlanInputs, type PlanInputs } from '../planning/plan-inputs';
import { readCountDue } from '../stock/stock.service';

/**
 * Release states whose open lines the line risk counts on: the supplier has confirmed them (or
 * shipped). Drafts, sent-but-unanswered releases and exceptions are not firm.
 */
export const FIRM_RELEASE_STATES = ['confirmed', 'shipped', 'partial'];

/** Part facts the screen shows beside the figures. */
export interface PartDetails {
  hazardous: boolean;
  supplierName: string | null;
}

export interface LineRiskInputs extends Omit<PlanInputs, 'parts'> {
  parts: (LineRiskPart & { description: string; uom: string })[];
  firmReceipts: ScheduledReceipt[];
  loops: LoopSupply[];
  details: Map<string, PartDetails>;
}

// The same expected arrival as the plan's; only the firm (confirmed or shipped) lines count here.
const FIRM_LINES_SQL = `SELECT l.part_number AS "partNumber", ${EXPECTED_ARRIVAL} AS date,
  COALESCE(l.confirmed_qty, l.qty) - l.received_qty AS qty
  FROM release_line l JOIN release r ON r.id = l.release_id
  WHERE NOT l.closed AND COALESCE(l.confirmed_qty, l.qty) > l.received_qty
  AND r.status IN (${FIRM_RELEASE_STATES.map((state) => `'${state}'`).join(', ')})`;

const DETAILS_SQL = `SELECT p.part_number AS "partNumber", p.hazardous AS hazardous, s.name AS "supplierName"
  FROM part p LEFT JOIN supplier s ON s.code = p.supplier_code`;

interface DetailRow {
  partNumber: string;
  hazardous: boolean | number;
  supplierName: string | null;
}

/**
 * Reads the plan inputs, the firm receipts, the kanban loops as supply and the part details; the
 * caller runs it in one snapshot.
 */
export async function loadLineRiskInputs(
  manager: EntityManager,
  loops: readonly KanbanLoop[],
  now = new Date(),
): Promise<LineRiskInputs> {
  const inputs = await loadPlanInputs(manager);
  const firmReceipts: ScheduledReceipt[] = await manager.query(FIRM_LINES_SQL);
  const rows: DetailRow[] = await manager.query(DETAILS_SQL);
  const countDue = await readCountDue(manager, now);
  const details = new Map(
    rows.map((row) => [row.partNumber, { hazardous: Boolean(row.hazardous), supplierName: row.supplierName }]),
  );
  const parts = inputs.parts.map((part) => ({
    ...part,
    replenishment: part.replenishment as LineRiskPart['replenishment'],
    countDue: countDue.has(part.partNumber),
  }));
  const supplies: LoopSupply[] = loops
    .filter((loop) => loop.partIsKanban)
    .map((loop) => ({
      partNumber: loop.partNumber,
      activeCards: loop.activeCards,
      recommendedCards: loop.recommendedCards,
      containerQty: loop.containerQty,
      replenishmentDays: loop.replenishmentDays,
      emptyCards: loop.cardStates.empty,
    }));
  return { ...inputs, parts, firmReceipts, loops: supplies, details };
}
