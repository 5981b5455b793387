import type { IsoDate } from './types';

/*
 * Plant dates are calendar days, not instants. Every date is handled as a whole-day count since
 * 1970-01-01 on the UTC time line, so a host's time zone or a daylight-saving change can never
 * shift a day. Years below 100 are rejected because Date.UTC maps them onto 1900–1999.
 */

const MS_PER_DAY = 86_400_000;
const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

function isLeapYear(year: number): boolean {
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
}

function pad(value: number, width: number): string {
  return String(value).padStart(width, '0');
}

/** True when `value` is a real calendar date written `YYYY-MM-DD` (year 0100 or later). */
export function isIsoDate(value: unknown): value is IsoDate {
  if (typeof value !== 'string') return false;
  const match = ISO_DATE.exec(value);
  if (!match) return false;
  const year = Number(match[1]);
  const month = Number(match[2]);
  const day = Number(match[3]);
  if (year < 100 || month < 1 || month > 12 || day < 1) return false;
  const monthLength = month === 2 && isLeapYear(year) ? 29 : DAYS_IN_MONTH[month - 1];
  return day <= monthLength;
}

/** Whole days from 1970-01-01 to `date`; throws a RangeError for anything but a real ISO date. */
export function toDayNumber(date: IsoDate): number {
  if (!isIsoDate(date)) {
    throw new RangeError(`Not a calendar date in the form YYYY-MM-DD: ${JSON.stringify(date)}`);
  }
  const year = Number(date.slice(0, 4));
  const month = Number(date.slice(5, 7));
  const day = Number(date.slice(8, 10));
  return Date.UTC(year, month - 1, day) / MS_PER_DAY;
}

/** The ISO date `dayNumber` whole days after 1970-01-01. */
export function fromDayNumber(dayNumber: number): IsoDate {
  const instant = new Date(dayNumber * MS_PER_DAY);
  return `${pad(instant.getUTCFullYear(), 4)}-${pad(instant.getUTCMonth() + 1, 2)}-${pad(instant.getUTCDate(), 2)}`;
}

/** ISO weekday of a day number: 1 = Monday … 7 = Sunday (1970-01-01 was a Thursday). */
export function weekdayOfDayNumber(dayNumber: number): number {
  return ((((dayNumber + 3) % 7) + 7) % 7) + 1;
}

/** `date` moved by `days` calendar days (negative moves back). */
export function addCalendarDays(date: IsoDate, days: number): IsoDate {
  if (!Number.isInteger(days)) throw new RangeError(`Calendar day offset must be a whole number: ${days}`);
  return fromDayNumber(toDayNumber(date) + days);
}

/** The calendar day of an instant on this machine's clock: the plant's "today" on the server, the user's in the browser. */
export function localIsoDate(instant: Date = new Date()): IsoDate {
  const pad = (value: number) => String(value).padStart(2, '0');
  return `${instant.getFullYear()}-${pad(instant.getMonth() + 1)}-${pad(instant.getDate())}`;
}
