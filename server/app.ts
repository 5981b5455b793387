import cookieParser from 'cookie-parser';
import express, { Router, type Express } from 'express';
import helmet from 'helmet';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { AuthService } from './auth/auth.service';
import { createAuthRouter } from './auth/auth.router';
import { createCalendarRouter } from './calendar/calendar.router';
import { CalendarService } from './calendar/calendar.service';
import { createConfirmRouter } from './releases/confirm.router';
import { createDockRouter } from './dock/dock.router';
import { NotFoundError } from './errors';
import { createEventsRouter } from './events/events.router';
import { createOpenApiRegistry, generateOpenApiDocument } from './http/openapi';
import { defineRoute } from './http/route';
import type { FakeSmtp } from './outbox/fake-smtp';
import { createKanbanRouter } from './loops/loops.router';
import { createLineRiskRouter } from './line-risk/line-risk.router';
import { createMailRouter } from './outbox/outbox.router';
import { createMasterDataRouter } from './master-data/master-data.router';
import { createPerformanceRouter } from './supplier-performance/supplier-performance.router';
import { MasterDataService } from './master-data/master-data.service';
import { authenticate } from './auth/authenticate';
import { ForecastMailService } from './horizon/forecast-mail.service';
import { createPlanningRouter } from './horizon/horizon.router';
import { PlanningService } from './planning/planning.service';
import { errorHandler } from './http/error-handler';
import { createImportsRouter } from './imports/imports.router';
import { createReleasesRouter } from './releases/releases.router';
import { ReleasesService } from './releases/releases.service';
import { createReceiptsRouter } from './dock/receipts.router';
import { createSequenceRouter } from './sequence/sequence.router';
import { createUsersRouter } from './users/users.router';
import { UsersService } from './users/users.service';

export interface AppOptions {
  jwtSecret: string;
  jwtTtl?: string;
  loginFailureLimit?: number;
  fakeSmtp?: FakeSmtp | null;
  /** Folder of the built client to serve; omitted in API tests. */
  clientDir?: string;
  /** Base URL of the web client, for links in e-mails (release confirmation); APP_URL in production. */
  appUrl?: string;
  /** Folder for packing-slip files; defaults to `attachments` beside the database file (data/attachments in memory). */
  attachmentsDir?: string;
}

/** Builds the whole HTTP application over an open data source; never listens (tests use supertest). */
export function createApp(dataSource: DataSource, options: AppOptions): Express {
  const app = express();
  const registry = createOpenApiRegistry();
  const api = Router();

  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
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
    }),
  );
  app.use(express.json({ limit: '1mb' }));
  app.use(cookieParser());
  app.use('/api', authenticate(dataSource, options.jwtSecret));

  defineRoute(api, registry, {
    method: 'get',
    path: '/health',
    summary: 'Liveness check',
    access: 'public',
    response: z.object({ status: z.literal('ok') }),
    handler: () => ({ status: 'ok' }),
  });

  const authService = new AuthService(dataSource, options.jwtSecret, options.jwtTtl ?? '8h');
  api.use(createAuthRouter({ authService, registry, loginFailureLimit: options.loginFailureLimit ?? 10 }));
  api.use(createUsersRouter(new UsersService(dataSource), registry));
  api.use(createCalendarRouter(new CalendarService(dataSource), registry));
  api.use(createPerformanceRouter(dataSource, registry));
  api.use(createMasterDataRouter(new MasterDataService(dataSource), registry));
  api.use(createImportsRouter(dataSource, registry));
  api.use(createSequenceRouter(dataSource, registry));
  const planning = new PlanningService(dataSource);
  api.use(createPlanningRouter(planning, new ForecastMailService(dataSource, planning), registry));
  api.use(createKanbanRouter(dataSource, planning, registry));
  api.use(createEventsRouter(dataSource, registry));
  api.use(createMailRouter(dataSource, options.fakeSmtp ?? null, registry));
  api.use(createLineRiskRouter(dataSource, registry));
  api.use(
    createReleasesRouter(
      new ReleasesService(dataSource, planning, { appUrl: options.appUrl ?? 'http://localhost:3000' }),
      registry,
    ),
  );
  api.use(createConfirmRouter(dataSource, registry));
  api.use(createReceiptsRouter(dataSource, registry));
  api.use(createDockRouter(dataSource, registry, options.attachmentsDir));

  const openApiDocument = generateOpenApiDocument(registry);
  api.get('/openapi.json', (_req, res) => {
    res.json(openApiDocument);
  });
  api.use(() => {
    throw new NotFoundError('No such API route.');
  });
  app.use('/api', api);

  if (options.clientDir && existsSync(join(options.clientDir, 'index.html'))) {
    const clientDir = options.clientDir;
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    app.get('/{*splat}', (_req, res) => {
      res.sendFile(join(clientDir, 'index.html'));
    });
  }

  app.use(errorHandler);
  return app;
}
