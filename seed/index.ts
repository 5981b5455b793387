import { resolve } from 'node:path';
import { loadConfig } from '../server/config';
import { openDatabase } from '../server/db/database';
import { plantToday } from '../server/planning/plan-dates';
import { isDatabaseEmpty } from '../server/users/bootstrap';
import { seedDemoScenario } from './seed-demo';

// `npm run seed`: migrates and seeds the demo into DATABASE_PATH when it is empty; never overwrites.
const config = loadConfig();
const db = await openDatabase(resolve(config.DATABASE_PATH));
if (await isDatabaseEmpty(db)) {
  await seedDemoScenario(db, plantToday());
  console.log(`Seeded the demo scenario into ${config.DATABASE_PATH}.`);
} else {
  console.log(`${config.DATABASE_PATH} already holds data; nothing seeded.`);
}
await db.close();
