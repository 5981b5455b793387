import { Router } from 'express';
import type { ChangeNotice } from '../db/change-feed';
import { defineRoute, type RouteDeps } from '../http/route';
import { READ_ROLES } from '../http/roles';
import { readVersion, type VersionChannel } from '../settings/versions';

const HEARTBEAT_MS = 25_000;
const CHANNELS: VersionChannel[] = ['planning', 'dock'];

/**
 * Server-sent events telling open screens that planning inputs or the receiving board changed.
 * Each stream starts with the current versions, then gets a notice the moment a change commits.
 */
export function createEventsRouter(deps: RouteDeps): Router {
  const router = Router();
  const { db } = deps;

  defineRoute(router, deps, {
    method: 'get',
    path: '/events',
    summary:
      'Server-sent events: `planning` with {version} whenever a planning input changes, `dock` with {version} whenever the receiving board changes',
    access: READ_ROLES,
    produces: ['text/event-stream'],
    // A stream stays open for hours; it must not hold a read snapshot that long.
    unit: 'none',
    handler: async ({ req, res }) => {
      const send = (channel: string, payload: unknown) =>
        res.write(`event: ${channel}\ndata: ${JSON.stringify(payload)}\n\n`);
      // Subscribe before reading the versions, so a change committed in between is not missed.
      const queued: ChangeNotice[] = [];
      let live = false;
      const unsubscribe = db.changes.subscribe((notice) => {
        if (!CHANNELS.includes(notice.channel as VersionChannel)) return;
        if (live) send(notice.channel, notice.payload);
        else queued.push(notice);
      });
      const heartbeat = setInterval(() => res.write(': keep-alive\n\n'), HEARTBEAT_MS);
      req.on('close', () => {
        unsubscribe();
        clearInterval(heartbeat);
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
