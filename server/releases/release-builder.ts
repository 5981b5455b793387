import type { EntityManager } from 'typeorm';
import { addWorkingDays, type WorkingCalendar } from '../../shared/domain/calendar';
import { kanbanReplenishmentWorkingDays } from '../../shared/domain/release-rules';
import type { DeliveryCycle } from '../../shared/domain/kanban-sizing';
import type { PlanResult, PlantCalendar } from '../../shared/domain/types';
import type { ReleaseLineOrigin } from '../../shared/schemas/releases';

/** An empty card of a supplier loop: the pull signal for one container. */
export interface EmptyCardSignal {
  cardId: number;
  cardNumber: string;
  partNumber: string;
  containerQty: number;
  supplierCode: string;
  cycle: DeliveryCycle;
}

/** A bought part replenished on schedule, as the run needs it. */
export interface ScheduledPart {
  partNumber: string;
  supplierCode: string;
  leadTimeDays: number;
}

export interface DraftLine {
  supplierCode: string;
  partNumber: string;
  qty: number;
  needDate: string;
  origin: ReleaseLineOrigin;
  cardId: number | null;
}

// The loop must be a supplier loop of a bought part still on kanban: a card of a part that moved to
// scheduled replenishment is left for the buyer to pull, since the plan now orders that part.
const EMPTY_CARDS_SQL = `SELECT c.id AS "cardId", c.card_number AS "cardNumber", l.part_number AS "partNumber",
  l.container_qty AS "containerQty", p.supplier_code AS "supplierCode", s.cycle_days AS "cycleDays",
  s.deliveries_per_cycle AS deliveries, s.delivery_delay AS delay
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
  cycleDays: number;
  deliveries: number;
  delay: number;
}

/** Every card waiting to be ordered from a supplier, read inside the run's transaction. */
export async function readEmptyCardSignals(manager: EntityManager): Promise<EmptyCardSignal[]> {
  const rows: EmptyCardRow[] = await manager.query(EMPTY_CARDS_SQL);
  return rows.map((row) => ({
    cardId: Number(row.cardId),
    cardNumber: row.cardNumber,
    partNumber: row.partNumber,
    containerQty: Number(row.containerQty),
    supplierCode: row.supplierCode,
    cycle: { days: Number(row.cycleDays), deliveries: Number(row.deliveries), delay: Number(row.delay) },
  }));
}

/**
 * One line per empty card: a container's worth, needed back after the supplier's replenishment
 * time counted in working days from the release date.
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
    needDate: addWorkingDays(releaseDate, kanbanReplenishmentWorkingDays(card.cycle), calendar),
    origin: 'kanban',
    cardId: card.cardId,
  }));
}

/**
 * The planned releases of scheduled parts that are due by the release date: those the plan dates on
 * or before it, past-due ones included. Each becomes a line for the planned receipt it feeds — its
 * quantity, needed on the receipt date (release date plus the part's lead time in working days).
 * `alreadyOrdered` holds `part|needDate` keys of open plan lines; a release they cover is skipped.
 */
export function plannedLines(
  plan: PlanResult,
  parts: ScheduledPart[],
  releaseDate: string,
  calendar: PlantCalendar | WorkingCalendar,
  alreadyOrdered: ReadonlySet<string>,
): DraftLine[] {
  const lines: DraftLine[] = [];
  for (const part of parts) {
    const partPlan = plan.parts.get(part.partNumber);
    if (!partPlan) continue;
    const due = [
      ...partPlan.pastDue,
      ...partPlan.buckets
        .filter((bucket) => bucket.date <= releaseDate && bucket.plannedRelease > 0)
        .map((bucket) => ({ date: bucket.date, qty: bucket.plannedRelease })),
    ];
    for (const release of due) {
      const needDate = addWorkingDays(release.date, part.leadTimeDays, calendar);
      if (alreadyOrdered.has(lineKey(part.partNumber, needDate))) continue;
      lines.push({
        supplierCode: part.supplierCode,
        partNumber: part.partNumber,
        qty: release.qty,
        needDate,
        origin: 'plan',
        cardId: null,
      });
    }
  }
  return lines;
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
