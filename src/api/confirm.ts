import type { ConfirmAnswer, Confirmation, ConfirmResult } from '@shared/schemas/releases';
import { http } from './http';

/** Where an answer comes from: the e-mailed link (no account), or a signed-in supplier's release. */
export type ConfirmSource = { token: string } | { releaseNumber: string };

function pathOf(source: ConfirmSource): string {
  return 'token' in source
    ? `/confirm/${encodeURIComponent(source.token)}`
    : `/releases/${encodeURIComponent(source.releaseNumber)}/confirmation`;
}

// Through the link the supplier has no account: no session token is sent, and a 401 could never
// mean "your session ended".

/** The release to answer. */
export function getConfirmation(source: ConfirmSource): Promise<Confirmation> {
  return http.get<Confirmation>(pathOf(source), { anonymous: 'token' in source });
}

/** Sends the supplier's answer; the link is spent when it succeeds. */
export function sendConfirmation(source: ConfirmSource, answer: ConfirmAnswer): Promise<ConfirmResult> {
  return http.post<ConfirmResult>(pathOf(source), answer, { anonymous: 'token' in source });
}
