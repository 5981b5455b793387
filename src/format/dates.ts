import { localIsoDate } from '@shared/domain/date';
import type { IsoDate } from '@shared/domain/types';
import {
  MONTH_NAMES,
  WEEKDAY_NAMES,
  formatDate,
  formatDay,
  formatDayMonth,
  formatTime,
  toInstant,
} from '@shared/format/dates';

export { formatDate, formatDay, formatDayMonth, formatTime, formatWeekday } from '@shared/format/dates';

/*
 * Dates for people in the one style of `@shared/format/dates` ("Wed 2 Dec", "Wed 2 Dec 2026"), plus
 * what only a screen needs: picker formats, month names, and instants on this computer's 24-hour
 * clock ("14:05").
 */

/** The same style in dayjs tokens, for Element Plus date pickers (`format`). */
export const DATE_PICKER_FORMAT = 'ddd D MMM YYYY';
/** Month pickers show "Mar 2026". */
export const MONTH_PICKER_FORMAT = 'MMM YYYY';
/** What a picker hands back (`value-format`): the ISO date the API takes. */
export const ISO_DATE_FORMAT = 'YYYY-MM-DD';
export const ISO_MONTH_FORMAT = 'YYYY-MM';

/** ISO 8601 weekday numbers (1 = Monday … 7 = Sunday) as names: `Mon, Thu`. */
export function formatWeekdays(weekdays: readonly number[]): string {
  return [...weekdays]
    .sort((a, b) => a - b)
    .map((day) => WEEKDAY_NAMES[day - 1] ?? String(day))
    .join(', ');
}

/** The weekdays as choices, Monday first (ISO 8601 numbering). */
export const WEEKDAY_OPTIONS = WEEKDAY_NAMES.map((label, index) => ({ value: index + 1, label }));

/** `1–4 Dec`, or `30 Nov – 4 Dec` across a month end: the first to the last day of a span. */
export function formatDayRange(first: IsoDate, last: IsoDate): string {
  if (first === last) return formatDayMonth(first);
  if (first.slice(0, 7) === last.slice(0, 7)) return `${Number(first.slice(8, 10))}–${formatDayMonth(last)}`;
  return `${formatDayMonth(first)} – ${formatDayMonth(last)}`;
}

/** `Mar 2026` for a month written `YYYY-MM`. */
export function formatMonth(month: string): string {
  const match = /^(\d{4})-(\d{2})$/.exec(month);
  const name = match ? MONTH_NAMES[Number(match[2]) - 1] : undefined;
  return match && name ? `${name} ${match[1]}` : month;
}

/** The calendar day of an instant on this computer's clock, as `YYYY-MM-DD` (one rule with the server's). */
export const isoDateOf = (instant: Date): IsoDate => localIsoDate(instant);

/** Today's date on this computer's clock, as `YYYY-MM-DD`. */
export const localToday = (now = new Date()): IsoDate => localIsoDate(now);

/** `Wed 2 Dec 2026`: the day of a stored timestamp on this computer's clock; blank for none. */
export function formatDateOf(value: string | Date | null): string {
  if (!value) return '';
  const instant = toInstant(value);
  return instant ? formatDate(isoDateOf(instant)) : String(value);
}

/**
 * `Wed 2 Dec 14:05` for a stored timestamp, in this computer's time zone, or `Wed 2 Dec 2026
 * 14:05` with the year; blank for none, and a value that is no timestamp as it is.
 */
export function formatDateTime(value: string | Date | null, options: { year?: boolean } = {}): string {
  if (!value) return '';
  const instant = toInstant(value);
  if (!instant) return String(value);
  const day = isoDateOf(instant);
  return `${options.year ? formatDate(day) : formatDay(day)} ${formatTime(instant)}`;
}

/**
 * `14:05` for a timestamp of today, `Tue 1 Dec 14:05` for one of another day: how a person says
 * when something happened or will, in this computer's time zone; blank for none.
 */
export function formatWhen(value: string | Date | null, now = new Date()): string {
  if (!value) return '';
  const instant = toInstant(value);
  if (!instant) return String(value);
  return isoDateOf(instant) === isoDateOf(now) ? formatTime(instant) : formatDateTime(instant);
}
