import type { SupplierMonthPerformanceDto } from '@shared/schemas/supplier-performance';
import { http } from './http';

/** Months a performance view covers, `YYYY-MM`, both included; a supplier code narrows it to one. */
export interface PerformanceFilter {
  from: string;
  to: string;
  supplier?: string;
}

/** On-time, fill rate and confirmation latency per supplier and month (GET /api/suppliers/performance). */
export function getSupplierPerformance(
  filter: PerformanceFilter,
  signal?: AbortSignal,
): Promise<SupplierMonthPerformanceDto[]> {
  return http.get<SupplierMonthPerformanceDto[]>('/suppliers/performance', { query: { ...filter }, signal });
}
