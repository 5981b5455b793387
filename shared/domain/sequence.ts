import type { UnitStatus } from '../schemas/builds';
import type { SequenceDay, SequenceUnit } from '../schemas/sequence';
import type { IsoDate } from './types';

/*
 * Rules of the build sequence that the board (for a move and its preview) and the server (when
 * it saves one) both apply.
 */

/** A day's new order of units, as PUT /api/sequence/days takes it. */
export interface DayOrder {
  date: IsoDate;
  serials: string[];
}

/** The load of a day: the units it builds, each counted at its quantity. */
export function dayLoad(units: readonly { qty: number }[]): number {
  return units.reduce((sum, unit) => sum + unit.qty, 0);
}

/** A unit as it stands, and the place and content a change would give it. */
export interface UnitPlace {
  date: IsoDate;
  sequence: number;
  model: string;
  qty: number;
}

/**
 * Why a unit cannot change as asked, or null. A built unit is history: its parts were backflushed
 * on that day, so it keeps its day, place, model and quantity and cannot be removed. A started unit
 * has its kit at the line: it keeps its day, model and quantity but may change place within the day.
 * `next` null means removal.
 */
export function unitChangeProblem(
  unit: UnitPlace & { serial: string; status: UnitStatus },
  next: UnitPlace | null,
): string | null {
  if (unit.status === 'planned') return null;
  const what =
    unit.status === 'built' ? `was built on ${unit.date}` : `was started on ${unit.date} (its kit is at the line)`;
  if (next === null) return `unit '${unit.serial}' ${what}; reverse it at the line end before removing it`;
  const changes = [
    next.date !== unit.date && 'day',
    unit.status === 'built' && next.sequence !== unit.sequence && 'place',
    next.model !== unit.model && 'model',
    next.qty !== unit.qty && 'quantity',
  ].filter((change): change is string => change !== false);
  return changes.length === 0
    ? null
    : `unit '${unit.serial}' ${what}; its ${new Intl.ListFormat('en').format(changes)} cannot change`;
}

/** One unit moving to a place on a day, with the day orders to send and the days it changes. */
export interface PlannedMove {
  serial: string;
  fromDate: string;
  toDate: string;
  /** Position in the target day, counted from 0 after the unit has left its old place. */
  toIndex: number;
  orders: DayOrder[];
  /** Days whose order changes: the target, and the day the unit leaves when that differs. */
  changedDates: string[];
  /** Why the move cannot be saved (it would shift a built unit or carry off a started one), or null. */
  problem: string | null;
  /** The target day's load past its capacity, which the server refuses as it does; null while it fits. */
  overCapacity: { date: string; load: number; capacity: number } | null;
}

/** The first unit the new day orders would change against its status, as unitChangeProblem words it. */
export function ordersProblem(days: readonly SequenceDay[], orders: readonly DayOrder[]): string | null {
  const units = new Map(days.flatMap((day) => day.units.map((unit) => [unit.serial, unit])));
  for (const order of orders) {
    for (const [index, serial] of order.serials.entries()) {
      const unit = units.get(serial);
      const problem = unit && unitChangeProblem(unit, { ...unit, date: order.date, sequence: index + 1 });
      if (problem) return problem;
    }
  }
  return null;
}

/** The day holding a serial, or undefined. */
export function dayOfSerial(days: readonly SequenceDay[], serial: string): SequenceDay | undefined {
  return days.find((day) => day.units.some((unit) => unit.serial === serial));
}

/**
 * Works out a move without changing anything: the unit leaves its day and is inserted at
 * `toIndex` (clamped) of `toDate`. Null when the unit is unknown or would end where it is.
 */
export function planMove(
  days: readonly SequenceDay[],
  serial: string,
  toDate: string,
  toIndex: number,
): PlannedMove | null {
  const from = dayOfSerial(days, serial);
  const to = days.find((day) => day.date === toDate);
  if (!from || !to) return null;
  const fromSerials = from.units.map((unit) => unit.serial).filter((candidate) => candidate !== serial);
  const toSerials = from === to ? fromSerials : to.units.map((unit) => unit.serial);
  const index = Math.max(0, Math.min(toIndex, toSerials.length));
  const target = [...toSerials.slice(0, index), serial, ...toSerials.slice(index)];
  if (from === to) {
    const unchanged = target.every((candidate, position) => candidate === from.units[position]?.serial);
    if (unchanged) return null;
    const orders = [{ date: toDate, serials: target }];
    return {
      serial,
      fromDate: from.date,
      toDate,
      toIndex: index,
      orders,
      changedDates: [toDate],
      problem: ordersProblem(days, orders),
      overCapacity: null,
    };
  }
  // The target first: it is what the planner aimed at; the server takes both at once anyway.
  const orders = [
    { date: toDate, serials: target },
    { date: from.date, serials: fromSerials },
  ];
  return {
    serial,
    fromDate: from.date,
    toDate,
    toIndex: index,
    orders,
    changedDates: [toDate, from.date],
    problem: ordersProblem(days, orders),
    overCapacity: overCapacityOf(to, dayLoad(to.units) + (from.units.find((unit) => unit.serial === serial)?.qty ?? 0)),
  };
}

/** A day that would hold `load` units past its capacity (the server's rule: a change may not fill a day past it). */
function overCapacityOf(day: SequenceDay, load: number): PlannedMove['overCapacity'] {
  const capacity = day.capacity;
  return typeof capacity === 'number' && load > capacity && load > dayLoad(day.units)
    ? { date: day.date, load, capacity }
    : null;
}

/** A day given a new order of (known) units: positions renumbered 1..n and the load recounted. */
export function reorderDay(
  day: SequenceDay,
  serials: readonly string[],
  unitsBySerial: ReadonlyMap<string, SequenceUnit>,
): SequenceDay {
  const units = serials.map((serial, index) => ({
    ...unitsBySerial.get(serial)!,
    date: day.date,
    sequence: index + 1,
  }));
  return { ...day, units, load: dayLoad(units) };
}
