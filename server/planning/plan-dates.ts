import { addWorkingDays, nextWorkingDay } from '../../shared/domain/calendar';
import type { PlantCalendar } from '../../shared/domain/types';
import { BadRequestError } from '../errors';

/** Today's date on the server's clock, as the plant's calendar day. */
export function plantToday(now = new Date()): string {
  const local = new Date(now.getTime() - now.getTimezoneOffset() * 60_000);
  return local.toISOString().slice(0, 10);
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
