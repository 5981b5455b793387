import { importRowErrorSchema, type ImportKind, type ImportResult, type ImportRowError } from '@shared/schemas/imports';
import type { Role } from '@shared/schemas/user';
import { type ApiError, requestRaw } from './http';
import { uploadFile } from './upload';

/**
 * Who may load each kind, as the server enforces it (PRODUCT.md, role rules): master data and
 * stock counts are the buyer's, the build sequence the planner's; admins may load everything.
 */
export const IMPORT_KIND_ROLES: Record<ImportKind, readonly Role[]> = {
  suppliers: ['admin', 'buyer'],
  parts: ['admin', 'buyer'],
  bom: ['admin', 'buyer'],
  schedule: ['admin', 'planner'],
  'on-hand': ['admin', 'buyer'],
  'open-orders': ['admin', 'buyer'],
};

/** Sends a CSV file to `POST /api/imports/<kind>`; a file with any bad row rejects with a 422 ApiError. */
export function importCsv(
  kind: ImportKind,
  file: File,
  options: { onProgress?: (fraction: number) => void; signal?: AbortSignal } = {},
): Promise<ImportResult> {
  return uploadFile<ImportResult>(`/imports/${kind}`, file, file.name, options);
}

/** The row-level problems of a refused import (422), in the order the server listed them. */
export function importProblems(error: ApiError): ImportRowError[] {
  if (error.status !== 422) return [];
  return error.details.flatMap((detail) => {
    const parsed = importRowErrorSchema.safeParse(detail);
    return parsed.success ? [parsed.data] : [];
  });
}

/** The CSV template of a kind (header and example rows), as a Blob to save. */
export async function downloadImportTemplate(kind: ImportKind): Promise<Blob> {
  const response = await requestRaw(`/imports/templates/${kind}`, { accept: 'text/csv' });
  return response.blob();
}
