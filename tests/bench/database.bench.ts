import type { AddressInfo } from 'node:net';
import { performance } from 'node:perf_hooks';
import { pathToFileURL } from 'node:url';
import { createApp } from '../../server/app';
import { sessionExpiry, signSessionToken } from '../../server/auth/tokens';
import { openDatabase, type Database } from '../../server/db/database';
import { runSql } from '../../server/db/sql';
import { loadPlanInputs } from '../../server/planning/plan-inputs';
import { openSession } from '../../server/users/sessions';
import { UserEntity } from '../../server/users/user.entity';
import { computePlan } from '../../shared/domain/plan';
import { generatePlanFixture } from './plan-fixture';
import { writeFixture } from './plan-fixture-db';

/** A token of a live session for the user, without going through the password. */
export async function signInAs(db: Database, userId: number, secret: string): Promise<string> {
  const expiresAt = sessionExpiry('1h');
  const session = await db.write((manager) => openSession(manager, userId, expiresAt));
  return signSessionToken({ userId, sessionId: session.id }, secret, expiresAt);
}

/*
 * The same synthetic plant stored in SQLite: (1) the gross-requirements explosion written as one
 * recursive SQL query, against computePlan on the same rows; (2) GET /api/demand over all parts
 * and 60 working days through real HTTP, first call (read + plan), from the plan cache, and right
 * after a change of the planning data (a stock count posted through the API: inputs read again
 * and the plan computed again, as every screen sees it after a change).
 */

const RUNS = 10;
const API_RUNS = 30;
const AFTER_CHANGE_RUNS = 9;

// Explosion only (no netting, no lead-time offsets): components at their parent's build date,
// effectivity checked at that date, scrap applied. Less work than the engine does.
export const RECURSIVE_EXPLOSION = `
WITH RECURSIVE demand(part, date, qty) AS (
  SELECT model, date, CAST(SUM(qty) AS double precision) FROM sequence_entry WHERE date BETWEEN ? AND ? GROUP BY model, date
  UNION ALL
  SELECT b.component, d.date, d.qty * b.qty_per * (1 + b.scrap_pct / 100.0)
  FROM demand d JOIN bom_line b ON b.parent = d.part
  WHERE (b.effective_from IS NULL OR b.effective_from <= d.date)
    AND (b.effective_to IS NULL OR b.effective_to >= d.date)
)
SELECT part, date, SUM(qty) AS qty FROM demand GROUP BY part, date`;

export interface DatabaseBenchFigures {
  engine: string;
  sqlExplosionMedianMs: number;
  sqlRows: number;
  enginePlanMedianMs: number;
  ratio: number;
  demandFirstCallMs: number;
  demandCachedMedianMs: number;
  demandCachedP90Ms: number;
  demandAfterChangeMedianMs: number;
  demandAfterChangeMaxMs: number;
  demandRows: number;
  demandDays: number;
}

function median(samples: number[]): number {
  const sorted = [...samples].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)];
}

function p90(samples: number[]): number {
  const sorted = [...samples].sort((a, b) => a - b);
  return sorted[Math.ceil(sorted.length * 0.9) - 1];
}

export async function runDatabaseBench(): Promise<DatabaseBenchFigures> {
  const fixture = generatePlanFixture();
  const db = await openDatabase(':memory:');
  await writeFixture(db, fixture);

  const sqlSamples: number[] = [];
  let sqlRows = 0;
  for (let run = 0; run < RUNS + 1; run += 1) {
    const start = performance.now();
    const rows = await runSql<unknown[]>(db.manager, RECURSIVE_EXPLOSION, [fixture.from, fixture.to]);
    if (run > 0) sqlSamples.push(performance.now() - start);
    sqlRows = rows.length;
  }

  const inputs = await db.read((manager) => loadPlanInputs(manager));
  const engineSamples: number[] = [];
  for (let run = 0; run < RUNS + 3; run += 1) {
    const start = performance.now();
    computePlan({ ...inputs, from: fixture.from, to: fixture.to });
    if (run >= 3) engineSamples.push(performance.now() - start);
  }

  const admin = await db.dataSource.getRepository(UserEntity).save({
    email: 'bench@example.com',
    name: 'Bench',
    role: 'admin',
    passwordHash: 'not-used',
    supplierCode: null,
  });
  const secret = 'bench-secret-bench-secret-bench-secret-bench';
  const token = await signInAs(db, admin.id, secret);
  const server = createApp(db, { jwtSecret: secret }).listen(0);
  const { port } = server.address() as AddressInfo;
  const url = `http://127.0.0.1:${port}/api/demand?from=${fixture.from}&to=${fixture.to}`;
  const callDemand = async () => {
    const start = performance.now();
    const response = await fetch(url, { headers: { Authorization: `Bearer ${token}` } });
    const body = (await response.json()) as { days: string[]; rows: unknown[] };
    if (!response.ok) throw new Error(`GET /api/demand answered ${response.status}`);
    return { ms: performance.now() - start, body };
  };
  const first = await callDemand();
  const cached: number[] = [];
  for (let run = 0; run < API_RUNS; run += 1) cached.push((await callDemand()).ms);
  const counted = fixture.parts.find((part) => part.source === 'buy')!.partNumber;
  const afterChange: number[] = [];
  for (let run = 0; run < AFTER_CHANGE_RUNS; run += 1) {
    const count = await fetch(`http://127.0.0.1:${port}/api/stock/counts`, {
      method: 'POST',
      headers: {
        Authorization: `Bearer ${token}`,
        'Content-Type': 'application/json',
        'Idempotency-Key': `bench-count-${run}`,
      },
      body: JSON.stringify({ partNumber: counted, counted: 1000 + run }),
    });
    if (count.status !== 201) throw new Error(`POST /api/stock/counts answered ${count.status}`);
    await count.arrayBuffer();
    afterChange.push((await callDemand()).ms);
  }
  server.close();
  await db.close();

  const sqlMedian = median(sqlSamples);
  const engineMedian = median(engineSamples);
  return {
    engine: db.engine === 'postgres' ? 'PostgreSQL' : 'SQLite',
    sqlExplosionMedianMs: sqlMedian,
    sqlRows,
    enginePlanMedianMs: engineMedian,
    ratio: sqlMedian / engineMedian,
    demandFirstCallMs: first.ms,
    demandCachedMedianMs: median(cached),
    demandCachedP90Ms: p90(cached),
    demandAfterChangeMedianMs: median(afterChange),
    demandAfterChangeMaxMs: Math.max(...afterChange),
    demandRows: first.body.rows.length,
    demandDays: first.body.days.length,
  };
}

export function printDatabaseBench(figures: DatabaseBenchFigures): void {
  const ms = (value: number) => `${value.toFixed(2)} ms`;
  console.log(
    `recursive SQL explosion (${figures.engine})  median ${ms(figures.sqlExplosionMedianMs)}  (${figures.sqlRows} part-days, explosion only)`,
  );
  console.log(
    `computePlan on the same rows      median ${ms(figures.enginePlanMedianMs)}  (explosion + offsets + netting)`,
  );
  console.log(`ratio SQL / engine                ${figures.ratio.toFixed(1)}×`);
  console.log(
    `GET /api/demand ${figures.demandDays} days × ${figures.demandRows} parts: first call ${ms(figures.demandFirstCallMs)}, ` +
      `cached median ${ms(figures.demandCachedMedianMs)}  p90 ${ms(figures.demandCachedP90Ms)}  (target < 150 ms)`,
  );
  console.log(
    `  after a change (stock count posted)  median ${ms(figures.demandAfterChangeMedianMs)}  ` +
      `max ${ms(figures.demandAfterChangeMaxMs)}  (${AFTER_CHANGE_RUNS} changes)`,
  );
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  printDatabaseBench(await runDatabaseBench());
}
