import { spawn } from 'node:child_process';
import { parseArgs } from 'node:util';
import { printCloseDayBench, runCloseDayBench } from './close-day.bench';
import { printDatabaseBench, runDatabaseBench } from './database.bench';
import { runPlanBench } from './plan.bench';
import { runScaleBench } from './scale.bench';
import { printWhatIfBench, runWhatIfBench } from './what-if.bench';
import { printReceiptsBench, runReceiptsBench } from './receipts.bench';

// `npm run bench`: figures only, no pass/fail; targets are compared by a person reading them.
// `npm run bench -- --scale 16` (or `--scale 1,4,16`): the plant-size figures alone, for each size
// (several sizes each in a process of their own);
// add `--browser` for the time the Horizon and then every other screen take to open in Chromium.
// `npm run bench -- --engines`: the database figures alone, on SQLite and (BENCH_DATABASE_URL) PostgreSQL.
const { values } = parseArgs({
  options: { scale: { type: 'string' }, browser: { type: 'boolean' }, engines: { type: 'boolean' } },
});
const scales = values.scale ? values.scale.split(',').map(Number) : null;
if (scales?.some((scale) => !Number.isInteger(scale) || scale < 1)) {
  throw new Error('--scale takes whole numbers from 1, separated by commas (e.g. --scale 1,4,16)');
}

/** The figures that touch the database, on SQLite and then on PostgreSQL when a server is named. */
async function engineFigures(): Promise<void> {
  // BENCH_DATABASE_URL (or TEST_DATABASE_URL) names a server the bench may create throw-away databases on.
  const postgresServer = process.env.BENCH_DATABASE_URL ?? process.env.TEST_DATABASE_URL;
  for (const engine of ['SQLite', 'PostgreSQL']) {
    if (engine === 'PostgreSQL') {
      if (!postgresServer) {
        console.log('\nPostgreSQL figures skipped: set BENCH_DATABASE_URL to a PostgreSQL server.');
        break;
      }
      process.env.SCRATCH_DATABASE_URL = postgresServer;
    }
    console.log(`\n— ${engine} —`);
    printDatabaseBench(await runDatabaseBench());
    printCloseDayBench(await runCloseDayBench());
    printReceiptsBench(await runReceiptsBench(1));
    if (engine === 'PostgreSQL') printReceiptsBench(await runReceiptsBench(2));
  }
}

if (values.engines) {
  await engineFigures();
} else if (!scales) {
  const ms = (value: number) => `${value.toFixed(2)} ms`;
  const plan = await runPlanBench();
  console.log(
    `Synthetic plant: ${plan.parts} parts, ${plan.bomLines} BOM lines, ${plan.sequenceSlots} sequence slots, ${plan.workingDays} working days`,
  );
  console.log(
    `computePlan (explosion + netting)  median ${ms(plan.medianMs)}  p90 ${ms(plan.p90Ms)}  (target < 25 ms; ${plan.runs} runs)`,
  );
  console.log(
    `  + every bucket object           median ${ms(plan.allBucketsMedianMs)}  p90 ${ms(plan.allBucketsP90Ms)}`,
  );
  console.log(`  + demand report                 median ${ms(plan.demandMedianMs)}  p90 ${ms(plan.demandP90Ms)}`);
  console.log(`bare typed-array explosion floor   median ${ms(plan.floorMedianMs)}  p90 ${ms(plan.floorP90Ms)}`);
  console.log(`engine / floor                     ${(plan.medianMs / plan.floorMedianMs).toFixed(1)}×`);
  console.log('');
  await engineFigures();
  console.log('');
  printWhatIfBench(await runWhatIfBench());
}
/**
 * One plant size in a process of its own, as a server holds one plant: what a smaller plant's run
 * leaves on the heap (its fixture, its database, its workers' garbage) then does not slow the next
 * size's figures.
 */
function runScaleApart(scale: number): Promise<void> {
  const args = [
    ...process.execArgv,
    process.argv[1]!,
    '--scale',
    String(scale),
    ...(values.browser ? ['--browser'] : []),
  ];
  return new Promise((resolve, reject) => {
    spawn(process.execPath, args, { stdio: 'inherit' })
      .on('error', reject)
      .on('exit', (code) =>
        code === 0 ? resolve() : reject(new Error(`The ${scale}× run stopped (exit code ${code}).`)),
      );
  });
}

if (!values.engines) {
  if (scales && scales.length > 1) for (const scale of scales) await runScaleApart(scale);
  else await runScaleBench(scales?.[0] ?? 1, { browser: values.browser });
}
