import type { EntityManager } from 'typeorm';
import { addWorkingDays, toWorkingCalendar, type WorkingCalendar } from '../../shared/domain/calendar';
import { roundQty } from '../../shared/domain/quantity';
import {
  deliveryDayOnOrBefore,
  earliestArrival,
  partTerms,
  type SupplierTerms,
} from '../../shared/domain/supplier-timing';
import { supplierTerms } from '../../shared/schemas/master-data';
import { SupplierEntity } from '../master-data/supplier.entity';
import type { PlanResult, PlantCalendar } from '../../shared/domain/types';
import type { ReleaseLineOrigin } from '../../shared/schemas/releases';

/** An empty card of a supplier loop: the pull signal for one container. */
export interface EmptyCardSignal {
  cardId: number;
  cardNumber: string;
  partNumber: string;
  containerQty: number;
  supplierCode: string;
  /** The part's timing: its supplier's terms with the part's own lead time. */
  terms: SupplierTerms;
}

/** A bought part replenished on schedule, as the run needs it. */
export interface ScheduledPart {
  partNumber: string;
  supplierCode: string;
  terms: SupplierTerms;
}

export interface DraftLine {
  supplierCode: string;
  partNumber: string;
  qty: number;
  needDate: string;
  origin: ReleaseLineOrigin;
  cardId: number | null;
  /** Needed sooner than the lead time allows, or off the supplier's delivery days. */
  expedite: boolean;
}

// The loop must be a supplier loop of a bought part still on kanban: a card of a part that moved to
// scheduled replenishment is left for the buyer to pull, since the plan now orders that part.
const EMPTY_CARDS_SQL = `SELECT c.id AS "cardId", c.card_number AS "cardNumber", l.part_number AS "partNumber",
  l.container_qty AS "containerQty", p.supplier_code AS "supplierCode", p.lead_time_days AS "leadTimeDays"
  FROM kanban_card c JOIN kanban_loop l ON l.id = c.loop_id
  JOIN part p ON p.part_number = l.part_number JOIN supplier s ON s.code = p.supplier_code
  WHERE c.state = 'empty' AND c.retired_at IS NULL AND l.kind = 'supplier' AND p.source = 'buy' AND p.replenishment = 'kanban'
  ORDER BY l.part_number, c.card_index`;

interface EmptyCardRow {
  cardId: number;
  cardNumber: string;
  partNumber: string;
  containerQty: number;
  supplierCode: string;
  leadTimeDays: number;
}

/** Every card waiting to be ordered from a supplier, read inside the run's transaction. */
export async function readEmptyCardSignals(manager: EntityManager): Promise<EmptyCardSignal[]> {
  const rows: EmptyCardRow[] = await manager.query(EMPTY_CARDS_SQL);
  const suppliers = await manager.find(SupplierEntity);
  const termsByCode = new Map(suppliers.map((supplier) => [supplier.code, supplierTerms(supplier)]));
  return rows.map((row) => ({
    cardId: Number(row.cardId),
    cardNumber: row.cardNumber,
    partNumber: row.partNumber,
    containerQty: Number(row.containerQty),
    supplierCode: row.supplierCode,
    terms: partTerms(termsByCode.get(row.supplierCode)!, Number(row.leadTimeDays)),
  }));
}

/**
 * One line per empty card: a container's worth, needed on the first of the supplier's delivery
 * days its lead time allows (a loop is sized on a replenishment time that covers this wait).
 */
export function kanbanLines(
  cards: EmptyCardSignal[],
  releaseDate: string,
  calendar: PlantCalendar | WorkingCalendar,
): DraftLine[] {
  return cards.map((card) => ({
    supplierCode: card.supplierCode,
    partNumber: card.partNumber,
    qty: card.containerQty,
    needDate: earliestArrival(releaseDate, card.terms, calendar),
    origin: 'kanban',
    cardId: card.cardId,
    expedite: false,
  }));
}

/**
 * The planned receipts of scheduled parts that must be ordered by the release date. The plan dates
 * each receipt on the day it is needed; the supplier brings it on its last delivery day on or
 * before then, so the receipt is ordered a lead time before that delivery day — which may be a
 * few days before the plan's own release date for a supplier that delivers weekly. A receipt whose
 * delivery day is closer than the lead time (past-due releases among them) is an expedite, asked
 * for on the day it is needed. Receipts of one part on one day become one line.
 * `alreadyOrdered` holds `part|needDate` keys of open plan lines; a receipt they cover is skipped.
 */
export function plannedLines(
  plan: PlanResult,
  parts: ScheduledPart[],
  releaseDate: string,
  calendar: PlantCalendar | WorkingCalendar,
  alreadyOrdered: ReadonlySet<string>,
): DraftLine[] {
  const working = toWorkingCalendar(calendar);
  const lines = new Map<string, DraftLine>();
  for (const part of parts) {
    const partPlan = plan.parts.get(part.partNumber);
    if (!partPlan) continue;
    const releases = [
      ...partPlan.pastDue,
      ...partPlan.buckets
        .filter((bucket) => bucket.plannedRelease > 0)
        .map((bucket) => ({ date: bucket.date, qty: bucket.plannedRelease })),
    ];
    const arrivalIfOrderedNow = addWorkingDays(releaseDate, part.terms.leadTimeDays, working);
    for (const release of releases) {
      const receipt = addWorkingDays(release.date, part.terms.leadTimeDays, working);
      const delivery = deliveryDayOnOrBefore(receipt, part.terms, working);
      if (delivery > arrivalIfOrderedNow) continue;
      const expedite = delivery < arrivalIfOrderedNow;
      const needDate = expedite ? receipt : delivery;
      if (alreadyOrdered.has(lineKey(part.partNumber, needDate))) continue;
      const key = `${lineKey(part.partNumber, needDate)}|${expedite}`;
      const merged = lines.get(key);
      if (merged) merged.qty = roundQty(merged.qty + release.qty);
      else
        lines.set(key, {
          supplierCode: part.supplierCode,
          partNumber: part.partNumber,
          qty: release.qty,
          needDate,
          origin: 'plan',
          cardId: null,
          expedite,
        });
    }
  }
  return [...lines.values()];
}

/** Key of an order line for the "already ordered" check. */
export function lineKey(partNumber: string, needDate: string): string {
  return `${partNumber}|${needDate}`;
}

/** Lines grouped into one release per supplier, each release's lines by need date then part. */
export function groupBySupplier(lines: DraftLine[]): Map<string, DraftLine[]> {
  const bySupplier = new Map<string, DraftLine[]>();
  for (const line of lines) {
    const group = bySupplier.get(line.supplierCode) ?? [];
    group.push(line);
    bySupplier.set(line.supplierCode, group);
  }
  for (const group of bySupplier.values()) {
    group.sort(
      (a, b) =>
        a.needDate.localeCompare(b.needDate) ||
        a.partNumber.localeCompare(b.partNumber) ||
        (a.cardId ?? 0) - (b.cardId ?? 0),
    );
  }
  return new Map([...bySupplier].sort(([a], [b]) => a.localeCompare(b)));
}
