import { addWorkingDays, isoWeekday, workingDaysBetween } from '../shared/domain/calendar';
import { arrivalOf, earliestArrival } from '../shared/domain/supplier-timing';
import { supplierTerms } from '../shared/schemas/master-data';
import type { IsoDate, PlantCalendar } from '../shared/domain/types';
import { COUNT_TO_CHECK, SHORT_COVER_DAYS, UNDERSIZED_LOOP } from './scenario-stock';
import type { DemoPart, DemoSupplier } from './scenario-types';

/*
 * The weeks before the demo's first day as the materials team lived them: releases sent, answered
 * and received at the dock, so the scorecard, a supplier's own page and the Outbox have something
 * to show. Past lines are all closed; what is still open is kanban containers on their way, so the
 * line-risk stories (scenario-stock.ts), which rest on scheduled parts and one loop, are untouched.
 */

/** The supplier that delivers late, week after week. */
export const LATE_SUPPLIER = 'OMW';
/** The supplier whose oldest delivery in the history came short. */
export const SHORT_SUPPLIER = 'GDC';
/** The supplier whose latest delivery came days before it was asked for. */
export const EARLY_SUPPLIER = 'SRM';
/** Suppliers of scheduled parts whose past deliveries the demo keeps, one release per delivery. */
const HISTORY_SUPPLIERS = ['FBS', 'OMW', 'GDC', 'HSS', 'SRM', 'COS'];

const LATE_BY_WORKING_DAYS = 2;
const EARLY_BY_WORKING_DAYS = 3;
/** Share of a short delivery that arrived. */
const SHORT_SHARE = 0.75;
/** Share of a part's consumption over the history that its past deliveries brought in. */
const REPLACED_SHARE = 0.8;

export interface HistoryReceipt {
  qty: number;
  on: IsoDate;
  discrepancy: 'short' | null;
  final: boolean;
  note: string | null;
}

export interface HistoryLine {
  partNumber: string;
  qty: number;
  needDate: IsoDate;
  origin: 'plan' | 'kanban';
  confirmedQty: number | null;
  shipDate: IsoDate | null;
  arrivalDate: IsoDate | null;
  receipts: HistoryReceipt[];
}

export interface HistoryRelease {
  supplierCode: string;
  releaseDate: IsoDate;
  status: 'received' | 'confirmed' | 'exception';
  /** The day the supplier answered; null while it has not. */
  answeredOn: IsoDate | null;
  supplierNote: string | null;
  lines: HistoryLine[];
}

/** Parts whose stock tells a line-risk story: the history never delivers them. */
const STORY_PARTS = new Set([...Object.keys(SHORT_COVER_DAYS), UNDERSIZED_LOOP.partNumber, COUNT_TO_CHECK]);

function deliversOn(date: IsoDate, supplier: DemoSupplier): boolean {
  return supplier.deliveryWeekdays.length === 0 || supplier.deliveryWeekdays.includes(isoWeekday(date));
}

/**
 * Past releases of scheduled parts, one per delivery day of each history supplier between the
 * first built day and the day before `firstDay`. Each line brings a share of what the part was
 * consumed in those weeks, in whole packs, so stock before the deliveries stays positive.
 */
export function pastReleases(
  parts: readonly DemoPart[],
  suppliers: readonly DemoSupplier[],
  calendar: PlantCalendar,
  historyStart: IsoDate,
  firstDay: IsoDate,
  consumed: ReadonlyMap<string, number>,
): HistoryRelease[] {
  const lastPastDay = addWorkingDays(firstDay, -1, calendar);
  const pastDays = workingDaysBetween(historyStart, lastPastDay, calendar);
  const releases: HistoryRelease[] = [];
  for (const supplier of suppliers.filter((candidate) => HISTORY_SUPPLIERS.includes(candidate.code))) {
    const terms = supplierTerms(supplier);
    const deliveries = pastDays.filter((day) => deliversOn(day, supplier));
    const own = parts.filter(
      (part) =>
        part.supplierCode === supplier.code && part.replenishment === 'scheduled' && !STORY_PARTS.has(part.partNumber),
    );
    deliveries.forEach((needDate, index) => {
      const lines = own.flatMap((part): HistoryLine[] => {
        const share = ((consumed.get(part.partNumber) ?? 0) * REPLACED_SHARE) / deliveries.length;
        const qty = Math.floor(share / part.packQty) * part.packQty;
        if (qty <= 0) return [];
        const shipDate = addWorkingDays(needDate, -terms.transitDays, calendar);
        return [
          {
            partNumber: part.partNumber,
            qty,
            needDate,
            origin: 'plan',
            confirmedQty: qty,
            shipDate,
            arrivalDate: arrivalOf(shipDate, terms, calendar),
            receipts: [receiptOf(supplier.code, qty, needDate, index, deliveries.length, lastPastDay, calendar)],
          },
        ];
      });
      if (lines.length === 0) return;
      const releaseDate = addWorkingDays(needDate, -terms.leadTimeDays, calendar);
      releases.push({
        supplierCode: supplier.code,
        releaseDate,
        status: 'received',
        answeredOn: addWorkingDays(releaseDate, 1, calendar),
        supplierNote: null,
        lines,
      });
    });
  }
  return releases;
}

/** How one past delivery arrived: late for the late supplier, one short, one early, the rest on the day. */
function receiptOf(
  supplierCode: string,
  qty: number,
  needDate: IsoDate,
  index: number,
  count: number,
  lastPastDay: IsoDate,
  calendar: PlantCalendar,
): HistoryReceipt {
  const onTime: HistoryReceipt = { qty, on: needDate, discrepancy: null, final: false, note: null };
  if (supplierCode === LATE_SUPPLIER) {
    const late = addWorkingDays(needDate, LATE_BY_WORKING_DAYS, calendar);
    return late <= lastPastDay ? { ...onTime, on: late } : onTime;
  }
  if (supplierCode === SHORT_SUPPLIER && index === 0) {
    return {
      qty: Math.max(1, Math.floor(qty * SHORT_SHARE)),
      on: needDate,
      discrepancy: 'short',
      final: true,
      note: 'Short on the packing slip too; the supplier does not send the rest.',
    };
  }
  if (supplierCode === EARLY_SUPPLIER && index === count - 1) {
    return { ...onTime, on: addWorkingDays(needDate, -EARLY_BY_WORKING_DAYS, calendar) };
  }
  return onTime;
}

/** A kanban container still on its way: which loop, from whom, and how its release stands. */
export interface OpenKanbanDelivery {
  partNumber: string;
  supplierCode: string;
  releaseDate: IsoDate;
  needDate: IsoDate;
  status: 'confirmed' | 'exception';
  answeredOn: IsoDate;
  /** The ship date the supplier answered. */
  shipDate: IsoDate;
  arrivalDate: IsoDate;
  supplierNote: string | null;
}

/**
 * Open kanban orders: two due at the dock on `firstDay`, one of the late supplier overdue, one
 * answered with a later date; and a card emptied at the line the day before, which the first
 * day's release run orders.
 */
export const OPEN_KANBAN = {
  dueToday: ['WHL-250', 'FK-FRM'],
  overdue: 'BRM-04',
  later: 'BRU-16',
  exception: 'PMP-S24',
  emptied: 'HNS-M20',
} as const;

/** The kanban orders still open when the demo starts; every one a container of a right-sized loop. */
export function openKanbanDeliveries(
  parts: readonly DemoPart[],
  suppliers: readonly DemoSupplier[],
  calendar: PlantCalendar,
  firstDay: IsoDate,
): OpenKanbanDelivery[] {
  const supplierOf = (partNumber: string): DemoSupplier => {
    const code = parts.find((part) => part.partNumber === partNumber)!.supplierCode;
    return suppliers.find((supplier) => supplier.code === code)!;
  };
  const confirmedFor = (partNumber: string, needDate: IsoDate): OpenKanbanDelivery => {
    const supplier = supplierOf(partNumber);
    const terms = supplierTerms(supplier);
    const releaseDate = addWorkingDays(needDate, -terms.leadTimeDays, calendar);
    const shipDate = addWorkingDays(needDate, -terms.transitDays, calendar);
    return {
      partNumber,
      supplierCode: supplier.code,
      releaseDate,
      needDate,
      status: 'confirmed',
      answeredOn: addWorkingDays(releaseDate, 1, calendar),
      shipDate,
      arrivalDate: arrivalOf(shipDate, terms, calendar),
      supplierNote: null,
    };
  };
  const yesterday = addWorkingDays(firstDay, -1, calendar);
  const exceptionSupplier = supplierOf(OPEN_KANBAN.exception);
  const exceptionTerms = supplierTerms(exceptionSupplier);
  const exceptionNeed = earliestArrival(yesterday, exceptionTerms, calendar);
  const proposedShip = addWorkingDays(exceptionNeed, 2 - exceptionTerms.transitDays, calendar);
  return [
    ...OPEN_KANBAN.dueToday.map((partNumber) => confirmedFor(partNumber, firstDay)),
    confirmedFor(OPEN_KANBAN.overdue, yesterday),
    confirmedFor(OPEN_KANBAN.later, addWorkingDays(firstDay, 2, calendar)),
    {
      partNumber: OPEN_KANBAN.exception,
      supplierCode: exceptionSupplier.code,
      releaseDate: yesterday,
      needDate: exceptionNeed,
      status: 'exception',
      // Answered the day it was sent, so the answer is never later than the demo's start.
      answeredOn: yesterday,
      shipDate: proposedShip,
      arrivalDate: arrivalOf(proposedShip, exceptionTerms, calendar),
      supplierNote: 'Pump housings are on back order; we can ship two working days later than asked.',
    },
  ];
}
