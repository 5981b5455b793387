import type { Calendar } from '@shared/schemas/master-data';
import { http } from './http';

/** The plant calendar: working ISO weekdays (1 = Monday) and holiday dates. */
export function fetchCalendar(signal?: AbortSignal): Promise<Calendar> {
  return http.get<Calendar>('/calendar', { signal });
}

/** Replaces the whole calendar (admin, planner); bad input rejects with a 400 ApiError carrying zod issues. */
export function saveCalendar(calendar: Calendar): Promise<Calendar> {
  return http.put<Calendar>('/calendar', calendar);
}
