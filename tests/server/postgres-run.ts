import pg from 'pg';

/*
 * The PostgreSQL run's throw-away databases (a migrated template per test process, a copy per test
 * context) carry the id of the run (`SCRATCH_RUN_ID`, set in vite.config.ts). When the run ends,
 * whatever of them is left — every template, and the copies of a test that failed before closing
 * its context — is dropped, so a developer's server does not fill up; other runs' are left alone.
 */
export async function teardown(): Promise<void> {
  const server = process.env.TEST_DATABASE_URL;
  const run = process.env.SCRATCH_RUN_ID;
  if (!server || !run || !/^[0-9a-f]+$/.test(run)) return;
  const client = new pg.Client({ connectionString: server });
  await client.connect();
  try {
    const { rows } = await client.query<{ datname: string }>(
      'SELECT datname FROM pg_database WHERE datname ~ $1 ORDER BY datname DESC',
      [`^cardloop_(scratch|template)_${run}_`],
    );
    for (const { datname } of rows) await client.query(`DROP DATABASE IF EXISTS "${datname}" WITH (FORCE)`);
  } finally {
    await client.end();
  }
}
