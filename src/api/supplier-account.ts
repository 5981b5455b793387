import type { Release } from '@shared/schemas/releases';
import type { ReceivingClaim, SupplierForecast } from '@shared/schemas/supplier-account';
import { download } from './download';
import { http } from './http';

/** Demand for one supplier's parts by day, zoned firm, planned and forecast. */
export function getSupplierForecast(code: string, signal?: AbortSignal): Promise<SupplierForecast> {
  return http.get<SupplierForecast>(`/suppliers/${encodeURIComponent(code)}/forecast`, { signal });
}

/** Downloads the same forecast as CSV; resolves the file name used. */
export function downloadSupplierForecastCsv(code: string): Promise<string> {
  return download(`/suppliers/${encodeURIComponent(code)}/forecast`, `forecast-${code}.csv`, { format: 'csv' });
}

/** What the dock recorded short, over, damaged or as the wrong part against the supplier's releases. */
export function getReceivingClaims(code: string, signal?: AbortSignal): Promise<ReceivingClaim[]> {
  return http.get<ReceivingClaim[]>(`/suppliers/${encodeURIComponent(code)}/claims`, { signal });
}

/** The signed-in supplier's releases (the server keeps them to its own). */
export function getOwnReleases(signal?: AbortSignal): Promise<Release[]> {
  return http.get<Release[]>('/releases', { signal });
}
