import type { Database } from '../server/db/database';
import { recordAudit } from '../server/audit/audit.service';
import { hashPassword } from '../server/users/passwords';
import { writeCalendar } from '../server/calendar/calendar.service';
import { syncLoops } from '../server/loops/loop-sync';
import { writeSequenceSettings } from '../server/sequence/sequence-settings';
import { replaceBomLines, upsertSuppliers } from '../server/master-data/master-data.writer';
import { savePartsWithStock } from '../server/stock/stock.service';
import { upsertSequenceEntries } from '../server/sequence/sequence.writer';
import { writeSetting } from '../server/settings/settings';
import { UserEntity } from '../server/users/user.entity';
import { buildDemoScenario } from './scenario';

/** Every demo account shares this password; it exists only in the demo database. */
export const DEMO_PASSWORD = 'cardloop-demo';
/** Setting holding the e-mail addresses of the accounts the demo seed created. */
export const DEMO_ACCOUNTS = 'demo.accounts';

/** Writes the invented demo plant into an empty database in one transaction. */
export async function seedDemoScenario(db: Database, seedDay: string): Promise<void> {
  const scenario = buildDemoScenario(seedDay);
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  await db.write(async (manager) => {
    await writeCalendar(manager, scenario.calendar);
    await upsertSuppliers(manager, scenario.suppliers);
    await savePartsWithStock(manager, scenario.parts);
    await replaceBomLines(manager, scenario.bom);
    await upsertSequenceEntries(manager, scenario.sequence);
    await syncLoops(manager);
    // The demo line can take 26 units a day against a plan of about 24, so a planner can move units.
    await writeSequenceSettings(manager, { frozenWindowDays: 3, dailyCapacity: 26 });
    await manager.insert(
      UserEntity,
      scenario.users.map((user) => ({ ...user, passwordHash, active: true })),
    );
    // The start banner lists these accounts beside the demo password, and never anyone added later.
    await writeSetting(
      manager,
      DEMO_ACCOUNTS,
      scenario.users.map((user) => user.email),
    );
    await recordAudit(manager, {
      actorEmail: null,
      action: 'seed',
      entity: 'scenario',
      entityKey: seedDay,
      changes: { suppliers: scenario.suppliers.length, parts: scenario.parts.length, units: scenario.sequence.length },
    });
  });
}
