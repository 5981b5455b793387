import type { DemandResponse, ForecastMailResponse, PlanResponse } from '@shared/schemas/horizon';
import { download } from './download';
import { http } from './http';

/** The horizon and supplier a demand view covers; dates are ISO `YYYY-MM-DD`, both inclusive. */
export interface DemandQuery {
  from: string;
  to: string;
  supplier?: string;
}

/** Gross demand of bought parts per working day over the horizon, optionally of one supplier. */
export function getDemand(query: DemandQuery, signal?: AbortSignal): Promise<DemandResponse> {
  return http.get<DemandResponse>('/demand', { query: { ...query }, signal });
}

/** The gross-to-net buckets of one part over the horizon, with its past-due releases. */
export function getPlan(
  part: string,
  range: { from: string; to: string },
  signal?: AbortSignal,
): Promise<PlanResponse> {
  return http.get<PlanResponse>('/plan', { query: { part, ...range }, signal });
}

/** Downloads the demand as CSV with the same filters; resolves the file name used. */
export function downloadDemandCsv(query: DemandQuery): Promise<string> {
  const fallback = `demand-${query.from}${query.supplier ? `-${query.supplier}` : ''}.csv`;
  return download('/demand', fallback, { ...query, format: 'csv' });
}

/** Queues an e-mail to the supplier with its demand over the horizon attached as CSV. */
export function sendForecastMail(query: DemandQuery & { supplier: string }): Promise<ForecastMailResponse> {
  return http.post<ForecastMailResponse>('/demand/forecast-mail', {
    supplier: query.supplier,
    from: query.from,
    to: query.to,
  });
}
