import type { CalendarUpdate, VersionedCalendar } from '@shared/schemas/master-data';
import { http } from './http';

/** The plant calendar: working ISO weekdays (1 = Monday) and holiday dates. */
export function fetchCalendar(signal?: AbortSignal): Promise<VersionedCalendar> {
  return http.get<VersionedCalendar>('/calendar', { signal });
}

/**
 * Replaces the whole calendar (admin, planner) as it was shown (`version`), naming the holidays in
 * `holidayNames` (the others keep theirs); bad input rejects with a 400 ApiError carrying zod
 * issues, a change someone made first with 409 `stale`.
 */
export function saveCalendar(calendar: CalendarUpdate, version: string): Promise<VersionedCalendar> {
  return http.put<VersionedCalendar>('/calendar', calendar, { ifMatch: version });
}
