import { In, type EntityManager } from 'typeorm';
import type { PlanningBomLine, PlanningPart, ScheduledReceipt, SequenceSlot } from '../../shared/domain/types';
import type { Calendar } from '../../shared/schemas/master-data';
import { BomLineEntity } from '../bom/bom-line.entity';
import { readCalendar } from '../calendar/calendar.service';
import { PartEntity } from '../parts/part.entity';
import { ReleaseLineEntity } from '../releases/release-line.entity';
import { ReleaseEntity } from '../releases/release.entity';
import { SequenceEntryEntity } from '../sequence/sequence-entry.entity';

/** Release states whose open lines count as scheduled receipts. */
export const OPEN_RELEASE_STATES = ['sent', 'confirmed', 'exception', 'shipped', 'partial'];

export interface PlanInputs {
  parts: (PlanningPart & { description: string; uom: string; replenishment: string | null })[];
  bom: PlanningBomLine[];
  sequence: SequenceSlot[];
  scheduledReceipts: ScheduledReceipt[];
  calendar: Calendar;
}

/** Reads everything the engine needs in one consistent snapshot. */
export async function loadPlanInputs(manager: EntityManager): Promise<PlanInputs> {
  const [parts, bom, sequence, calendar, openReleases] = await Promise.all([
    manager.find(PartEntity, { order: { partNumber: 'ASC' } }),
    manager.find(BomLineEntity),
    manager.find(SequenceEntryEntity, { order: { date: 'ASC', sequence: 'ASC' } }),
    readCalendar(manager),
    manager.find(ReleaseEntity, { where: { status: In(OPEN_RELEASE_STATES) }, select: { id: true } }),
  ]);
  const openLines = openReleases.length
    ? await manager.find(ReleaseLineEntity, { where: { releaseId: In(openReleases.map((release) => release.id)), closed: false } })
    : [];
  return {
    parts: parts.map((part) => ({
      partNumber: part.partNumber,
      description: part.description,
      uom: part.uom,
      source: part.source as PlanningPart['source'],
      supplierCode: part.supplierCode,
      replenishment: part.replenishment,
      leadTimeDays: part.leadTimeDays,
      packQty: part.packQty,
      onHand: part.onHand,
      safetyStock: part.safetyStock,
    })),
    bom: bom.map(({ parent, component, qtyPer, scrapPct, effectiveFrom, effectiveTo }) => ({
      parent,
      component,
      qtyPer,
      scrapPct,
      effectiveFrom,
      effectiveTo,
    })),
    sequence: sequence.map(({ date, sequence: position, model, serial, qty }) => ({ date, sequence: position, model, serial, qty })),
    scheduledReceipts: openLines
      .map((line) => ({ partNumber: line.partNumber, date: line.needDate, qty: line.qty - line.receivedQty }))
      .filter((receipt) => receipt.qty > 0),
    calendar,
  };
}
