import type { AuditList, AuditQuery } from '@shared/schemas/audit';
import { download } from './download';
import { http } from './http';

export type AuditFilters = Omit<AuditQuery, 'format'>;

/** The audit trail, newest first, narrowed by the filters given. */
export function fetchAudit(filters: AuditFilters, signal?: AbortSignal): Promise<AuditList> {
  return http.get<AuditList>('/audit', { query: { ...filters }, signal });
}

/** The kinds of record the trail holds, for the filter. */
export function fetchAuditKinds(signal?: AbortSignal): Promise<string[]> {
  return http.get<string[]>('/audit/kinds', { signal });
}

/** Saves the filtered trail as a CSV file; answers the file name. */
export function downloadAuditCsv(filters: AuditFilters): Promise<string> {
  return download('/audit', 'audit.csv', { ...filters, format: 'csv' });
}
