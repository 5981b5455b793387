import { databaseLabel, databaseTarget, loadConfig } from '../server/config';
import { openDatabase } from '../server/db/database';
import { plantToday } from '../server/planning/plan-dates';
import { isDatabaseEmpty } from '../server/users/bootstrap';
import { seedDemoScenario } from './seed-demo';

// `npm run seed`: migrates and seeds the demo into the database (DATABASE_URL or DATABASE_PATH) when it is empty; never overwrites.
const config = loadConfig();
const db = await openDatabase(databaseTarget(config, process.cwd()));
if (await isDatabaseEmpty(db)) {
  await seedDemoScenario(db, plantToday(), { appUrl: config.APP_URL });
  console.log(`Seeded the demo scenario into ${databaseLabel(config)}.`);
} else {
  console.log(`${databaseLabel(config)} already holds data; nothing seeded.`);
}
await db.close();
