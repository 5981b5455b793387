import type { OverCheckResponse } from '@shared/schemas/receipts';
import { http } from './http';

/** What a count of `qty` on a release line would do: over the supplier's tolerance or not, and where kept excess goes. */
export function checkOver(releaseLineId: number, qty: number, signal?: AbortSignal): Promise<OverCheckResponse> {
  const query = new URLSearchParams({ releaseLineId: String(releaseLineId), qty: String(qty) });
  return http.get<OverCheckResponse>(`/receipts/over-check?${query.toString()}`, { signal });
}
