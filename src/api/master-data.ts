import { http } from './http';

/** The part of a supplier record that pickers need; the full record carries more. */
export interface SupplierSummary {
  code: string;
  name: string;
}

/** All suppliers, e.g. to bind a supplier contact's account to its company. */
export function listSuppliers(signal?: AbortSignal): Promise<SupplierSummary[]> {
  return http.get<SupplierSummary[]>('/suppliers', { signal });
}
