import type { Server } from 'node:net';
import { performance } from 'node:perf_hooks';
import request from 'supertest';
import { In, Like } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CloseDayJob } from '../../server/builds/close-day-job';
import { CLOSE_DAY_TIME } from '../../server/builds/builds.service';
import { openDatabase } from '../../server/db/database';
import { alertFrozenWindowShortages } from '../../server/line-risk/frozen-window-alerts';
import { replaceBomLines } from '../../server/master-data/master-data.writer';
import { startFakeSmtp } from '../../server/outbox/fake-smtp';
import { OutboxMessageEntity } from '../../server/outbox/outbox-message.entity';
import { enqueueMail, OutboxDispatcher } from '../../server/outbox/outbox.service';
import { plantToday } from '../../server/planning/plan-dates';
import { upsertSequenceEntries } from '../../server/sequence/sequence.writer';
import { prepareDatabase } from '../../server/start-up';
import { UserEntity } from '../../server/users/user.entity';
import { nextWorkingDay } from '../../shared/domain/calendar';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { KanbanCardEntity } from '../../server/loops/kanban-card.entity';
import { KanbanLoopEntity } from '../../server/loops/kanban-loop.entity';
import { syncLoops } from '../../server/loops/loop-sync';
import { PartEntity } from '../../server/master-data/part.entity';
import { ReceiptEntity } from '../../server/dock/receipt.entity';
import { ReceiptShareEntity } from '../../server/dock/receipt-share.entity';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { ReleaseLineEntity } from '../../server/releases/release-line.entity';
import { ReleaseJob } from '../../server/releases/release-job';
import { RELEASE_JOB_LAST_RUN, RELEASE_JOB_TIME } from '../../server/releases/releases.service';
import { writeSetting } from '../../server/settings/settings';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { StockMovementEntity } from '../../server/stock/stock-movement.entity';
import { SESSIONS_CHANNEL } from '../../server/users/sessions';
import { addCalendarDays } from '../../shared/domain/date';
import { cardNumber } from '../../shared/domain/gs1';
import { openEventStream } from './event-stream';
import {
  bearer,
  createTestContext,
  onPostgres,
  secondNode,
  signIn,
  TEST_PASSWORD,
  testPart,
  type TestContext,
} from './helpers';

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
        testPart('SPOOL-N', { onHand: 0, replenishment: 'scheduled' }),
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

  // One release per supplier and day (a unique key): every line opened here gets a day of its own.
  let releasesOpened = 0;

  async function openLine(qty: number): Promise<number> {
    releasesOpened += 1;
    const release = await nodeA.dataSource.getRepository(ReleaseEntity).save({
      number: `R-NODES-${releasesOpened}`,
      supplierCode: 'SUP-A',
      releaseDate: addCalendarDays('2026-10-01', releasesOpened),
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

    const announced = events
      .nextPast('dock', connected.version)
      .then((notice) => ({ notice, heardAt: performance.now() }));
    const response = await receive(nodeA, lineId, 12, 'nodes-announce');
    const answeredAt = performance.now();
    const { notice, heardAt } = (await Promise.race([
      announced,
      new Promise((_, reject) => setTimeout(() => reject(new Error('node B heard nothing within 5 s')), 5_000)),
    ])) as { notice: { version: number }; heardAt: number };
    events.close();

    expect(response.status).toBe(201);
    expect(notice.version).toBeGreaterThan(connected.version);
    // The suite's one timing bound: a change reaches the screens of every node within a second.
    // Node A commits before it answers, so a notice heard within a second of the answer is heard
    // within a second of the check-in; PostgreSQL takes milliseconds, so the margin is wide.
    expect(heardAt - answeredAt).toBeLessThan(1_000);
  });

  it('refuses on node B a token just used there, once node B hears it was signed out on node A', async () => {
    const token = await signIn(nodeA.app, 'buyer@example.com', TEST_PASSWORD);
    const me = (node: TestContext) => request(node.app).get('/api/auth/me').set(bearer(token));
    const before = await me(nodeB);
    const heard = new Promise<void>((resolve) => {
      const stop = nodeB.db.changes.subscribe((notice) => {
        if (notice.channel !== SESSIONS_CHANNEL) return;
        stop();
        resolve();
      });
    });

    const out = await request(nodeA.app).post('/api/auth/logout').set(bearer(token));
    // Generous: PostgreSQL delivers the notice when node A commits; no timing is asserted beyond this.
    await Promise.race([
      heard,
      new Promise((_, reject) => setTimeout(() => reject(new Error('node B heard nothing within 5 s')), 5_000)),
    ]);

    expect(before.status).toBe(200);
    expect(out.status).toBe(204);
    expect((await me(nodeB)).status).toBe(401);
    expect((await me(nodeA)).status).toBe(401);
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

  it('spreads the excess of over receipts posted on both nodes at once over later lines only once', async () => {
    const release = await nodeA.dataSource.getRepository(ReleaseEntity).save({
      number: 'R-NODES-OVER',
      supplierCode: 'SUP-A',
      releaseDate: '2026-11-20',
      reference: 'nodes-over',
      status: 'confirmed',
      sentAt: new Date().toISOString(),
      carrier: null,
      trackingNumber: null,
      dockColumn: 'expected',
    });
    const [one, two, later] = await nodeA.dataSource.getRepository(ReleaseLineEntity).save(
      ['2026-11-30', '2026-11-30', '2026-12-10'].map((needDate) => ({
        releaseId: release.id,
        partNumber: 'SPOOL-N',
        qty: 10,
        needDate,
        origin: 'plan',
        cardId: null,
        confirmedQty: null,
        receivedQty: 0,
        closed: false,
      })),
    );
    const over = (node: TestContext, releaseLineId: number, key: string) =>
      request(node.app)
        .post('/api/receipts')
        .set(bearer(node.tokens.receiving))
        .set('Idempotency-Key', key)
        .send({ releaseLineId, qty: 16, overAction: 'keep' });

    // Each count twice, once on each node with the same key, and the two counts racing each other.
    const answers = await Promise.all([
      over(nodeA, one.id, 'nodes-over-1'),
      over(nodeB, two.id, 'nodes-over-2'),
      over(nodeB, one.id, 'nodes-over-1'),
      over(nodeA, two.id, 'nodes-over-2'),
    ]);

    expect(answers.map((answer) => answer.status).sort()).toEqual([200, 200, 201, 201]);
    const lines = await nodeA.dataSource.getRepository(ReleaseLineEntity).findBy({ partNumber: 'SPOOL-N' });
    const receivedOn = (id: number) => lines.find((line) => line.id === id)!.receivedQty;
    // Conservation: the 32 counted are on hand once, and spread over the lines once; the later
    // line holds exactly what the receipts say they applied to it, never more than its 10.
    expect(lines.reduce((sum, line) => sum + line.receivedQty, 0)).toBe(32);
    const shares = await nodeA.dataSource.getRepository(ReceiptShareEntity).findBy({ releaseLineId: later.id });
    expect(shares.reduce((sum, share) => sum + share.qty, 0)).toBe(receivedOn(later.id));
    expect(receivedOn(later.id)).toBeLessThanOrEqual(10);
    expect((await nodeA.dataSource.getRepository(PartEntity).findOneByOrFail({ partNumber: 'SPOOL-N' })).onHand).toBe(
      32,
    );
    expect(await nodeA.dataSource.getRepository(ReceiptEntity).countBy({ releaseLineId: one.id })).toBe(1);
  });

  it('counts failed sign-ins on both nodes together', async () => {
    const login = (node: TestContext, password: string) =>
      request(node.app).post('/api/auth/login').send({ email: 'line@example.com', password });
    // Five failures in all (the limit both nodes are given), three on A and two on B.
    const failures = [];
    for (const node of [nodeA, nodeB, nodeA, nodeB, nodeA]) failures.push((await login(node, 'a wrong guess')).status);

    const onB = await login(nodeB, TEST_PASSWORD);
    const onA = await login(nodeA, TEST_PASSWORD);

    expect(failures).toEqual([401, 401, 401, 401, 401]);
    expect(onB.status).toBe(429);
    expect(onB.body.error.details[0]).toMatchObject({ scope: 'account' });
    expect(onA.status).toBe(429);
  });

  it('sends each queued notice once when both nodes drain the outbox at once', async () => {
    const smtp = await startFakeSmtp();
    const dispatchers = [nodeA, nodeB].map((node) => new OutboxDispatcher(node.db, smtp.url, 'cardloop@example.com'));
    try {
      // More than one dispatcher's batch, so both have notices to take.
      const subjects = Array.from({ length: 45 }, (_, index) => `Node notice ${index + 1}`);
      await nodeA.db.write(async (manager) => {
        for (const subject of subjects)
          await enqueueMail(manager, { to: 'orders@supplier-a.example.com', subject, text: 'Hello.' });
      });
      const due = () =>
        nodeA.dataSource.getRepository(OutboxMessageEntity).countBy({ status: In(['pending', 'failing']) });

      const sentBy = [0, 0];
      for (let round = 0; round < 10 && (await due()) > 0; round += 1) {
        const [a, b] = await Promise.all(dispatchers.map((dispatcher) => dispatcher.dispatchDue()));
        sentBy[0] += a;
        sentBy[1] += b;
      }

      const received = smtp.messages.filter((mail) => mail.subject.startsWith('Node notice '));
      expect(await due()).toBe(0);
      expect(received.map((mail) => mail.subject).sort()).toEqual([...subjects].sort());
      expect(sentBy[0] + sentBy[1]).toBe(smtp.messages.length);
    } finally {
      for (const dispatcher of dispatchers) dispatcher.close();
      await smtp.close();
    }
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
  describe('jobs both nodes reach in the same minute', () => {
    const buildDay = '2027-03-04';
    const frozenDay = nextWorkingDay(plantToday(), { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] });

    beforeAll(async () => {
      await nodeA.db.write(async (manager) => {
        await savePartsWithStock(manager, [
          testPart('MODEL-E', { source: 'end_item', supplierCode: null, replenishment: null }),
          testPart('BOLT-E', { onHand: 100, replenishment: 'scheduled' }),
          testPart('MODEL-F', { source: 'end_item', supplierCode: null, replenishment: null }),
          // Two working days to bring: short today, it can only be expedited (an alarm).
          testPart('MOTOR-F', { onHand: 1, leadTimeDays: 2, description: 'Drive motor' }),
        ]);
        await replaceBomLines(manager, [
          { parent: 'MODEL-E', component: 'BOLT-E', qtyPer: 2, scrapPct: 0, effectiveFrom: null, effectiveTo: null },
          { parent: 'MODEL-F', component: 'MOTOR-F', qtyPer: 2, scrapPct: 0, effectiveFrom: null, effectiveTo: null },
        ]);
        await upsertSequenceEntries(manager, [
          { date: buildDay, sequence: 1, model: 'MODEL-E', serial: 'E-1', qty: 1 },
          { date: buildDay, sequence: 2, model: 'MODEL-E', serial: 'E-2', qty: 1 },
          // One unit needing 2 motors with 1 on hand, inside the frozen window: a line stop ahead.
          { date: frozenDay, sequence: 1, model: 'MODEL-F', serial: 'F-1', qty: 1 },
        ]);
      });
    });
    afterAll(async () => {
      await nodeA?.services.lineRisk.close();
      await nodeB?.services.lineRisk.close();
    });

    it('closes the day once', async () => {
      await writeSetting(nodeA.dataSource.manager, CLOSE_DAY_TIME, '22:00');
      const jobs = [nodeA, nodeB].map((node) => new CloseDayJob(node.db, node.services.builds));
      const sameMinute = new Date(2027, 2, 4, 22, 0, 5);

      const results = await Promise.all(jobs.map((job) => job.tick(sameMinute)));

      const ran = results.filter((result) => result !== null);
      expect(ran).toHaveLength(1);
      expect(ran[0]?.built).toEqual(['E-1', 'E-2']);
      // Conservation: two units of 2 bolts each are taken from stock once.
      const bolts = await nodeA.dataSource.getRepository(PartEntity).findOneByOrFail({ partNumber: 'BOLT-E' });
      expect(bolts.onHand).toBe(100 - 2 * 2);
    });

    it('e-mails the planners once about a shortage entering the frozen window', async () => {
      const check = (node: TestContext) =>
        alertFrozenWindowShortages(node.db, node.services.lineRisk, 'http://plant.example.com');

      const results = await Promise.all([check(nodeA), check(nodeB)]);

      expect(results.flat()).toEqual(['MOTOR-F']);
      const alerts = await nodeA.dataSource
        .getRepository(OutboxMessageEntity)
        .findBy({ to: 'planner@example.com', subject: Like('Line stop ahead%') });
      expect(alerts).toHaveLength(1);
      expect(alerts[0].text).toContain('F-1 (MODEL-F)');
    });
  });

  it('prepares a fresh database once when two nodes start at the same moment', async () => {
    const first = await openDatabase(':memory:');
    const second = await openDatabase((first.dataSource.options as { url: string }).url);
    const config = {
      SEED_DEMO: '0',
      ADMIN_EMAIL: 'it@example.com',
      ADMIN_PASSWORD: 'a-long-admin-password',
      APP_URL: 'http://plant.example.com',
    } as const;
    try {
      const started = await Promise.allSettled([prepareDatabase(first, config), prepareDatabase(second, config)]);

      expect(started.map((result) => result.status)).toEqual(['fulfilled', 'fulfilled']);
      expect(await first.dataSource.getRepository(UserEntity).findBy({ role: 'admin' })).toMatchObject([
        { email: 'it@example.com' },
      ]);
    } finally {
      await second.close();
      await first.close();
    }
  });
});
