import { isIsoDate, toDayNumber, weekdayOfDayNumber } from '../domain/date';
import type { IsoDate } from '../domain/types';

/*
 * One date style for people, on every screen and in the planners' e-mails, in English day-month
 * order whatever the reader's language: weekday, day, short month — "Wed 2 Dec" in dense tables
 * and sentences, "Wed 2 Dec 2026" where the year matters. Files and API bodies keep ISO 8601
 * `YYYY-MM-DD`. The names come from these tables rather than Intl so that a browser's locale data
 * (newer en-GB data writes "Sept") cannot change a screen. Plant dates are calendar days, so no time
 * zone is involved in them; a time of day is read on this computer's clock (the server's is the
 * plant's), "14:05".
 */
export const WEEKDAY_NAMES = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'] as const;
export const MONTH_NAMES = [
  'Jan',
  'Feb',
  'Mar',
  'Apr',
  'May',
  'Jun',
  'Jul',
  'Aug',
  'Sep',
  'Oct',
  'Nov',
  'Dec',
] as const;

/** `Wed` for a plant date. */
export function formatWeekday(date: IsoDate): string {
  return isIsoDate(date) ? WEEKDAY_NAMES[weekdayOfDayNumber(toDayNumber(date)) - 1]! : date;
}

/** `2 Dec` for a plant date. */
export function formatDayMonth(date: IsoDate): string {
  return isIsoDate(date) ? `${Number(date.slice(8, 10))} ${MONTH_NAMES[Number(date.slice(5, 7)) - 1]}` : date;
}

/** `Wed 2 Dec` for a plant date, the style of tables and sentences; blank for none. */
export function formatDay(date: IsoDate | null): string {
  if (!date) return '';
  return isIsoDate(date) ? `${formatWeekday(date)} ${formatDayMonth(date)}` : date;
}

/** `Wed 2 Dec 2026` for a plant date whose year matters; blank for none. */
export function formatDate(date: IsoDate | null): string {
  if (!date) return '';
  return isIsoDate(date) ? `${formatDay(date)} ${date.slice(0, 4)}` : date;
}

function pad2(value: number): string {
  return String(value).padStart(2, '0');
}

/** An instant from a stored timestamp; null when it is none. */
export function toInstant(value: string | Date): Date | null {
  const instant = value instanceof Date ? value : new Date(value);
  return Number.isNaN(instant.getTime()) ? null : instant;
}

/** `14:05` (or `14:05:09` with seconds) on a 24-hour clock, in this computer's time zone; blank for none. */
export function formatTime(value: string | Date | null, options: { seconds?: boolean } = {}): string {
  if (!value) return '';
  const instant = toInstant(value);
  if (!instant) return String(value);
  const time = `${pad2(instant.getHours())}:${pad2(instant.getMinutes())}`;
  return options.seconds ? `${time}:${pad2(instant.getSeconds())}` : time;
}
