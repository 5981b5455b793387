import { performance } from 'node:perf_hooks';
import { get as httpGet } from 'node:http';
import { promisify } from 'node:util';
import { gunzip as gunzipCallback, gzipSync } from 'node:zlib';
import { openDatabase } from '../../server/db/database';
import { seedDemoScenario } from '../../seed/seed-demo';
import { addWorkingDays } from '../../shared/domain/calendar';
import { computeLineRisk, LineRiskWalker, walkLineRisk, type LineRiskInput } from '../../shared/domain/line-risk';
import { summarise } from '../../server/line-risk/line-risk-summary';
import { computePlan } from '../../shared/domain/plan';
import { plantToday } from '../../server/planning/plan-dates';
import { bumpPlanningVersion } from '../../server/settings/versions';
import { postMovements } from '../../server/stock/stock-ledger';
import { RECURSIVE_EXPLOSION } from './database.bench';
import { printHorizonOpen } from './horizon-open.bench';
import { printScreensOpen } from './screens-open.bench';
import { BOARD_WORKING_DAYS, boardWhatIf, printWhatIfBench } from './what-if.bench';
import { benchUser, formatLoad, listen, load, ms } from './http-load';
import { generatePlanFixture } from './plan-fixture';
import { writeFixture } from './plan-fixture-db';

/*
 * The figures of a plant `scale` times the benchmark plant, each beside a peer measured in the same
 * run on the same machine: the engine beside a recursive-SQL explosion, line risk beside the plan
 * of the same weeks, every API call beside GET /api/health. Wall-clock times; on a shared machine
 * they move with the load of everything else running.
 */

/** Moves tried on the board of a large plant: each is walked twice (from the last walk, and afresh). */
const BOARD_MOVES = 6;
const WEEKS_4 = 20;
const gunzip = promisify(gunzipCallback);

const median = (samples: number[]) => [...samples].sort((a, b) => a - b)[Math.floor(samples.length / 2)];
const p90 = (samples: number[]) => [...samples].sort((a, b) => a - b)[Math.ceil(samples.length * 0.9) - 1];
const mb = (bytes: number) => `${(bytes / 1e6).toFixed(2)} MB`;

function timed<T>(run: () => T): { value: T; ms: number } {
  const start = performance.now();
  const value = run();
  return { value, ms: performance.now() - start };
}

async function timedAsync<T>(run: () => Promise<T>): Promise<{ value: T; ms: number }> {
  const start = performance.now();
  const value = await run();
  return { value, ms: performance.now() - start };
}

/**
 * One GET taking gzip, timed to the last byte unzipped (as a browser does); `bytes` is the JSON's
 * size. Read with node:http and unzipped by zlib, as a browser's network stack does natively: this
 * client runs in the server's own process, and fetch's decoder (web streams over zlib) costs about
 * 50 ms more per 7 MB report on that thread, which is not the server's work (`getThroughFetch`
 * prints it beside).
 */
function get(url: string, token: string): Promise<{ ms: number; bytes: number; body: Buffer }> {
  const start = performance.now();
  return new Promise((resolve, reject) => {
    const headers = { Authorization: `Bearer ${token}`, 'Accept-Encoding': 'gzip' };
    httpGet(url, { headers }, (response) => {
      const chunks: Buffer[] = [];
      response.on('data', (chunk: Buffer) => chunks.push(chunk));
      response.on('error', reject);
      response.on('end', () => {
        if (response.statusCode !== 200) return reject(new Error(`GET ${url} answered ${response.statusCode}`));
        const raw = Buffer.concat(chunks);
        // Out of the event loop, in output chunks of 4 MB: at zlib's default of 16 kB a 7 MB body
        // takes four times as long, mostly in returning to the loop for every chunk.
        const body =
          response.headers['content-encoding'] === 'gzip' ? gunzip(raw, { chunkSize: 1 << 22 }) : Promise.resolve(raw);
        body.then((bytes) => resolve({ ms: performance.now() - start, bytes: bytes.length, body: bytes }), reject);
      });
    }).on('error', reject);
  });
}

/** The same GET through fetch, which unzips through web streams on this thread. */
async function getThroughFetch(url: string, token: string): Promise<number> {
  const start = performance.now();
  const response = await fetch(url, { headers: { Authorization: `Bearer ${token}`, 'Accept-Encoding': 'gzip' } });
  await response.arrayBuffer();
  if (!response.ok) throw new Error(`GET ${url} answered ${response.status}`);
  return performance.now() - start;
}

/** One POST with an idempotency key, as the line-end screen sends a build; or a PUT, as the board moves units. */
async function post(
  url: string,
  token: string,
  body: object,
  key: string,
  method: 'POST' | 'PUT' = 'POST',
): Promise<{ status: number }> {
  const response = await fetch(url, {
    method,
    headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json', 'Idempotency-Key': key },
    body: JSON.stringify(body),
  });
  await response.arrayBuffer();
  return { status: response.status };
}

/** Prints every figure of one plant size. */
export async function runScaleBench(scale: number, options: { browser?: boolean } = {}): Promise<void> {
  // From today, so the Horizon screen (which always looks ahead from today) shows the plant's demand.
  const fixture = generatePlanFixture({ scale, from: plantToday() });
  const to4 = addWorkingDays(fixture.from, WEEKS_4 - 1, fixture.calendar);
  const units4 = fixture.sequence.filter((slot) => slot.date <= to4);
  const inOrder = [...units4].sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : a.sequence - b.sequence));
  const modelLines = new Map<string, number>();
  for (const line of fixture.bom) modelLines.set(line.parent, (modelLines.get(line.parent) ?? 0) + 1);
  const structure = (part: string): number =>
    fixture.bom
      .filter((line) => line.parent === part)
      .reduce((sum, line) => sum + 1 + (modelLines.has(line.component) ? structure(line.component) : 0), 0);
  const linesPerModel = structure(fixture.parts.find((part) => part.source === 'end_item')!.partNumber);
  console.log(
    `\n=== ${scale}× plant: ${fixture.parts.length} parts, ${fixture.bom.length} BOM lines (${linesPerModel} below a model), ` +
      `${units4.length} units in 4 weeks ===`,
  );

  const db = await openDatabase(':memory:');
  const write = await timedAsync(() => writeFixture(db, fixture));
  console.log(`plant written to SQLite                 ${ms(write.ms)}`);

  // --- Engine beside recursive SQL, 4 weeks ---
  const sql: number[] = [];
  for (let run = 0; run < 4; run += 1) {
    sql.push((await timedAsync(() => db.manager.query(RECURSIVE_EXPLOSION, [fixture.from, to4]))).ms);
  }
  const planInput = { ...fixture, to: to4 };
  computePlan(planInput);
  const plan = Array.from({ length: 5 }, () => timed(() => computePlan(planInput)).ms);
  console.log(
    `computePlan, 4 weeks                    median ${ms(median(plan))}   | recursive SQL explosion ${ms(median(sql.slice(1)))} ` +
      `(${(median(sql.slice(1)) / median(plan)).toFixed(1)}× the engine)`,
  );

  // --- Line risk, 4 weeks, in place: every run is a run after a change (nothing is reused) ---
  const lineRiskInput: LineRiskInput = {
    parts: fixture.parts,
    bom: fixture.bom,
    sequence: units4,
    firmReceipts: fixture.scheduledReceipts,
    calendar: fixture.calendar,
    from: fixture.from,
    to: to4,
  };
  // What the server's worker does after a change: the walk, and the summary the report shows. The
  // first three walks are printed apart: the code is still being compiled as it runs.
  const coldSamples: number[] = [];
  for (let run = 0; run < 3; run += 1) coldSamples.push(timed(() => summarise(walkLineRisk(lineRiskInput))).ms);
  const walkSamples: number[] = [];
  for (let run = 0; run < 5; run += 1) walkSamples.push(timed(() => summarise(walkLineRisk(lineRiskInput))).ms);
  // What the worker does after a stock count: the walker walks again only the counted part.
  const walker = new LineRiskWalker();
  walker.walk(lineRiskInput);
  const againSamples: number[] = [];
  const againKinds = new Set<string>();
  const boughtAt = lineRiskInput.parts.flatMap((part, index) => (part.source === 'buy' ? [index] : []));
  for (let run = 0; run < 5; run += 1) {
    const counted = boughtAt[(run * 97) % boughtAt.length];
    const input = {
      ...lineRiskInput,
      parts: lineRiskInput.parts.map((part, index) =>
        index === counted ? { ...part, onHand: part.onHand + 1 } : part,
      ),
    };
    againSamples.push(timed(() => summarise(walker.walk(input))).ms);
    againKinds.add(walker.lastKind);
  }
  // What it does after a line of a bought component changed: units whose BOM passes the line are
  // exploded again, and only that part walked again.
  const source = new Map(fixture.parts.map((part) => [part.partNumber, part.source]));
  const boughtLines = lineRiskInput.bom.flatMap((line, index) => (source.get(line.component) === 'buy' ? [index] : []));
  const bomSamples: number[] = [];
  const bomKinds = new Set<string>();
  let bomInput = lineRiskInput;
  walker.walk(bomInput);
  for (let run = 0; run < 5; run += 1) {
    const changed = boughtLines[(run * 389) % boughtLines.length];
    bomInput = {
      ...bomInput,
      bom: bomInput.bom.map((line, index) => (index === changed ? { ...line, qtyPer: line.qtyPer + 1 } : line)),
    };
    bomSamples.push(timed(() => summarise(walker.walk(bomInput))).ms);
    bomKinds.add(walker.lastKind);
  }
  // The whole answer, every unit and slot at risk as an object. Only the figures are kept: a 16×
  // result is a million objects, and holding it here would slow the server below (same process)
  // with garbage collection.
  const lineRiskSamples: number[] = [];
  let lineRisk = { unitsAtRisk: 0, shortages: 0, slots: 0, jsonBytes: 0, gzipBytes: 0, firstAtRisk: false };
  for (let run = 0; run < 3; run += 1) {
    const { value, ms: runMs } = timed(() => computeLineRisk(lineRiskInput));
    lineRiskSamples.push(runMs);
    if (run > 0) continue;
    const json = Buffer.from(JSON.stringify(value));
    lineRisk = {
      unitsAtRisk: value.unitsAtRisk.length,
      shortages: value.shortages.length,
      slots: value.shortages.reduce((sum, shortage) => sum + shortage.slotsAtRisk.length, 0),
      jsonBytes: json.length,
      gzipBytes: gzipSync(json).length,
      firstAtRisk: value.unitsAtRisk[0]?.serial === inOrder[0].serial,
    };
  }
  const walkMs = median(walkSamples);
  const lineRiskMs = median(lineRiskSamples);
  console.log(
    `line risk, 4 weeks, walk + summary     median ${ms(walkMs)}   | computePlan same weeks ${ms(median(plan))} ` +
      `(${(walkMs / median(plan)).toFixed(1)}×)   target < 500 ms at 16×`,
  );
  console.log(`  the first three walks: ${coldSamples.map(ms).join(', ')}`);
  console.log(
    `  ${units4.length} units × ${linesPerModel} lines = ${units4.length * linesPerModel} unit-lines, ` +
      `${((walkMs * 1000) / (units4.length * linesPerModel)).toFixed(2)} µs each; ` +
      `${lineRisk.unitsAtRisk} units at risk, ${lineRisk.shortages} short parts, ${lineRisk.slots} slots at risk`,
  );
  console.log(
    `  walk again after a stock count       median ${ms(median(againSamples))} (${[...againKinds].join(', ')})`,
  );
  console.log(`  walk again after a bought BOM line   median ${ms(median(bomSamples))} (${[...bomKinds].join(', ')})`);
  console.log(`  whole answer, every slot an object   median ${ms(lineRiskMs)}`);
  // The Build sequence board's what-if, which the browser works out with the same engine.
  const boardTo = addWorkingDays(fixture.from, BOARD_WORKING_DAYS - 1, fixture.calendar);
  const boardInput = {
    ...lineRiskInput,
    to: boardTo,
    sequence: lineRiskInput.sequence.filter((slot) => slot.date <= boardTo),
  };
  printWhatIfBench(boardWhatIf(boardInput, BOARD_MOVES), `the ${scale}× plant`);

  // --- Through HTTP ---
  const token = await benchUser(db);
  const app = await listen(db);
  try {
    const demandUrl = `${app.base}/api/demand?from=${fixture.from}&to=${to4}`;
    const healthUrl = `${app.base}/api/health`;
    const first = await get(demandUrl, token);
    const cached: number[] = [];
    const health: number[] = [];
    for (let run = 0; run < 20; run += 1) {
      cached.push((await get(demandUrl, token)).ms);
      health.push((await get(healthUrl, token)).ms);
    }
    console.log(
      `GET /api/demand 4 weeks: first ${ms(first.ms)}, cached median ${ms(median(cached))} p90 ${ms(p90(cached))} ` +
        `| /api/health median ${ms(median(health))}   target < 200 ms cached at 16×`,
    );
    console.log(`  body ${mb(first.bytes)} JSON, ${mb(gzipSync(first.body).length)} gzipped`);

    // Line risk through the API: computed in the worker while /api/health keeps answering.
    const lineRiskUrl = `${app.base}/api/line-risk?from=${fixture.from}&to=${to4}`;
    const during: number[] = [];
    let done = false;
    const report = get(lineRiskUrl, token).finally(() => (done = true));
    while (!done) during.push((await get(healthUrl, token)).ms);
    const firstReport = await report;
    // The cached report, read as every figure below is read and through fetch: the client's own share.
    const cachedReads: number[] = [];
    const cachedFetches: number[] = [];
    for (let run = 0; run < 5; run += 1) {
      cachedReads.push((await get(lineRiskUrl, token)).ms);
      cachedFetches.push(await getThroughFetch(lineRiskUrl, token));
    }
    // A BOM line's quantity changed, bumped as the BOM service bumps: only the BOM is read again
    // (with stock, firm receipts and loops). A line of a bought component is walked again for that
    // part alone; after a line of a made one (taken from stock in turn) every unit is judged again,
    // the units of the models it reaches exploded anew.
    const changeBomLine = (source: 'buy' | 'make', run: number) =>
      db.write(async (manager) => {
        await manager.query(
          `UPDATE bom_line SET qty_per = qty_per + ? WHERE id = (SELECT MIN(l.id) FROM bom_line l
            JOIN part p ON p.part_number = l.component WHERE p.source = ?)`,
          [run % 2 === 0 ? 1 : -1, source],
        );
        await bumpPlanningVersion(manager, 'bom');
      });
    // The worker's code is compiled as it runs: its first walks are slower than those of a server
    // that has been up a while. Six walks that judge every unit first, printed, then the figures
    // after each change.
    const warmUp: number[] = [];
    for (let run = 0; run < 6; run += 1) {
      await changeBomLine('make', run);
      warmUp.push((await get(lineRiskUrl, token)).ms);
    }
    // After a change of the planning data that leaves the line risk's inputs as they were (a
    // release drafted or sent, bumped as release events bump: stock, firm receipts and loops read
    // again), and the result kept.
    const afterChange: number[] = [];
    for (let run = 0; run < 3; run += 1) {
      await db.write((manager) => bumpPlanningVersion(manager, 'stock'));
      afterChange.push((await get(lineRiskUrl, token)).ms);
    }
    // After a stock count of one bought part, posted as the stock screen posts it: only stock is
    // read again, and the walker walks only that part again.
    const bought = fixture.parts.filter((part) => part.source === 'buy');
    const afterStock: number[] = [];
    for (let run = 0; run < 5; run += 1) {
      await db.write((manager) =>
        postMovements(manager, [{ partNumber: bought[run * 97].partNumber, qty: 1, kind: 'count', userEmail: null }]),
      );
      afterStock.push((await get(lineRiskUrl, token)).ms);
    }
    // After a BOM line changed, of a bought and of a made component (see changeBomLine).
    const afterBomLine = async (source: 'buy' | 'make') => {
      const samples: number[] = [];
      for (let run = 0; run < 3; run += 1) {
        await changeBomLine(source, run);
        samples.push((await get(lineRiskUrl, token)).ms);
      }
      return median(samples);
    };
    const afterBoughtLine = await afterBomLine('buy');
    const afterMadeLine = await afterBomLine('make');
    // After the first units of the sequence are reported built (backflushed through the API): the
    // sequence and stock are read again; units the last walk found buildable are taken out of it,
    // after a unit it found at risk every other unit is judged again with the needs it found.
    const afterBuild: number[] = [];
    for (let run = 0; run < 3; run += 1) {
      const built = await post(`${app.base}/api/builds`, token, { serial: inOrder[run].serial }, `bench-${run}`);
      if (built.status !== 201) throw new Error(`POST /api/builds answered ${built.status}`);
      afterBuild.push((await get(lineRiskUrl, token)).ms);
    }
    // After two units of a day in the middle of the horizon swapped places on the board: the
    // sequence is read again, every unit judged again, and only units whose made stock moved
    // exploded again.
    const middle = inOrder.filter((slot) => slot.date === inOrder[Math.floor(inOrder.length / 2)].date);
    const afterMove: number[] = [];
    for (let run = 0; run < 3; run += 1) {
      const serials = middle.map((slot) => slot.serial);
      if (run % 2 === 0) serials.splice(0, 2, serials[1], serials[0]);
      const moved = await post(
        `${app.base}/api/sequence/days`,
        token,
        { days: [{ date: middle[0].date, serials }], allowFrozen: true },
        `bench-move-${run}`,
        'PUT',
      );
      if (moved.status !== 200) throw new Error(`PUT /api/sequence/days answered ${moved.status}`);
      afterMove.push((await get(lineRiskUrl, token)).ms);
    }
    // After a part master change (a made part's lead time, bumped as the part editor bumps): the
    // part master is read again, every unit judged again, those passing the part exploded anew.
    const madePart = fixture.parts.find((part) => part.source === 'make')!.partNumber;
    const afterPartEdit: number[] = [];
    for (let run = 0; run < 3; run += 1) {
      await db.write(async (manager) => {
        await manager.query(`UPDATE part SET lead_time_days = lead_time_days + ? WHERE part_number = ?`, [
          run % 2 === 0 ? 1 : -1,
          madePart,
        ]);
        await bumpPlanningVersion(manager, 'parts');
      });
      afterPartEdit.push((await get(lineRiskUrl, token)).ms);
    }
    // After a calendar change, bumped as the calendar screen bumps: a holiday set weeks past the
    // horizon, then lifted (every working day the walk reads stands: every unit judged again), and
    // a holiday set in the middle of the horizon, then lifted (the days move: every unit walked
    // afresh).
    const afterHoliday = async (date: string) => {
      const samples: number[] = [];
      for (let run = 0; run < 3; run += 1) {
        await db.write(async (manager) => {
          if (run % 2 === 0) {
            await manager.query(`INSERT INTO plant_holiday (date, name) VALUES (?, 'Bench')`, [date]);
          } else await manager.query(`DELETE FROM plant_holiday WHERE name = 'Bench'`);
          await bumpPlanningVersion(manager, 'calendar');
        });
        samples.push((await get(lineRiskUrl, token)).ms);
      }
      return median(samples);
    };
    const afterHolidayAhead = await afterHoliday(addWorkingDays(to4, 30, fixture.calendar));
    const afterHolidayInside = await afterHoliday(addWorkingDays(fixture.from, 10, fixture.calendar));
    console.log(
      `GET /api/line-risk 4 weeks: first ${ms(firstReport.ms)} (worker starting), then after a made BOM line ` +
        `(every unit judged again, the worker's code still compiling): ${warmUp.map(ms).join(', ')}`,
    );
    console.log(
      `  cached median ${ms(median(cachedReads))} (through fetch ${ms(median(cachedFetches))}), ` +
        `after a change it does not read median ${ms(median(afterChange))}, ` +
        `after a stock count median ${ms(median(afterStock))}   target < 500 ms at 16×`,
    );
    console.log(
      `  after a BOM change: bought component median ${ms(afterBoughtLine)}, made component median ${ms(afterMadeLine)}; ` +
        `after a unit built median ${ms(median(afterBuild))} (${inOrder[0].serial} is ${lineRisk.firstAtRisk ? 'at risk' : 'buildable'} in the walk)`,
    );
    console.log(
      `  after two units of a day swapped on the board median ${ms(median(afterMove))}; ` +
        `after a made part's lead time changed median ${ms(median(afterPartEdit))}; ` +
        `after a holiday set weeks ahead median ${ms(afterHolidayAhead)}, ` +
        `inside the horizon (every unit walked afresh) median ${ms(afterHolidayInside)}`,
    );
    console.log(
      `  report ${mb(firstReport.bytes)} JSON | full result ${mb(lineRisk.jsonBytes)} JSON, ${mb(lineRisk.gzipBytes)} gzipped`,
    );
    console.log(
      `  /api/health meanwhile: ${during.length} calls, median ${ms(median(during))}, max ${ms(Math.max(...during))}`,
    );
    if (scale === 1) await throughput(app.base, token, demandUrl);
  } finally {
    await app.close();
  }
  try {
    if (options.browser) {
      await printHorizonOpen(db);
      await printScreensOpen(db);
    }
  } finally {
    await db.close();
  }
}

const fiftyFor10s = async (url: string, token: string) =>
  formatLoad(await load(url, token, { connections: 50, duration: 10 }));

/** 50 connections for 10 s each: the 1× plant's demand, the demo plant's dock board, and /api/health. */
async function throughput(base: string, token: string, demandUrl: string): Promise<void> {
  console.log('throughput, 50 connections, 10 s each (autocannon on the same machine):');
  console.log(`  GET /api/demand 4 weeks  ${await fiftyFor10s(demandUrl, token)}`);
  console.log(`  GET /api/health          ${await fiftyFor10s(`${base}/api/health`, token)}`);
  const demo = await openDatabase(':memory:');
  await seedDemoScenario(demo, plantToday());
  const demoToken = await benchUser(demo);
  const demoApp = await listen(demo);
  try {
    console.log(`  GET /api/dock (demo)     ${await fiftyFor10s(`${demoApp.base}/api/dock`, demoToken)}`);
    console.log(`  GET /api/health (demo)   ${await fiftyFor10s(`${demoApp.base}/api/health`, demoToken)}`);
  } finally {
    await demoApp.close();
    await demo.close();
  }
}
