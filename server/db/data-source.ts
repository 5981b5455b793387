import 'reflect-metadata';
import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { DataSource } from 'typeorm';
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

/** Opens the database, turns on foreign keys and WAL, and applies pending migrations. */
export async function openDatabase(databasePath: string): Promise<DataSource> {
  const dataSource = createDataSource(databasePath);
  await dataSource.initialize();
  if (databasePath !== ':memory:') await dataSource.query('PRAGMA journal_mode = WAL');
  await dataSource.query('PRAGMA busy_timeout = 5000');
  await dataSource.runMigrations({ transaction: 'all' });
  return dataSource;
}
