import { toWorkingCalendar, type WorkingCalendar } from './calendar';
import { fromDayNumber, toDayNumber, weekdayOfDayNumber } from './date';
import type { DeliveryCycle } from './kanban-sizing';
import type { IsoDate, PlantCalendar } from './types';

/*
 * One timing model for a supplier, used by releases, confirmations, the dock, planning, line risk
 * and kanban sizing alike:
 * - lead time: working days from releasing an order to its arrival at our dock;
 * - transit: working days from the supplier shipping to the goods arriving (arrival = ship + transit);
 * - delivery weekdays: the ISO weekdays (1 = Monday) on which the supplier delivers to us;
 * - delivery cycle, written days–deliveries–delay: `deliveries` deliveries every `days` working
 *   days, each bringing the containers of the cards released `delay` deliveries earlier (the
 *   delay is counted in deliveries, not days). A kanban card is back after
 *   T = days × (1 + delay) / deliveries working days (Monden, Toyota Production System, the
 *   supplier kanban's delivery cycle — from memory).
 * A supplier without a cycle of its own gets the one its delivery weekdays and lead time imply: a
 * week of `days` working days, one delivery per delivery weekday, and the fewest deliveries of
 * delay whose time covers the lead time. A stated cycle whose delay is shorter than the lead time
 * contradicts it (cards would be expected back before the goods can come): a supplier's own is
 * refused, and a part whose lead time is longer than its supplier's uses the derived cycle.
 * A bought part's terms are its supplier's with the part's own lead time.
 */

export interface SupplierTerms {
  leadTimeDays: number;
  transitDays: number;
  /** ISO weekdays on which the supplier delivers; empty means every working day. */
  deliveryWeekdays: number[];
  /** The stated delivery cycle, or null to derive it from the weekdays and lead time. */
  cycle: DeliveryCycle | null;
}

/** Working days of the plant's week: the `days` of a derived cycle (5 when no calendar is given). */
function weekWorkingDays(calendar?: Pick<PlantCalendar, 'workingWeekdays'>): number[] {
  return calendar ? [...calendar.workingWeekdays] : [1, 2, 3, 4, 5];
}

/** The terms of one bought part: its supplier's, with the part's own lead time. */
export function partTerms(supplier: SupplierTerms, partLeadTimeDays: number): SupplierTerms {
  return { ...supplier, leadTimeDays: partLeadTimeDays };
}

/**
 * The cycle of the supplier: stated, or derived from its delivery weekdays and lead time. Derived:
 * one week of the plant's working days, one delivery per working weekday it delivers on (every
 * working day when it names none), and the fewest deliveries of delay whose time covers the lead time.
 */
export function effectiveCycle(terms: SupplierTerms, calendar?: Pick<PlantCalendar, 'workingWeekdays'>): DeliveryCycle {
  // A stated cycle stands unless it contradicts the lead time it serves (a part may wait longer than its supplier's norm).
  if (terms.cycle && !cycleContradiction(terms)) return terms.cycle;
  const week = weekWorkingDays(calendar);
  const delivering = week.filter((day) => terms.deliveryWeekdays.length === 0 || terms.deliveryWeekdays.includes(day));
  const days = week.length;
  const deliveries = Math.max(1, delivering.length);
  // days × delay / deliveries ≥ lead time, in whole deliveries; at least one (a card is never back the day it goes).
  const delay = Math.max(1, Math.ceil((terms.leadTimeDays * deliveries) / days));
  return { days, deliveries, delay };
}

/** Why a stated cycle contradicts the lead time, or null when it holds together. */
export function cycleContradiction(terms: SupplierTerms): string | null {
  if (!terms.cycle) return null;
  const { days, deliveries, delay } = terms.cycle;
  const delayDays = (days * delay) / deliveries;
  if (delayDays + 1e-9 >= terms.leadTimeDays) return null;
  const needed = Math.ceil((terms.leadTimeDays * deliveries) / days);
  return (
    `the delivery cycle ${days}-${deliveries}-${delay} brings a card's container back ${formatDays(delayDays)} after its ` +
    `delivery, but the lead time is ${terms.leadTimeDays} working days: use a delay of at least ${needed} deliveries ` +
    `(${days}-${deliveries}-${needed}), or leave the cycle empty to derive it`
  );
}

function formatDays(days: number): string {
  const rounded = Math.round(days * 100) / 100;
  return `${rounded} working day${rounded === 1 ? '' : 's'}`;
}

/** The kanban replenishment time T in working days: days × (1 + delay) / deliveries of the effective cycle. */
export function replenishmentDays(terms: SupplierTerms, calendar?: Pick<PlantCalendar, 'workingWeekdays'>): number {
  const { days, deliveries, delay } = effectiveCycle(terms, calendar);
  return (days * (1 + delay)) / deliveries;
}

function calendarOf(calendar: PlantCalendar | WorkingCalendar): WorkingCalendar {
  return toWorkingCalendar(calendar);
}

/** Whether the supplier delivers on this working day. */
export function isDeliveryDay(date: IsoDate, terms: SupplierTerms, calendar: PlantCalendar | WorkingCalendar): boolean {
  const day = toDayNumber(date);
  if (!calendarOf(calendar).isWorking(day)) return false;
  return terms.deliveryWeekdays.length === 0 || terms.deliveryWeekdays.includes(weekdayOfDayNumber(day));
}

/**
 * The supplier's last delivery day on or before `date` (a need is brought forward to the delivery
 * that can still bring it in time); `date` itself when no delivery day lies within a fortnight.
 */
export function deliveryDayOnOrBefore(
  date: IsoDate,
  terms: SupplierTerms,
  calendar: PlantCalendar | WorkingCalendar,
): IsoDate {
  const working = calendarOf(calendar);
  let day = toDayNumber(date);
  for (let step = 0; step < 14; step += 1, day -= 1) {
    if (isDeliveryDay(fromDayNumber(day), terms, working)) return fromDayNumber(day);
  }
  return date;
}

/** The supplier's first delivery day on or after `date`; `date` itself when none lies within a fortnight. */
export function deliveryDayOnOrAfter(
  date: IsoDate,
  terms: SupplierTerms,
  calendar: PlantCalendar | WorkingCalendar,
): IsoDate {
  const working = calendarOf(calendar);
  let day = toDayNumber(date);
  for (let step = 0; step < 14; step += 1, day += 1) {
    if (isDeliveryDay(fromDayNumber(day), terms, working)) return fromDayNumber(day);
  }
  return date;
}

/** When goods shipped on `shipDate` arrive: `transitDays` working days later (the next working day at the earliest when 0 lands on a day off). */
export function arrivalOf(
  shipDate: IsoDate,
  terms: Pick<SupplierTerms, 'transitDays'>,
  calendar: PlantCalendar | WorkingCalendar,
): IsoDate {
  const working = calendarOf(calendar);
  const ship = toDayNumber(shipDate);
  const start = working.isWorking(ship) ? ship : working.nextWorking(ship);
  return fromDayNumber(working.addWorking(start, terms.transitDays));
}

/**
 * The day an order released on `releaseDay` arrives, delivery days aside: `leadTimeDays` working
 * days after the first working day on or after its release. Goods arriving on the day they are
 * needed are in time, so a need on or after this day is met by releasing then; a need before it
 * must be expedited.
 */
export function leadTimeArrival(releaseDay: number, leadTimeDays: number, working: WorkingCalendar): number {
  return working.addWorking(working.nextWorking(releaseDay), leadTimeDays);
}

/** The earliest arrival of an order released on `releaseDate`: lead time later, on a delivery day. */
export function earliestArrival(
  releaseDate: IsoDate,
  terms: SupplierTerms,
  calendar: PlantCalendar | WorkingCalendar,
): IsoDate {
  const working = calendarOf(calendar);
  const arrival = fromDayNumber(leadTimeArrival(toDayNumber(releaseDate), terms.leadTimeDays, working));
  return deliveryDayOnOrAfter(arrival, terms, working);
}

/** True when a line needed on `needDate` cannot arrive in time if released on `releaseDate`: it needs expediting. */
export function isInsideLeadTime(
  needDate: IsoDate,
  releaseDate: IsoDate,
  terms: SupplierTerms,
  calendar: PlantCalendar | WorkingCalendar,
): boolean {
  const working = calendarOf(calendar);
  return toDayNumber(needDate) < leadTimeArrival(toDayNumber(releaseDate), terms.leadTimeDays, working);
}

/** The ship dates that bring goods inside the on-time window of a need date. */
export interface ShipWindow {
  /** Shipping before this brings the goods more than the early tolerance ahead of the need. */
  earliestShipDate: IsoDate;
  /** Shipping after this brings the goods after the need date. */
  latestShipDate: IsoDate;
}

/**
 * The on-time window of a line, turned into ship dates: the goods may arrive from
 * `earlyToleranceDays` working days before the need date up to the need date itself, and take
 * `transitDays` working days on the road.
 */
export function shipWindow(
  needDate: IsoDate,
  terms: Pick<SupplierTerms, 'transitDays'>,
  earlyToleranceDays: number,
  calendar: PlantCalendar | WorkingCalendar,
): ShipWindow {
  const working = calendarOf(calendar);
  const need = working.nextWorking(toDayNumber(needDate));
  return {
    earliestShipDate: fromDayNumber(working.addWorking(need, -(terms.transitDays + earlyToleranceDays))),
    latestShipDate: fromDayNumber(working.addWorking(need, -terms.transitDays)),
  };
}
