import { writeHeapSnapshot } from 'node:v8';
import { readCalendar } from '../../server/calendar/calendar.service';
import { openDatabase, type Database } from '../../server/db/database';
import { ReceiptEntity } from '../../server/dock/receipt.entity';
import { PartEntity } from '../../server/master-data/part.entity';
import { plantToday } from '../../server/planning/plan-dates';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { ReleaseLineEntity } from '../../server/releases/release-line.entity';
import { seedDemoScenario } from '../../seed/seed-demo';
import { addWorkingDays } from '../../shared/domain/calendar';
import { benchUser, listen } from './http-load';
import { generatePlanFixture } from './plan-fixture';
import { writeFixture } from './plan-fixture-db';

/*
 * The server `npm run bench:api` loads, in a process of its own so that its memory is its own and
 * the load generator does not share its event loop. It builds a plant, listens on loopback, tells
 * the parent where, and answers the parent's questions over the IPC channel: memory (after a full
 * garbage collection when started with --expose-gc), the stock totals, a heap snapshot.
 */

export type Plant = '1x' | 'demo';

/** Sent once the server listens. */
export interface ServerReady {
  kind: 'ready';
  base: string;
  token: string;
  from: string;
  to4: string;
  /** Open release lines the receipts run counts against, each ordered far more than it can receive. */
  receiptLineIds: number[];
}

export type Question = { kind: 'memory' | 'stock' } | { kind: 'snapshot'; path: string };
export type ServerQuestion = Question & { id: number };

export interface StockTotals {
  onHand: number;
  receipts: number;
  receiptQty: number;
}

const RECEIPT_LINES = 20;
const WEEKS_4 = 20;

async function buildPlant(db: Database, plant: Plant): Promise<{ from: string; to4: string }> {
  const today = plantToday();
  if (plant === 'demo') {
    await seedDemoScenario(db, today);
    return { from: today, to4: addWorkingDays(today, WEEKS_4 - 1, await readCalendar(db.manager)) };
  }
  const fixture = generatePlanFixture({ scale: 1, from: today });
  await writeFixture(db, fixture);
  // The plant's open receipts become confirmed releases, one a supplier and day, so the dock board
  // holds what such a plant has on its way in.
  const supplierOf = new Map(fixture.parts.map((part) => [part.partNumber, part.supplierCode ?? null]));
  const releases = new Map<string, { supplierCode: string; date: string; lines: typeof fixture.scheduledReceipts }>();
  for (const receipt of fixture.scheduledReceipts) {
    const supplierCode = supplierOf.get(receipt.partNumber);
    if (!supplierCode) continue;
    const key = `${supplierCode}|${receipt.date}`;
    const release = releases.get(key) ?? { supplierCode, date: receipt.date, lines: [] };
    release.lines.push(receipt);
    releases.set(key, release);
  }
  await db.write(async (manager) => {
    let number = 0;
    for (const release of releases.values()) {
      number += 1;
      const saved = await manager.save(ReleaseEntity, {
        number: `R-PLANT-${number}`,
        supplierCode: release.supplierCode,
        releaseDate: release.date,
        status: 'confirmed',
        sentAt: new Date().toISOString(),
        dockColumn: 'expected',
      });
      await manager.insert(
        ReleaseLineEntity,
        release.lines.map((line) => ({
          releaseId: saved.id,
          partNumber: line.partNumber,
          qty: line.qty,
          needDate: line.date,
          origin: 'plan',
          cardId: null,
          confirmedQty: null,
          receivedQty: 0,
          closed: false,
        })),
      );
    }
  });
  return { from: fixture.from, to4: addWorkingDays(fixture.from, WEEKS_4 - 1, fixture.calendar) };
}

/** Releases of a bought part, each ordered so much that the receipts run never closes them. */
async function receiptLines(db: Database): Promise<number[]> {
  return db.write(async (manager) => {
    const part = await manager.findOneOrFail(PartEntity, {
      where: { source: 'buy' },
      order: { partNumber: 'ASC' },
    });
    const ids: number[] = [];
    for (let index = 0; index < RECEIPT_LINES; index += 1) {
      const release = await manager.save(ReleaseEntity, {
        number: `R-BENCH-${index}`,
        supplierCode: part.supplierCode!,
        releaseDate: plantToday(),
        reference: `bench ${index}`,
        status: 'confirmed',
        sentAt: new Date().toISOString(),
        dockColumn: 'expected',
      });
      const line = await manager.save(ReleaseLineEntity, {
        releaseId: release.id,
        partNumber: part.partNumber,
        qty: 1_000_000_000,
        needDate: plantToday(),
        origin: 'plan',
        cardId: null,
        confirmedQty: null,
        receivedQty: 0,
        closed: false,
      });
      ids.push(line.id);
    }
    return ids;
  });
}

async function stockTotals(db: Database): Promise<StockTotals> {
  return db.read(async (manager) => {
    const parts = await manager.find(PartEntity, { select: { partNumber: true, onHand: true } });
    const receipts = await manager.find(ReceiptEntity, { select: { id: true, qty: true } });
    return {
      onHand: parts.reduce((sum, part) => sum + part.onHand, 0),
      receipts: receipts.length,
      receiptQty: receipts.reduce((sum, receipt) => sum + receipt.qty, 0),
    };
  });
}

const gc = (globalThis as { gc?: () => void }).gc;

async function answer(db: Database, question: ServerQuestion): Promise<unknown> {
  switch (question.kind) {
    case 'memory':
      gc?.();
      return process.memoryUsage();
    case 'stock':
      return stockTotals(db);
    case 'snapshot':
      gc?.();
      return writeHeapSnapshot(question.path);
  }
}

const plant: Plant = process.argv[2] === 'demo' ? 'demo' : '1x';
const db = await openDatabase(':memory:');
const horizon = await buildPlant(db, plant);
const receiptLineIds = await receiptLines(db);
const token = await benchUser(db);
const app = await listen(db);
process.on('message', (question: ServerQuestion) => {
  void answer(db, question).then(
    (value) => process.send!({ id: question.id, value }),
    (error: unknown) => process.send!({ id: question.id, error: String(error) }),
  );
});
process.on('disconnect', () => {
  void app.close().then(() => db.close());
});
process.send!({ kind: 'ready', base: app.base, token, ...horizon, receiptLineIds } satisfies ServerReady);
