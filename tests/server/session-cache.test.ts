import { describe, expect, it } from 'vitest';
import { SessionCache } from '../../server/auth/session-cache';
import { ChangeFeed } from '../../server/db/change-feed';
import type { AuthenticatedUser } from '../../server/http/request-user';
import { SESSIONS_CHANNEL } from '../../server/users/sessions';

const user = (id: number, sessionId: string): AuthenticatedUser => ({
  id,
  email: `user${id}@example.com`,
  name: `User ${id}`,
  role: 'buyer',
  supplierCode: null,
  sessionId,
});
const FAR = '2999-01-01T00:00:00.000Z';

function cacheAt(limits = { ttlMs: 5_000, maxEntries: 3 }) {
  const clock = { now: Date.parse('2026-12-02T10:00:00.000Z') };
  const feed = new ChangeFeed();
  return { clock, feed, cache: new SessionCache([feed], limits, () => clock.now) };
}

describe('SessionCache', () => {
  it('believes a session for the TTL, or until the session itself ends if sooner', () => {
    const { clock, cache } = cacheAt();
    cache.set(user(1, 'a'), FAR, cache.mark());
    cache.set(user(2, 'b'), new Date(clock.now + 1_000).toISOString(), cache.mark());

    clock.now += 1_000;
    const afterOneSecond = [cache.get('a', 1), cache.get('b', 2)];
    clock.now += 4_000;

    expect(afterOneSecond).toEqual([user(1, 'a'), undefined]);
    expect(cache.get('a', 1)).toBeUndefined();
  });

  it('forgets revoked sessions the moment their notice is published: named ones, or all of a user', () => {
    const { feed, cache } = cacheAt({ ttlMs: 5_000, maxEntries: 10 });
    for (const [id, session] of [
      [1, 'a'],
      [1, 'b'],
      [2, 'c'],
      [2, 'd'],
    ] as const)
      cache.set(user(id, session), FAR, cache.mark());

    feed.publish(SESSIONS_CHANNEL, { userId: 1, sessionIds: ['a'] });
    feed.publish(SESSIONS_CHANNEL, { userId: 2, sessionIds: null });
    feed.publish('planning', { version: 7 });

    expect([cache.get('a', 1), cache.get('b', 1), cache.get('c', 2), cache.get('d', 2)]).toEqual([
      undefined,
      user(1, 'b'),
      undefined,
      undefined,
    ]);
  });

  it('does not keep a session read as alive before a revocation heard while it was read', () => {
    const { feed, cache } = cacheAt();
    const mark = cache.mark();

    feed.publish(SESSIONS_CHANNEL, { userId: 1, sessionIds: ['a'] });
    cache.set(user(1, 'a'), FAR, mark);

    expect(cache.get('a', 1)).toBeUndefined();
  });

  it('answers only for the user the token names, and holds at most maxEntries, the oldest going first', () => {
    const { cache } = cacheAt();
    for (const session of ['a', 'b', 'c', 'd']) cache.set(user(1, session), FAR, cache.mark());

    expect(cache.size).toBe(3);
    expect(cache.get('a', 1)).toBeUndefined();
    expect(cache.get('d', 1)).toEqual(user(1, 'd'));
    expect(cache.get('d', 2)).toBeUndefined();
  });
});
