import { seedDemoScenario } from '../seed/seed-demo';
import type { AppConfig } from './config';
import type { Database } from './db/database';
import { plantToday } from './planning/plan-dates';
import { readSetting } from './settings/settings';
import { DEMO_ACCOUNTS, ensureAdmin, isDatabaseEmpty } from './users/bootstrap';

/**
 * Gives a fresh database its first users: the demo plant (SEED_DEMO=1) or the configured admin.
 * Nodes started together take turns, so a shared PostgreSQL database is seeded once and the
 * admin made once; the one that comes second finds the work done. Returns the demo sign-ins
 * worth printing (none outside the demo).
 */
export function prepareDatabase(
  db: Database,
  config: Pick<AppConfig, 'SEED_DEMO' | 'ADMIN_EMAIL' | 'ADMIN_PASSWORD' | 'APP_URL'>,
  today = plantToday(),
): Promise<string[]> {
  return db.runInTurn('start-up', async () => {
    if (config.SEED_DEMO === '0') {
      await ensureAdmin(db, config.ADMIN_EMAIL!, config.ADMIN_PASSWORD!);
      return [];
    }
    if (await isDatabaseEmpty(db)) {
      console.log('Empty database: seeding the demo scenario…');
      await seedDemoScenario(db, today, { appUrl: config.APP_URL });
    }
    return listDemoSignIns(db);
  });
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
