import type {
  AddSequenceUnitRequest,
  ResequenceResponse,
  SequenceBoard,
  SequenceSettings,
  SequenceUnit,
  VersionedSequenceSettings,
} from '@shared/schemas/sequence';
import { http } from './http';

import type { DayOrder } from '@shared/domain/sequence';

/** The build sequence by day from `from` (default today) for `days` working days (default 10). */
export function fetchBoard(range: { from?: string; days?: number } = {}, signal?: AbortSignal): Promise<SequenceBoard> {
  return http.get<SequenceBoard>('/sequence', { query: { from: range.from, days: range.days }, signal });
}

/** The frozen window and daily capacity, with the version to send back when changing them. */
export function fetchSettings(signal?: AbortSignal): Promise<VersionedSequenceSettings> {
  return http.get<VersionedSequenceSettings>('/sequence/settings', { signal });
}

/**
 * Sets the frozen window and capacity (admin, planner) as they were shown (`version`);
 * out-of-range values reject with a 400 carrying zod issues, a change someone made first with
 * 409 `stale`.
 */
export function saveSettings(settings: SequenceSettings, version: string): Promise<VersionedSequenceSettings> {
  return http.put<VersionedSequenceSettings>('/sequence/settings', settings, { ifMatch: version });
}

/** The version of a day's order as the board showed it. */
export interface DayVersion {
  date: string;
  version: string;
}

/**
 * Gives each listed day its full new order in one change, made on the days as `basedOn` shows
 * them. A day inside the frozen window is refused (409 `frozen_window`) unless `allowFrozen` says
 * the planner confirmed it; a day over capacity is refused (409 `over_capacity`); a day someone
 * changed since is refused (409 `stale`, with the days as they are and who changed them last).
 */
export function resequenceDays(
  days: DayOrder[],
  basedOn: DayVersion[],
  allowFrozen = false,
): Promise<ResequenceResponse> {
  return http.put<ResequenceResponse>('/sequence/days', { days, basedOn, ...(allowFrozen && { allowFrozen: true }) });
}

/** Adds a unit at the end of its day; a serial already used rejects with 409. */
export function addUnit(unit: AddSequenceUnitRequest): Promise<SequenceUnit> {
  return http.post<SequenceUnit>('/sequence/units', unit);
}

/** Removes a unit; the units after it close up. */
export function removeUnit(serial: string, allowFrozen = false): Promise<void> {
  return http.delete<void>(`/sequence/units/${encodeURIComponent(serial)}`, {
    query: { allowFrozen: allowFrozen || undefined },
  });
}
