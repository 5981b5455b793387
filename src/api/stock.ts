import type { StockChange, StockCountRequest, StockItem, StockLedger, StockScrapRequest } from '@shared/schemas/stock';
import { http } from './http';

/** Every part's on-hand, flagged when negative or due a count. */
export function listStock(signal?: AbortSignal): Promise<StockItem[]> {
  return http.get<StockItem[]>('/stock', { signal });
}

/** A part's movements between two days (inclusive, ISO `YYYY-MM-DD`) with the running balance. */
export function fetchLedger(
  partNumber: string,
  range: { from: string; to: string },
  signal?: AbortSignal,
): Promise<StockLedger> {
  return http.get<StockLedger>(`/stock/${encodeURIComponent(partNumber)}/movements`, { query: { ...range }, signal });
}

/** Records a count; the difference to on-hand is posted as a count adjustment. */
export function recordCount(count: StockCountRequest): Promise<StockChange> {
  return http.post<StockChange>('/stock/counts', count);
}

/** Records scrap that really happened; it leaves stock with its reason. */
export function recordScrap(scrap: StockScrapRequest): Promise<StockChange> {
  return http.post<StockChange>('/stock/scrap', scrap);
}
