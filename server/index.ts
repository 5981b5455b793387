import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createApp } from './app';
import { ensureClientBuilt } from './client-build';
import { databaseLabel, databaseTarget, loadConfig } from './config';
import { openDatabase, type Database } from './db/database';
import { plantToday } from './planning/plan-dates';
import { createServices } from './services';
import { ReleaseJob } from './releases/release-job';
import { CloseDayJob } from './builds/close-day-job';
import { startJobs } from './jobs/scheduler';
import { alertFrozenWindowShortages } from './line-risk/frozen-window-alerts';
import { startFakeSmtp } from './outbox/fake-smtp';
import { OutboxDispatcher } from './outbox/outbox.service';
import { DEMO_ACCOUNTS, ensureAdmin, isDatabaseEmpty } from './users/bootstrap';
import { DEMO_PASSWORD, seedDemoScenario } from '../seed/seed-demo';
import { readSetting } from './settings/settings';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');

async function main(): Promise<void> {
  const config = loadConfig();
  const clientDir = await ensureClientBuilt(root);
  const db = await openDatabase(databaseTarget(config, root));

  const fakeSmtp = config.SMTP_URL ? null : await startFakeSmtp();
  const smtpUrl = config.SMTP_URL ?? fakeSmtp!.url;

  let demoSignIns: string[] = [];
  if (config.SEED_DEMO === '1') {
    if (await isDatabaseEmpty(db)) {
      console.log('Empty database: seeding the demo scenario…');
      await seedDemoScenario(db, plantToday(), { appUrl: config.APP_URL });
    }
    demoSignIns = await listDemoSignIns(db);
  } else {
    await ensureAdmin(db, config.ADMIN_EMAIL!, config.ADMIN_PASSWORD!);
  }

  const appOptions = {
    jwtSecret: config.jwtSecret,
    jwtTtl: config.JWT_TTL,
    loginAccountLimit: config.LOGIN_ACCOUNT_LIMIT,
    loginAddressLimit: config.LOGIN_ADDRESS_LIMIT,
    fakeSmtp,
    clientDir,
    appUrl: config.APP_URL,
  };
  const services = createServices(db, appOptions);
  const dispatcher = new OutboxDispatcher(db, smtpUrl, config.MAIL_FROM);
  const releaseJob = new ReleaseJob(db, services.releases);
  const closeDayJob = new CloseDayJob(db, services.builds);
  const jobs = startJobs([
    {
      name: 'Outbox',
      schedule: '*/10 * * * * *',
      run: async () => {
        await dispatcher.dispatchDue();
        return null;
      },
    },
    {
      name: 'Release job',
      schedule: '0 * * * * *',
      run: async () => {
        const result = await releaseJob.tick();
        return result && `${result.date}: ${result.releases.length} releases sent.`;
      },
    },
    {
      name: 'End of shift',
      schedule: '15 * * * * *',
      run: async () => {
        const result = await closeDayJob.tick();
        return result && `${result.date}: ${result.built.length} units reported built.`;
      },
    },
    {
      name: 'Frozen-window check',
      schedule: '30 */5 * * * *',
      run: async () => {
        const parts = await alertFrozenWindowShortages(db, services.lineRisk, config.APP_URL);
        return parts.length > 0 ? `shortage alert sent for ${parts.join(', ')}.` : null;
      },
    },
  ]);
  const app = createApp(db, appOptions, services);
  const server = app.listen(config.PORT, () => {
    console.log(`Cardloop is running on http://localhost:${config.PORT}`);
    console.log(
      `Database: ${databaseLabel(config)}; mail: ${fakeSmtp ? `embedded fake SMTP at ${fakeSmtp.url}` : 'SMTP_URL'}`,
    );
    if (config.jwtSecretGenerated) console.log('JWT_SECRET is not set: sessions end when the server restarts.');
    if (demoSignIns.length > 0) {
      console.log(`Demo sign-ins (password "${DEMO_PASSWORD}"):`);
      for (const line of demoSignIns) console.log(`  ${line}`);
    }
  });

  let stopping = false;
  const shutdown = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`${signal}: shutting down…`);
    for (const job of jobs) await job.stop();
    server.close();
    server.closeAllConnections();
    dispatcher.close();
    await services.lineRisk.close();
    await fakeSmtp?.close();
    await db.close();
    process.exit(0);
  };
  process.on('SIGTERM', () => void shutdown('SIGTERM'));
  process.on('SIGINT', () => void shutdown('SIGINT'));
}

/** The demo's own accounts still active; users added later are never printed beside the demo password. */
async function listDemoSignIns(db: Database): Promise<string[]> {
  const demoAccounts = new Set(await readSetting<string[]>(db.manager, DEMO_ACCOUNTS, []));
  const all: { email: string; role: string; supplier_code: string | null }[] = await db.manager.query(
    'SELECT email, role, supplier_code FROM "user" WHERE active = TRUE ORDER BY CASE role WHEN \'supplier\' THEN 1 ELSE 0 END, id',
  );
  const rows = all.filter((row) => demoAccounts.has(row.email));
  return rows.map((row) => `${row.role.padEnd(10)} ${row.email}${row.supplier_code ? `  (${row.supplier_code})` : ''}`);
}

main().catch((error) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
