import { addBusinessDays, addDays, getISODay, getISOWeek, getISOWeekYear } from 'date-fns';
import fc from 'fast-check';
import { afterEach, describe, expect, it } from 'vitest';
import {
  addCalendarDays,
  addWorkingDays,
  isoWeekKey,
  isoWeekday,
  isWorkingDay,
  nextWorkingDay,
  workingDaysBetween,
} from '../../shared/domain/calendar';
import { fromDayNumber, toDayNumber } from '../../shared/domain/date';
import type { PlantCalendar } from '../../shared/domain/types';

// date-fns works on local-time Date objects; build them from the parts so no time zone shifts a day.
function localDate(iso: string): Date {
  const [year, month, day] = iso.split('-').map(Number);
  return new Date(year, month - 1, day);
}

function isoOf(date: Date): string {
  const pad = (value: number, width: number): string => String(value).padStart(width, '0');
  return `${pad(date.getFullYear(), 4)}-${pad(date.getMonth() + 1, 2)}-${pad(date.getDate(), 2)}`;
}

function everyDay(from: string, to: string): string[] {
  const days: string[] = [];
  for (let day = from; day <= to; day = addCalendarDays(day, 1)) days.push(day);
  return days;
}

const MONDAY_TO_FRIDAY: PlantCalendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] };

describe('isoWeekKey', () => {
  // ISO 8601-1:2019, week dates: weeks start on Monday and week 01 of a week-numbering year is the
  // week containing the year's first Thursday (equivalently 4 January). The dates below are the
  // standard's own example 1985-W15-5 and the usual year-boundary cases, recalled from memory;
  // each is re-derivable from that rule and is also cross-checked against date-fns further down.
  it.each([
    ['1985-04-12', '1985-W15'],
    ['2005-01-01', '2004-W53'],
    ['2005-01-02', '2004-W53'],
    ['2005-12-31', '2005-W52'],
    ['2006-01-01', '2005-W52'],
    ['2006-01-02', '2006-W01'],
    ['2007-01-01', '2007-W01'],
    ['2007-12-30', '2007-W52'],
    ['2007-12-31', '2008-W01'],
    ['2008-12-28', '2008-W52'],
    ['2008-12-29', '2009-W01'],
    ['2009-01-01', '2009-W01'],
    ['2009-12-31', '2009-W53'],
    ['2010-01-03', '2009-W53'],
    ['2010-01-04', '2010-W01'],
  ])('puts %s in ISO week %s', (date, expected) => {
    expect(isoWeekKey(date)).toBe(expected);
  });

  it('agrees with getISOWeek and getISOWeekYear of date-fns on every day of 1999–2032', () => {
    const mismatches: string[] = [];

    for (const day of everyDay('1999-01-01', '2032-12-31')) {
      const reference = `${getISOWeekYear(localDate(day))}-W${String(getISOWeek(localDate(day))).padStart(2, '0')}`;
      if (isoWeekKey(day) !== reference) mismatches.push(`${day}: ${isoWeekKey(day)} ≠ ${reference}`);
    }

    expect(mismatches).toEqual([]);
  });
});

describe('isoWeekday', () => {
  it('numbers the days of the week 1 = Monday … 7 = Sunday (ISO 8601-1:2019 example 1985-W15-5 is a Friday, from memory)', () => {
    expect(isoWeekday('1985-04-12')).toBe(5);
  });

  it('agrees with getISODay of date-fns on every day of 1999–2032', () => {
    const mismatches = everyDay('1999-01-01', '2032-12-31').filter(
      (day) => isoWeekday(day) !== getISODay(localDate(day)),
    );

    expect(mismatches).toEqual([]);
  });
});

describe('addCalendarDays', () => {
  it('agrees with addDays of date-fns across month ends and leap days of 2023–2028', () => {
    const mismatches = everyDay('2023-01-01', '2028-12-31').filter(
      (day) =>
        addCalendarDays(day, 1) !== isoOf(addDays(localDate(day), 1)) ||
        addCalendarDays(day, -40) !== isoOf(addDays(localDate(day), -40)),
    );

    expect(mismatches).toEqual([]);
  });

  it('rejects dates that do not exist', () => {
    expect(() => addCalendarDays('2026-02-29', 1)).toThrow(RangeError);
    expect(() => addCalendarDays('2026-2-3', 1)).toThrow(RangeError);
  });
});

describe('day numbers under different host time zones', () => {
  const originalZone = process.env.TZ;
  afterEach(() => {
    // Assigning undefined to process.env would store the string 'undefined'.
    if (originalZone === undefined) delete process.env.TZ;
    else process.env.TZ = originalZone;
  });

  it.each(['Pacific/Auckland', 'America/Los_Angeles', 'Asia/Kolkata'])(
    'round-trips every day of 2026 and keeps weekdays when TZ is %s',
    (zone) => {
      process.env.TZ = zone;

      const broken = everyDay('2026-01-01', '2026-12-31').filter(
        (day) => fromDayNumber(toDayNumber(day)) !== day || isoWeekday(day) !== getISODay(localDate(day)),
      );

      expect(broken).toEqual([]);
    },
  );
});

describe('addWorkingDays', () => {
  it('agrees with addBusinessDays of date-fns on a Monday–Friday calendar without holidays', () => {
    const mismatches: string[] = [];

    for (const day of everyDay('2025-12-01', '2026-03-31')) {
      for (const offset of [-11, -5, -1, 0, 1, 3, 5, 12]) {
        const reference = isoOf(addBusinessDays(localDate(day), offset));
        if (addWorkingDays(day, offset, MONDAY_TO_FRIDAY) !== reference) mismatches.push(`${day}${offset}`);
      }
    }

    expect(mismatches).toEqual([]);
  });

  it('releases a receipt due Monday with lead time 1 on the previous Friday', () => {
    // 2026-03-09 is a Monday and 2026-03-06 a Friday (both checked by the date-fns comparison above).
    expect(addWorkingDays('2026-03-09', -1, MONDAY_TO_FRIDAY)).toBe('2026-03-06');
  });

  it('steps over a weekend and holidays on both sides of it', () => {
    const calendar: PlantCalendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: ['2026-04-03', '2026-04-06'] };

    // Thursday 2 April → Fri 3 (holiday), Sat, Sun, Mon 6 (holiday) → Tuesday 7 April is one working day on.
    expect(addWorkingDays('2026-04-02', 1, calendar)).toBe('2026-04-07');
    expect(addWorkingDays('2026-04-07', -2, calendar)).toBe('2026-04-01');
  });

  it('returns the date itself for an offset of zero, even on a non-working day', () => {
    expect(addWorkingDays('2026-03-07', 0, MONDAY_TO_FRIDAY)).toBe('2026-03-07');
  });

  it('matches a day-by-day reference built on date-fns for random calendars and offsets', () => {
    const referenceAdd = (start: string, offset: number, calendar: PlantCalendar): string => {
      const holidays = new Set(calendar.holidays);
      let date = localDate(start);
      let remaining = Math.abs(offset);
      while (remaining > 0) {
        date = addDays(date, Math.sign(offset));
        if (calendar.workingWeekdays.includes(getISODay(date)) && !holidays.has(isoOf(date))) remaining -= 1;
      }
      return isoOf(date);
    };
    const calendars = fc.record({
      workingWeekdays: fc.uniqueArray(fc.integer({ min: 1, max: 7 }), { minLength: 1, maxLength: 7 }),
      holidays: fc.uniqueArray(
        fc.integer({ min: 0, max: 120 }).map((offset) => addCalendarDays('2026-01-01', offset)),
        { maxLength: 30 },
      ),
    });

    fc.assert(
      fc.property(
        calendars,
        fc.integer({ min: 0, max: 120 }),
        fc.integer({ min: -25, max: 25 }),
        (calendar, start, offset) => {
          const date = addCalendarDays('2026-01-01', start);
          expect(addWorkingDays(date, offset, calendar)).toBe(referenceAdd(date, offset, calendar));
        },
      ),
    );
  });

  it('throws instead of looping when the calendar has no working weekday', () => {
    expect(() => addWorkingDays('2026-03-02', 1, { workingWeekdays: [], holidays: [] })).toThrow(/no working weekdays/);
    expect(() => isWorkingDay('2026-03-02', { workingWeekdays: [8], holidays: [] })).toThrow(RangeError);
  });
});

describe('isWorkingDay and nextWorkingDay', () => {
  const calendar: PlantCalendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: ['2026-12-25'] };

  it('treats holidays and unworked weekdays as non-working', () => {
    expect(isWorkingDay('2026-12-24', calendar)).toBe(true);
    expect(isWorkingDay('2026-12-25', calendar)).toBe(false);
    expect(isWorkingDay('2026-12-26', calendar)).toBe(false);
  });

  it('moves a non-working day to the next working day and leaves a working day alone', () => {
    expect(nextWorkingDay('2026-12-25', calendar)).toBe('2026-12-28');
    expect(nextWorkingDay('2026-12-24', calendar)).toBe('2026-12-24');
  });
});

describe('workingDaysBetween', () => {
  it('lists the working days with both ends included', () => {
    const calendar: PlantCalendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: ['2026-04-03', '2026-04-06'] };

    expect(workingDaysBetween('2026-04-01', '2026-04-08', calendar)).toEqual([
      '2026-04-01',
      '2026-04-02',
      '2026-04-07',
      '2026-04-08',
    ]);
  });

  it('is empty when the start lies after the end', () => {
    expect(workingDaysBetween('2026-04-08', '2026-04-01', MONDAY_TO_FRIDAY)).toEqual([]);
  });

  it('counts as many days as addWorkingDays steps over, for a six-day week with holidays', () => {
    const calendar: PlantCalendar = { workingWeekdays: [1, 2, 3, 4, 5, 6], holidays: ['2026-05-01', '2026-05-25'] };

    const days = workingDaysBetween('2026-04-27', '2026-06-05', calendar);

    expect(addWorkingDays(days[0], days.length - 1, calendar)).toBe(days[days.length - 1]);
    expect(days.every((day) => isWorkingDay(day, calendar))).toBe(true);
  });
});
