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
    return {
      serial,
      fromDate: from.date,
      toDate,
      toIndex: index,
      orders: [{ date: toDate, serials: target }],
      changedDates: [toDate],
    };
  }
  return {
    serial,
    fromDate: from.date,
    toDate,
    toIndex: index,
    // The target first: it is what the planner aimed at; the server takes both at once anyway.
    orders: [
      { date: toDate, serials: target },
      { date: from.date, serials: fromSerials },
    ],
    changedDates: [toDate, from.date],
  };
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
