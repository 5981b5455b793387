import pg from 'pg';
import { AdvancedConsoleLogger, DataSource, QueryFailedError, type QueryRunner } from 'typeorm';
import { entities } from './entities';
import { migrations } from './migrations';

/*
 * PostgreSQL as Cardloop uses it: one pooled data source per node, migrations applied under an
 * advisory lock (two nodes starting together migrate once), COUNT(*) and other 64-bit integers
 * read as numbers like SQLite gives them (every count here is far below 2^53).
 */
pg.types.setTypeParser(pg.types.builtins.INT8, (value) => Number(value));
pg.types.setTypeParser(pg.types.builtins.NUMERIC, (value) => Number(value));

/** Connections one node keeps to the server (`DATABASE_POOL_SIZE`). */
const DEFAULT_POOL_SIZE = 10;

/** SQLSTATEs after which a transaction may simply be run again: serialization failure, deadlock. */
const RETRYABLE = new Set(['40001', '40P01']);

/** Advisory lock keys; any 64-bit number unlikely to clash with another application's. */
export const LOCK_KEYS = {
  migrations: 7_264_001,
  'release-job': 7_264_002,
  'end-of-shift': 7_264_003,
  'frozen-window-check': 7_264_004,
  'start-up': 7_264_005,
} as const;

/** A job that must run on one node at a time. */
export type ExclusiveJob = Exclude<keyof typeof LOCK_KEYS, 'migrations'>;

export function isPostgresUrl(target: string): boolean {
  return /^postgres(ql)?:\/\//i.test(target);
}

/** Logs failed queries, except the conflicts a write unit answers by running again. */
class ConflictQuietLogger extends AdvancedConsoleLogger {
  constructor() {
    super(['error']);
  }

  override logQueryError(error: string, query: string, parameters?: unknown[], runner?: QueryRunner): void {
    const code = (error as unknown as { code?: string }).code;
    if (code !== undefined && RETRYABLE.has(code)) return;
    super.logQueryError(error, query, parameters, runner);
  }
}

/**
 * A pooled data source. `readOnly` sessions refuse every write (`default_transaction_read_only`),
 * so a stray write outside a write unit fails loudly, as SQLite's query-only readers do.
 */
export function postgresSource(
  url: string,
  { poolSize = Number(process.env.DATABASE_POOL_SIZE) || DEFAULT_POOL_SIZE, readOnly = false } = {},
) {
  return new DataSource({
    type: 'postgres',
    url,
    entities,
    migrations: readOnly ? [] : migrations,
    migrationsRun: false,
    synchronize: false,
    logger: new ConflictQuietLogger(),
    extra: {
      max: poolSize,
      application_name: 'cardloop',
      ...(readOnly ? { options: '-c default_transaction_read_only=on' } : {}),
    },
  });
}

/** Applies pending migrations once, even when several nodes start at the same moment. */
export async function migratePostgres(source: DataSource): Promise<void> {
  const runner = source.createQueryRunner();
  try {
    await runner.query('SELECT pg_advisory_lock($1)', [LOCK_KEYS.migrations]);
    try {
      await source.runMigrations({ transaction: 'all' });
    } finally {
      await runner.query('SELECT pg_advisory_unlock($1)', [LOCK_KEYS.migrations]);
    }
  } finally {
    await runner.release();
  }
}

export function isRetryableConflict(error: unknown): boolean {
  if (!(error instanceof QueryFailedError)) return false;
  const code = (error.driverError as { code?: string } | undefined)?.code;
  return code !== undefined && RETRYABLE.has(code);
}

function databaseUrl(url: string, database: string): string {
  const parsed = new URL(url);
  parsed.pathname = `/${database}`;
  return parsed.toString();
}

let template: Promise<string> | undefined;
let scratchCount = 0;

/**
 * The start of this process's throw-away database names. A test run sets `SCRATCH_RUN_ID`, so that
 * at its end it can drop every database it made (`tests/server/postgres-run.ts`), and only those.
 */
function scratchNamePrefix(kind: 'template' | 'scratch'): string {
  const run = process.env.SCRATCH_RUN_ID;
  return `cardloop_${kind}_${run ? `${run}_` : ''}${process.pid}`;
}

async function adminQuery(url: string, sql: string): Promise<void> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}

/** A migrated template database made once per process, named after it so parallel workers never share one. */
function templateDatabase(serverUrl: string): Promise<string> {
  template ??= (async () => {
    const name = scratchNamePrefix('template');
    await adminQuery(serverUrl, `DROP DATABASE IF EXISTS ${name}`);
    await adminQuery(serverUrl, `CREATE DATABASE ${name}`);
    const source = postgresSource(databaseUrl(serverUrl, name), { poolSize: 1 });
    await source.initialize();
    await source.runMigrations({ transaction: 'all' });
    await source.destroy();
    return name;
  })();
  return template;
}

/**
 * A throw-away database on the server at `serverUrl`, copied from a migrated template: tests get a
 * fresh database in a fraction of a second. Returns its URL and how to drop it.
 */
export async function scratchPostgres(serverUrl: string): Promise<{ url: string; drop: () => Promise<void> }> {
  const source = await templateDatabase(serverUrl);
  scratchCount += 1;
  const name = `${scratchNamePrefix('scratch')}_${scratchCount}`;
  await adminQuery(serverUrl, `DROP DATABASE IF EXISTS ${name}`);
  await adminQuery(serverUrl, `CREATE DATABASE ${name} TEMPLATE ${source} STRATEGY FILE_COPY`);
  return {
    url: databaseUrl(serverUrl, name),
    drop: () => adminQuery(serverUrl, `DROP DATABASE IF EXISTS ${name} WITH (FORCE)`),
  };
}
