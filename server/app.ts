import compression from 'compression';
import cookieParser from 'cookie-parser';
import express, { Router, type Express, type Response } from 'express';
import helmet from 'helmet';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { z } from 'zod';
import { createAuditRouter } from './audit/audit.router';
import { createAuthRouter } from './auth/auth.router';
import { authenticate } from './auth/authenticate';
import { createBuildsRouter } from './builds/builds.router';
import { createCalendarRouter } from './calendar/calendar.router';
import type { Database } from './db/database';
import { createDockRouter } from './dock/dock.router';
import { createReceiptsRouter } from './dock/receipts.router';
import { NotFoundError } from './errors';
import { createEventsRouter } from './events/events.router';
import { createHorizonRouter } from './horizon/horizon.router';
import { errorHandler } from './http/error-handler';
import { createOpenApiRegistry, generateOpenApiDocument } from './http/openapi';
import { defineRoute, type RouteDeps } from './http/route';
import { createImportsRouter } from './imports/imports.router';
import { createLineRiskRouter } from './line-risk/line-risk.router';
import { createLoopsRouter } from './loops/loops.router';
import { createMasterDataRouter } from './master-data/master-data.router';
import type { FakeSmtp } from './outbox/fake-smtp';
import { createOutboxRouter } from './outbox/outbox.router';
import { createOverviewRouter } from './overview/overview.router';
import { createConfirmRouter } from './releases/confirm.router';
import { createShipNoticesRouter } from './ship-notices/ship-notices.router';
import { createReleasesRouter } from './releases/releases.router';
import { createSequenceRouter } from './sequence/sequence.router';
import { createServices, type ServiceOptions, type Services } from './services';
import { createStockRouter } from './stock/stock.router';
import { createSupplierPerformanceRouter } from './supplier-performance/supplier-performance.router';
import { createSupplierAccountRouter } from './supplier-account/supplier-account.router';
import { createUsersRouter } from './users/users.router';

export interface AppOptions extends ServiceOptions {
  fakeSmtp?: FakeSmtp | null;
  /** The reverse proxies trusted for the client's address and scheme (TRUST_PROXY); default loopback. */
  trustProxy?: string | number;
  /** Folder of the built client to serve; omitted in API tests. */
  clientDir?: string;
}

/**
 * Builds the whole HTTP application over an open database; never listens (tests use supertest).
 * `services` are built here unless the caller (the server, which also runs jobs on them) passes its own.
 */
export function createApp(
  db: Database,
  options: AppOptions,
  services: Services = createServices(db, options),
): Express {
  const app = express();
  const deps: RouteDeps = { registry: createOpenApiRegistry(), db };
  const api = Router();

  app.disable('x-powered-by');
  app.set('trust proxy', options.trustProxy ?? 'loopback');
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // Element Plus positions popovers with inline styles; scripts stay 'self' only.
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'upgrade-insecure-requests': null,
        },
      },
      // Set below, and only over HTTPS: over plain HTTP the header is meaningless at best.
      strictTransportSecurity: false,
    }),
  );
  app.use((req, res, next) => {
    if (req.secure) res.setHeader('Strict-Transport-Security', 'max-age=31536000; includeSubDomains');
    next();
  });
  // An event stream must reach the browser as each event is written, not when a buffer fills.
  app.use(
    compression({
      filter: (req, res) =>
        !String(res.getHeader('Content-Type') ?? '').startsWith('text/event-stream') && compression.filter(req, res),
    }),
  );
  app.use(express.json({ limit: '1mb' }));
  app.use(cookieParser());
  app.use('/api', authenticate(services.auth));

  defineRoute(api, deps, {
    method: 'get',
    path: '/health',
    summary: 'Liveness check',
    access: 'public',
    unit: 'none',
    response: z.object({ status: z.literal('ok') }),
    handler: () => ({ status: 'ok' }),
  });

  api.use(createAuthRouter(services, deps));
  api.use(createUsersRouter(services, deps));
  api.use(createCalendarRouter(services, deps));
  api.use(createSupplierPerformanceRouter(services, deps));
  api.use(createSupplierAccountRouter(services, deps));
  api.use(createMasterDataRouter(services, deps));
  api.use(createImportsRouter(services, deps));
  api.use(createSequenceRouter(services, deps));
  api.use(createHorizonRouter(services, deps));
  api.use(createLoopsRouter(services, deps));
  api.use(createEventsRouter(services, deps));
  api.use(createOutboxRouter(services, deps, options.fakeSmtp ?? null));
  api.use(createLineRiskRouter(services, deps));
  api.use(createReleasesRouter(services, deps));
  api.use(createConfirmRouter(services, deps));
  api.use(createShipNoticesRouter(services, deps));
  api.use(createReceiptsRouter(services, deps));
  api.use(createDockRouter(services, deps));
  api.use(createStockRouter(services, deps));
  api.use(createBuildsRouter(services, deps));
  api.use(createOverviewRouter(services, deps));
  api.use(createAuditRouter(services, deps));

  const openApiDocument = generateOpenApiDocument(deps.registry);
  api.get('/openapi.json', (_req, res) => {
    res.json(openApiDocument);
  });
  api.use(() => {
    throw new NotFoundError('No such API route.');
  });
  app.use('/api', api);

  if (options.clientDir && existsSync(join(options.clientDir, 'index.html'))) {
    const clientDir = options.clientDir;
    app.use(express.static(clientDir, { index: false, setHeaders: setStaticCaching }));
    app.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(join(clientDir, 'index.html'));
    });
  }

  app.use(errorHandler);
  return app;
}

/**
 * Vite names every built asset after a hash of its content, so a name never changes meaning: the
 * browser may keep it for a year without asking. The page itself (and anything unhashed) is asked
 * for again each time, so a new release is picked up at the next load.
 */
function setStaticCaching(res: Response, path: string): void {
  const hashed = /[\\/]assets[\\/][^\\/]+-[\w-]{8,}\.\w+$/.test(path);
  res.setHeader('Cache-Control', hashed ? 'public, max-age=31536000, immutable' : 'no-cache');
}
