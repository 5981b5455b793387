import type { Express } from 'express';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import type { Part } from '../../shared/schemas/master-data';
import type { Role } from '../../shared/schemas/user';
import { createApp, type AppOptions } from '../../server/app';
import { createServices, type Services } from '../../server/services';
import { hashPassword } from '../../server/users/passwords';
import { openDatabase, type Database } from '../../server/db/database';
import { SupplierEntity } from '../../server/master-data/supplier.entity';
import { ReleaseLineEntity } from '../../server/releases/release-line.entity';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { UserEntity } from '../../server/users/user.entity';
import { SUPPLIER_DEFAULT_TERMS } from '../../shared/schemas/master-data';

export const TEST_SECRET = 'test-secret-that-is-at-least-32-characters-long';
export const TEST_PASSWORD = 'correct-horse-battery';

export interface TestContext {
  app: Express;
  db: Database;
  /** The app's services, for jobs and checks that do not go through HTTP. */
  services: Services;
  /** The writer connection, for arranging and inspecting data directly. */
  dataSource: DataSource;
  /** Bearer tokens of one user per role; the supplier user belongs to supplier `SUP-A`. */
  tokens: Record<Role, string>;
  close(): Promise<void>;
}

let sharedHash: Promise<string> | undefined;

/** A fresh in-memory database with two suppliers and one signed-in user per role. */
export async function createTestContext(options: Partial<AppOptions> = {}): Promise<TestContext> {
  const db = await openDatabase(':memory:');
  const dataSource = db.dataSource;
  const appOptions = { jwtSecret: TEST_SECRET, loginAccountLimit: 5, ...options };
  const services = createServices(db, appOptions);
  const app = createApp(db, appOptions, services);
  sharedHash ??= hashPassword(TEST_PASSWORD);
  const passwordHash = await sharedHash;
  await dataSource.getRepository(SupplierEntity).insert([
    {
      code: 'SUP-A',
      name: 'Supplier A',
      email: 'orders@supplier-a.example.com',
      leadTimeDays: 3,
      ...SUPPLIER_DEFAULT_TERMS,
    },
    {
      code: 'SUP-B',
      name: 'Supplier B',
      email: 'orders@supplier-b.example.net',
      leadTimeDays: 5,
      ...SUPPLIER_DEFAULT_TERMS,
      // Two deliveries a week, each two deliveries (5 working days) after its signal.
      cycleDays: 5,
      deliveriesPerCycle: 2,
      deliveryDelay: 2,
    },
  ]);
  const roles: Role[] = ['admin', 'planner', 'buyer', 'receiving', 'line', 'supplier', 'viewer'];
  await dataSource.getRepository(UserEntity).insert(
    roles.map((role) => ({
      email: `${role}@example.com`,
      name: `Test ${role}`,
      role,
      passwordHash,
      supplierCode: role === 'supplier' ? 'SUP-A' : null,
    })),
  );
  const tokens = {} as Record<Role, string>;
  for (const role of roles) tokens[role] = await signIn(app, `${role}@example.com`, TEST_PASSWORD);
  return { app, db, services, dataSource, tokens, close: () => db.close() };
}

/** True when this run's throw-away databases are PostgreSQL (the `server-postgres` project). */
export const onPostgres = Boolean(process.env.SCRATCH_DATABASE_URL);

/**
 * A second app node over the database of `first` (PostgreSQL only: one SQLite file is served by
 * one process): its own connections, change listener, services and app; the same users and tokens.
 */
export async function secondNode(first: TestContext, options: Partial<AppOptions> = {}): Promise<TestContext> {
  const url = (first.db.dataSource.options as { url?: string }).url;
  if (first.db.engine !== 'postgres' || !url) throw new Error('a second node needs a PostgreSQL database');
  const db = await openDatabase(url);
  const appOptions = { jwtSecret: TEST_SECRET, loginAccountLimit: 5, ...options };
  const services = createServices(db, appOptions);
  const app = createApp(db, appOptions, services);
  return { app, db, services, dataSource: db.dataSource, tokens: first.tokens, close: () => db.close() };
}

export async function signIn(app: Express, email: string, password: string): Promise<string> {
  const response = await request(app).post('/api/auth/login').send({ email, password });
  if (response.status !== 200) throw new Error(`sign-in of ${email} failed: ${response.status}`);
  return response.body.token as string;
}

export const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

/** A bought kanban part of supplier `SUP-A` with neutral defaults; override what a test is about. */
export const testPart = (partNumber: string, overrides: Partial<Part> = {}): Part => ({
  partNumber,
  description: `Part ${partNumber}`,
  uom: 'H87',
  source: 'buy',
  supplierCode: 'SUP-A',
  leadTimeDays: 0,
  packQty: 1,
  onHand: 0,
  replenishment: 'kanban',
  safetyStock: 0,
  pointOfUse: null,
  hazardous: false,
  ...overrides,
});

/** A line of a release written by a test; a line with a card is a kanban line. */
export interface TestReleaseLine {
  partNumber: string;
  qty: number;
  /** The release's day when not given. */
  needDate?: string;
  confirmedQty?: number | null;
  cardId?: number | null;
  /** What the buyer asked for, when the test is about a change to it. */
  requestedQty?: number;
  requestedDate?: string;
}

/**
 * A release as the release job and the supplier would leave it (of SUP-A unless told, sent at
 * 06:00 on its day, each line needed that day unless told, nothing received), written straight to
 * the tables.
 */
export async function writeTestRelease(
  context: TestContext,
  release: {
    number: string;
    releaseDate: string;
    status: string;
    supplierCode?: string;
    reference?: string;
    dockColumn?: string;
  },
  lines: TestReleaseLine[],
): Promise<{ release: ReleaseEntity; lines: ReleaseLineEntity[] }> {
  const saved = await context.dataSource.getRepository(ReleaseEntity).save({
    number: release.number,
    supplierCode: release.supplierCode ?? 'SUP-A',
    releaseDate: release.releaseDate,
    reference: release.reference,
    status: release.status,
    sentAt: `${release.releaseDate}T06:00:00.000Z`,
    carrier: null,
    trackingNumber: null,
    dockColumn: release.dockColumn,
  });
  const savedLines = await context.dataSource.getRepository(ReleaseLineEntity).save(
    lines.map((line) => ({
      releaseId: saved.id,
      partNumber: line.partNumber,
      qty: line.qty,
      requestedQty: line.requestedQty,
      requestedDate: line.requestedDate,
      needDate: line.needDate ?? release.releaseDate,
      origin: line.cardId ? 'kanban' : 'plan',
      cardId: line.cardId ?? null,
      confirmedQty: line.confirmedQty ?? null,
      receivedQty: 0,
      closed: false,
    })),
  );
  return { release: saved, lines: savedLines };
}
