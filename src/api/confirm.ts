import type { ConfirmAnswer, Confirmation, ConfirmResult } from '@shared/schemas/releases';
import { http } from './http';

// The supplier arrives from an e-mail without an account: no session token is sent, and a 401
// could never mean "your session ended".

/** The release behind a confirmation link. */
export function getConfirmation(token: string): Promise<Confirmation> {
  return http.get<Confirmation>(`/confirm/${encodeURIComponent(token)}`, { anonymous: true });
}

/** Sends the supplier's answer; the link is spent when it succeeds. */
export function sendConfirmation(token: string, answer: ConfirmAnswer): Promise<ConfirmResult> {
  return http.post<ConfirmResult>(`/confirm/${encodeURIComponent(token)}`, answer, { anonymous: true });
}
