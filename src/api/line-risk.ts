import type { LineRiskInput } from '@shared/domain/line-risk';
import type { LineRiskReport } from '@shared/schemas/line-risk';
import { http } from './http';

/** The dates a line-risk view covers, ISO `YYYY-MM-DD`, both inclusive. */
export interface LineRiskRange {
  from: string;
  to: string;
}

/** Units at risk, short parts and rescues over the horizon, for the Line risk screen. */
export function getLineRisk(range: LineRiskRange, signal?: AbortSignal): Promise<LineRiskReport> {
  return http.get<LineRiskReport>('/line-risk', { query: { ...range }, signal });
}

/** The line-risk engine's inputs over a horizon (parts, BOM, units not built, firm receipts, loops, calendar), for a what-if in the browser. */
export function getEngineInput(range: LineRiskRange, signal?: AbortSignal): Promise<LineRiskInput> {
  return http.get<LineRiskInput>('/line-risk/engine-input', { query: { ...range }, signal });
}
