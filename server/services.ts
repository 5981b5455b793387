import { dirname, join } from 'node:path';
import type { Database } from './db/database';
import { AuditTrailService } from './audit/audit-trail.service';
import { AuthService } from './auth/auth.service';
import { BuildsService } from './builds/builds.service';
import { CalendarService } from './calendar/calendar.service';
import { AttachmentsService } from './dock/attachments.service';
import { DockService } from './dock/dock.service';
import { ReceiptsService } from './dock/receipts.service';
import { ForecastMailService } from './horizon/forecast-mail.service';
import { ImportsService } from './imports/imports.service';
import { LineRiskService } from './line-risk/line-risk.service';
import { LoopsService } from './loops/loops.service';
import { BomService } from './master-data/bom.service';
import { MasterDataEditService } from './master-data/master-data-edit.service';
import { MasterDataService } from './master-data/master-data.service';
import { OutboxService } from './outbox/outbox.service';
import { OverviewService } from './overview/overview.service';
import { PlanningService } from './planning/planning.service';
import { SupplierAccountService } from './supplier-account/supplier-account.service';
import { ConfirmService } from './releases/confirm.service';
import { ReleasesService } from './releases/releases.service';
import { SequenceService } from './sequence/sequence.service';
import { readShipNotices, ShipNoticesService } from './ship-notices/ship-notices.service';
import { issueShippingLink } from './ship-notices/shipping-links';
import { savePartsWithStock, StockService } from './stock/stock.service';
import { SupplierPerformanceService } from './supplier-performance/supplier-performance.service';
import { UsersService } from './users/users.service';

export interface ServiceOptions {
  jwtSecret: string;
  jwtTtl?: string;
  /** Failed sign-ins on one account (from anywhere) in 15 minutes before 429; default 10. */
  loginAccountLimit?: number;
  /** Failed sign-ins from one address (on any account) in 15 minutes before 429; default 100. */
  loginAddressLimit?: number;
  /** Base URL of the web client, for links in e-mails (release confirmation); APP_URL in production. */
  appUrl?: string;
  /** Folder for packing-slip files; defaults to `attachments` beside the database file. */
  attachmentsDir?: string;
}

/** Every service of the application, built once over one database; routers and jobs share them. */
export type Services = ReturnType<typeof createServices>;

/** Packing slips live beside the database file, in `attachments`. */
function defaultAttachmentsDir(db: Database): string {
  return join(dirname(String(db.dataSource.options.database)), 'attachments');
}

/** The composition root: the one place services are built and wired to each other. */
export function createServices(db: Database, options: ServiceOptions) {
  const appUrl = (options.appUrl ?? 'http://localhost:3000').replace(/\/+$/, '');
  const planning = new PlanningService(db);
  const loops = new LoopsService(db, planning);
  const lineRisk = new LineRiskService(db, loops);
  const dock = new DockService(db);
  const outbox = new OutboxService(db);
  return {
    db,
    appUrl,
    auth: new AuthService(db, {
      jwtSecret: options.jwtSecret,
      jwtTtl: options.jwtTtl ?? '8h',
      appUrl,
      throttle: { perAccount: options.loginAccountLimit ?? 10, perAddress: options.loginAddressLimit ?? 100 },
    }),
    users: new UsersService(db),
    calendar: new CalendarService(db),
    masterData: new MasterDataService(db),
    masterDataEdit: new MasterDataEditService(db, savePartsWithStock),
    bom: new BomService(db),
    imports: new ImportsService(db),
    sequence: new SequenceService(db),
    planning,
    forecastMail: new ForecastMailService(db, planning),
    loops,
    lineRisk,
    releases: new ReleasesService(db, planning, { appUrl, readShipNotices }),
    confirm: new ConfirmService(db, issueShippingLink),
    shipNotices: new ShipNoticesService(db),
    dock,
    receipts: new ReceiptsService(db),
    attachments: new AttachmentsService(db, options.attachmentsDir ?? defaultAttachmentsDir(db)),
    supplierPerformance: new SupplierPerformanceService(db),
    supplierAccount: new SupplierAccountService(db, planning),
    outbox,
    overview: new OverviewService(db, { lineRisk, loops, dock, outbox }),
    stock: new StockService(db),
    builds: new BuildsService(db),
    auditTrail: new AuditTrailService(db),
  };
}
