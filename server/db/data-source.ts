import 'reflect-metadata';
import { AsyncLocalStorage } from 'node:async_hooks';
import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { DataSource, type EntityManager } from 'typeorm';
import { entities } from './entities';
import { migrations } from './migrations';

/** A SQLite data source over `databasePath` (`:memory:` for tests); schema comes only from migrations. */
export function createDataSource(databasePath: string): DataSource {
  if (databasePath !== ':memory:') mkdirSync(dirname(databasePath), { recursive: true });
  return new DataSource({
    type: 'sqlite',
    database: databasePath,
    entities,
    migrations,
    migrationsRun: false,
    synchronize: false,
    logging: ['error'],
  });
}

/**
 * Makes transactions on this data source run one after another. The SQLite driver has a single
 * connection, so two transactions begun at once would collide ("cannot start a transaction within
 * a transaction"). A transaction begun inside another one (same async context) runs at once, as
 * the driver's nested savepoint, instead of waiting for itself.
 */
export function serialiseTransactions(dataSource: DataSource): void {
  const manager = dataSource.manager;
  const begin = manager.transaction.bind(manager) as (...args: unknown[]) => Promise<unknown>;
  const insideTransaction = new AsyncLocalStorage<true>();
  let tail: Promise<unknown> = Promise.resolve();
  manager.transaction = ((...args: unknown[]) => {
    if (insideTransaction.getStore()) return begin(...args);
    const run = tail.then(() => insideTransaction.run(true, () => begin(...args)));
    tail = run.catch(() => undefined);
    return run;
  }) as EntityManager['transaction'];
}

/** Opens the database, turns on foreign keys and WAL, and applies pending migrations. */
export async function openDatabase(databasePath: string): Promise<DataSource> {
  const dataSource = createDataSource(databasePath);
  serialiseTransactions(dataSource);
  await dataSource.initialize();
  if (databasePath !== ':memory:') await dataSource.query('PRAGMA journal_mode = WAL');
  await dataSource.query('PRAGMA busy_timeout = 5000');
  await dataSource.runMigrations({ transaction: 'all' });
  return dataSource;
}
