import { addWorkingDays, nextWorkingDay } from '../../shared/domain/calendar';
import { localIsoDate } from '../../shared/domain/date';
import type { PlantCalendar } from '../../shared/domain/types';
import { BadRequestError } from '../errors';

/** Today's date on the server's clock, which runs on plant time. */
export function plantToday(now = new Date()): string {
  return localIsoDate(now);
}

export const DEFAULT_HORIZON_WORKING_DAYS = 20;

/** Fills in a missing horizon: from the next working day, 20 working days long. */
export function resolveHorizon(calendar: PlantCalendar, from?: string, to?: string): { from: string; to: string } {
  const start = from ?? nextWorkingDay(plantToday(), calendar);
  const end = to ?? addWorkingDays(nextWorkingDay(start, calendar), DEFAULT_HORIZON_WORKING_DAYS - 1, calendar);
  if (end < start)
    throw new BadRequestError('to is before from.', [{ path: ['to'], message: 'must not be before from' }]);
  return { from: start, to: end };
}
