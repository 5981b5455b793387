import 'reflect-metadata';
import { AsyncLocalStorage } from 'node:async_hooks';
import { copyFileSync, existsSync, mkdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { DataSource, type EntityManager } from 'typeorm';
import { ChangeFeed } from './change-feed';
import { entities } from './entities';
import { migrations } from './migrations';

/*
 * Every request sees only committed data and writes only in its own unit of work.
 *
 * SQLite allows one writer and, in WAL mode, any number of readers that each see the database as
 * it was when their read began. The TypeORM driver holds one connection per data source, so the
 * database is opened several times: one writer, whose transactions run one after another, and
 * read-only readers (`PRAGMA query_only`, so a stray write outside a unit fails loudly instead of
 * joining someone else's transaction). A read unit leases a reader for a snapshot transaction;
 * plain reads outside any unit go to a reader that never holds a transaction open.
 */

type UnitKind = 'read' | 'write';

interface Unit {
  database: Database;
  kind: UnitKind;
  manager: EntityManager;
  /** Effects to run once the write unit has committed (notices to open screens). */
  afterCommit: (() => void)[];
}

const units = new AsyncLocalStorage<Unit>();

/** Snapshot readers a read unit can lease; more units than this wait their turn. */
const SNAPSHOT_READERS = 4;
const BUSY_TIMEOUT_MS = 10_000;

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
    /** The writer connection; migrations, seeding and tests arranging data use it directly. */
    readonly dataSource: DataSource,
    private readonly reader: DataSource,
    private readonly snapshotReaders: DataSource[],
    /** Change notices (planning, dock…) for open screens; published after commit. */
    readonly changes: ChangeFeed,
    private readonly onClose: () => void = () => undefined,
  ) {
    this.pool = new ReaderPool(snapshotReaders);
  }

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
    const reader = await this.pool.acquire();
    const runner = reader.createQueryRunner();
    try {
      await runner.startTransaction();
      try {
        return await units.run({ database: this, kind: 'read', manager: runner.manager, afterCommit: [] }, () =>
          work(runner.manager),
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
    const run = this.writeTail.then(async () => {
      const afterCommit: (() => void)[] = [];
      const result = await this.dataSource.transaction((manager) =>
        units.run({ database: this, kind: 'write', manager, afterCommit }, () => work(manager)),
      );
      for (const effect of afterCommit) effect();
      return result;
    });
    this.writeTail = run.catch(() => undefined);
    return run;
  }

  /** Runs `effect` once the current write unit has committed; at once when no write unit is open. */
  afterCommit(effect: () => void): void {
    const open = this.currentUnit();
    if (open?.kind === 'write') open.afterCommit.push(effect);
    else effect();
  }

  /** Tells open screens that `channel` changed, once the current unit has committed. */
  notify(channel: string, payload: unknown): void {
    this.afterCommit(() => this.changes.publish(channel, payload));
  }

  async close(): Promise<void> {
    await Promise.allSettled([this.writeTail]);
    for (const source of [this.reader, ...this.snapshotReaders, this.dataSource]) {
      if (source.isInitialized) await source.destroy();
    }
    this.onClose();
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

function sqliteSource(databasePath: string, role: 'writer' | 'reader'): DataSource {
  return new DataSource({
    type: 'sqlite',
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
 * Opens the SQLite database at `databasePath` (`:memory:` for a throw-away file that is deleted
 * on close), applies pending migrations and opens the readers.
 */
export async function openDatabase(databasePath: string): Promise<Database> {
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
  return new Database(writer, reader, snapshotReaders, new ChangeFeed(), () => {
    if (scratch) removeDatabaseFiles(path);
  });
}
