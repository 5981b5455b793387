import type { BomLine, Part, Supplier } from '@shared/schemas/master-data';
import type { BomTree, EngineeringChange, PartDetail, PartEdit, WhereUsed } from '@shared/schemas/master-data-edit';
import { http } from './http';

/** One line of a parent's BOM as the form sends it. */
export type BomLineInput = Omit<BomLine, 'parent'>;

/** The part of a supplier record that pickers need; the full record carries more. */
export interface SupplierSummary {
  code: string;
  name: string;
}

/** All suppliers, e.g. to bind a supplier contact's account to its company. */
export function listSuppliers(signal?: AbortSignal): Promise<SupplierSummary[]> {
  return http.get<SupplierSummary[]>('/suppliers', { signal });
}

/** Every supplier with all its terms. */
export function listSupplierRecords(signal?: AbortSignal): Promise<Supplier[]> {
  return http.get<Supplier[]>('/suppliers', { signal });
}

/** One supplier. */
export function fetchSupplier(code: string, signal?: AbortSignal): Promise<Supplier> {
  return http.get<Supplier>(`/suppliers/${encodeURIComponent(code)}`, { signal });
}

/** Creates or changes a supplier; refused with the field named as a suppliers file would be. */
export function saveSupplier(code: string, fields: Record<string, unknown>): Promise<Supplier> {
  return http.put<Supplier>(`/suppliers/${encodeURIComponent(code)}`, fields);
}

/** Every part of the master. */
export function listParts(signal?: AbortSignal): Promise<Part[]> {
  return http.get<Part[]>('/parts', { signal });
}

/** One part with its low-level code, supplier name and kanban loop. */
export function fetchPart(partNumber: string, signal?: AbortSignal): Promise<PartDetail> {
  return http.get<PartDetail>(`/parts/${encodeURIComponent(partNumber)}`, { signal });
}

/** Creates or changes a part; on-hand stays with the stock ledger. */
export function savePart(partNumber: string, fields: Partial<PartEdit>): Promise<PartDetail> {
  return http.put<PartDetail>(`/parts/${encodeURIComponent(partNumber)}`, fields);
}

/** Deletes a part nothing refers to; a part in use is refused (409) with the reasons. */
export function deletePart(partNumber: string): Promise<void> {
  return http.delete<void>(`/parts/${encodeURIComponent(partNumber)}`);
}

/** The parents that use a part and the end items that reach it. */
export function fetchWhereUsed(partNumber: string, signal?: AbortSignal): Promise<WhereUsed> {
  return http.get<WhereUsed>(`/parts/${encodeURIComponent(partNumber)}/where-used`, { signal });
}

/** The multi-level BOM below a part: in effect on `date`, or every line when `date` is null. */
export function fetchBom(parent: string, date: string | null, signal?: AbortSignal): Promise<BomTree> {
  return http.get<BomTree>(`/bom/${encodeURIComponent(parent)}`, { query: { date: date ?? undefined }, signal });
}

/** Replaces every single-level line of a parent. */
export function saveBomLines(parent: string, lines: BomLineInput[]): Promise<BomTree> {
  return http.put<BomTree>(`/bom/${encodeURIComponent(parent)}`, { lines });
}

/** From a date, a replacement instead of the current line, which ends the day before. */
export function makeEngineeringChange(parent: string, change: EngineeringChange): Promise<BomTree> {
  return http.post<BomTree>(`/bom/${encodeURIComponent(parent)}/engineering-changes`, change);
}
