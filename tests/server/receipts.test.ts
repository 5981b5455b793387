import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEventEntity } from '../../server/audit/audit-event.entity';
import { CardScanEntity } from '../../server/loops/card-scan.entity';
import { KanbanCardEntity } from '../../server/loops/kanban-card.entity';
import { KanbanLoopEntity } from '../../server/loops/kanban-loop.entity';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { PartEntity } from '../../server/master-data/part.entity';
import { ReceiptEntity } from '../../server/dock/receipt.entity';
import { ReleaseLineEntity } from '../../server/releases/release-line.entity';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { readPlanningVersion } from '../../server/settings/versions';
import { readDockVersion } from '../../server/settings/versions';
import { cardNumber } from '../../shared/domain/gs1';
import type { Role } from '../../shared/schemas/user';
import {
  bearer,
  createTestContext,
  testPart,
  writeTestRelease,
  type TestContext,
  type TestReleaseLine,
} from './helpers';

let context: TestContext;
let releaseDay = 0;
let keyCounter = 0;

/** A release as the release job and the supplier would leave it, written straight to the tables. */
async function makeRelease(status: string, lines: TestReleaseLine[]) {
  releaseDay += 1;
  const releaseDate = `2026-11-${String(releaseDay).padStart(2, '0')}`;
  return writeTestRelease(context, { number: `R-TEST-${releaseDay}`, releaseDate, status }, lines);
}

const freshKey = () => `test-key-${(keyCounter += 1)}`;

function receive(body: object, key: string | null = freshKey(), role: Role = 'receiving') {
  const call = request(context.app).post('/api/receipts').set(bearer(context.tokens[role]));
  return key === null ? call.send(body) : call.set('Idempotency-Key', key).send(body);
}

const onHandOf = async (partNumber: string) =>
  (await context.dataSource.getRepository(PartEntity).findOneByOrFail({ partNumber })).onHand;
const lineOf = (id: number) => context.dataSource.getRepository(ReleaseLineEntity).findOneByOrFail({ id });
const releaseOf = (id: number) => context.dataSource.getRepository(ReleaseEntity).findOneByOrFail({ id });
const receiptCount = (releaseLineId: number) =>
  context.dataSource.getRepository(ReceiptEntity).countBy({ releaseLineId });

beforeAll(async () => {
  context = await createTestContext();
  await context.dataSource.transaction((manager) =>
    savePartsWithStock(manager, [
      testPart('BRUSH-20', { onHand: 10, replenishment: 'scheduled' }),
      testPart('PAD-26', { onHand: 0, replenishment: 'scheduled' }),
      testPart('CASTER-75', { onHand: 4 }),
      testPart('DECAL-S', { onHand: 100, replenishment: 'scheduled' }),
    ]),
  );
});
afterAll(() => context.close());

describe('POST /api/receipts', () => {
  it('adds the count to on-hand, closes a fully received line and marks the release received', async () => {
    const { release, lines } = await makeRelease('confirmed', [{ partNumber: 'BRUSH-20', qty: 40 }]);
    const planningBefore = await readPlanningVersion(context.dataSource.manager);
    const dockBefore = await readDockVersion(context.dataSource.manager);

    const response = await receive({ releaseLineId: lines[0].id, qty: 40, note: 'Two pallets' });

    // Conservation: on-hand after = on-hand before (10) + the counted quantity (40).
    expect(response.status).toBe(201);
    expect(response.body.onHand).toBe(50);
    expect(response.body.receipt).toMatchObject({
      releaseLineId: lines[0].id,
      releaseNumber: release.number,
      partNumber: 'BRUSH-20',
      qty: 40,
      discrepancy: null,
      note: 'Two pallets',
      final: false,
      addedToOnHand: 40,
      onHandAfter: 50,
      userEmail: 'receiving@example.com',
    });
    expect(await onHandOf('BRUSH-20')).toBe(50);
    const ledger = await request(context.app).get('/api/stock/BRUSH-20/movements').set(bearer(context.tokens.buyer));
    expect(ledger.body.movements.at(-1)).toMatchObject({
      kind: 'receipt',
      qty: 40,
      balance: 50,
      refType: 'release',
      ref: release.number,
      userEmail: 'receiving@example.com',
    });
    expect(await lineOf(lines[0].id)).toMatchObject({ receivedQty: 40, closed: true, dockColumn: 'counted' });
    expect(await releaseOf(release.id)).toMatchObject({ status: 'received' });
    expect(await readPlanningVersion(context.dataSource.manager)).toBeGreaterThan(planningBefore);
    expect(await readDockVersion(context.dataSource.manager)).toBeGreaterThan(dockBefore);
    const audit = await context.dataSource
      .getRepository(AuditEventEntity)
      .findOneBy({ entity: 'receipt', entityKey: String(response.body.receipt.id) });
    expect(audit).toMatchObject({ action: 'receive', actorEmail: 'receiving@example.com' });
    expect(audit?.changes).toMatchObject({
      releaseNumber: release.number,
      onHand: { from: 10, to: 50 },
      lineClosed: true,
    });
    // The trail names the receipt as the dock does: by release and part.
    const trail = await request(context.app).get('/api/audit?kind=receipt').set(bearer(context.tokens.admin));
    expect(trail.body.events).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ subject: `${release.number} · BRUSH-20 (receipt ${response.body.receipt.id})` }),
      ]),
    );
  });

  it('counts a replayed Idempotency-Key once and answers 200 with the same body', async () => {
    const { lines } = await makeRelease('sent', [{ partNumber: 'PAD-26', qty: 30 }]);
    const key = freshKey();
    const body = { releaseLineId: lines[0].id, qty: 12 };

    const first = await receive(body, key);
    const second = await receive(body, key);

    expect(first.status).toBe(201);
    expect(second.status).toBe(200);
    expect(second.body).toEqual(first.body);
    expect(await onHandOf('PAD-26')).toBe(12);
    expect(await receiptCount(lines[0].id)).toBe(1);
    expect((await lineOf(lines[0].id)).receivedQty).toBe(12);
  });

  it('counts once when two identical requests race', async () => {
    const { lines } = await makeRelease('shipped', [{ partNumber: 'DECAL-S', qty: 500 }]);
    const key = freshKey();
    const body = { releaseLineId: lines[0].id, qty: 200 };

    const [a, b] = await Promise.all([receive(body, key), receive(body, key)]);

    expect([a.status, b.status].sort()).toEqual([200, 201]);
    expect(a.body).toEqual(b.body);
    expect(await onHandOf('DECAL-S')).toBe(300);
    expect(await receiptCount(lines[0].id)).toBe(1);
  });

  it('refuses the same key with a different body (409) and changes nothing', async () => {
    const { lines } = await makeRelease('sent', [{ partNumber: 'PAD-26', qty: 30 }]);
    const key = freshKey();
    await receive({ releaseLineId: lines[0].id, qty: 5 }, key);
    const onHandBefore = await onHandOf('PAD-26');

    const response = await receive({ releaseLineId: lines[0].id, qty: 6 }, key);

    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('conflict');
    expect(await onHandOf('PAD-26')).toBe(onHandBefore);
    expect(await receiptCount(lines[0].id)).toBe(1);
  });

  it('answers 400 without an Idempotency-Key, or with one longer than 100 characters', async () => {
    const { lines } = await makeRelease('sent', [{ partNumber: 'PAD-26', qty: 30 }]);
    const onHandBefore = await onHandOf('PAD-26');

    const missing = await receive({ releaseLineId: lines[0].id, qty: 5 }, null);
    const tooLong = await receive({ releaseLineId: lines[0].id, qty: 5 }, 'k'.repeat(101));

    expect(missing.status).toBe(400);
    expect(missing.body.error.details[0].path).toEqual(['Idempotency-Key']);
    expect(tooLong.status).toBe(400);
    expect(await onHandOf('PAD-26')).toBe(onHandBefore);
  });

  it('records damaged goods without adding them to usable on-hand, and leaves the line open', async () => {
    const { release, lines } = await makeRelease('confirmed', [{ partNumber: 'CASTER-75', qty: 8 }]);

    const response = await receive({ releaseLineId: lines[0].id, qty: 8, discrepancy: 'damaged', note: 'Crushed box' });

    expect(response.status).toBe(201);
    expect(response.body.receipt).toMatchObject({ qty: 8, discrepancy: 'damaged', addedToOnHand: 0, onHandAfter: 4 });
    expect(response.body.onHand).toBe(4);
    expect(await onHandOf('CASTER-75')).toBe(4);
    expect(await lineOf(lines[0].id)).toMatchObject({ receivedQty: 0, closed: false });
    expect((await releaseOf(release.id)).status).toBe('confirmed');
  });

  it('adds a short count to on-hand and keeps the line open for the rest', async () => {
    const { release, lines } = await makeRelease('confirmed', [{ partNumber: 'PAD-26', qty: 20 }]);
    const before = await onHandOf('PAD-26');

    const response = await receive({ releaseLineId: lines[0].id, qty: 15, discrepancy: 'short' });

    expect(response.status).toBe(201);
    expect(response.body.onHand).toBe(before + 15);
    expect(await lineOf(lines[0].id)).toMatchObject({ receivedQty: 15, closed: false });
    expect((await releaseOf(release.id)).status).toBe('partial');
  });

  it('takes a partial delivery, then the rest, and ends with every line closed and the release received', async () => {
    const { release, lines } = await makeRelease('shipped', [
      { partNumber: 'BRUSH-20', qty: 24, confirmedQty: 20 },
      { partNumber: 'PAD-26', qty: 10 },
    ]);

    const firstPart = await receive({ releaseLineId: lines[0].id, qty: 12 });
    const afterFirst = await releaseOf(release.id);
    const rest = await receive({ releaseLineId: lines[0].id, qty: 8 });
    const afterRest = await releaseOf(release.id);
    const otherLine = await receive({ releaseLineId: lines[1].id, qty: 10 });

    expect([firstPart.status, rest.status, otherLine.status]).toEqual([201, 201, 201]);
    expect(afterFirst.status).toBe('partial');
    // The line is ordered for the supplier's confirmed 20, not the 24 first asked for.
    expect(await lineOf(lines[0].id)).toMatchObject({ receivedQty: 20, closed: true });
    expect(afterRest.status).toBe('partial');
    expect((await releaseOf(release.id)).status).toBe('received');
  });

  it('closes a line short when the clerk marks the receipt final', async () => {
    const { release, lines } = await makeRelease('confirmed', [{ partNumber: 'PAD-26', qty: 50 }]);

    const response = await receive({ releaseLineId: lines[0].id, qty: 45, discrepancy: 'short', close: true });

    expect(response.status).toBe(201);
    expect(response.body.receipt.final).toBe(true);
    expect(await lineOf(lines[0].id)).toMatchObject({ receivedQty: 45, closed: true });
    expect((await releaseOf(release.id)).status).toBe('received');
  });

  it('returns the kanban card of a line to full when the line closes, with a scan in its log', async () => {
    const loop = await context.dataSource
      .getRepository(KanbanLoopEntity)
      .save({ partNumber: 'CASTER-75', kind: 'supplier', containerQty: 6 });
    const card = await context.dataSource.getRepository(KanbanCardEntity).save({
      loopId: loop.id,
      cardIndex: 1,
      cardNumber: cardNumber(loop.id, 1),
      state: 'shipped',
      stateChangedAt: '2026-11-30T08:00:00.000Z',
      retiredAt: null,
      releaseLineId: null,
    });
    const { lines } = await makeRelease('shipped', [{ partNumber: 'CASTER-75', qty: 6, cardId: card.id }]);

    const response = await receive({ releaseLineId: lines[0].id, qty: 6 });

    expect(response.status).toBe(201);
    expect((await context.dataSource.getRepository(KanbanCardEntity).findOneByOrFail({ id: card.id })).state).toBe(
      'full',
    );
    const scans = await context.dataSource.getRepository(CardScanEntity).findBy({ cardId: card.id });
    expect(scans.map((scan) => [scan.event, scan.fromState, scan.toState, scan.userEmail])).toEqual([
      ['receive', 'shipped', 'full', 'receiving@example.com'],
    ]);
  });

  it('sends the card of a line closed with nothing usable back to empty, not full', async () => {
    // The caster's loop from the test before.
    const loop = await context.dataSource.getRepository(KanbanLoopEntity).findOneByOrFail({ partNumber: 'CASTER-75' });
    const card = await context.dataSource.getRepository(KanbanCardEntity).save({
      loopId: loop.id,
      cardIndex: 2,
      cardNumber: cardNumber(loop.id, 2),
      state: 'ordered',
      stateChangedAt: '2026-11-30T08:00:00.000Z',
      retiredAt: null,
      releaseLineId: null,
    });
    const { lines } = await makeRelease('confirmed', [{ partNumber: 'CASTER-75', qty: 6, cardId: card.id }]);
    const before = await onHandOf('CASTER-75');

    const response = await receive({ releaseLineId: lines[0].id, qty: 6, discrepancy: 'damaged', close: true });

    expect(response.status).toBe(201);
    expect(await onHandOf('CASTER-75')).toBe(before);
    expect(await lineOf(lines[0].id)).toMatchObject({ closed: true, receivedQty: 0 });
    expect(await context.dataSource.getRepository(KanbanCardEntity).findOneByOrFail({ id: card.id })).toMatchObject({
      state: 'empty',
      releaseLineId: null,
    });
  });

  it('refuses a closed line with 409 and counts nothing', async () => {
    const { lines } = await makeRelease('sent', [
      { partNumber: 'BRUSH-20', qty: 5 },
      { partNumber: 'PAD-26', qty: 5 },
    ]);
    await receive({ releaseLineId: lines[0].id, qty: 5 });
    const before = await onHandOf('BRUSH-20');

    const response = await receive({ releaseLineId: lines[0].id, qty: 5 });

    expect(response.status).toBe(409);
    expect(await onHandOf('BRUSH-20')).toBe(before);
  });

  it('refuses lines of a draft or cancelled release with 409', async () => {
    const draft = await makeRelease('draft', [{ partNumber: 'PAD-26', qty: 5 }]);
    const cancelled = await makeRelease('cancelled', [{ partNumber: 'PAD-26', qty: 5 }]);

    const onDraft = await receive({ releaseLineId: draft.lines[0].id, qty: 5 });
    const onCancelled = await receive({ releaseLineId: cancelled.lines[0].id, qty: 5 });

    expect(onDraft.status).toBe(409);
    expect(onCancelled.status).toBe(409);
  });

  it('answers 404 for an unknown line', async () => {
    const response = await receive({ releaseLineId: 999_999, qty: 1 });

    expect(response.status).toBe(404);
  });

  it('rejects a negative count, and a zero count that gives no discrepancy', async () => {
    const { lines } = await makeRelease('sent', [{ partNumber: 'PAD-26', qty: 5 }]);

    const negative = await receive({ releaseLineId: lines[0].id, qty: -1 });
    const zero = await receive({ releaseLineId: lines[0].id, qty: 0 });
    const nothingCame = await receive({ releaseLineId: lines[0].id, qty: 0, discrepancy: 'short' });

    expect(negative.status).toBe(400);
    expect(zero.status).toBe(400);
    expect(zero.body.error.details[0].path).toEqual(['qty']);
    expect(nothingCame.status).toBe(201);
  });

  it('lets admin and receiving record receipts and refuses every other role', async () => {
    const { lines } = await makeRelease('sent', [{ partNumber: 'DECAL-S', qty: 1000 }]);
    const outcomes: Partial<Record<Role, number>> = {};

    for (const role of ['admin', 'receiving', 'buyer', 'planner', 'viewer', 'supplier'] as Role[]) {
      outcomes[role] = (await receive({ releaseLineId: lines[0].id, qty: 1 }, freshKey(), role)).status;
    }

    expect(outcomes).toEqual({ admin: 201, receiving: 201, buyer: 403, planner: 403, viewer: 403, supplier: 403 });
    expect(await receiptCount(lines[0].id)).toBe(2);
  });
});
