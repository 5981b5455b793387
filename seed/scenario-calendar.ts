import { addCalendarDays } from '../shared/domain/date';
import type { IsoDate } from '../shared/domain/types';

/** A day the demo plant does not work, with the name its calendar shows. */
export interface PlantShutdown {
  date: IsoDate;
  name: string;
}

/**
 * Western (Gregorian) Easter Sunday of a year by the anonymous Gregorian algorithm, as set out in
 * Meeus, Astronomical Algorithms, ch. 8: integer steps only, valid for every Gregorian year.
 */
export function easterSunday(year: number): IsoDate {
  const a = year % 19;
  const b = Math.floor(year / 100);
  const c = year % 100;
  const d = Math.floor(b / 4);
  const e = b % 4;
  const f = Math.floor((b + 8) / 25);
  const g = Math.floor((b - f + 1) / 3);
  const h = (19 * a + b - d - g + 15) % 30;
  const i = Math.floor(c / 4);
  const k = c % 4;
  const l = (32 + 2 * e + 2 * i - h - k) % 7;
  const m = Math.floor((a + 11 * h + 22 * l) / 451);
  const month = Math.floor((h + l - 7 * m + 114) / 31);
  const day = ((h + l - 7 * m + 114) % 31) + 1;
  return `${year}-${String(month).padStart(2, '0')}-${String(day).padStart(2, '0')}`;
}

/**
 * The invented plant closes on the public holidays most of its staff keep, whatever the country:
 * New Year's Day, the Easter Friday and Monday, 1 May, and the year's end from Christmas Eve to
 * Boxing Day and on New Year's Eve. The calendar calls them plant shutdown days.
 */
export function plantShutdowns(year: number): PlantShutdown[] {
  const easter = easterSunday(year);
  const days: PlantShutdown[] = [
    { date: `${year}-01-01`, name: 'Plant shutdown: New Year' },
    { date: addCalendarDays(easter, -2), name: 'Plant shutdown: spring holiday' },
    { date: addCalendarDays(easter, 1), name: 'Plant shutdown: spring holiday' },
    { date: `${year}-05-01`, name: 'Plant shutdown: May holiday' },
    { date: `${year}-12-24`, name: 'Plant shutdown: year end' },
    { date: `${year}-12-25`, name: 'Plant shutdown: year end' },
    { date: `${year}-12-26`, name: 'Plant shutdown: year end' },
    { date: `${year}-12-31`, name: 'Plant shutdown: year end' },
  ];
  return days.sort((a, b) => a.date.localeCompare(b.date));
}

/** Shutdown days of the years around the seed day: the history, the sequence and the forecast beyond. */
export function demoShutdowns(seedDay: IsoDate): PlantShutdown[] {
  const year = Number(seedDay.slice(0, 4));
  return [year - 1, year, year + 1].flatMap(plantShutdowns);
}
