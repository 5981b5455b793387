import type { AddressInfo, Server } from 'node:net';
import { performance } from 'node:perf_hooks';
import { createApp } from '../../server/app';
import { sessionExpiry, signSessionToken } from '../../server/auth/tokens';
import { openDatabase, type Database } from '../../server/db/database';
import { ReceiptEntity } from '../../server/dock/receipt.entity';
import { PartEntity } from '../../server/master-data/part.entity';
import { SupplierEntity } from '../../server/master-data/supplier.entity';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { ReleaseLineEntity } from '../../server/releases/release-line.entity';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { StockMovementEntity } from '../../server/stock/stock-movement.entity';
import { openSession } from '../../server/users/sessions';
import { UserEntity } from '../../server/users/user.entity';

/*
 * Dock check-ins through real HTTP on loopback: CONNECTIONS clients each post RECEIPTS_EACH
 * receipts (partial deliveries of one unit, every one under its own key) to their own release
 * line, spread over the nodes. Afterwards every receipt must be in the database once and on-hand
 * must equal the ledger.
 */
const CONNECTIONS = 20;
const RECEIPTS_EACH = 40;
const PARTS = 10;
const SECRET = 'bench-secret-bench-secret-bench-secret-bench';

export interface ReceiptsBenchFigures {
  label: string;
  receipts: number;
  perSecond: number;
  stored: number;
  lost: number;
  doubled: number;
  ledgerMatches: boolean;
}

async function arrange(db: Database): Promise<{ token: string; lineIds: number[] }> {
  const source = db.dataSource;
  await source.getRepository(SupplierEntity).insert({
    code: 'SUP-A',
    name: 'Supplier A',
    email: 'orders@supplier-a.example.com',
    leadTimeDays: 1,
    cycleDays: 1,
    deliveriesPerCycle: 1,
    deliveryDelay: 1,
  });
  const parts = Array.from({ length: PARTS }, (_, index) => `BENCH-${index}`);
  await db.write((manager) =>
    savePartsWithStock(
      manager,
      parts.map((partNumber) => ({
        partNumber,
        description: partNumber,
        uom: 'H87',
        source: 'buy',
        supplierCode: 'SUP-A',
        leadTimeDays: 1,
        packQty: 1,
        onHand: 0,
        replenishment: 'scheduled',
        safetyStock: 0,
        pointOfUse: null,
        hazardous: false,
      })),
    ),
  );
  const lineIds: number[] = [];
  for (let index = 0; index < CONNECTIONS; index += 1) {
    const release = await source.getRepository(ReleaseEntity).save({
      number: `R-BENCH-${index}`,
      supplierCode: 'SUP-A',
      releaseDate: `2026-0${1 + Math.floor(index / 28)}-${String((index % 28) + 1).padStart(2, '0')}`,
      status: 'confirmed',
      sentAt: new Date().toISOString(),
      carrier: null,
      trackingNumber: null,
    });
    const line = await source.getRepository(ReleaseLineEntity).save({
      releaseId: release.id,
      partNumber: parts[index % PARTS],
      qty: RECEIPTS_EACH * 10,
      needDate: '2026-12-31',
      origin: 'plan',
      cardId: null,
      confirmedQty: null,
      receivedQty: 0,
      closed: false,
    });
    lineIds.push(line.id);
  }
  const user = await source
    .getRepository(UserEntity)
    .save({ email: 'dock@example.com', name: 'Dock', role: 'receiving', passwordHash: 'not-used', supplierCode: null });
  const expiresAt = sessionExpiry('1h');
  const session = await db.write((manager) => openSession(manager, user.id, expiresAt));
  return { token: signSessionToken({ userId: user.id, sessionId: session.id }, SECRET, expiresAt), lineIds };
}

/** Receipts per second through `nodes` app nodes over one database, and whether any was lost or doubled. */
export async function runReceiptsBench(nodeCount: number): Promise<ReceiptsBenchFigures> {
  const first = await openDatabase(':memory:');
  const url = (first.dataSource.options as { url?: string }).url;
  const nodes = [first];
  for (let index = 1; index < nodeCount; index += 1) nodes.push(await openDatabase(url!));
  const { token, lineIds } = await arrange(first);
  const servers: Server[] = await Promise.all(
    nodes.map(
      (db) =>
        new Promise<Server>((resolve) => {
          const server = createApp(db, { jwtSecret: SECRET }).listen(0, '127.0.0.1', () => resolve(server));
        }),
    ),
  );
  const ports = servers.map((server) => (server.address() as AddressInfo).port);
  let accepted = 0;
  try {
    const start = performance.now();
    await Promise.all(
      lineIds.map(async (lineId, client) => {
        const port = ports[client % ports.length];
        for (let receipt = 0; receipt < RECEIPTS_EACH; receipt += 1) {
          const response = await fetch(`http://127.0.0.1:${port}/api/receipts`, {
            method: 'POST',
            headers: {
              Authorization: `Bearer ${token}`,
              'Content-Type': 'application/json',
              'Idempotency-Key': `bench-${client}-${receipt}`,
            },
            body: JSON.stringify({ releaseLineId: lineId, qty: 1 }),
          });
          if (response.status !== 201) throw new Error(`POST /api/receipts answered ${response.status}`);
          await response.arrayBuffer();
          accepted += 1;
        }
      }),
    );
    const seconds = (performance.now() - start) / 1000;
    const stored = await first.dataSource.getRepository(ReceiptEntity).count();
    const keys = new Set((await first.dataSource.getRepository(ReceiptEntity).find()).map((row) => row.idempotencyKey));
    const onHand = (await first.dataSource.getRepository(PartEntity).find()).reduce(
      (sum, part) => sum + part.onHand,
      0,
    );
    const ledger = (await first.dataSource.getRepository(StockMovementEntity).find()).reduce(
      (sum, movement) => sum + movement.qty,
      0,
    );
    return {
      label: `${first.engine === 'postgres' ? 'PostgreSQL' : 'SQLite'}, ${nodeCount} node${nodeCount === 1 ? '' : 's'}`,
      receipts: accepted,
      perSecond: accepted / seconds,
      stored,
      lost: CONNECTIONS * RECEIPTS_EACH - keys.size,
      doubled: stored - keys.size,
      ledgerMatches: Math.abs(onHand - ledger) < 1e-6 && onHand === accepted,
    };
  } finally {
    for (const server of servers) server.close();
    for (const db of nodes.slice(1)) await db.close();
    await first.close();
  }
}

export function printReceiptsBench(figures: ReceiptsBenchFigures): void {
  console.log(
    `receipts, ${figures.label}, ${CONNECTIONS} connections: ${figures.perSecond.toFixed(0)}/s  ` +
      `(${figures.receipts} posted, ${figures.stored} stored, ${figures.lost} lost, ${figures.doubled} doubled, ` +
      `on-hand ${figures.ledgerMatches ? '=' : '≠'} ledger)`,
  );
}
