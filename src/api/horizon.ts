import type { DemandTableResponse, ForecastMailResponse, PlanResponse } from '@shared/schemas/horizon';
import type { BucketSize, DemandSort } from '@shared/domain/demand-table';
import { download } from './download';
import { http } from './http';

/** The horizon and supplier a demand view covers; dates are ISO `YYYY-MM-DD`, both inclusive. */
export interface DemandQuery {
  from: string;
  to: string;
  supplier?: string;
}

/** One page of the demand table: which part numbers, in what order and buckets. */
export interface DemandTableRequest extends DemandQuery {
  bucket: BucketSize;
  search?: string;
  sort: DemandSort;
  page: number;
  pageSize: number;
}

/** One page of gross demand, searched, sorted and bucketed by the server, with its totals and chart bands. */
export function getDemandTable(request: DemandTableRequest, signal?: AbortSignal): Promise<DemandTableResponse> {
  const { search, sort, ...rest } = request;
  return http.get<DemandTableResponse>('/demand/table', {
    query: {
      ...rest,
      q: search?.trim() || undefined,
      sort: sort.order ? (sort.prop ?? undefined) : undefined,
      order: sort.prop ? (sort.order ?? undefined) : undefined,
    },
    signal,
  });
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
