import { Router } from 'express';
import { tokenOf } from '../auth/authenticate';
import type { ChangeNotice } from '../db/change-feed';
import { RateLimitedError } from '../errors';
import { defineRoute, type RouteDeps } from '../http/route';
import { READ_ROLES } from '../http/roles';
import type { Services } from '../services';
import { readVersion, type VersionChannel } from '../settings/versions';
import { SESSIONS_CHANNEL, type SessionsRevoked } from '../users/sessions';

const HEARTBEAT_MS = 25_000;
/** How often a stream checks that its session still lives (expiry; revocation arrives at once). */
const SESSION_CHECK_MS = 60_000;
/** Open streams one user may hold at once (tabs, tablets); one more is refused with 429. */
export const MAX_STREAMS_PER_USER = 8;
const CHANNELS: VersionChannel[] = ['planning', 'dock'];

/**
 * Server-sent events telling open screens that planning inputs or the receiving board changed.
 * Each stream starts with the current versions, then gets a notice the moment a change commits,
 * and ends when its session ends (sign-out, password change, deactivation, expiry).
 */
export function createEventsRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const { db } = deps;
  const openStreams = new Map<number, number>();

  defineRoute(router, deps, {
    method: 'get',
    path: '/events',
    summary:
      'Server-sent events: `planning` with {version} whenever a planning input changes, `dock` with {version} whenever the receiving board changes. ' +
      `At most ${MAX_STREAMS_PER_USER} open streams per user (429 beyond).`,
    access: READ_ROLES,
    produces: ['text/event-stream'],
    // A stream stays open for hours; it must not hold a read snapshot that long.
    unit: 'none',
    handler: async ({ req, res, user }) => {
      const open = openStreams.get(user.id) ?? 0;
      if (open >= MAX_STREAMS_PER_USER) {
        throw new RateLimitedError(
          `You have ${open} live-update connections open; close a few Cardloop tabs or windows and reload.`,
        );
      }
      openStreams.set(user.id, open + 1);

      const send = (channel: string, payload: unknown) =>
        res.write(`event: ${channel}\ndata: ${JSON.stringify(payload)}\n\n`);
      const end = () => {
        if (!res.writableEnded) res.end();
      };
      // Subscribe before reading the versions, so a change committed in between is not missed.
      const queued: ChangeNotice[] = [];
      let live = false;
      const unsubscribe = db.changes.subscribe((notice) => {
        if (notice.channel === SESSIONS_CHANNEL) {
          const revoked = notice.payload as SessionsRevoked;
          const mine =
            revoked.userId === user.id && (revoked.sessionIds === null || revoked.sessionIds.includes(user.sessionId));
          if (mine) end();
          return;
        }
        if (!CHANNELS.includes(notice.channel as VersionChannel)) return;
        if (live) send(notice.channel, notice.payload);
        else queued.push(notice);
      });
      const heartbeat = setInterval(() => res.write(': keep-alive\n\n'), HEARTBEAT_MS);
      const sessionCheck = setInterval(() => {
        services.auth
          .resolve(tokenOf(req) ?? '')
          .then((still) => {
            if (!still) end();
          })
          .catch(() => undefined);
      }, SESSION_CHECK_MS);
      res.on('close', () => {
        unsubscribe();
        clearInterval(heartbeat);
        clearInterval(sessionCheck);
        const remaining = (openStreams.get(user.id) ?? 1) - 1;
        if (remaining > 0) openStreams.set(user.id, remaining);
        else openStreams.delete(user.id);
      });
      const versions = await db.read(async (manager) =>
        Promise.all(CHANNELS.map(async (channel) => [channel, await readVersion(manager, channel)] as const)),
      );
      res.writeHead(200, {
        'Content-Type': 'text/event-stream',
        'Cache-Control': 'no-cache, no-transform',
        Connection: 'keep-alive',
        'X-Accel-Buffering': 'no',
      });
      res.write('retry: 3000\n\n');
      for (const [channel, version] of versions) send(channel, { version });
      for (const notice of queued) send(notice.channel, notice.payload);
      live = true;
      return undefined;
    },
  });

  return router;
}
