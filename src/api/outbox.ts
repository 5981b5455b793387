import type { CapturedMail, OutboxMessage } from '@shared/schemas/outbox';
import { http } from './http';

/** The newest outgoing notices and their delivery state (admin). */
export function listOutbox(signal?: AbortSignal): Promise<OutboxMessage[]> {
  return http.get<OutboxMessage[]>('/outbox', { signal });
}

/**
 * What the embedded demo mail server received, newest first (admin). Rejects with a 404 ApiError
 * when SMTP_URL points at a real server and nothing is captured.
 */
export function listCapturedMail(signal?: AbortSignal): Promise<CapturedMail[]> {
  return http.get<CapturedMail[]>('/dev/mail', { signal });
}
