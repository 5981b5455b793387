import { createHash, randomBytes } from 'node:crypto';
import { IsNull, MoreThan, type EntityManager } from 'typeorm';
import { ConfirmationTokenEntity } from './confirmation-token.entity';

/** A confirmation link stays valid this long after it is sent. */
export const CONFIRMATION_TOKEN_TTL_DAYS = 7;

const TOKEN_BYTES = 32;
const DAY_MS = 24 * 60 * 60 * 1000;

/** SHA-256 of the token as hex: what the table stores and what a presented token is looked up by. */
export function hashConfirmationToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/**
 * Issues a new single-use link for a release inside the caller's transaction and returns the raw
 * token, which exists only in the e-mail from here on. Earlier links of the release that were not
 * used stop working at once (they report as expired), so only the newest e-mail is live.
 */
export async function issueConfirmationToken(
  manager: EntityManager,
  releaseId: number,
  now = new Date(),
): Promise<{ token: string; expiresAt: string }> {
  await revokeConfirmationTokens(manager, releaseId, now);
  const token = randomBytes(TOKEN_BYTES).toString('base64url');
  const expiresAt = new Date(now.getTime() + CONFIRMATION_TOKEN_TTL_DAYS * DAY_MS).toISOString();
  await manager.insert(ConfirmationTokenEntity, {
    releaseId,
    tokenHash: hashConfirmationToken(token),
    expiresAt,
    usedAt: null,
  });
  return { token, expiresAt };
}

/** Ends every unused link of a release now (the release was cancelled or answered another way). */
export async function revokeConfirmationTokens(
  manager: EntityManager,
  releaseId: number,
  now = new Date(),
): Promise<void> {
  const at = now.toISOString();
  await manager.update(
    ConfirmationTokenEntity,
    { releaseId, usedAt: IsNull(), expiresAt: MoreThan(at) },
    { expiresAt: at },
  );
}
