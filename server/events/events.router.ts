import type { OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { defineRoute } from '../http/route';
import { READ_ROLES } from '../http/roles';
import { readDockVersion } from '../settings/versions';
import { readPlanningVersion } from '../settings/settings';

const POLL_MS = 2000;
const HEARTBEAT_MS = 25_000;

/**
 * Server-sent events telling open screens that planning inputs changed. The version is read from
 * the database rather than from an in-process emitter, so a change made by another instance (or a
 * seed script) reaches every screen too.
 */
export function createEventsRouter(dataSource: DataSource, registry: OpenAPIRegistry): Router {
  const router = Router();

  defineRoute(router, registry, {
    method: 'get',
    path: '/events',
    summary:
      'Server-sent events: `planning` with {version} whenever a planning input changes, `dock` with {version} whenever the receiving board changes',
    access: READ_ROLES,
    produces: ['text/event-stream'],
    handler: async ({ req, res }) => {
      res.writeHead(200, {
        'Content-Type': 'text/event-stream',
        'Cache-Control': 'no-cache, no-transform',
        Connection: 'keep-alive',
        'X-Accel-Buffering': 'no',
      });
      let version = await readPlanningVersion(dataSource.manager);
      res.write(`retry: 3000\nevent: planning\ndata: ${JSON.stringify({ version })}\n\n`);
      let dockVersion = await readDockVersion(dataSource.manager);
      res.write(`event: dock\ndata: ${JSON.stringify({ version: dockVersion })}\n\n`);
      const poll = setInterval(() => {
        readPlanningVersion(dataSource.manager)
          .then((current) => {
            if (current === version) return;
            version = current;
            res.write(`event: planning\ndata: ${JSON.stringify({ version })}\n\n`);
          })
          .catch(() => undefined);
        readDockVersion(dataSource.manager)
          .then((current) => {
            if (current === dockVersion) return;
            dockVersion = current;
            res.write(`event: dock\ndata: ${JSON.stringify({ version: dockVersion })}\n\n`);
          })
          .catch(() => undefined);
      }, POLL_MS);
      const heartbeat = setInterval(() => res.write(': keep-alive\n\n'), HEARTBEAT_MS);
      req.on('close', () => {
        clearInterval(poll);
        clearInterval(heartbeat);
      });
      return undefined;
    },
  });

  return router;
}
