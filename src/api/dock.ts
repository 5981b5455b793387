import type { DockAttachment, DockColumn, DockItem } from '@shared/schemas/dock';
import type { ReceiptRequest, ReceiptResponse } from '@shared/schemas/receipts';
import { IDEMPOTENCY_HEADER } from '@shared/schemas/idempotency';
import { fetchFile, type DownloadedFile } from './download';
import { http } from './http';
import { uploadFile, type UploadOptions } from './upload';

/** The receiving board: a card per shipment and per day unshipped lines are expected, ordered by column then day. */
export function listDock(signal?: AbortSignal): Promise<DockItem[]> {
  return http.get<DockItem[]>('/dock', { signal });
}

/** Moves a card (by its key) to another column; 409 when a fully received card would leave the line. */
export function moveDockItem(id: string, column: DockColumn): Promise<DockItem> {
  return http.patch<DockItem>(`/dock/items/${encodeURIComponent(id)}`, { column });
}

/**
 * Records one count. The same `idempotencyKey` sent again (a double tap, a retry after a lost
 * answer) returns the first result and counts nothing twice.
 */
export function postReceipt(receipt: ReceiptRequest, idempotencyKey: string): Promise<ReceiptResponse> {
  return http.post<ReceiptResponse>('/receipts', receipt, { headers: { [IDEMPOTENCY_HEADER]: idempotencyKey } });
}

/** Attaches a packing-slip photo or PDF to a release. */
export function uploadPackingSlip(releaseId: number, file: File, options: UploadOptions = {}): Promise<DockAttachment> {
  return uploadFile<DockAttachment>(`/dock/releases/${releaseId}/attachments`, file, file.name, options);
}

/** Fetches a packing slip with the session token, for showing it in a new tab. */
export function fetchPackingSlip(attachment: DockAttachment): Promise<DownloadedFile> {
  return fetchFile(`/dock/attachments/${attachment.id}`, attachment.fileName);
}
