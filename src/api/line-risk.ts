import type { LineRiskReport, SlotsPageDto } from '@shared/schemas/line-risk';
import { http, requestRaw } from './http';

/** The dates a line-risk view covers, ISO `YYYY-MM-DD`, both inclusive. */
export interface LineRiskRange {
  from: string;
  to: string;
}

/** Units at risk, short parts and rescues over the horizon, for the Line risk screen. */
export function getLineRisk(range: LineRiskRange, signal?: AbortSignal): Promise<LineRiskReport> {
  return http.get<LineRiskReport>('/line-risk', { query: { ...range }, signal });
}

/** Units `offset` … `offset + limit - 1` (in build order) that lack one short part over the horizon. */
export function getPartSlots(
  partNumber: string,
  range: LineRiskRange,
  page: { offset: number; limit: number },
  signal?: AbortSignal,
): Promise<SlotsPageDto> {
  return http.get<SlotsPageDto>(`/line-risk/parts/${encodeURIComponent(partNumber)}/slots`, {
    query: { ...range, offset: page.offset, limit: page.limit },
    signal,
  });
}

/**
 * The line-risk engine's inputs over a horizon (parts, BOM, units not built, firm receipts, loops,
 * calendar), for a what-if in the browser: as JSON bytes, parsed where the engine runs.
 */
export async function getEngineInputBytes(range: LineRiskRange, signal?: AbortSignal): Promise<ArrayBuffer> {
  const response = await requestRaw('/line-risk/engine-input', {
    query: { ...range },
    signal,
    accept: 'application/json',
  });
  return response.arrayBuffer();
}
