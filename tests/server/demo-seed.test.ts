import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openDatabase, type Database } from '../../server/db/database';
import { plantToday } from '../../server/planning/plan-dates';
import { HISTORY_DAYS } from '../../seed/scenario';
import { seedDemoScenario } from '../../seed/seed-demo';
import { runSql } from '../../server/db/sql';

let db: Database;
beforeAll(async () => {
  db = await openDatabase(':memory:');
  await seedDemoScenario(db, plantToday());
}, 120_000);
afterAll(() => db.close());

describe('the seeded demo plant', () => {
  it('starts in a steady state: the past weeks built, and on-hand what the ledger sums to', async () => {
    const built: { days: number; units: number }[] = await db.manager.query(
      "SELECT COUNT(DISTINCT date) AS days, COUNT(*) AS units FROM sequence_entry WHERE status = 'built'",
    );
    const mismatches = await db.manager.query(
      `SELECT p.part_number FROM part p LEFT JOIN stock_movement m ON m.part_number = p.part_number
       GROUP BY p.part_number, p.on_hand HAVING ABS(p.on_hand - COALESCE(SUM(m.qty), 0)) > 1e-6`,
    );
    const backflushed: { units: number }[] = await db.manager.query(
      "SELECT COUNT(DISTINCT ref) AS units FROM stock_movement WHERE kind = 'backflush'",
    );

    expect(Number(built[0].days)).toBe(HISTORY_DAYS);
    expect(Number(backflushed[0].units)).toBe(Number(built[0].units));
    expect(mismatches).toEqual([]);
  });

  it('leaves every unit from today on planned', async () => {
    const early: { n: number }[] = await runSql(
      db.manager,
      "SELECT COUNT(*) AS n FROM sequence_entry WHERE status <> 'built' AND date < ?",
      [plantToday()],
    );
    const late: { n: number }[] = await runSql(
      db.manager,
      "SELECT COUNT(*) AS n FROM sequence_entry WHERE status = 'built' AND date >= ?",
      [plantToday()],
    );

    expect(Number(early[0].n)).toBe(0);
    expect(Number(late[0].n)).toBe(0);
  });
});
