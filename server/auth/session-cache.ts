import type { ChangeFeed } from '../db/change-feed';
import type { AuthenticatedUser } from '../http/request-user';
import { SESSIONS_CHANNEL, type SessionsRevoked } from '../users/sessions';

export interface SessionCacheLimits {
  /** How long a live session is believed without reading it again, in ms. */
  ttlMs: number;
  maxEntries: number;
}

export const SESSION_CACHE_LIMITS: SessionCacheLimits = { ttlMs: 5_000, maxEntries: 10_000 };

interface Entry {
  user: AuthenticatedUser;
  /** Epoch ms after which the session is read again: the TTL, or the session's own end if sooner. */
  until: number;
}

/**
 * Sessions found alive in the last few seconds, so that a busy client's requests do not each read
 * its session and user again. Every revocation (sign-out, password, role, deactivation) sends a
 * sessions notice: the process that committed it forgets the sessions before the revoking request
 * is answered, other nodes when PostgreSQL hands them the notice, and the TTL bounds how long a
 * notice lost with a dropped listening connection could keep one alive there. Bounded in entries,
 * the oldest going first.
 */
export class SessionCache {
  private readonly entries = new Map<string, Entry>();
  /** Counts revocations heard, so a session read as alive before one is not kept after it. */
  private revocations = 0;

  constructor(
    feeds: ChangeFeed[],
    private readonly limits: SessionCacheLimits = SESSION_CACHE_LIMITS,
    private readonly now: () => number = Date.now,
  ) {
    for (const feed of new Set(feeds)) {
      feed.subscribe((notice) => {
        if (notice.channel === SESSIONS_CHANNEL) this.forget(notice.payload as SessionsRevoked);
      });
    }
  }

  get(sessionId: string, userId: number): AuthenticatedUser | undefined {
    const entry = this.entries.get(sessionId);
    if (!entry) return undefined;
    if (entry.until <= this.now() || entry.user.id !== userId) {
      this.entries.delete(sessionId);
      return undefined;
    }
    return entry.user;
  }

  /** To pass to `set`: taken before the session is read. */
  mark(): number {
    return this.revocations;
  }

  /** Keeps a session read as alive, unless a revocation was heard since `mark` (it may be this one). */
  set(user: AuthenticatedUser, sessionExpiresAt: string, mark: number): void {
    if (mark !== this.revocations) return;
    const until = Math.min(this.now() + this.limits.ttlMs, Date.parse(sessionExpiresAt));
    this.entries.delete(user.sessionId);
    if (this.entries.size >= this.limits.maxEntries) this.entries.delete(this.entries.keys().next().value!);
    this.entries.set(user.sessionId, { user, until });
  }

  forget({ userId, sessionIds }: SessionsRevoked): void {
    this.revocations += 1;
    if (sessionIds) {
      for (const id of sessionIds) this.entries.delete(id);
      return;
    }
    for (const [id, entry] of this.entries) if (entry.user.id === userId) this.entries.delete(id);
  }

  get size(): number {
    return this.entries.size;
  }
}
