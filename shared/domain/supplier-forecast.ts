import { addWorkingDays, nextWorkingDay, type WorkingCalendar } from './calendar';
import type { IsoDate, PlantCalendar } from './types';

/*
 * How firm a day's demand is, as a supplier should read it:
 * - firm: inside the plant's frozen window — the build sequence for those days no longer changes;
 * - planned: beyond the frozen window but inside the part's lead time — orders for these days are
 *   being released now, so the quantities are what the plan asks for today;
 * - forecast: beyond the lead time — nothing is ordered yet; the figures may still move.
 */
export type ForecastZone = 'firm' | 'planned' | 'forecast';

export const FORECAST_ZONES: readonly ForecastZone[] = ['firm', 'planned', 'forecast'];

/** Last day inside a part's lead time: `leadTimeDays` working days after today's (or the next) working day. */
export function plannedUntil(today: IsoDate, leadTimeDays: number, calendar: PlantCalendar | WorkingCalendar): IsoDate {
  return addWorkingDays(nextWorkingDay(today, calendar), leadTimeDays, calendar);
}

/** The zone of one day's demand of a part; the frozen window wins over the lead time. */
export function forecastZone(
  date: IsoDate,
  limits: { frozenUntil: IsoDate | null; plannedUntil: IsoDate },
): ForecastZone {
  if (limits.frozenUntil !== null && date <= limits.frozenUntil) return 'firm';
  return date <= limits.plannedUntil ? 'planned' : 'forecast';
}
