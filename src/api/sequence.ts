import type {
  AddSequenceUnitRequest,
  ResequenceResponse,
  SequenceBoard,
  SequenceSettings,
  SequenceUnit,
} from '@shared/schemas/sequence';
import { http } from './http';

import type { DayOrder } from '@shared/domain/sequence';

/** The build sequence by day from `from` (default today) for `days` working days (default 10). */
export function fetchBoard(range: { from?: string; days?: number } = {}, signal?: AbortSignal): Promise<SequenceBoard> {
  return http.get<SequenceBoard>('/sequence', { query: { from: range.from, days: range.days }, signal });
}

/** Sets the frozen window and capacity (admin, planner); out-of-range values reject with a 400 carrying zod issues. */
export function saveSettings(settings: SequenceSettings): Promise<SequenceSettings> {
  return http.put<SequenceSettings>('/sequence/settings', settings);
}

/**
 * Gives each listed day its full new order in one change. A day inside the frozen window is
 * refused (409 `frozen_window`) unless `allowFrozen` says the planner confirmed it; a day over
 * capacity is refused (409 `over_capacity`).
 */
export function resequenceDays(days: DayOrder[], allowFrozen = false): Promise<ResequenceResponse> {
  return http.put<ResequenceResponse>('/sequence/days', { days, ...(allowFrozen && { allowFrozen: true }) });
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
