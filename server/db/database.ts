import 'reflect-metadata';
import { AsyncLocalStorage } from 'node:async_hooks';
import { copyFileSync, existsSync, mkdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import sqlite3 from 'sqlite3';
import { DataSource, type EntityManager } from 'typeorm';
import { ChangeFeed, PostgresChangeListener } from './change-feed';
import { entities } from './entities';
import { migrations } from './migrations';
import {
  isPostgresUrl,
  isRetryableConflict,
  LOCK_KEYS,
  migratePostgres,
  postgresSource,
  scratchPostgres,
  type ExclusiveJob,
} from './postgres';

/*
 * Every request sees only committed data and writes only in its own unit of work.
 *
 * SQLite allows one writer and, in WAL mode, any number of readers that each see the database as
 * it was when their read began. The TypeORM driver holds one connection per data source, so the
 * database is opened several times: one writer, whose transactions run one after another, and
 * read-only readers (`PRAGMA query_only`, so a stray write outside a unit fails loudly instead of
 * joining someone else's transaction). A read unit leases a reader for a snapshot transaction;
 * plain reads outside any unit go to a reader that never holds a transaction open.
 *
 * PostgreSQL has its own isolation, so nothing is serialised in the process: a write unit is a
 * SERIALIZABLE transaction on a pooled connection, run again when the server reports a
 * serialization failure or deadlock (it then re-reads, and a replayed request finds its first
 * answer); a read unit is a REPEATABLE READ, READ ONLY transaction. Change notices are sent with
 * NOTIFY inside the write unit, so PostgreSQL delivers them to every node exactly when it commits.
 */

type UnitKind = 'read' | 'write';
export type Engine = 'sqlite' | 'postgres';

interface Unit {
  database: Database;
  kind: UnitKind;
  manager: EntityManager;
  /** Effects to run once the write unit has committed (notices to open screens). */
  afterCommit: (() => void)[];
  /** Change notices to send with the write unit's commit (PostgreSQL). */
  notices: { channel: string; payload: unknown }[];
}

const units = new AsyncLocalStorage<Unit>();

/** Snapshot readers a read unit can lease; more units than this wait their turn. */
const SNAPSHOT_READERS = 4;
const BUSY_TIMEOUT_MS = 10_000;
/** Times a PostgreSQL write unit is tried before its serialization failure is the caller's. */
const WRITE_ATTEMPTS = 60;
/** Cap of the random back-off between attempts, in ms. */
const MAX_BACKOFF_MS = 1_000;
/** The NOTIFY channel of change notices. */
export const CHANGES_CHANNEL = 'cardloop_changes';

/** Thrown when code tries to write inside a read unit: the route or job must use a write unit. */
export class ReadOnlyUnitError extends Error {
  constructor() {
    super('A write was attempted inside a read unit of work; writes belong in Database.write().');
    this.name = 'ReadOnlyUnitError';
  }
}

/** A first-come, first-served pool of the snapshot readers. */
class ReaderPool {
  private readonly idle: DataSource[];
  private readonly waiting: ((reader: DataSource) => void)[] = [];

  constructor(readers: DataSource[]) {
    this.idle = [...readers];
  }

  acquire(): Promise<DataSource> {
    const reader = this.idle.pop();
    if (reader) return Promise.resolve(reader);
    return new Promise((resolve) => this.waiting.push(resolve));
  }

  release(reader: DataSource): void {
    const next = this.waiting.shift();
    if (next) next(reader);
    else this.idle.push(reader);
  }
}

/** The database as the application uses it: units of work over a writer and readers. */
export class Database {
  /** Tail of the queue of write units: SQLite has one writer, so they run one after another. */
  private writeTail: Promise<unknown> = Promise.resolve();

  constructor(
    readonly engine: Engine,
    /** The writer connection; migrations, seeding and tests arranging data use it directly. */
    readonly dataSource: DataSource,
    private readonly reader: DataSource,
    private readonly snapshotReaders: DataSource[],
    /** Change notices (planning, dock…) for open screens; published after commit. */
    readonly changes: ChangeFeed,
    private readonly onClose: () => void | Promise<void> = () => undefined,
  ) {
    this.pool = new ReaderPool(snapshotReaders);
    this.committedHere = engine === 'sqlite' ? changes : new ChangeFeed();
  }

  /**
   * The notices of changes this process committed, published the moment each commits. On SQLite
   * this is `changes`; on PostgreSQL `changes` hears them from the server a little later, too late
   * for what must not outlive the commit by a single request here (a revoked session).
   */
  readonly committedHere: ChangeFeed;

  private readonly pool: ReaderPool;

  /** The manager of the current unit of work, or of the reader when no unit is open. */
  get manager(): EntityManager {
    return this.currentUnit()?.manager ?? this.reader.manager;
  }

  /** True inside a write unit: what is read there may not be committed yet, so it must not be cached. */
  get inWriteUnit(): boolean {
    return this.currentUnit()?.kind === 'write';
  }

  /** Runs `work` on one consistent snapshot of committed data; joins the unit already open. */
  async read<T>(work: (manager: EntityManager) => Promise<T>): Promise<T> {
    const open = this.currentUnit();
    if (open) return work(open.manager);
    if (this.engine === 'postgres') return this.readPostgres(work);
    const reader = await this.pool.acquire();
    const runner = reader.createQueryRunner();
    try {
      await runner.startTransaction();
      try {
        return await units.run(
          { database: this, kind: 'read', manager: runner.manager, afterCommit: [], notices: [] },
          () => work(runner.manager),
        );
      } finally {
        await runner.commitTransaction();
      }
    } finally {
      this.pool.release(reader);
    }
  }

  /**
   * Runs `work` in a transaction of its own, after every write unit begun before it; all of it
   * commits or none. A write unit begun inside another joins it. Effects registered with
   * `afterCommit` run once it has committed.
   */
  write<T>(work: (manager: EntityManager) => Promise<T>): Promise<T> {
    const open = this.currentUnit();
    if (open?.kind === 'write') return work(open.manager);
    if (open?.kind === 'read') return Promise.reject(new ReadOnlyUnitError());
    if (this.engine === 'postgres') return this.writePostgres(work);
    const run = this.writeTail.then(async () => {
      const afterCommit: (() => void)[] = [];
      const result = await this.dataSource.transaction((manager) =>
        units.run({ database: this, kind: 'write', manager, afterCommit, notices: [] }, () => work(manager)),
      );
      for (const effect of afterCommit) effect();
      return result;
    });
    this.writeTail = run.catch(() => undefined);
    return run;
  }

  /**
   * Runs `work` unless another node is running `job` right now, and returns null then. On
   * PostgreSQL a session advisory lock decides, held for the whole run; on SQLite one process
   * serves the database, and the job itself keeps its runs apart. Work run under it re-reads
   * whether it is still due, so a node that takes the lock just after another released it finds
   * the work done.
   */
  async runAlone<T>(job: ExclusiveJob, work: () => Promise<T>): Promise<T | null> {
    if (this.engine === 'sqlite') return work();
    const runner = this.dataSource.createQueryRunner();
    try {
      const [{ locked }] = (await runner.query('SELECT pg_try_advisory_lock($1) AS locked', [LOCK_KEYS[job]])) as {
        locked: boolean;
      }[];
      if (!locked) return null;
      try {
        return await work();
      } finally {
        await runner.query('SELECT pg_advisory_unlock($1)', [LOCK_KEYS[job]]);
      }
    } finally {
      await runner.release();
    }
  }

  /**
   * Runs `work` once no other node is running `job`, waiting for its turn: for what every node
   * needs done before it serves but only one may do at a time (preparing a fresh database). On
   * PostgreSQL a session advisory lock, held for the whole run; on SQLite one process serves the
   * database. Work run under it re-reads whether it is still to be done.
   */
  async runInTurn<T>(job: ExclusiveJob, work: () => Promise<T>): Promise<T> {
    if (this.engine === 'sqlite') return work();
    const runner = this.dataSource.createQueryRunner();
    try {
      await runner.query('SELECT pg_advisory_lock($1)', [LOCK_KEYS[job]]);
      try {
        return await work();
      } finally {
        await runner.query('SELECT pg_advisory_unlock($1)', [LOCK_KEYS[job]]);
      }
    } finally {
      await runner.release();
    }
  }

  /** Runs `effect` once the current write unit has committed; at once when no write unit is open. */
  afterCommit(effect: () => void): void {
    const open = this.currentUnit();
    if (open?.kind === 'write') open.afterCommit.push(effect);
    else effect();
  }

  /** Tells open screens (of every node, on PostgreSQL) that `channel` changed, once the current unit has committed. */
  notify(channel: string, payload: unknown): void {
    if (this.engine === 'sqlite') {
      this.afterCommit(() => this.changes.publish(channel, payload));
      return;
    }
    this.afterCommit(() => this.committedHere.publish(channel, payload));
    const open = this.currentUnit();
    if (open?.kind === 'write') open.notices.push({ channel, payload });
    else {
      void this.dataSource
        .query('SELECT pg_notify($1, $2)', [CHANGES_CHANNEL, JSON.stringify({ channel, payload })])
        .catch((error: unknown) => console.error('Change notice lost:', error));
    }
  }

  private async readPostgres<T>(work: (manager: EntityManager) => Promise<T>): Promise<T> {
    // The reader pool's sessions are read-only: the snapshot refuses writes like SQLite's readers.
    const runner = this.reader.createQueryRunner();
    try {
      await runner.startTransaction('REPEATABLE READ');
      try {
        return await units.run(
          { database: this, kind: 'read', manager: runner.manager, afterCommit: [], notices: [] },
          () => work(runner.manager),
        );
      } finally {
        await runner.commitTransaction().catch(() => runner.rollbackTransaction());
      }
    } finally {
      await runner.release();
    }
  }

  private async writePostgres<T>(work: (manager: EntityManager) => Promise<T>): Promise<T> {
    for (let attempt = 1; ; attempt += 1) {
      const unit: Unit = {
        database: this,
        kind: 'write',
        manager: this.dataSource.manager,
        afterCommit: [],
        notices: [],
      };
      try {
        const result = await this.dataSource.transaction('SERIALIZABLE', (manager) =>
          units.run({ ...unit, manager }, async () => {
            const answer = await work(manager);
            for (const notice of unit.notices) {
              await manager.query('SELECT pg_notify($1, $2)', [CHANGES_CHANNEL, JSON.stringify(notice)]);
            }
            return answer;
          }),
        );
        for (const effect of unit.afterCommit) effect();
        return result;
      } catch (error) {
        if (attempt >= WRITE_ATTEMPTS || !isRetryableConflict(error)) throw error;
        // Back off randomly, longer each time, so the transactions that collided do not collide again.
        const backoff = Math.random() * Math.min(MAX_BACKOFF_MS, 4 * 2 ** attempt);
        await new Promise((resolve) => setTimeout(resolve, backoff));
      }
    }
  }

  async close(): Promise<void> {
    await Promise.allSettled([this.writeTail]);
    for (const source of new Set([this.reader, ...this.snapshotReaders, this.dataSource])) {
      if (source.isInitialized) await source.destroy();
    }
    await this.onClose();
  }

  private currentUnit(): Unit | undefined {
    const unit = units.getStore();
    return unit?.database === this ? unit : undefined;
  }
}

/** Publishes a change notice after the open write unit commits; outside a unit nobody is listening. */
export function notifyAfterCommit(channel: string, payload: unknown): void {
  units.getStore()?.database.notify(channel, payload);
}

/**
 * The sqlite3 driver as TypeORM gets it, minus `verbose()`: TypeORM calls it, and it wraps every
 * query of the process to capture a stack trace and inspect every argument (SQL and parameters)
 * in case the query fails, a cost paid by every request for the sake of longer error traces.
 */
const quietSqlite = Object.assign(Object.create(sqlite3) as typeof sqlite3, { verbose: () => sqlite3 });

function sqliteSource(databasePath: string, role: 'writer' | 'reader'): DataSource {
  return new DataSource({
    type: 'sqlite',
    driver: quietSqlite,
    database: databasePath,
    entities,
    migrations: role === 'writer' ? migrations : [],
    migrationsRun: false,
    synchronize: false,
    enableWAL: true,
    busyTimeout: BUSY_TIMEOUT_MS,
    logging: role === 'writer' ? ['error'] : false,
  });
}

let templatePath: string | undefined;
let scratchCount = 0;

/**
 * A throw-away database file, copied from a migrated template made once per process: tests get a
 * fresh database in milliseconds and still exercise several connections, which `:memory:` cannot.
 */
async function scratchDatabasePath(): Promise<string> {
  const folder = join(tmpdir(), `cardloop-${process.pid}`);
  mkdirSync(folder, { recursive: true });
  if (!templatePath || !existsSync(templatePath)) {
    const path = join(folder, 'template.sqlite');
    rmSync(path, { force: true });
    const writer = sqliteSource(path, 'writer');
    await writer.initialize();
    await writer.runMigrations({ transaction: 'all' });
    await writer.query('PRAGMA wal_checkpoint(TRUNCATE)');
    await writer.destroy();
    templatePath = path;
  }
  scratchCount += 1;
  const path = join(folder, `scratch-${scratchCount}.sqlite`);
  copyFileSync(templatePath, path);
  return path;
}

function removeDatabaseFiles(path: string): void {
  for (const suffix of ['', '-wal', '-shm']) rmSync(`${path}${suffix}`, { force: true });
}

/**
 * Opens the database `target` names and applies pending migrations: a `postgres://` URL, a SQLite
 * file path, or `:memory:` for a throw-away database deleted on close — a SQLite file, or a
 * PostgreSQL database on the server `SCRATCH_DATABASE_URL` names when that is set (the server
 * test suite's PostgreSQL run).
 */
export async function openDatabase(target: string): Promise<Database> {
  if (isPostgresUrl(target)) return openPostgres(target);
  const scratchServer = process.env.SCRATCH_DATABASE_URL;
  if (target === ':memory:' && scratchServer) {
    const scratch = await scratchPostgres(scratchServer);
    return openPostgres(scratch.url, scratch.drop);
  }
  return openSqlite(target);
}

async function openPostgres(url: string, onClose: () => Promise<void> = async () => undefined): Promise<Database> {
  const source = postgresSource(url);
  await source.initialize();
  await migratePostgres(source);
  const reader = postgresSource(url, {
    readOnly: true,
    poolSize: Math.max(2, Math.ceil((source.options.extra as { max: number }).max / 2)),
  });
  await reader.initialize();
  const listener = await PostgresChangeListener.start(url, CHANGES_CHANNEL);
  return new Database('postgres', source, reader, [], listener.feed, async () => {
    await listener.stop();
    await onClose();
  });
}

async function openSqlite(databasePath: string): Promise<Database> {
  const scratch = databasePath === ':memory:';
  const path = scratch ? await scratchDatabasePath() : databasePath;
  if (!scratch) mkdirSync(dirname(path), { recursive: true });
  const writer = sqliteSource(path, 'writer');
  await writer.initialize();
  await writer.runMigrations({ transaction: 'all' });
  const readers = Array.from({ length: SNAPSHOT_READERS + 1 }, () => sqliteSource(path, 'reader'));
  for (const reader of readers) {
    await reader.initialize();
    await reader.query('PRAGMA query_only = ON');
  }
  const [reader, ...snapshotReaders] = readers;
  return new Database('sqlite', writer, reader, snapshotReaders, new ChangeFeed(), () => {
    if (scratch) removeDatabaseFiles(path);
  });
}
