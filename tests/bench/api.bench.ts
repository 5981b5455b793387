import type { Request as LoadRequest } from 'autocannon';
import { fork, type ChildProcess } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { parseArgs } from 'node:util';
import type { Plant, Question, ServerQuestion, ServerReady, StockTotals } from './api-server';
import { formatLoad, load, type LoadFigures } from './http-load';

/*
 * `npm run bench:api`: the API under load through real HTTP on loopback, the server in a child
 * process of its own. Prints /api/health as the baseline of the same run, GET /api/demand (4 weeks)
 * and GET /api/dock at 50 connections, POST /api/receipts at 20 connections with the stock checked
 * afterwards, then a soak cycling those calls while the server's memory is sampled every 10 s.
 *
 *   --plant 1x|demo      the benchmark plant at 1× with its open receipts on the dock (default), or the demo
 *   --duration 10        seconds of each load run
 *   --soak 120           seconds of the soak (0: none)
 *   --snapshots <dir>    heap snapshots after the soak's first minute and at its end, to compare
 *                        (writing one raises the server's RSS by itself: read the memory series without)
 *
 * Figures only, nothing passes or fails but the stock check; a shared machine moves them.
 */

const { values } = parseArgs({
  options: {
    plant: { type: 'string', default: '1x' },
    duration: { type: 'string', default: '10' },
    soak: { type: 'string', default: '120' },
    snapshots: { type: 'string' },
  },
});
const plant = values.plant as Plant;
const duration = Number(values.duration);
const soakSeconds = Number(values.soak);
if (plant !== '1x' && plant !== 'demo') throw new Error('--plant is 1x or demo');
if (!(duration > 0) || !(soakSeconds >= 0)) throw new Error('--duration takes seconds above 0, --soak seconds from 0');

const READ_CONNECTIONS = 50;
const RECEIPT_CONNECTIONS = 20;
const SAMPLE_EVERY_MS = 10_000;
/** Every so many receipts one repeats an earlier key, as a retry after a lost answer would. */
const REPEAT_EVERY = 10;
const SOAK_STEP_SECONDS = 5;

/** The server child and its answers over IPC. */
class BenchServer {
  private nextId = 1;
  private readonly waiting = new Map<number, (message: { value?: unknown; error?: string }) => void>();

  private constructor(
    private readonly child: ChildProcess,
    readonly ready: ServerReady,
  ) {
    child.on('message', (message: { id?: number; value?: unknown; error?: string }) => {
      const resolve = message.id === undefined ? undefined : this.waiting.get(message.id);
      if (!resolve) return;
      this.waiting.delete(message.id!);
      resolve(message);
    });
  }

  static start(plant: Plant): Promise<BenchServer> {
    const child = fork(join(import.meta.dirname, 'api-server.ts'), [plant], {
      execArgv: ['--import', 'tsx', '--expose-gc', ...(process.env.BENCH_SERVER_ARGS?.split(' ') ?? [])],
      stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
    });
    return new Promise((resolve, reject) => {
      child.once('exit', (code) => reject(new Error(`the bench server stopped before listening (exit ${code})`)));
      child.once('message', (message: ServerReady) => resolve(new BenchServer(child, message)));
    });
  }

  ask<T>(question: Question): Promise<T> {
    const id = this.nextId++;
    return new Promise((resolve, reject) => {
      this.waiting.set(id, (message) =>
        message.error ? reject(new Error(message.error)) : resolve(message.value as T),
      );
      this.child.send({ ...question, id } satisfies ServerQuestion);
    });
  }

  stop(): Promise<void> {
    return new Promise((resolve) => {
      this.child.once('exit', () => resolve());
      this.child.disconnect();
      setTimeout(() => this.child.kill(), 10_000).unref();
    });
  }
}

/**
 * Receipts under fresh keys, with every REPEAT_EVERY-th request repeating a key sent a little
 * earlier (maybe still in flight): it must be answered 200 with the first receipt and count nothing.
 * A key always carries the same body, so a repeat is a true retry. A key the server answered 201 or
 * 200 is stored; one still in flight when a run stops is sent again afterwards, as a client whose
 * answer was lost would, and its answer says whether the first attempt had landed.
 */
class ReceiptTraffic {
  private sent = 0;
  private keys = 0;
  private readonly unanswered = new Set<number>();
  private readonly stored = new Set<number>();
  created = 0;
  replayed = 0;
  settled = 0;
  readonly other: Record<string, number> = {};

  constructor(private readonly lineIds: number[]) {}

  private static qtyOf(key: number): number {
    return 1 + (key % 3);
  }

  private bodyOf(key: number): string {
    return JSON.stringify({ releaseLineId: this.lineIds[key % this.lineIds.length], qty: ReceiptTraffic.qtyOf(key) });
  }

  private headersOf(key: number): Record<string, string> {
    return { 'Content-Type': 'application/json', 'Idempotency-Key': `bench-api-${key}` };
  }

  private answered(key: number, status: number): void {
    this.unanswered.delete(key);
    if (status === 201) this.created += 1;
    else if (status === 200) this.replayed += 1;
    else this.other[status] = (this.other[status] ?? 0) + 1;
    if (status === 201 || status === 200) this.stored.add(key);
  }

  /** Distinct keys the server holds a receipt for, and their quantity. */
  get accepted(): { receipts: number; qty: number } {
    let qty = 0;
    for (const key of this.stored) qty += ReceiptTraffic.qtyOf(key);
    return { receipts: this.stored.size, qty };
  }

  requests(): LoadRequest[] {
    return [
      {
        method: 'POST',
        path: '/api/receipts',
        setupRequest: (request, context) => {
          this.sent += 1;
          const repeat = this.sent % REPEAT_EVERY === 0 && this.keys > 3;
          const key = repeat ? this.keys - 3 : this.keys++;
          context.key = key;
          this.unanswered.add(key);
          return { ...request, headers: { ...request.headers, ...this.headersOf(key) }, body: this.bodyOf(key) };
        },
        onResponse: (status, _body, context) => this.answered(context.key as number, status),
      },
    ];
  }

  /** Sends every key left in flight when the run stopped once more, one after another. */
  async settle(base: string, token: string): Promise<void> {
    for (const key of [...this.unanswered]) {
      const response = await fetch(`${base}/api/receipts`, {
        method: 'POST',
        headers: { Authorization: `Bearer ${token}`, ...this.headersOf(key) },
        body: this.bodyOf(key),
      });
      await response.arrayBuffer();
      this.settled += 1;
      this.answered(key, response.status);
    }
  }
}

const mb = (bytes: number) => `${(bytes / 1048576).toFixed(0)} MB`;

function stockCheck(before: StockTotals, after: StockTotals, traffic: ReceiptTraffic): string {
  const accepted = traffic.accepted;
  const expected = before.onHand + accepted.qty;
  const stockOk = Math.abs(after.onHand - expected) < 1e-6;
  const rowsOk = after.receipts - before.receipts === accepted.receipts;
  const others = Object.entries(traffic.other).map(([status, count]) => `${count} × ${status}`);
  return (
    `${stockOk && rowsOk ? 'OK' : 'MISMATCH'}: on-hand ${before.onHand} + ${accepted.qty} accepted = ${expected}, ` +
    `server holds ${after.onHand}; ${accepted.receipts} keys accepted, ${after.receipts - before.receipts} receipts stored ` +
    `(${traffic.created} answers 201, ${traffic.replayed} repeats answered 200, ${traffic.settled} in flight at a stop sent again` +
    `${others.length ? `, ${others.join(', ')}` : ''})`
  );
}

async function warm(url: string, token: string): Promise<number> {
  const start = performance.now();
  const response = await fetch(url, { headers: { Authorization: `Bearer ${token}`, 'Accept-Encoding': 'gzip' } });
  await response.arrayBuffer();
  if (!response.ok) throw new Error(`GET ${url} answered ${response.status}`);
  return performance.now() - start;
}

interface MemorySample {
  seconds: number;
  rss: number;
  heapTotal: number;
  heapUsed: number;
  external: number;
}

async function soak(server: BenchServer, traffic: ReceiptTraffic, urls: Record<string, string>): Promise<void> {
  const { base, token } = server.ready;
  console.log(
    `\nsoak, ${soakSeconds} s: ${SOAK_STEP_SECONDS} s each of health, demand, dock (${READ_CONNECTIONS} connections) ` +
      `and receipts (${RECEIPT_CONNECTIONS}) in turn; server memory every ${SAMPLE_EVERY_MS / 1000} s after a full GC`,
  );
  const samples: MemorySample[] = [];
  const start = performance.now();
  const sample = async () => {
    const memory = await server.ask<NodeJS.MemoryUsage>({ kind: 'memory' });
    const seconds = Math.round((performance.now() - start) / 1000);
    samples.push({
      seconds,
      rss: memory.rss,
      heapTotal: memory.heapTotal,
      heapUsed: memory.heapUsed,
      external: memory.external,
    });
    console.log(
      `  ${String(seconds).padStart(4)} s  rss ${mb(memory.rss).padStart(7)}  heapTotal ${mb(memory.heapTotal).padStart(7)}  heapUsed ${mb(memory.heapUsed).padStart(7)}  ` +
        `external ${mb(memory.external).padStart(6)}`,
    );
  };
  await sample();
  const sampler = setInterval(() => void sample(), SAMPLE_EVERY_MS);
  const steps: (() => Promise<LoadFigures>)[] = [
    () => load(urls.health, token, { connections: READ_CONNECTIONS, duration: SOAK_STEP_SECONDS }),
    () => load(urls.demand, token, { connections: READ_CONNECTIONS, duration: SOAK_STEP_SECONDS }),
    () => load(urls.dock, token, { connections: READ_CONNECTIONS, duration: SOAK_STEP_SECONDS }),
    () =>
      load(`${base}/api/receipts`, token, {
        connections: RECEIPT_CONNECTIONS,
        duration: SOAK_STEP_SECONDS,
        requests: traffic.requests(),
      }),
  ];
  let failed = 0;
  let requests = 0;
  let snapshotTaken = false;
  for (let step = 0; performance.now() - start < soakSeconds * 1000; step += 1) {
    const figures = await steps[step % steps.length]();
    failed += figures.failed;
    requests += figures.total;
    if (!snapshotTaken && performance.now() - start >= 60_000 && values.snapshots) {
      snapshotTaken = true;
      mkdirSync(values.snapshots, { recursive: true });
      console.log(
        `  heap snapshot: ${await server.ask<string>({ kind: 'snapshot', path: join(values.snapshots, 'after-1-minute.heapsnapshot') })}`,
      );
    }
  }
  clearInterval(sampler);
  await sample();
  if (values.snapshots) {
    console.log(
      `  heap snapshot: ${await server.ask<string>({ kind: 'snapshot', path: join(values.snapshots, 'at-end.heapsnapshot') })}`,
    );
  }
  const atMinute = samples.find((entry) => entry.seconds >= 60);
  const last = samples.at(-1)!;
  console.log(`  ${requests} requests, ${failed} outside 2xx or failed (receipts: 409/422 would show in the check)`);
  if (atMinute && atMinute !== last) {
    const minutes = (last.seconds - atMinute.seconds) / 60;
    const rest = samples.filter((entry) => entry.seconds >= atMinute.seconds);
    const range = (pick: (entry: MemorySample) => number) =>
      `${mb(Math.min(...rest.map(pick)))}–${mb(Math.max(...rest.map(pick)))}`;
    console.log(
      `  growth after the first minute (${atMinute.seconds} s → ${last.seconds} s): rss ${signed(last.rss - atMinute.rss)}, ` +
        `heapUsed ${signed(last.heapUsed - atMinute.heapUsed)} (${signed((last.heapUsed - atMinute.heapUsed) / minutes)} a minute); ` +
        `over that time rss ${range((entry) => entry.rss)}, heapUsed ${range((entry) => entry.heapUsed)}`,
    );
  } else {
    console.log('  the soak was too short to compare against its first minute (give --soak 90 or more)');
  }
}

const signed = (bytes: number) => `${bytes >= 0 ? '+' : '−'}${(Math.abs(bytes) / 1048576).toFixed(1)} MB`;

const server = await BenchServer.start(plant);
try {
  const { base, token, from, to4, receiptLineIds } = server.ready;
  const urls = {
    health: `${base}/api/health`,
    demand: `${base}/api/demand?from=${from}&to=${to4}`,
    dock: `${base}/api/dock`,
  };
  const memory = await server.ask<NodeJS.MemoryUsage>({ kind: 'memory' });
  console.log(
    `${plant === '1x' ? 'benchmark plant at 1×' : 'demo plant'}, server in a child process, rss ${mb(memory.rss)} ` +
      `heapUsed ${mb(memory.heapUsed)} after start`,
  );
  console.log(
    `first calls: GET /api/demand 4 weeks ${(await warm(urls.demand, token)).toFixed(0)} ms, ` +
      `GET /api/dock ${(await warm(urls.dock, token)).toFixed(0)} ms`,
  );
  const read = (url: string) => load(url, token, { connections: READ_CONNECTIONS, duration });
  console.log(`${READ_CONNECTIONS} connections, ${duration} s each (autocannon in this process, server in its own):`);
  console.log(`  GET /api/health            ${formatLoad(await read(urls.health))}`);
  console.log(`  GET /api/demand 4 weeks    ${formatLoad(await read(urls.demand))}`);
  console.log(`  GET /api/dock              ${formatLoad(await read(urls.dock))}`);

  const traffic = new ReceiptTraffic(receiptLineIds);
  const before = await server.ask<StockTotals>({ kind: 'stock' });
  const receipts = await load(`${base}/api/receipts`, token, {
    connections: RECEIPT_CONNECTIONS,
    duration,
    requests: traffic.requests(),
  });
  console.log(`${RECEIPT_CONNECTIONS} connections, ${duration} s, a repeated key every ${REPEAT_EVERY}th request:`);
  console.log(`  POST /api/receipts         ${formatLoad(receipts)}`);
  await traffic.settle(base, token);
  console.log(`  stock ${stockCheck(before, await server.ask<StockTotals>({ kind: 'stock' }), traffic)}`);

  if (soakSeconds > 0) {
    await soak(server, traffic, urls);
    await traffic.settle(base, token);
    console.log(
      `  stock after the soak ${stockCheck(before, await server.ask<StockTotals>({ kind: 'stock' }), traffic)}`,
    );
  }
} finally {
  await server.stop();
}
