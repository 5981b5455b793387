import { execFile } from 'node:child_process';
import { mkdtemp, rm } from 'node:fs/promises';
import type { Server } from 'node:net';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { backupDatabase, restoreDatabase } from '../../server/db/backup';
import { openDatabase, type Database } from '../../server/db/database';
import { entities } from '../../server/db/entities';
import { isPostgresUrl } from '../../server/db/postgres';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { ReleaseLineEntity } from '../../server/releases/release-line.entity';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';
import { addCalendarDays } from '../../shared/domain/date';

let context: TestContext;
let server: Server;
let folder: string;

/** Where a database lives: its PostgreSQL URL or its SQLite file. */
const locationOf = (db: Database) =>
  String((db.dataSource.options as { url?: string; database?: unknown }).url ?? db.dataSource.options.database);

/** Every row of every table, in a stable order: what a round trip must bring back unchanged. */
async function contents(db: Database): Promise<Record<string, unknown[]>> {
  const all: Record<string, unknown[]> = {};
  for (const entity of entities) {
    const metadata = db.dataSource.getMetadata(entity);
    const order = Object.fromEntries(metadata.primaryColumns.map((column) => [column.propertyName, 'ASC']));
    all[metadata.tableName] = await db.dataSource.manager.find(entity, { order });
  }
  return all;
}

const repository = resolve(dirname(fileURLToPath(import.meta.url)), '../..');

/** Runs `npm run <script> -- <args>` in the repository as a person would, the database named as the app is told. */
async function npmRun(script: 'backup' | 'restore', args: string[], location: string) {
  const env = Object.fromEntries(
    Object.entries(process.env).filter(([name]) => name !== 'DATABASE_URL' && name !== 'DATABASE_PATH'),
  );
  env[isPostgresUrl(location) ? 'DATABASE_URL' : 'DATABASE_PATH'] = location;
  return promisify(execFile)('npm', ['run', '--silent', script, '--', ...args], { cwd: repository, env });
}

/** A fresh, migrated, empty database of the same engine to restore into. */
async function emptyTwin(): Promise<Database> {
  return openDatabase(':memory:');
}

// One release per supplier and day (a unique key): every line opened here gets a day of its own.
let releasesOpened = 0;

async function openLine(qty: number): Promise<number> {
  releasesOpened += 1;
  const release = await context.dataSource.getRepository(ReleaseEntity).save({
    number: `R-BACKUP-${releasesOpened}`,
    supplierCode: 'SUP-A',
    releaseDate: addCalendarDays('2026-08-01', releasesOpened),
    status: 'confirmed',
    sentAt: new Date().toISOString(),
    carrier: null,
    trackingNumber: null,
  });
  const line = await context.dataSource.getRepository(ReleaseLineEntity).save({
    releaseId: release.id,
    partNumber: 'WHEEL-B',
    qty,
    needDate: '2026-09-30',
    origin: 'plan',
    cardId: null,
    confirmedQty: null,
    receivedQty: 0,
    closed: false,
  });
  return line.id;
}

const receive = (releaseLineId: number, qty: number, key: string) =>
  request(server)
    .post('/api/receipts')
    .set(bearer(context.tokens.receiving))
    .set('Idempotency-Key', key)
    .send({ releaseLineId, qty });

beforeAll(async () => {
  folder = await mkdtemp(join(tmpdir(), 'cardloop-backup-'));
  context = await createTestContext();
  server = context.app.listen(0);
  await context.dataSource.transaction((manager) =>
    savePartsWithStock(manager, [testPart('WHEEL-B', { onHand: 7, replenishment: 'scheduled' })]),
  );
  const lineId = await openLine(50);
  for (let index = 0; index < 3; index += 1)
    expect((await receive(lineId, 5, `backup-seed-${index}`)).status).toBe(201);
});
afterAll(async () => {
  server.close();
  await context.close();
  await rm(folder, { recursive: true, force: true });
});

describe('npm run backup / npm run restore', () => {
  it('brings every row back unchanged', async () => {
    const file = join(folder, 'quiet.backup');
    const before = await contents(context.db);

    await backupDatabase(locationOf(context.db), file);
    const twin = await emptyTwin();
    try {
      await restoreDatabase(locationOf(twin), file);
      const restored = await contents(twin);

      expect(restored).toEqual(before);
      expect(restored.receipt).toHaveLength(3);
    } finally {
      await twin.close();
    }
  });

  it('runs as `npm run backup FILE` and `npm run restore FILE` on the database the app is configured with', async () => {
    const file = join(folder, 'by-npm.backup');
    const before = await contents(context.db);

    const backedUp = await npmRun('backup', [file], locationOf(context.db));
    const twin = await emptyTwin();
    try {
      const restored = await npmRun('restore', [file], locationOf(twin));

      expect(backedUp.stdout).toContain(`to ${file}`);
      expect(restored.stdout).toContain(`from ${file}`);
      expect(await contents(twin)).toEqual(before);
    } finally {
      await twin.close();
    }
  });

  it('refuses to restore from a file that is not there, changing nothing', async () => {
    const before = await contents(context.db);

    const missing = await npmRun('restore', [join(folder, 'no-such.backup')], locationOf(context.db)).catch(
      (error: { code: number; stderr: string }) => error,
    );

    expect(missing).toMatchObject({ code: 1, stderr: expect.stringContaining('No backup file') });
    expect(await contents(context.db)).toEqual(before);
  });

  it('refuses to back up a SQLite database that is not there, naming the file it looked for', async () => {
    const nowhere = join(folder, 'no-such.sqlite');

    const missing = await npmRun('backup', [join(folder, 'never.backup')], nowhere).catch(
      (error: { code: number; stderr: string }) => error,
    );

    expect(missing).toMatchObject({ code: 1, stderr: expect.stringContaining(`No database at ${nowhere}`) });
  });

  it('writes a consistent copy while receipts keep arriving', async () => {
    const file = join(folder, 'busy.backup');
    const lineId = await openLine(1000);
    const committedBefore = await contents(context.db);
    let arriving = true;
    const traffic = (async () => {
      let count = 0;
      while (arriving) {
        const response = await receive(lineId, 1, `backup-busy-${count}`);
        expect(response.status).toBe(201);
        count += 1;
      }
      return count;
    })();

    await backupDatabase(locationOf(context.db), file);
    arriving = false;
    const sent = await traffic;
    const twin = await emptyTwin();
    try {
      await restoreDatabase(locationOf(twin), file);
      const restored = await contents(twin);
      const [wheel] = (await twin.dataSource.query("SELECT on_hand FROM part WHERE part_number = 'WHEEL-B'")) as {
        on_hand: number;
      }[];
      const [ledger] = (await twin.dataSource.query(
        "SELECT SUM(qty) AS total FROM stock_movement WHERE part_number = 'WHEEL-B'",
      )) as { total: number }[];
      const [line] = (await twin.dataSource.query(`SELECT received_qty FROM release_line WHERE id = ${lineId}`)) as {
        received_qty: number;
      }[];
      const busyReceipts = (restored.receipt as { releaseLineId: number }[]).filter(
        (receipt) => receipt.releaseLineId === lineId,
      );

      // Everything committed before the backup began is in it.
      for (const [table, rows] of Object.entries(committedBefore)) {
        expect(restored[table].length, table).toBeGreaterThanOrEqual(rows.length);
      }
      // No receipt is torn: each one in the copy has moved on-hand and its line, and nothing more.
      expect(sent).toBeGreaterThan(0);
      expect(busyReceipts.length).toBeLessThanOrEqual(sent);
      expect(Number(line.received_qty)).toBe(busyReceipts.length);
      expect(Number(wheel.on_hand)).toBe(Number(ledger.total));
    } finally {
      await twin.close();
    }
  });
});
