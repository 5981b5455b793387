import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createApp } from './app';
import { ensureClientBuilt } from './client-build';
import { databaseLabel, databaseTarget, loadConfig } from './config';
import { openDatabase } from './db/database';
import { createServices } from './services';
import { ReleaseJob } from './releases/release-job';
import { CloseDayJob } from './builds/close-day-job';
import { startJobs } from './jobs/scheduler';
import { alertFrozenWindowShortages } from './line-risk/frozen-window-alerts';
import { startFakeSmtp } from './outbox/fake-smtp';
import { OutboxDispatcher } from './outbox/outbox.service';
import { pruneExpiredSessions } from './users/sessions';
import { prepareDatabase } from './start-up';
import { DEMO_PASSWORD } from '../seed/seed-demo';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');

async function main(): Promise<void> {
  const config = loadConfig();
  const clientDir = await ensureClientBuilt(root);
  const db = await openDatabase(databaseTarget(config, root));

  const fakeSmtp = config.SMTP_URL ? null : await startFakeSmtp();
  const smtpUrl = config.SMTP_URL ?? fakeSmtp!.url;

  const demoSignIns = await prepareDatabase(db, config);

  const appOptions = {
    jwtSecret: config.jwtSecret,
    jwtTtl: config.JWT_TTL,
    loginAccountLimit: config.LOGIN_ACCOUNT_LIMIT,
    loginAddressLimit: config.LOGIN_ADDRESS_LIMIT,
    trustProxy: config.TRUST_PROXY,
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
      name: 'Session cleanup',
      schedule: '0 10 3 * * *',
      run: async () => {
        const pruned = await db.write((manager) => pruneExpiredSessions(manager));
        return pruned > 0 ? `${pruned} expired sessions deleted.` : null;
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

main().catch((error) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
