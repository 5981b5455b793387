import { addCalendarDays, fromDayNumber, toDayNumber, weekdayOfDayNumber } from './date';
import type { IsoDate, PlantCalendar } from './types';

export { addCalendarDays };

/**
 * A plant calendar prepared for repeated look-ups (weekday table and holiday set on day numbers).
 * The plan engine builds one per run; the exported functions accept either form.
 */
export class WorkingCalendar {
  private readonly worksOnWeekday: boolean[];
  private readonly holidayDays: Set<number>;

  constructor(calendar: PlantCalendar) {
    this.worksOnWeekday = new Array<boolean>(8).fill(false);
    for (const weekday of calendar.workingWeekdays) {
      if (!Number.isInteger(weekday) || weekday < 1 || weekday > 7) {
        throw new RangeError(`Working weekday must be an ISO weekday number 1–7, got ${weekday}`);
      }
      this.worksOnWeekday[weekday] = true;
    }
    // Without a worked weekday no offset could ever be reached; fail loudly instead of looping.
    if (!this.worksOnWeekday.some(Boolean)) {
      throw new Error('Plant calendar has no working weekdays; at least one of 1–7 (Monday–Sunday) must be worked');
    }
    this.holidayDays = new Set(calendar.holidays.map(toDayNumber));
  }

  /** True when the day number is a worked weekday and not a holiday. */
  isWorking(dayNumber: number): boolean {
    return this.worksOnWeekday[weekdayOfDayNumber(dayNumber)] && !this.holidayDays.has(dayNumber);
  }

  /** The day number `count` working days away (see addWorkingDays for the rules). */
  addWorking(dayNumber: number, count: number): number {
    if (!Number.isInteger(count)) throw new RangeError(`Working day offset must be a whole number: ${count}`);
    const step = count < 0 ? -1 : 1;
    let remaining = Math.abs(count);
    let day = dayNumber;
    // Terminates: every 7 consecutive days hold a worked weekday and the holiday list is finite.
    while (remaining > 0) {
      day += step;
      if (this.isWorking(day)) remaining -= 1;
    }
    return day;
  }

  /** The day number itself when working, else the next working one. */
  nextWorking(dayNumber: number): number {
    let day = dayNumber;
    while (!this.isWorking(day)) day += 1;
    return day;
  }
}

/** Prepares a plant calendar for repeated look-ups; returns a prepared one unchanged. */
export function toWorkingCalendar(calendar: PlantCalendar | WorkingCalendar): WorkingCalendar {
  return calendar instanceof WorkingCalendar ? calendar : new WorkingCalendar(calendar);
}

/** ISO 8601 weekday of a date: 1 = Monday … 7 = Sunday. */
export function isoWeekday(date: IsoDate): number {
  return weekdayOfDayNumber(toDayNumber(date));
}

/** True when the plant works on `date` (a worked weekday that is not a holiday). */
export function isWorkingDay(date: IsoDate, calendar: PlantCalendar | WorkingCalendar): boolean {
  return toWorkingCalendar(calendar).isWorking(toDayNumber(date));
}

/**
 * The date `count` working days after `date` (before it when negative), counting only days
 * strictly after (before) the start. `count` 0 returns `date` itself even on a non-working day,
 * so a zero lead time never moves a date. Example: a receipt due Monday with lead time 1 is
 * released the previous Friday on a Monday–Friday calendar.
 */
export function addWorkingDays(date: IsoDate, count: number, calendar: PlantCalendar | WorkingCalendar): IsoDate {
  if (count === 0) return date;
  return fromDayNumber(toWorkingCalendar(calendar).addWorking(toDayNumber(date), count));
}

/** Every working day from `from` to `to`, both inclusive, in order (empty when `from` > `to`). */
export function workingDaysBetween(from: IsoDate, to: IsoDate, calendar: PlantCalendar | WorkingCalendar): IsoDate[] {
  const working = toWorkingCalendar(calendar);
  const last = toDayNumber(to);
  const days: IsoDate[] = [];
  for (let day = toDayNumber(from); day <= last; day += 1) {
    if (working.isWorking(day)) days.push(fromDayNumber(day));
  }
  return days;
}

/** `date` itself when it is a working day, otherwise the next working day. */
export function nextWorkingDay(date: IsoDate, calendar: PlantCalendar | WorkingCalendar): IsoDate {
  return fromDayNumber(toWorkingCalendar(calendar).nextWorking(toDayNumber(date)));
}

/**
 * ISO 8601 week key such as `2026-W01`: weeks start on Monday and week 1 is the week holding the
 * year's first Thursday, so the key's year is the ISO week-year, which can differ from the
 * calendar year in the first and last days of January and December.
 */
export function isoWeekKey(date: IsoDate): string {
  const day = toDayNumber(date);
  const thursday = day - weekdayOfDayNumber(day) + 4;
  const weekYear = Number(fromDayNumber(thursday).slice(0, 4));
  const firstJanuary = toDayNumber(`${String(weekYear).padStart(4, '0')}-01-01`);
  const week = Math.floor((thursday - firstJanuary) / 7) + 1;
  return `${String(weekYear).padStart(4, '0')}-W${String(week).padStart(2, '0')}`;
}
