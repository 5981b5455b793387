// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { addDays, format as formatWithDateFns } from 'date-fns';
import dayjs from 'dayjs';
import { UNIT_CODES } from '@shared/schemas/master-data';
import { elementLocale, sentenceCase } from '@/format/element-locale';
import {
  DATE_PICKER_FORMAT,
  countOf,
  formatDate,
  formatDateOf,
  formatDateTime,
  formatDay,
  formatDayMonth,
  formatDayRange,
  formatFigure,
  formatFileSize,
  formatHours,
  formatMonth,
  formatPercent,
  formatQty,
  formatQtyCell,
  formatQuantity,
  formatRate,
  formatTime,
  formatTotal,
  formatUnitTotals,
  formatWeekday,
  isoDateOf,
  localToday,
  unitWord,
} from '@/format';
import { setUpDatePickers } from '@/format/date-pickers';

// date-fns (a general-purpose date library) writes the same fields with its own code; its default
// English names are the short names used here ("Wed", "Dec"). It works on local-time Dates, so
// each day is built from its parts and no time zone can shift it.
function referenceDay(iso: string, pattern: string): string {
  const [year, month, day] = iso.split('-').map(Number);
  return formatWithDateFns(new Date(year!, month! - 1, day!), pattern);
}

function everyDay(from: Date, count: number): string[] {
  return Array.from({ length: count }, (_, offset) => formatWithDateFns(addDays(from, offset), 'yyyy-MM-dd'));
}

describe('plant dates on screen', () => {
  it('writes weekday, day and short month, with the year where it matters', () => {
    // 2 December 2026 is a Wednesday (ISO 8601 calendar; the same day date-fns computes below).
    expect(formatDay('2026-12-02')).toBe('Wed 2 Dec');
    expect(formatDate('2026-12-02')).toBe('Wed 2 Dec 2026');
    expect(formatWeekday('2026-12-02')).toBe('Wed');
    expect(formatDayMonth('2026-12-02')).toBe('2 Dec');
    // 1 January 2001 was a Monday (from memory; date-fns agrees in the sweep below).
    expect(formatDate('2001-01-01')).toBe('Mon 1 Jan 2001');
    expect(formatDate('2024-02-29')).toBe('Thu 29 Feb 2024');
  });

  it('agrees with date-fns on every day of five years, leap days included', () => {
    for (const day of everyDay(new Date(2024, 0, 1), 5 * 366)) {
      expect(formatDate(day)).toBe(referenceDay(day, 'EEE d MMM yyyy'));
      expect(formatDay(day)).toBe(referenceDay(day, 'EEE d MMM'));
    }
  });

  it('gives date pickers the same style as the screens', () => {
    for (const day of everyDay(new Date(2026, 0, 1), 366)) {
      expect(dayjs(day).format(DATE_PICKER_FORMAT)).toBe(formatDate(day));
    }
  });

  it('lets a date picker read back a date typed as shown, without its weekday, or as ISO', () => {
    setUpDatePickers();
    // What Element Plus does with typed text: dayjs(text, format), then isValid().
    const typed = (text: string) => {
      const day = dayjs(text, DATE_PICKER_FORMAT);
      return day.isValid() ? day.format('YYYY-MM-DD') : null;
    };

    expect(typed('Fri 25 Dec 2026')).toBe('2026-12-25');
    expect(typed(' 25 Dec 2026 ')).toBe('2026-12-25');
    expect(typed('25 December 2026')).toBe('2026-12-25');
    expect(typed('2026-12-25')).toBe('2026-12-25');
    expect(typed('Mon 25 Dec 2026')).toBeNull();
    expect(typed('31 Feb 2026')).toBeNull();
    expect(typed('12/25/26')).toBeNull();
    // Weeks start on Monday (ISO 8601), in pickers and calendars.
    expect(dayjs('2026-12-02').startOf('week').format('YYYY-MM-DD')).toBe('2026-11-30');
  });

  it('leaves nothing for no date and shows a value that is no date as it is', () => {
    expect(formatDay(null)).toBe('');
    expect(formatDate(null)).toBe('');
    expect(formatDay('2026-02-30')).toBe('2026-02-30');
  });

  it('writes a span of days once its month is known', () => {
    expect(formatDayRange('2026-12-01', '2026-12-04')).toBe('1–4 Dec');
    expect(formatDayRange('2026-11-30', '2026-12-04')).toBe('30 Nov – 4 Dec');
    expect(formatDayRange('2026-12-07', '2026-12-07')).toBe('7 Dec');
  });

  it('writes a month with its year', () => {
    expect(formatMonth('2026-03')).toBe('Mar 2026');
    expect(formatMonth('2026-09')).toBe(referenceDay('2026-09-01', 'MMM yyyy'));
    expect(formatMonth('March')).toBe('March');
  });
});

describe('times on screen', () => {
  it('uses a 24-hour clock in this computer’s time zone', () => {
    const afternoon = new Date(2026, 11, 2, 16, 44, 9);

    expect(formatTime(afternoon)).toBe('16:44');
    expect(formatTime(afternoon, { seconds: true })).toBe('16:44:09');
    expect(formatTime(new Date(2026, 11, 2, 0, 5))).toBe('00:05');
    expect(formatDateTime(afternoon)).toBe('Wed 2 Dec 16:44');
    expect(formatDateTime(afternoon, { year: true })).toBe('Wed 2 Dec 2026 16:44');
    expect(formatDateOf(afternoon)).toBe('Wed 2 Dec 2026');
  });

  it('agrees with date-fns on stored timestamps around the clock', () => {
    const first = Date.UTC(2026, 2, 28, 0, 0);
    for (let hour = 0; hour < 72; hour += 1) {
      const stored = new Date(first + hour * 3_600_000 + 7 * 60_000).toISOString();
      const local = new Date(stored);
      expect(formatTime(stored)).toBe(formatWithDateFns(local, 'HH:mm'));
      expect(formatDateTime(stored)).toBe(formatWithDateFns(local, 'EEE d MMM HH:mm'));
    }
  });

  it('leaves nothing for no time and shows a value that is no timestamp as it is', () => {
    expect(formatDateTime(null)).toBe('');
    expect(formatTime('')).toBe('');
    expect(formatDateTime('soon')).toBe('soon');
  });

  it('takes today and the day of an instant from this computer’s calendar, as ISO dates', () => {
    const lateEvening = new Date(2026, 0, 5, 23, 59);

    expect(isoDateOf(lateEvening)).toBe('2026-01-05');
    expect(localToday(lateEvening)).toBe(formatWithDateFns(lateEvening, 'yyyy-MM-dd'));
  });
});

describe('quantities on screen', () => {
  it('writes the unit as people say it, never its UN/ECE Recommendation 20 code', () => {
    expect(formatQuantity(4, 'SET')).toBe('4 sets');
    expect(formatQuantity(1, 'SET')).toBe('1 set');
    expect(formatQuantity(12, 'H87')).toBe('12 pcs');
    expect(formatQuantity(1, 'H87')).toBe('1 pc');
    expect(formatQuantity(2, 'PR')).toBe('2 pairs');
    expect(formatQuantity(1250.5, 'KGM')).toBe('1,250.5 kg');
    expect(formatQuantity(1, 'LTR')).toBe('1 L');
    expect(formatQuantity(3.25, 'MTR')).toBe('3.25 m');
    for (const code of UNIT_CODES) expect(unitWord(code)).not.toBe(code);
  });

  it('shows an unknown code as it is rather than hiding the unit', () => {
    expect(formatQuantity(5, 'XBX')).toBe('5 XBX');
  });

  it('rounds to three decimals, blanks zeros in dense cells, and writes a sum to the decimals of its cells', () => {
    expect(formatQty(71.50000000000001)).toBe('71.5');
    expect(formatQty(0.1235)).toBe('0.124');
    expect(formatQty(0)).toBe('0');
    expect(formatQtyCell(0)).toBe('');
    expect(formatQtyCell(12000)).toBe('12,000');
    expect(formatTotal(1234.56)).toBe('1,234.56');
    expect(formatTotal(16.32)).toBe(formatQty(16.32));
    expect(formatTotal(0)).toBe('0');
  });

  it('writes sums in several units side by side, never as one number', () => {
    expect(
      formatUnitTotals([
        { uom: 'H87', qty: 1250 },
        { uom: 'KGM', qty: 56.54 },
        { uom: 'PR', qty: 1 },
      ]),
    ).toBe('1,250 pcs · 56.54 kg · 1 pair');
    expect(formatUnitTotals([])).toBe('0');
  });
});

describe('rates, counts and sizes on screen', () => {
  it('writes measured rates with one decimal and settings as given', () => {
    expect(formatRate(0.95)).toBe('95.0 %');
    // Per-mille rounding first: 0.1235 × 1000 = 123.5 rounds half up to 124.
    expect(formatRate(0.1235)).toBe('12.4 %');
    expect(formatRate(null)).toBe('—');
    expect(formatPercent(0.15)).toBe('15 %');
    expect(formatPercent(0.125)).toBe('12.5 %');
  });

  it('counts with their nouns, figures, hours and file sizes', () => {
    expect(countOf(1, 'row', 'rows')).toBe('1 row');
    expect(countOf(1250, 'row', 'rows')).toBe('1,250 rows');
    expect(formatFigure(2.3333)).toBe('2.33');
    expect(formatHours(12.46)).toBe('12.5 h');
    expect(formatHours(null)).toBe('—');
    expect(formatFileSize(820)).toBe('820 B');
    expect(formatFileSize(14.2 * 1024)).toBe('14.2 KB');
    expect(formatFileSize(5 * 1024 * 1024)).toBe('5 MB');
  });
});

describe('sentenceCase', () => {
  it('writes Element Plus labels in sentence case and keeps abbreviations', () => {
    expect(sentenceCase('Previous Month')).toBe('Previous month');
    expect(sentenceCase('OTP Input')).toBe('OTP input');
    expect(elementLocale.el.datepicker.prevMonth).toBe('Previous month');
  });
});
