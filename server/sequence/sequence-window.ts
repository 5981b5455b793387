import { addWorkingDays, isoWeekday, nextWorkingDay, WorkingCalendar } from '../../shared/domain/calendar';
import { fromDayNumber, toDayNumber } from '../../shared/domain/date';
import type { IsoDate, PlantCalendar } from '../../shared/domain/types';
import { formatDay } from '../../shared/format/dates';
import type { SequenceSettings } from '../../shared/schemas/sequence';

const WEEKDAY_NAMES = ['', 'Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'];
/** How far back and ahead a build date may lie; wider is almost always a typo in the year. */
export const SCHEDULE_YEARS_BACK = 1;
export const SCHEDULE_YEARS_AHEAD = 2;

/**
 * Why a unit cannot be built on `date`, or null when it can: the one rule for a unit added or moved
 * on the board and for a row of the schedule import.
 */
export function buildDateProblem(
  date: IsoDate,
  today: IsoDate,
  working: WorkingCalendar,
  holidays: ReadonlySet<string>,
): string | null {
  if (date < shiftYears(today, -SCHEDULE_YEARS_BACK))
    return `${date} is more than ${SCHEDULE_YEARS_BACK} year in the past`;
  if (date > shiftYears(today, SCHEDULE_YEARS_AHEAD)) return `${date} is more than ${SCHEDULE_YEARS_AHEAD} years ahead`;
  if (working.isWorking(toDayNumber(date))) return null;
  return holidays.has(date)
    ? `${date} is a plant holiday`
    : `${date} is a ${WEEKDAY_NAMES[isoWeekday(date)]}, not a working day of the plant calendar`;
}

/**
 * The last day of the frozen window: the first `frozenWindowDays` working days counted from
 * today, today itself being day 1 when it is a working day (on a Saturday the window starts
 * Monday). Null when the window is 0 days long.
 */
export function frozenUntil(
  today: IsoDate,
  frozenWindowDays: number,
  calendar: PlantCalendar | WorkingCalendar,
): IsoDate | null {
  if (frozenWindowDays <= 0) return null;
  return addWorkingDays(nextWorkingDay(today, calendar), frozenWindowDays - 1, calendar);
}

/** What every sequence rule needs to know about the plant today. */
export class SequenceRules {
  readonly working: WorkingCalendar;
  readonly frozenUntil: IsoDate | null;
  private readonly holidays: ReadonlySet<string>;

  constructor(
    calendar: PlantCalendar,
    readonly settings: SequenceSettings,
    readonly today: IsoDate,
  ) {
    this.working = new WorkingCalendar(calendar);
    this.holidays = new Set(calendar.holidays);
    this.frozenUntil = frozenUntil(today, settings.frozenWindowDays, this.working);
  }

  isWorking(date: IsoDate): boolean {
    return this.working.isWorking(toDayNumber(date));
  }

  /** Days before today count as built, so they are as fixed as the frozen window itself. */
  isFrozen(date: IsoDate): boolean {
    return date < this.today || (this.frozenUntil !== null && date <= this.frozenUntil);
  }

  isPast(date: IsoDate): boolean {
    return date < this.today;
  }

  /** Why a day cannot take units, or null when it can. */
  dateProblem(date: IsoDate): string | null {
    return buildDateProblem(date, this.today, this.working, this.holidays);
  }

  /** One sentence naming the frozen days a change would touch. */
  frozenMessage(dates: IsoDate[]): string {
    const past = dates.filter((date) => this.isPast(date));
    const window = dates.filter((date) => !this.isPast(date));
    const parts: string[] = [];
    if (window.length > 0) {
      const days = this.settings.frozenWindowDays;
      parts.push(
        `${listDates(window)} ${window.length === 1 ? 'is' : 'are'} inside the frozen window (${days} working ${days === 1 ? 'day' : 'days'})`,
      );
    }
    if (past.length > 0)
      parts.push(`${listDates(past)} ${past.length === 1 ? 'is' : 'are'} before today and count as built`);
    return `${parts.join('; ')}. Only a deliberate planner change may alter ${dates.length === 1 ? 'it' : 'them'}: confirm it with allowFrozen.`;
  }
}

/** Dates with their weekday, as people read them: "Tue 2026-01-13". */
export function listDates(dates: IsoDate[]): string {
  return dates.map(formatDay).join(', ');
}

/** The same month and day `years` years away (29 February becomes 1 March in a common year). */
function shiftYears(date: IsoDate, years: number): IsoDate {
  const [year, month, day] = date.split('-').map(Number);
  return fromDayNumber(Date.UTC(year + years, month - 1, day) / 86_400_000);
}
