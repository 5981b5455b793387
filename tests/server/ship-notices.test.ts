import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEventEntity } from '../../server/audit/audit-event.entity';
import { KanbanCardEntity } from '../../server/loops/kanban-card.entity';
import { KanbanLoopEntity } from '../../server/loops/kanban-loop.entity';
import { syncLoops } from '../../server/loops/loop-sync';
import { SupplierEntity } from '../../server/master-data/supplier.entity';
import { OutboxMessageEntity } from '../../server/outbox/outbox-message.entity';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { ShipNoticeEntity } from '../../server/ship-notices/ship-notice.entity';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { cardNumber } from '../../shared/domain/gs1';
import type { DockItem } from '../../shared/schemas/dock';
import type { Release, RunReleasesResponse } from '../../shared/schemas/releases';
import type { ShippingView } from '../../shared/schemas/ship-notices';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';

let context: TestContext;
let nextDay = 1;
let nextKey = 1;

/*
 * Fixture: kanban parts K (container 10) and W (container 25) from SUP-A, one card each. Each test
 * empties both cards, releases a new March 2027 working day and confirms the release as asked, so
 * it starts from a confirmed release of two lines (K 10, W 25) and the shipping link of its receipt.
 */
beforeAll(async () => {
  context = await createTestContext();
  await context.dataSource.transaction(async (manager) => {
    await savePartsWithStock(manager, [
      testPart('K', { packQty: 10, leadTimeDays: 2 }),
      testPart('W', { packQty: 25, leadTimeDays: 2, uom: 'KGM' }),
    ]);
    await syncLoops(manager);
    const loops = await manager.find(KanbanLoopEntity, { order: { partNumber: 'ASC' } });
    await manager.insert(
      KanbanCardEntity,
      loops.map((loop) => ({
        loopId: loop.id,
        cardIndex: 1,
        cardNumber: cardNumber(loop.id, 1),
        state: 'full',
        stateChangedAt: new Date().toISOString(),
        retiredAt: null,
        releaseLineId: null,
      })),
    );
  });
});
afterAll(async () => {
  await context.close();
});

const WORKING_DAYS_MARCH_2027 = ['01', '02', '03', '04', '05', '08', '09', '10', '11', '12', '15', '16', '17'];

async function confirmedRelease(): Promise<{ release: Release; shippingToken: string }> {
  await context.dataSource
    .getRepository(KanbanCardEntity)
    .update({ cardIndex: 1 }, { state: 'empty', releaseLineId: null });
  const date = `2027-03-${WORKING_DAYS_MARCH_2027[nextDay++ - 1]}`;
  const run = await request(context.app).post('/api/releases/run').set(bearer(context.tokens.buyer)).send({ date });
  expect(run.status).toBe(200);
  const [release] = (run.body as RunReleasesResponse).releases;
  const [mail] = await context.dataSource.getRepository(OutboxMessageEntity).find({ order: { id: 'DESC' }, take: 1 });
  const token = mail!.text.match(/\/confirm\/([A-Za-z0-9_-]+)/)![1];
  const answer = await request(context.app)
    .post(`/api/confirm/${token}`)
    .send({ lines: release!.lines.map((line) => ({ id: line.id, confirmedQty: line.qty, shipDate: line.needDate })) });
  expect(answer.status).toBe(200);
  return { release: release!, shippingToken: answer.body.shippingToken as string };
}

const lineOf = (release: Release, part: string) => release.lines.find((line) => line.partNumber === part)!;

function sendByLink(token: string, body: object, key = `key-${nextKey++}`) {
  return request(context.app).post(`/api/shipping/${token}`).set('Idempotency-Key', key).send(body);
}

function readRelease(number: string) {
  return request(context.app).get(`/api/releases/${number}`).set(bearer(context.tokens.buyer));
}

const shipment = { carrier: 'Road Freight Example', trackingNumber: 'TRK-0001', shipDate: '2027-03-01' };

describe('POST /api/shipping/:token (the link in the confirmation receipt)', () => {
  it('records part of a release as one shipment arriving ship date + transit; the release is partly shipped', async () => {
    // SUP-A needs two working days on the road: shipped Monday 1 Mar 2027 it arrives Wednesday
    // 3 Mar (1 Mar 2027 is a Monday by the Gregorian calendar; Mon + 2 working days = Wed).
    await context.dataSource.getRepository(SupplierEntity).update({ code: 'SUP-A' }, { transitDays: 2 });
    const { release, shippingToken } = await confirmedRelease();
    const k = lineOf(release, 'K');

    const response = await sendByLink(shippingToken, { ...shipment, lines: [{ lineId: k.id, qty: 10 }] });

    await context.dataSource.getRepository(SupplierEntity).update({ code: 'SUP-A' }, { transitDays: 0 });
    expect(response.status).toBe(201);
    expect(response.body.releaseStatus).toBe('partial');
    expect(response.body.notice).toMatchObject({
      releaseNumber: release.number,
      shipDate: '2027-03-01',
      arrivalDate: '2027-03-03',
      carrier: 'Road Freight Example',
      trackingNumber: 'TRK-0001',
      lines: [{ lineId: k.id, partNumber: 'K', qty: 10 }],
    });
    const after = await readRelease(release.number);
    expect(after.body.status).toBe('partial');
    expect(after.body.shipNotices).toHaveLength(1);
  });

  it('makes the release shipped once every open quantity is on a notice, and the cards shipped', async () => {
    const { release, shippingToken } = await confirmedRelease();
    const [k, w] = [lineOf(release, 'K'), lineOf(release, 'W')];

    const first = await sendByLink(shippingToken, {
      ...shipment,
      lines: [
        { lineId: k.id, qty: 10 },
        { lineId: w.id, qty: 5 },
      ],
    });
    const second = await sendByLink(shippingToken, {
      ...shipment,
      trackingNumber: 'TRK-0002',
      lines: [{ lineId: w.id, qty: 20 }],
    });

    expect(first.body.releaseStatus).toBe('partial');
    expect(second.status).toBe(201);
    expect(second.body.releaseStatus).toBe('shipped');
    const after = await readRelease(release.number);
    expect(after.body.status).toBe('shipped');
    expect(after.body.shipNotices.map((notice: { trackingNumber: string }) => notice.trackingNumber)).toEqual([
      'TRK-0001',
      'TRK-0002',
    ]);
    const cards = await context.dataSource.getRepository(KanbanCardEntity).findBy({ cardIndex: 1 });
    expect(cards.map((card) => card.state)).toEqual(['shipped', 'shipped']);
  });

  it('records a retried notice once', async () => {
    const { release, shippingToken } = await confirmedRelease();
    const body = { ...shipment, lines: [{ lineId: lineOf(release, 'K').id, qty: 10 }] };

    const first = await sendByLink(shippingToken, body, 'same-key');
    const retry = await sendByLink(shippingToken, body, 'same-key');

    expect(first.status).toBe(201);
    expect(retry.status).toBe(200);
    expect(retry.body.notice.id).toBe(first.body.notice.id);
    const row = await context.dataSource.getRepository(ReleaseEntity).findOneByOrFail({ number: release.number });
    expect(await context.dataSource.getRepository(ShipNoticeEntity).countBy({ releaseId: row.id })).toBe(1);
  });

  it('refuses a line not on the release and more than is open, naming the line, and records nothing', async () => {
    const { release, shippingToken } = await confirmedRelease();
    const k = lineOf(release, 'K');

    const foreign = await sendByLink(shippingToken, { ...shipment, lines: [{ lineId: 999_999, qty: 1 }] });
    const tooMany = await sendByLink(shippingToken, { ...shipment, lines: [{ lineId: k.id, qty: 11 }] });

    expect(foreign.status).toBe(422);
    expect(foreign.body.error.details).toEqual([
      { path: ['lines', 0, 'lineId'], message: `line 999999 is not on release ${release.number}` },
    ]);
    expect(tooMany.status).toBe(422);
    expect(tooMany.body.error.details[0].path).toEqual(['lines', 0, 'qty']);
    expect(tooMany.body.error.details[0].message).toContain(`line ${k.id} (K)`);
    expect((await readRelease(release.number)).body).toMatchObject({ status: 'confirmed', shipNotices: [] });
  });

  it('lets a supplier ship up to its over tolerance and no further', async () => {
    await context.dataSource.getRepository(SupplierEntity).update({ code: 'SUP-A' }, { overTolerancePct: 10 });
    const { release, shippingToken } = await confirmedRelease();
    const k = lineOf(release, 'K');

    const twelve = await sendByLink(shippingToken, { ...shipment, lines: [{ lineId: k.id, qty: 12 }] });
    const eleven = await sendByLink(shippingToken, { ...shipment, lines: [{ lineId: k.id, qty: 11 }] });

    await context.dataSource.getRepository(SupplierEntity).update({ code: 'SUP-A' }, { overTolerancePct: 0 });
    // 10 ordered + 10 % = 11 at most.
    expect(twelve.status).toBe(422);
    expect(eleven.status).toBe(201);
  });

  it('refuses a past ship date (422), a zero quantity and a missing carrier (400)', async () => {
    const { release, shippingToken } = await confirmedRelease();
    const k = lineOf(release, 'K');

    const past = await sendByLink(shippingToken, {
      ...shipment,
      shipDate: '2020-01-06',
      lines: [{ lineId: k.id, qty: 1 }],
    });
    const zero = await sendByLink(shippingToken, { ...shipment, lines: [{ lineId: k.id, qty: 0 }] });
    const noCarrier = await sendByLink(shippingToken, { ...shipment, carrier: ' ', lines: [{ lineId: k.id, qty: 1 }] });

    expect(past.status).toBe(422);
    expect(past.body.error.details[0].path).toEqual(['shipDate']);
    expect(zero.status).toBe(400);
    expect(noCarrier.status).toBe(400);
  });

  it('writes an audit entry and answers 404 to an unknown link', async () => {
    const { release, shippingToken } = await confirmedRelease();

    await sendByLink(shippingToken, { ...shipment, lines: [{ lineId: lineOf(release, 'K').id, qty: 10 }] });
    const unknown = await sendByLink('not-a-link', { ...shipment, lines: [{ lineId: 1, qty: 1 }] });

    const audit = await context.dataSource
      .getRepository(AuditEventEntity)
      .findOneBy({ action: 'ship-notice', entityKey: release.number });
    expect(audit).not.toBeNull();
    expect(unknown.status).toBe(404);
  });
});

describe('ship notices on the dock board', () => {
  it('shows a notice sent by link as its own card arriving ship date + transit, and the rest as Expected', async () => {
    // Two working days on the road: shipped Monday 1 Mar 2027 arrives Wednesday 3 Mar (1 Mar 2027
    // is a Monday by the Gregorian calendar; Mon + 2 working days = Wed).
    await context.dataSource.getRepository(SupplierEntity).update({ code: 'SUP-A' }, { transitDays: 2 });
    const { release, shippingToken } = await confirmedRelease();
    const [k, w] = [lineOf(release, 'K'), lineOf(release, 'W')];

    await sendByLink(shippingToken, { ...shipment, lines: [{ lineId: k.id, qty: 10 }] });
    const board = await request(context.app).get('/api/dock').set(bearer(context.tokens.receiving));
    const answered = await readRelease(release.number);

    await context.dataSource.getRepository(SupplierEntity).update({ code: 'SUP-A' }, { transitDays: 0 });
    const cards = (board.body as DockItem[]).filter((card) => card.number === release.number);
    const byKind = (kind: string) => cards.find((card) => card.kind === kind)!;
    expect(cards).toHaveLength(2);
    expect(byKind('shipment')).toMatchObject({ arrivalDate: '2027-03-03', carrier: 'Road Freight Example' });
    expect(byKind('shipment').lines.map((line) => [line.id, line.qty])).toEqual([[k.id, 10]]);
    // W is not on the truck: it waits on the day its answered ship date brings it.
    const wAnswered = (answered.body as Release).lines.find((line) => line.id === w.id)!;
    expect(byKind('expected').arrivalDate).toBe(wAnswered.arrivalDate);
    expect(byKind('expected').lines.map((line) => [line.id, line.qty])).toEqual([[w.id, 25]]);
  });
});

describe('POST /api/releases/:number/ship-notices (signed in)', () => {
  it('takes a notice from the supplier of the release and shows the form', async () => {
    const { release } = await confirmedRelease();

    const view = await request(context.app)
      .get(`/api/releases/${release.number}/ship-notices`)
      .set(bearer(context.tokens.supplier));
    const response = await request(context.app)
      .post(`/api/releases/${release.number}/ship-notices`)
      .set(bearer(context.tokens.supplier))
      .set('Idempotency-Key', 'signed-in-1')
      .send({ ...shipment, lines: [{ lineId: lineOf(release, 'W').id, qty: 25 }] });

    expect(view.status).toBe(200);
    expect((view.body as ShippingView).lines.map((line) => [line.partNumber, line.maxQty])).toEqual([
      ['K', 10],
      ['W', 25],
    ]);
    expect(response.status).toBe(201);
    expect(response.body.releaseStatus).toBe('partial');
  });

  it('answers 404 for another supplier’s release and 403 for a buyer', async () => {
    const { release } = await confirmedRelease();
    await context.dataSource.getRepository(ReleaseEntity).update({ number: release.number }, { supplierCode: 'SUP-B' });
    const body = { ...shipment, lines: [{ lineId: lineOf(release, 'K').id, qty: 1 }] };

    const foreign = await request(context.app)
      .post(`/api/releases/${release.number}/ship-notices`)
      .set(bearer(context.tokens.supplier))
      .set('Idempotency-Key', 'foreign-1')
      .send(body);
    const buyer = await request(context.app)
      .post(`/api/releases/${release.number}/ship-notices`)
      .set(bearer(context.tokens.buyer))
      .set('Idempotency-Key', 'buyer-1')
      .send(body);

    expect(foreign.status).toBe(404);
    expect(buyer.status).toBe(403);
  });
});
