import { randomBytes } from 'node:crypto';
import { IsNull, LessThan, Not, type EntityManager } from 'typeorm';
import { notifyAfterCommit } from '../db/database';
import { SessionEntity } from './session.entity';

export type RevokeReason = 'sign-out' | 'password-changed' | 'password-reset' | 'deactivated' | 'role-changed';

/** A change notice telling open event streams of these sessions to close. */
export interface SessionsRevoked {
  userId: number;
  /** The sessions ended; every session of the user when null. */
  sessionIds: string[] | null;
}

export const SESSIONS_CHANNEL = 'sessions';
/** Session ids (43 characters each) named in one notice of sessions ended. */
const SESSIONS_PER_NOTICE = 100;

/** Opens a session for a user until `expiresAt`; its id goes into the token. */
export async function openSession(manager: EntityManager, userId: number, expiresAt: Date): Promise<SessionEntity> {
  const session = manager.create(SessionEntity, {
    id: randomBytes(32).toString('base64url'),
    userId,
    createdAt: new Date().toISOString(),
    expiresAt: expiresAt.toISOString(),
    revokedAt: null,
    revokedReason: null,
  });
  await manager.insert(SessionEntity, session);
  return session;
}

/**
 * Ends the user's live sessions (all of them, or all but `keep`): their tokens stop working at
 * once and their open event streams close after the unit commits.
 */
export async function revokeSessions(
  manager: EntityManager,
  userId: number,
  reason: RevokeReason,
  keep?: string,
): Promise<number> {
  const live = await manager.find(SessionEntity, {
    where: { userId, revokedAt: IsNull(), ...(keep && { id: Not(keep) }) },
    select: { id: true },
  });
  if (live.length === 0) return 0;
  const ids = live.map((session) => session.id);
  await manager.update(SessionEntity, ids, { revokedAt: new Date().toISOString(), revokedReason: reason });
  // A notice travels by NOTIFY on PostgreSQL, whose payload must stay under 8,000 bytes: a
  // shared account's hundreds of sessions go out a hundred (about 4.6 kB) at a time.
  for (let start = 0; start < ids.length; start += SESSIONS_PER_NOTICE) {
    const sessionIds = ids.slice(start, start + SESSIONS_PER_NOTICE);
    notifyAfterCommit(SESSIONS_CHANNEL, { userId, sessionIds } satisfies SessionsRevoked);
  }
  return ids.length;
}

/** Days an ended session is kept past its expiry, for whoever asks why they were signed out. */
export const ENDED_SESSION_KEEP_DAYS = 30;

/**
 * Deletes the sessions that expired more than ENDED_SESSION_KEEP_DAYS before `now`: their tokens
 * expired with them, so nothing can name them any more. Returns how many went.
 */
export async function pruneExpiredSessions(manager: EntityManager, now = new Date()): Promise<number> {
  const before = new Date(now.getTime() - ENDED_SESSION_KEEP_DAYS * 86_400_000).toISOString();
  const result = await manager.delete(SessionEntity, { expiresAt: LessThan(before) });
  return result.affected ?? 0;
}
