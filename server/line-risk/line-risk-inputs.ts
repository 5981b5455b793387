import type { EntityManager } from 'typeorm';
import type { ScheduledReceipt } from '../../shared/domain/types';
import { loadPlanInputs, type PlanInputs } from '../planning/plan-inputs';

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

export interface LineRiskInputs extends PlanInputs {
  firmReceipts: ScheduledReceipt[];
  details: Map<string, PartDetails>;
}

/*
 * A confirmed line is counted at the later of its confirmed ship date and its need date: goods
 * never arrive before they ship, and nothing is counted on before the day it was asked for.
 * Its quantity is the confirmed one (the requested one when none was given) less what came in.
 */
const FIRM_LINES_SQL = `SELECT l.part_number AS partNumber,
  CASE WHEN l.ship_date IS NOT NULL AND l.ship_date > l.need_date THEN l.ship_date ELSE l.need_date END AS date,
  COALESCE(l.confirmed_qty, l.qty) - l.received_qty AS qty
  FROM release_line l JOIN release r ON r.id = l.release_id
  WHERE NOT l.closed AND COALESCE(l.confirmed_qty, l.qty) > l.received_qty
  AND r.status IN (${FIRM_RELEASE_STATES.map((state) => `'${state}'`).join(', ')})`;

const DETAILS_SQL = `SELECT p.part_number AS partNumber, p.hazardous AS hazardous, s.name AS supplierName
  FROM part p LEFT JOIN supplier s ON s.code = p.supplier_code`;

interface DetailRow {
  partNumber: string;
  hazardous: boolean | number;
  supplierName: string | null;
}

/** Reads the plan inputs, the firm receipts and the part details; the caller runs it in one snapshot. */
export async function loadLineRiskInputs(manager: EntityManager): Promise<LineRiskInputs> {
  const inputs = await loadPlanInputs(manager);
  const firmReceipts: ScheduledReceipt[] = await manager.query(FIRM_LINES_SQL);
  const rows: DetailRow[] = await manager.query(DETAILS_SQL);
  const details = new Map(
    rows.map((row) => [row.partNumber, { hazardous: Boolean(row.hazardous), supplierName: row.supplierName }]),
  );
  return { ...inputs, firmReceipts, details };
}
