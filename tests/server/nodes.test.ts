import type { Server } from 'node:net';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { KanbanCardEntity } from '../../server/loops/kanban-card.entity';
import { KanbanLoopEntity } from '../../server/loops/kanban-loop.entity';
import { syncLoops } from '../../server/loops/loop-sync';
import { PartEntity } from '../../server/master-data/part.entity';
import { ReceiptEntity } from '../../server/dock/receipt.entity';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { ReleaseLineEntity } from '../../server/releases/release-line.entity';
import { ReleaseJob } from '../../server/releases/release-job';
import { RELEASE_JOB_LAST_RUN, RELEASE_JOB_TIME } from '../../server/releases/releases.service';
import { writeSetting } from '../../server/settings/settings';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { StockMovementEntity } from '../../server/stock/stock-movement.entity';
import { cardNumber } from '../../shared/domain/gs1';
import { openEventStream } from './event-stream';
import { bearer, createTestContext, onPostgres, secondNode, testPart, type TestContext } from './helpers';

/*
 * Two app nodes over one PostgreSQL database, as behind a load balancer: each has its own
 * connections, change listener and jobs. SQLite is served by one process, so there is no second
 * node to start on it; these tests run in the `server-postgres` project.
 */
describe.skipIf(!onPostgres)('two app nodes over one PostgreSQL database', () => {
  let nodeA: TestContext;
  let nodeB: TestContext;
  let serverB: Server;

  beforeAll(async () => {
    nodeA = await createTestContext();
    nodeB = await secondNode(nodeA);
    serverB = nodeB.app.listen(0);
    await nodeA.dataSource.transaction(async (manager) => {
      await writeCalendar(manager, { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] });
      await savePartsWithStock(manager, [
        testPart('ROLLER-A', { onHand: 0, replenishment: 'scheduled' }),
        testPart('CASTER-K', { packQty: 10 }),
        testPart('BELT-K', { packQty: 4, supplierCode: 'SUP-B' }),
      ]);
      await syncLoops(manager);
      const loops = await manager.find(KanbanLoopEntity);
      const now = new Date().toISOString();
      await manager.insert(
        KanbanCardEntity,
        loops.map((loop) => ({
          loopId: loop.id,
          cardIndex: 1,
          cardNumber: cardNumber(loop.id, 1),
          state: 'empty',
          stateChangedAt: now,
          retiredAt: null,
          releaseLineId: null,
        })),
      );
    });
  });
  afterAll(async () => {
    serverB?.close();
    await nodeB?.close();
    await nodeA?.close();
  });

  async function openLine(qty: number): Promise<number> {
    const release = await nodeA.dataSource.getRepository(ReleaseEntity).save({
      number: `R-NODES-${Math.random().toString(36).slice(2, 8)}`,
      supplierCode: 'SUP-A',
      releaseDate: `2026-11-${String(Math.floor(Math.random() * 28) + 1).padStart(2, '0')}`,
      status: 'confirmed',
      sentAt: new Date().toISOString(),
      carrier: null,
      trackingNumber: null,
    });
    const line = await nodeA.dataSource.getRepository(ReleaseLineEntity).save({
      releaseId: release.id,
      partNumber: 'ROLLER-A',
      qty,
      needDate: '2026-11-30',
      origin: 'plan',
      cardId: null,
      confirmedQty: null,
      receivedQty: 0,
      closed: false,
    });
    return line.id;
  }

  const onHand = async () =>
    (await nodeA.dataSource.getRepository(PartEntity).findOneByOrFail({ partNumber: 'ROLLER-A' })).onHand;

  const receive = (node: TestContext, releaseLineId: number, qty: number, key: string) =>
    request(node.app)
      .post('/api/receipts')
      .set(bearer(node.tokens.receiving))
      .set('Idempotency-Key', key)
      .send({ releaseLineId, qty });

  it('announces a delivery checked in on node A on the event stream of node B', async () => {
    const events = await openEventStream(serverB, bearer(nodeB.tokens.viewer));
    const connected = await events.next<{ version: number }>('dock');
    const lineId = await openLine(12);

    const announced = events.next<{ version: number }>('dock');
    const response = await receive(nodeA, lineId, 12, 'nodes-announce');
    // Generous: PostgreSQL delivers the notice when node A commits; no timing is asserted beyond this.
    const notice = (await Promise.race([
      announced,
      new Promise((_, reject) => setTimeout(() => reject(new Error('node B heard nothing within 5 s')), 5_000)),
    ])) as { version: number };
    events.close();

    expect(response.status).toBe(201);
    expect(notice.version).toBeGreaterThan(connected.version);
  });

  it('counts a delivery posted to both nodes at once with the same key exactly once', async () => {
    const lineId = await openLine(30);
    const before = await onHand();

    const answers = await Promise.all([
      receive(nodeA, lineId, 30, 'nodes-same-key'),
      receive(nodeB, lineId, 30, 'nodes-same-key'),
    ]);

    expect(answers.map((answer) => answer.status).sort()).toEqual([200, 201]);
    expect(answers[0].body.receipt.id).toBe(answers[1].body.receipt.id);
    expect(await nodeA.dataSource.getRepository(ReceiptEntity).countBy({ releaseLineId: lineId })).toBe(1);
    // Conservation: on-hand moves by the one counted quantity.
    expect(await onHand()).toBe(before + 30);
  });

  it('loses no part of deliveries counted on both nodes at once under different keys', async () => {
    const lineId = await openLine(1000);
    const before = await onHand();

    const answers = await Promise.all(
      Array.from({ length: 16 }, (_, index) =>
        receive(index % 2 === 0 ? nodeA : nodeB, lineId, 5, `nodes-partial-${index}`),
      ),
    );

    expect(answers.map((answer) => answer.status)).toEqual(Array(16).fill(201));
    // Conservation: 16 partial deliveries of 5 each add 80, and the ledger sums to on-hand.
    expect(await onHand()).toBe(before + 80);
    const [{ sum }] = await nodeA.dataSource
      .getRepository(StockMovementEntity)
      .createQueryBuilder('movement')
      .select('SUM(movement.qty)', 'sum')
      .where('movement.partNumber = :part', { part: 'ROLLER-A' })
      .getRawMany<{ sum: number }>();
    expect(Number(sum)).toBe(await onHand());
    expect(await nodeA.dataSource.getRepository(ReleaseLineEntity).findOneByOrFail({ id: lineId })).toMatchObject({
      receivedQty: 80,
    });
  });

  it('serves a packing slip uploaded on node A from node B', async () => {
    const lineId = await openLine(1);
    const { releaseId } = await nodeA.dataSource.getRepository(ReleaseLineEntity).findOneByOrFail({ id: lineId });
    // A PDF opens with "%PDF-" and its version (ISO 32000-1:2008, 7.5.2 "File Header"; from memory).
    const pdf = Buffer.from(
      '%PDF-1.7\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n',
      'latin1',
    );

    const uploaded = await request(nodeA.app)
      .post(`/api/dock/releases/${releaseId}/attachments`)
      .set(bearer(nodeA.tokens.receiving))
      .attach('file', pdf, 'slip.pdf');
    const fromB = await request(nodeB.app)
      .get(`/api/dock/attachments/${uploaded.body.id}`)
      .set(bearer(nodeB.tokens.viewer))
      .buffer(true)
      .parse((response, done) => {
        const chunks: Buffer[] = [];
        response.on('data', (chunk: Buffer) => chunks.push(chunk));
        response.on('end', () => done(null, Buffer.concat(chunks)));
      });

    expect(uploaded.status).toBe(201);
    expect(fromB.status).toBe(200);
    expect(Buffer.compare(fromB.body as Buffer, pdf)).toBe(0);
  });

  it('runs the release job once when both nodes reach its time in the same minute', async () => {
    await writeSetting(nodeA.dataSource.manager, RELEASE_JOB_TIME, '06:00');
    await writeSetting(nodeA.dataSource.manager, RELEASE_JOB_LAST_RUN, '2027-03-02');
    const jobA = new ReleaseJob(nodeA.db, nodeA.services.releases);
    const jobB = new ReleaseJob(nodeB.db, nodeB.services.releases);
    const sameMinute = new Date(2027, 2, 3, 6, 0, 5);

    const results = await Promise.all([jobA.tick(sameMinute), jobB.tick(sameMinute)]);

    const ran = results.filter((result) => result !== null);
    expect(ran).toHaveLength(1);
    const releases = await nodeA.dataSource
      .getRepository(ReleaseEntity)
      .find({ where: { releaseDate: '2027-03-03' }, order: { supplierCode: 'ASC' } });
    expect(releases.map((release) => release.supplierCode)).toEqual(['SUP-A', 'SUP-B']);
  });
});
