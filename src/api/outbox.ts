import type { CapturedMail, OutboxHealth, OutboxMessage } from '@shared/schemas/outbox';
import { download } from './download';
import { http } from './http';

/** The newest outgoing notices and their delivery state (admin). */
export function listOutbox(signal?: AbortSignal): Promise<OutboxMessage[]> {
  return http.get<OutboxMessage[]>('/outbox', { signal });
}

/** How many notices wait and fail, and since when the oldest failing one fails (admin). */
export function getOutboxHealth(signal?: AbortSignal): Promise<OutboxHealth> {
  return http.get<OutboxHealth>('/outbox/health', { signal });
}

/** Tries a waiting or failing notice again at once and answers it as it now stands (admin). */
export function sendOutboxMessageAgain(id: number): Promise<OutboxMessage> {
  return http.post<OutboxMessage>(`/outbox/${id}/send-again`);
}

/**
 * What the embedded demo mail server received, newest first (admin). Rejects with a 404 ApiError
 * when SMTP_URL points at a real server and nothing is captured.
 */
export function listCapturedMail(signal?: AbortSignal): Promise<CapturedMail[]> {
  return http.get<CapturedMail[]>('/dev/mail', { signal });
}

/** Saves one file attached to a captured message under its own name (admin). */
export function downloadCapturedAttachment(mailId: number, index: number, fileName: string): Promise<string> {
  return download(`/dev/mail/${mailId}/attachments/${index}`, fileName);
}

/** One notice as written (text, HTML, files), to read as its recipient does (admin). */
export function getOutboxMail(id: number, signal?: AbortSignal): Promise<CapturedMail> {
  return http.get<CapturedMail>(`/outbox/${id}/mail`, { signal });
}

/** Saves one file attached to a notice in the outbox under its own name (admin). */
export function downloadOutboxAttachment(id: number, index: number, fileName: string): Promise<string> {
  return download(`/outbox/${id}/attachments/${index}`, fileName);
}
