import type { BuildResponse, CloseDayResponse, Kit } from '@shared/schemas/builds';
import { IDEMPOTENCY_HEADER } from '@shared/schemas/idempotency';
import type { SequenceBoard, SequenceDay } from '@shared/schemas/sequence';
import { http } from './http';

/** The line's day: the first day of the board from `date` (default: the server's today). */
export interface LineDay {
  today: string;
  day: SequenceDay | null;
}

/**
 * The units of one day with their status, read from the build sequence; without a date, the first
 * working day from the server's today (the next one on a weekend).
 */
export async function fetchLineDay(date: string | null, signal?: AbortSignal): Promise<LineDay> {
  const query = date ? { from: date, to: date } : { days: 1 };
  const board = await http.get<SequenceBoard>('/sequence', { query, signal });
  return { today: board.today, day: board.days[0] ?? null };
}

/**
 * Reports a unit built; its parts are backflushed once. The same `idempotencyKey` sent again (a
 * retry after a lost answer) returns the first result; a unit already built is 409 `already_built`.
 */
export function reportBuilt(serial: string, idempotencyKey: string): Promise<BuildResponse> {
  return http.post<BuildResponse>('/builds', { serial }, { headers: { [IDEMPOTENCY_HEADER]: idempotencyKey } });
}

/** Undoes a build with a reason; the line may undo only its own build of the last 30 minutes (else 403). */
export function undoBuild(serial: string, reason: string): Promise<BuildResponse> {
  return http.delete<BuildResponse>(`/builds/${encodeURIComponent(serial)}`, { query: { reason } });
}

/** Reports every unit of the day not yet built as built, in sequence order. */
export function closeDay(date: string): Promise<CloseDayResponse> {
  return http.post<CloseDayResponse>('/builds/close-day', { date });
}

/** The unit's kit went to the line: planned → started. */
export function startUnit(serial: string): Promise<BuildResponse> {
  return http.post<BuildResponse>(`/builds/${encodeURIComponent(serial)}/start`);
}

/** The components of one unit, grouped by point of use. */
export function fetchKit(serial: string, signal?: AbortSignal): Promise<Kit> {
  return http.get<Kit>(`/builds/${encodeURIComponent(serial)}/kit`, { signal });
}

/** The kits of every unit of a day, in sequence order. */
export function fetchDayKits(date: string, signal?: AbortSignal): Promise<Kit[]> {
  return http.get<Kit[]>('/builds/kits', { query: { date }, signal });
}
