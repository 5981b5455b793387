import { describe, expect, it } from 'vitest';
import { WorkingCalendar } from '../../shared/domain/calendar';
import { buildDateProblem } from '../../server/sequence/sequence-window';

// Every day is worked, so only the years-back and years-ahead limits can refuse a date.
const everyDay = new WorkingCalendar({ workingWeekdays: [1, 2, 3, 4, 5, 6, 7], holidays: [] });
const noHolidays = new Set<string>();

describe('buildDateProblem', () => {
  it('counts two years ahead of 29 February as 1 March when that year has no 29 February', () => {
    // Gregorian rule: a year is a leap year when divisible by 4, except centuries not divisible
    // by 400 (the Gregorian calendar ISO 8601 is built on; from memory), so 2028 has a 29 February and 2030 has not.
    const today = '2028-02-29';

    const onTheLimit = buildDateProblem('2030-03-01', today, everyDay, noHolidays);
    const pastTheLimit = buildDateProblem('2030-03-02', today, everyDay, noHolidays);

    expect(onTheLimit).toBeNull();
    expect(pastTheLimit).toBe('2030-03-02 is more than 2 years ahead');
  });

  it('counts one year back from 29 February as 1 March', () => {
    const today = '2028-02-29';

    expect(buildDateProblem('2027-03-01', today, everyDay, noHolidays)).toBeNull();
    expect(buildDateProblem('2027-02-28', today, everyDay, noHolidays)).toBe(
      '2027-02-28 is more than 1 year in the past',
    );
  });
});
