import { mkdir, mkdtemp, rm, writeFile } from 'node:fs/promises';
import type { Server } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { releasesChanged } from '../../server/releases/release-events';
import { bumpDockVersion } from '../../server/settings/versions';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEventEntity } from '../../server/audit/audit-event.entity';
import { AttachmentEntity } from '../../server/dock/attachment.entity';
import { AttachmentContentEntity } from '../../server/dock/attachment-content.entity';
import { KanbanCardEntity } from '../../server/loops/kanban-card.entity';
import { KanbanLoopEntity } from '../../server/loops/kanban-loop.entity';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { plantToday } from '../../server/planning/plan-dates';
import { ReceiptEntity } from '../../server/dock/receipt.entity';
import { SupplierEntity } from '../../server/master-data/supplier.entity';
import { ReleaseLineEntity } from '../../server/releases/release-line.entity';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { addCalendarDays } from '../../shared/domain/date';
import { cardNumber } from '../../shared/domain/gs1';
import type { DockItem } from '../../shared/schemas/dock';
import type { Role } from '../../shared/schemas/user';
import { openEventStream } from './event-stream';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';

let context: TestContext;
let attachmentsDir: string;
let releaseDay = 0;
const today = plantToday();

interface LineSpec {
  partNumber: string;
  qty: number;
  needDate?: string;
  closed?: boolean;
  receivedQty?: number;
  cardId?: number | null;
}

interface ReleaseExtra extends Partial<ReleaseEntity> {
  /** The column the release's lines stand in. */
  dockColumn?: string;
}

async function makeRelease(
  status: string,
  lines: LineSpec[],
  { dockColumn = 'expected', ...extra }: ReleaseExtra = {},
): Promise<{ release: ReleaseEntity; lines: ReleaseLineEntity[] }> {
  releaseDay += 1;
  const releaseDate = `2026-10-${String(releaseDay).padStart(2, '0')}`;
  const release = await context.dataSource.getRepository(ReleaseEntity).save({
    number: `R-DOCK-${releaseDay}`,
    supplierCode: 'SUP-A',
    releaseDate,
    status,
    carrier: null,
    trackingNumber: null,
    ...extra,
  });
  const saved = await context.dataSource.getRepository(ReleaseLineEntity).save(
    lines.map((line) => ({
      releaseId: release.id,
      partNumber: line.partNumber,
      qty: line.qty,
      needDate: line.needDate ?? today,
      origin: line.cardId ? 'kanban' : 'plan',
      cardId: line.cardId ?? null,
      confirmedQty: null,
      receivedQty: line.receivedQty ?? 0,
      closed: line.closed ?? false,
      dockColumn,
    })),
  );
  // As every writer of releases does, so the board served is rebuilt.
  await context.db.write((manager) => releasesChanged(manager));
  return { release, lines: saved };
}

async function listDock(role: Role = 'receiving'): Promise<DockItem[]> {
  const response = await request(context.app).get('/api/dock').set(bearer(context.tokens[role]));
  expect(response.status).toBe(200);
  return response.body as DockItem[];
}

function move(id: string, column: string, role: Role = 'receiving') {
  return request(context.app).patch(`/api/dock/items/${id}`).set(bearer(context.tokens[role])).send({ column });
}

function upload(id: number, content: Buffer, fileName: string, role: Role = 'receiving') {
  return request(context.app)
    .post(`/api/dock/releases/${id}/attachments`)
    .set(bearer(context.tokens[role]))
    .attach('file', content, fileName);
}

// A 1×1 PNG: the signature 89 50 4E 47 0D 0A 1A 0A (PNG specification, ISO/IEC 15948, "PNG signature";
// from memory) followed by IHDR, IDAT and IEND chunks.
const PNG = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==',
  'base64',
);
// A PDF opens with "%PDF-" and its version (ISO 32000-1:2008, 7.5.2 "File Header"; from memory).
const PDF = Buffer.from('%PDF-1.7\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n', 'latin1');
// A Windows program starts with the DOS header signature "MZ" (Microsoft PE/COFF specification,
// "MS-DOS Stub"; from memory), whatever its file is called.
const EXE = Buffer.concat([Buffer.from('MZ', 'latin1'), Buffer.alloc(126)]);

beforeAll(async () => {
  attachmentsDir = await mkdtemp(join(tmpdir(), 'cardloop-dock-'));
  context = await createTestContext({ attachmentsDir });
  await context.dataSource.transaction((manager) =>
    savePartsWithStock(manager, [
      testPart('BRUSH-20', { description: 'Disc brush 20 in', replenishment: 'scheduled' }),
      testPart('BATT-24V', {
        description: 'Traction battery 24 V',
        hazardous: true,
        replenishment: 'scheduled',
        unNumber: '2794',
        hazardClass: '8',
        unitWeightKg: 28,
        heavyLift: true,
      }),
      testPart('CASTER-75', { description: 'Caster 75 mm', uom: 'PR' }),
    ]),
  );
});
afterAll(async () => {
  await context.close();
  await rm(attachmentsDir, { recursive: true, force: true });
});

describe('GET /api/dock', () => {
  it('lists a card per day of open lines, with card numbers and hazard flag, ordered by column then expected day', async () => {
    const loop = await context.dataSource
      .getRepository(KanbanLoopEntity)
      .save({ partNumber: 'CASTER-75', kind: 'supplier', containerQty: 4 });
    const card = await context.dataSource.getRepository(KanbanCardEntity).save({
      loopId: loop.id,
      cardIndex: 1,
      cardNumber: cardNumber(loop.id, 1),
      state: 'ordered',
      stateChangedAt: '2026-10-01T08:00:00.000Z',
      retiredAt: null,
      releaseLineId: null,
    });
    const later = await makeRelease(
      'confirmed',
      [{ partNumber: 'BRUSH-20', qty: 12, needDate: addCalendarDays(today, 2) }],
      {
        carrier: 'Road freight',
        trackingNumber: 'TRK-0001',
      },
    );
    const dueToday = await makeRelease('sent', [
      { partNumber: 'BATT-24V', qty: 4, needDate: today },
      { partNumber: 'CASTER-75', qty: 4, needDate: addCalendarDays(today, 1), cardId: card.id },
    ]);
    const atDock = await makeRelease(
      'shipped',
      [{ partNumber: 'BRUSH-20', qty: 6, needDate: addCalendarDays(today, -1) }],
      { dockColumn: 'at_dock' },
    );
    await makeRelease('draft', [{ partNumber: 'BRUSH-20', qty: 6 }]);
    await makeRelease('cancelled', [{ partNumber: 'BRUSH-20', qty: 6 }]);

    const items = (await listDock()).filter((item) =>
      [dueToday.release.id, later.release.id, atDock.release.id].includes(item.releaseId),
    );

    // The release due today has lines due on two days: each day is its own card.
    expect(items.map((item) => item.id)).toEqual([
      `expected-${dueToday.release.id}-${today}`,
      `expected-${dueToday.release.id}-${addCalendarDays(today, 1)}`,
      `expected-${later.release.id}-${addCalendarDays(today, 2)}`,
      `expected-${atDock.release.id}-${addCalendarDays(today, -1)}`,
    ]);
    const [first, second] = items;
    expect(first).toMatchObject({
      kind: 'expected',
      releaseId: dueToday.release.id,
      shipNoticeId: null,
      number: dueToday.release.number,
      supplierCode: 'SUP-A',
      supplierName: 'Supplier A',
      column: 'expected',
      status: 'sent',
      shipDate: null,
      arrivalDate: today,
      expectedToday: true,
      overdue: false,
      carrier: null,
      trackingNumber: null,
      hazardous: true,
      attachments: [],
    });
    expect(first!.lines).toEqual([
      {
        id: dueToday.lines[0].id,
        partNumber: 'BATT-24V',
        description: 'Traction battery 24 V',
        uom: 'H87',
        qty: 4,
        receivedQty: 0,
        open: true,
        needDate: today,
        hazardous: true,
        unNumber: '2794',
        hazardClass: '8',
        sdsUrl: null,
        unitWeightKg: 28,
        heavyLift: true,
      },
    ]);
    expect(second).toMatchObject({ arrivalDate: addCalendarDays(today, 1), expectedToday: false, hazardous: false });
    expect(second!.lines).toEqual([
      {
        id: dueToday.lines[1].id,
        partNumber: 'CASTER-75',
        description: 'Caster 75 mm',
        uom: 'PR',
        qty: 4,
        receivedQty: 0,
        open: true,
        cardNumber: card.cardNumber,
        needDate: addCalendarDays(today, 1),
        hazardous: false,
        unNumber: null,
        hazardClass: null,
        sdsUrl: null,
        unitWeightKg: null,
        heavyLift: false,
      },
    ]);
    expect(items[2]).toMatchObject({
      carrier: 'Road freight',
      trackingNumber: 'TRK-0001',
      hazardous: false,
      expectedToday: false,
    });
    expect(items[3]).toMatchObject({ column: 'at_dock', overdue: true, expectedToday: false });
  });

  it('dates an answered line by its arrival, not its need date', async () => {
    const { release, lines } = await makeRelease('confirmed', [
      { partNumber: 'BRUSH-20', qty: 5, needDate: addCalendarDays(today, 3) },
    ]);
    await context.dataSource
      .getRepository(ReleaseLineEntity)
      .update({ id: lines[0].id }, { arrivalDate: addCalendarDays(today, 5) });

    const item = (await listDock()).find((candidate) => candidate.releaseId === release.id);

    expect(item).toMatchObject({
      id: `expected-${release.id}-${addCalendarDays(today, 5)}`,
      arrivalDate: addCalendarDays(today, 5),
    });
    expect(item!.lines[0]).toMatchObject({ needDate: addCalendarDays(today, 3) });
  });

  it('keeps a release received today on the board, and drops one received on an earlier day', async () => {
    const receivedNow = await makeRelease(
      'received',
      [{ partNumber: 'BRUSH-20', qty: 2, receivedQty: 2, closed: true }],
      { dockColumn: 'to_line' },
    );
    const earlier = await makeRelease('received', [{ partNumber: 'BRUSH-20', qty: 2, receivedQty: 2, closed: true }]);
    const receipts = context.dataSource.getRepository(ReceiptEntity);
    const base = {
      qty: 2,
      discrepancy: null,
      note: null,
      final: false,
      onHandAfter: 2,
      userEmail: 'receiving@example.com',
    };
    await receipts.save({
      ...base,
      releaseLineId: receivedNow.lines[0].id,
      idempotencyKey: 'dock-today',
      receivedAt: new Date().toISOString(),
    });
    await receipts.save({
      ...base,
      releaseLineId: earlier.lines[0].id,
      idempotencyKey: 'dock-earlier',
      receivedAt: '2026-10-01T09:00:00.000Z',
    });
    await context.db.write((manager) => bumpDockVersion(manager));

    const items = await listDock();
    const ids = items.map((item) => item.releaseId);

    expect(ids).toContain(receivedNow.release.id);
    expect(ids).not.toContain(earlier.release.id);
    // Due today, but nothing is left to come: no longer flagged as expected.
    expect(items.find((item) => item.releaseId === receivedNow.release.id)).toMatchObject({
      arrivalDate: today,
      expectedToday: false,
      overdue: false,
    });
  });

  it('shows a part or supplier edited since the last read, and answers 304 to the board the client holds', async () => {
    const { release } = await makeRelease('confirmed', [{ partNumber: 'CASTER-75', qty: 8 }]);
    const first = await request(context.app).get('/api/dock').set(bearer(context.tokens.receiving));
    const admin = bearer(context.tokens.admin);

    const unchanged = await request(context.app)
      .get('/api/dock')
      .set(bearer(context.tokens.receiving))
      .set('If-None-Match', first.headers.etag);
    const part = await request(context.app)
      .put('/api/parts/CASTER-75')
      .set(admin)
      .send({ description: 'Caster 75 mm, braked' });
    const supplier = await request(context.app)
      .put('/api/suppliers/SUP-A')
      .set(admin)
      .send({ name: 'Supplier A West' });
    const item = (await listDock()).find((candidate) => candidate.releaseId === release.id)!;

    expect(first.status).toBe(200);
    expect(unchanged.status).toBe(304);
    expect([part.status, supplier.status]).toEqual([200, 200]);
    expect(item.lines[0].description).toBe('Caster 75 mm, braked');
    expect(item.supplierName).toBe('Supplier A West');
  });

  it('is readable by every signed-in role but a supplier', async () => {
    const statuses: Partial<Record<Role, number>> = {};

    for (const role of ['admin', 'planner', 'buyer', 'receiving', 'viewer', 'supplier'] as Role[]) {
      statuses[role] = (await request(context.app).get('/api/dock').set(bearer(context.tokens[role]))).status;
    }

    expect(statuses).toEqual({ admin: 200, planner: 200, buyer: 200, receiving: 200, viewer: 200, supplier: 403 });
  });
});

describe('PATCH /api/dock/items/:id', () => {
  const keyOf = (release: ReleaseEntity, date = today) => `expected-${release.id}-${date}`;

  it('moves a card forward and back, audits each move and bumps the dock version', async () => {
    const { release } = await makeRelease('confirmed', [{ partNumber: 'BRUSH-20', qty: 3 }]);

    const forward = await move(keyOf(release), 'at_dock');
    const back = await move(keyOf(release), 'expected');

    expect(forward.status).toBe(200);
    expect(forward.body).toMatchObject({ id: keyOf(release), releaseId: release.id, column: 'at_dock' });
    expect(back.status).toBe(200);
    expect(back.body.column).toBe('expected');
    const audit = await context.dataSource.getRepository(AuditEventEntity).find({
      where: { entity: 'release', entityKey: release.number, action: 'dock-move' },
      order: { id: 'ASC' },
    });
    expect(audit.map((event) => event.changes)).toEqual([
      { card: keyOf(release), dockColumn: { from: 'expected', to: 'at_dock' } },
      { card: keyOf(release), dockColumn: { from: 'at_dock', to: 'expected' } },
    ]);
  });

  it('moves only the lines expected that day; a later day of the same release stays Expected', async () => {
    const tomorrow = addCalendarDays(today, 1);
    const { release } = await makeRelease('confirmed', [
      { partNumber: 'BRUSH-20', qty: 3, needDate: today },
      { partNumber: 'CASTER-75', qty: 2, needDate: tomorrow },
    ]);

    const moved = await move(keyOf(release), 'at_dock');

    expect(moved.status).toBe(200);
    const cards = (await listDock()).filter((item) => item.releaseId === release.id);
    expect(cards.map((item) => [item.id, item.column])).toEqual([
      [keyOf(release, tomorrow), 'expected'],
      [keyOf(release), 'at_dock'],
    ]);
  });

  it('keeps a fully received card at the line (409) but lets a partly received one go back', async () => {
    const received = await makeRelease('received', [{ partNumber: 'BRUSH-20', qty: 2, receivedQty: 2, closed: true }], {
      dockColumn: 'to_line',
    });
    await context.dataSource.getRepository(ReceiptEntity).save({
      releaseLineId: received.lines[0].id,
      shipNoticeId: null,
      qty: 2,
      discrepancy: null,
      note: null,
      final: false,
      onHandAfter: 2,
      userEmail: 'receiving@example.com',
      idempotencyKey: 'dock-at-line',
      receivedAt: new Date().toISOString(),
    });
    const partial = await makeRelease('partial', [{ partNumber: 'BRUSH-20', qty: 4, receivedQty: 2 }], {
      dockColumn: 'to_line',
    });

    const refused = await move(keyOf(received.release), 'counted');
    const allowed = await move(keyOf(partial.release), 'at_dock');

    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('conflict');
    expect(refused.body.error.message).toMatch(/fully received and at the line/);
    expect(allowed.status).toBe(200);
  });

  it('answers 404 for an unknown card, 400 for an unknown column, 403 for a role that may not move', async () => {
    const { release } = await makeRelease('sent', [{ partNumber: 'BRUSH-20', qty: 1 }]);

    const unknown = await move('expected-987654-2026-12-01', 'at_dock');
    const notAKey = await move('987654', 'at_dock');
    const noNotice = await move('shipment-987654', 'at_dock');
    const badColumn = await move(keyOf(release), 'on_truck');
    const asBuyer = await move(keyOf(release), 'at_dock', 'buyer');
    const asAdmin = await move(keyOf(release), 'at_dock', 'admin');

    expect(unknown.status).toBe(404);
    expect(notAKey.status).toBe(404);
    expect(noNotice.status).toBe(404);
    expect(badColumn.status).toBe(400);
    expect(asBuyer.status).toBe(403);
    expect(asAdmin.status).toBe(200);
  });
});

describe('shipments on the dock', () => {
  let key = 0;

  function sendNotice(number: string, body: object) {
    key += 1;
    return request(context.app)
      .post(`/api/releases/${number}/ship-notices`)
      .set(bearer(context.tokens.supplier))
      .set('Idempotency-Key', `dock-notice-${key}`)
      .send(body);
  }

  function receive(body: object) {
    key += 1;
    return request(context.app)
      .post('/api/receipts')
      .set(bearer(context.tokens.receiving))
      .set('Idempotency-Key', `dock-receipt-${key}`)
      .send(body);
  }

  const cardsOf = async (releaseId: number) => (await listDock()).filter((item) => item.releaseId === releaseId);

  it('shows each ship notice as its own card arriving ship date + transit, and the unshipped rest as Expected', async () => {
    const dueLater = addCalendarDays(today, 20);
    const { release, lines } = await makeRelease('confirmed', [
      { partNumber: 'BRUSH-20', qty: 12, needDate: dueLater },
      { partNumber: 'CASTER-75', qty: 8, needDate: dueLater },
    ]);
    // SUP-A takes two working days on the road: shipped Friday 5 Mar 2027, the goods arrive
    // Tuesday 9 Mar (5 Mar 2027 is a Friday by the Gregorian calendar; Fri + 2 working days, the
    // weekend skipped, is Tue).
    await context.dataSource.getRepository(SupplierEntity).update({ code: 'SUP-A' }, { transitDays: 2 });
    const notice = await sendNotice(release.number, {
      carrier: 'Road Freight Example',
      trackingNumber: 'TRK-DOCK-1',
      shipDate: '2027-03-05',
      lines: [{ lineId: lines[0].id, qty: 5 }],
    });
    await context.dataSource.getRepository(SupplierEntity).update({ code: 'SUP-A' }, { transitDays: 0 });
    expect(notice.status).toBe(201);
    const noticeId = notice.body.notice.id as number;

    const cards = await cardsOf(release.id);

    expect(cards.map((item) => item.id)).toEqual([`expected-${release.id}-${dueLater}`, `shipment-${noticeId}`]);
    const [rest, shipment] = cards;
    expect(shipment).toMatchObject({
      kind: 'shipment',
      shipNoticeId: noticeId,
      status: 'partial',
      column: 'expected',
      shipDate: '2027-03-05',
      arrivalDate: '2027-03-09',
      carrier: 'Road Freight Example',
      trackingNumber: 'TRK-DOCK-1',
    });
    expect(shipment!.lines.map((line) => [line.partNumber, line.qty, line.receivedQty, line.open])).toEqual([
      ['BRUSH-20', 5, 0, true],
    ]);
    // 12 − 5 of the brushes and all 8 casters are not shipped yet.
    expect(rest!.lines.map((line) => [line.partNumber, line.qty, line.open])).toEqual([
      ['BRUSH-20', 7, true],
      ['CASTER-75', 8, true],
    ]);
  });

  it('checks a shipment in against its own lines, moves only that card to Counted, and leaves the rest Expected', async () => {
    const dueLater = addCalendarDays(today, 21);
    const { release, lines } = await makeRelease('confirmed', [
      { partNumber: 'BRUSH-20', qty: 12, needDate: dueLater },
      { partNumber: 'CASTER-75', qty: 8, needDate: dueLater },
    ]);
    const first = await sendNotice(release.number, {
      carrier: 'Road Freight Example',
      trackingNumber: 'TRK-DOCK-2',
      shipDate: addCalendarDays(today, 1),
      lines: [{ lineId: lines[0].id, qty: 6 }],
    });
    const second = await sendNotice(release.number, {
      carrier: 'Road Freight Example',
      trackingNumber: 'TRK-DOCK-3',
      shipDate: addCalendarDays(today, 2),
      lines: [{ lineId: lines[0].id, qty: 6 }],
    });
    const [firstId, secondId] = [first.body.notice.id as number, second.body.notice.id as number];

    // The second truck comes first: its count is booked against it, not against the older notice.
    const counted = await receive({ releaseLineId: lines[0].id, qty: 6, shipNoticeId: secondId });

    expect(counted.status).toBe(201);
    expect(counted.body.receipt.shipNoticeId).toBe(secondId);
    const cards = await cardsOf(release.id);
    const byId = new Map(cards.map((item) => [item.id, item]));
    expect(byId.get(`shipment-${secondId}`)).toMatchObject({ column: 'counted' });
    expect(byId.get(`shipment-${secondId}`)!.lines[0]).toMatchObject({ qty: 6, receivedQty: 6, open: false });
    expect(byId.get(`shipment-${firstId}`)).toMatchObject({ column: 'expected' });
    expect(byId.get(`shipment-${firstId}`)!.lines[0]).toMatchObject({ qty: 6, receivedQty: 0, open: true });
    expect(byId.get(`expected-${release.id}-${dueLater}`)).toMatchObject({ column: 'expected' });
    expect(byId.get(`expected-${release.id}-${dueLater}`)!.lines.map((line) => line.partNumber)).toEqual(['CASTER-75']);

    // A count that names no shipment goes to the oldest one still waiting.
    const unnamed = await receive({ releaseLineId: lines[0].id, qty: 6 });

    expect(unnamed.body.receipt.shipNoticeId).toBe(firstId);
    expect((await cardsOf(release.id)).find((item) => item.id === `shipment-${firstId}`)).toMatchObject({
      column: 'counted',
    });
  });

  it('refuses a count naming a shipment that does not carry the line (422) and records nothing', async () => {
    const { release, lines } = await makeRelease('confirmed', [
      { partNumber: 'BRUSH-20', qty: 4, needDate: addCalendarDays(today, 22) },
      { partNumber: 'CASTER-75', qty: 4, needDate: addCalendarDays(today, 22) },
    ]);
    const notice = await sendNotice(release.number, {
      carrier: 'Road Freight Example',
      trackingNumber: 'TRK-DOCK-4',
      shipDate: addCalendarDays(today, 1),
      lines: [{ lineId: lines[0].id, qty: 4 }],
    });
    const receiptsBefore = await context.dataSource.getRepository(ReceiptEntity).count();

    const response = await receive({ releaseLineId: lines[1].id, qty: 4, shipNoticeId: notice.body.notice.id });

    expect(response.status).toBe(422);
    expect(response.body.error.details[0].path).toEqual(['shipNoticeId']);
    expect(await context.dataSource.getRepository(ReceiptEntity).count()).toBe(receiptsBefore);
  });

  it('answers a replayed count once, and refuses the same key naming another shipment (409)', async () => {
    const { release, lines } = await makeRelease('confirmed', [
      { partNumber: 'BRUSH-20', qty: 4, needDate: addCalendarDays(today, 24) },
    ]);
    const send = (qty: number) =>
      sendNotice(release.number, {
        carrier: 'Road Freight Example',
        trackingNumber: `TRK-DOCK-R${qty}`,
        shipDate: addCalendarDays(today, 1),
        lines: [{ lineId: lines[0].id, qty }],
      });
    const [first, second] = [(await send(2)).body.notice.id as number, (await send(2)).body.notice.id as number];
    const count = (shipNoticeId: number) =>
      request(context.app)
        .post('/api/receipts')
        .set(bearer(context.tokens.receiving))
        .set('Idempotency-Key', `dock-replay-${release.id}`)
        .send({ releaseLineId: lines[0].id, qty: 2, shipNoticeId });

    const counted = await count(first);
    const replayed = await count(first);
    const otherShipment = await count(second);

    expect([counted.status, replayed.status, otherShipment.status]).toEqual([201, 200, 409]);
    expect(await context.dataSource.getRepository(ReceiptEntity).countBy({ releaseLineId: lines[0].id })).toBe(1);
  });

  it('moves a shipment card on its own', async () => {
    const dueLater = addCalendarDays(today, 23);
    const { release, lines } = await makeRelease('confirmed', [{ partNumber: 'BRUSH-20', qty: 4, needDate: dueLater }]);
    const notice = await sendNotice(release.number, {
      carrier: 'Road Freight Example',
      trackingNumber: 'TRK-DOCK-5',
      shipDate: addCalendarDays(today, 1),
      lines: [{ lineId: lines[0].id, qty: 1 }],
    });

    const moved = await move(`shipment-${notice.body.notice.id}`, 'at_dock');

    expect(moved.status).toBe(200);
    expect((await cardsOf(release.id)).map((item) => [item.kind, item.column])).toEqual([
      ['expected', 'expected'],
      ['shipment', 'at_dock'],
    ]);
  });
});

describe('packing-slip attachments', () => {
  it('stores a photo under the release, lists it on the card and streams it back inline with its type', async () => {
    const { release } = await makeRelease('shipped', [{ partNumber: 'BRUSH-20', qty: 1 }]);

    const uploaded = await upload(release.id, PNG, 'slip photo.png');
    const item = (await listDock()).find((candidate) => candidate.releaseId === release.id);
    const downloaded = await request(context.app)
      .get(`/api/dock/attachments/${uploaded.body.id}`)
      .set(bearer(context.tokens.viewer))
      .buffer(true)
      .parse((response, done) => {
        const chunks: Buffer[] = [];
        response.on('data', (chunk: Buffer) => chunks.push(chunk));
        response.on('end', () => done(null, Buffer.concat(chunks)));
      });

    expect(uploaded.status).toBe(201);
    expect(uploaded.body).toMatchObject({
      fileName: 'slip photo.png',
      mimeType: 'image/png',
      sizeBytes: PNG.length,
      uploadedBy: 'receiving@example.com',
    });
    expect(item?.attachments.map((attachment) => attachment.fileName)).toEqual(['slip photo.png']);
    // Kept in the database, so every app node serves it: the stored bytes are the uploaded ones.
    const stored = await context.dataSource
      .getRepository(AttachmentContentEntity)
      .findOneByOrFail({ attachmentId: uploaded.body.id });
    expect(Buffer.compare(Buffer.from(stored.contentBase64, 'base64'), PNG)).toBe(0);
    expect(downloaded.status).toBe(200);
    expect(downloaded.headers['content-type']).toBe('image/png');
    expect(downloaded.headers['content-disposition']).toMatch(/^inline; filename="slip photo.png"/);
    expect(Buffer.compare(downloaded.body as Buffer, PNG)).toBe(0);
  });

  it('still serves a slip stored on disk before slips moved into the database', async () => {
    const { release } = await makeRelease('shipped', [{ partNumber: 'BRUSH-20', qty: 1 }]);
    await mkdir(join(attachmentsDir, String(release.id)), { recursive: true });
    await writeFile(join(attachmentsDir, String(release.id), 'old-slip.png'), PNG);
    const legacy = await context.dataSource.getRepository(AttachmentEntity).save({
      releaseId: release.id,
      receiptId: null,
      fileName: 'old slip.png',
      mimeType: 'image/png',
      sizeBytes: PNG.length,
      storagePath: `${release.id}/old-slip.png`,
      uploadedBy: 'receiving@example.com',
      uploadedAt: new Date().toISOString(),
    });

    const downloaded = await request(context.app)
      .get(`/api/dock/attachments/${legacy.id}`)
      .set(bearer(context.tokens.viewer))
      .buffer(true)
      .parse((response, done) => {
        const chunks: Buffer[] = [];
        response.on('data', (chunk: Buffer) => chunks.push(chunk));
        response.on('end', () => done(null, Buffer.concat(chunks)));
      });

    expect(downloaded.status).toBe(200);
    expect(Buffer.compare(downloaded.body as Buffer, PNG)).toBe(0);
  });

  it('takes a PDF whatever the browser calls it', async () => {
    const { release } = await makeRelease('shipped', [{ partNumber: 'BRUSH-20', qty: 1 }]);

    const response = await request(context.app)
      .post(`/api/dock/releases/${release.id}/attachments`)
      .set(bearer(context.tokens.receiving))
      .attach('file', PDF, { filename: 'slip.pdf', contentType: 'application/octet-stream' });

    expect(response.status).toBe(201);
    expect(response.body.mimeType).toBe('application/pdf');
  });

  it('rejects a program renamed .png by its content (415) and stores nothing', async () => {
    const { release } = await makeRelease('shipped', [{ partNumber: 'BRUSH-20', qty: 1 }]);

    const response = await request(context.app)
      .post(`/api/dock/releases/${release.id}/attachments`)
      .set(bearer(context.tokens.receiving))
      .attach('file', EXE, { filename: 'slip.png', contentType: 'image/png' });

    expect(response.status).toBe(415);
    expect(response.body.error.code).toBe('unsupported_file_type');
    expect((await listDock()).find((item) => item.releaseId === release.id)?.attachments).toEqual([]);
  });

  it.each(['received', 'cancelled'])(
    'refuses a packing slip on a %s release (409) and stores nothing',
    async (status) => {
      const { release } = await makeRelease(status, [{ partNumber: 'BRUSH-20', qty: 1, closed: true }]);
      const contentsBefore = await context.dataSource.getRepository(AttachmentContentEntity).count();

      const response = await upload(release.id, PNG, 'late slip.png');

      expect(response.status).toBe(409);
      expect(response.body.error.code).toBe('not_receivable');
      expect(await context.dataSource.getRepository(AttachmentEntity).countBy({ releaseId: release.id })).toBe(0);
      expect(await context.dataSource.getRepository(AttachmentContentEntity).count()).toBe(contentsBefore);
    },
  );

  it('refuses a file over 10 MB with 413', async () => {
    const { release } = await makeRelease('shipped', [{ partNumber: 'BRUSH-20', qty: 1 }]);
    const tooBig = Buffer.concat([PNG, Buffer.alloc(10 * 1024 * 1024)]);

    const response = await upload(release.id, tooBig, 'huge.png');

    expect(response.status).toBe(413);
    expect(response.body.error.code).toBe('payload_too_large');
  });

  it('lets only admin and receiving upload, and answers 404 for an unknown release or attachment', async () => {
    const { release } = await makeRelease('shipped', [{ partNumber: 'BRUSH-20', qty: 1 }]);

    const asViewer = await upload(release.id, PNG, 'slip.png', 'viewer');
    const toUnknown = await upload(876_543, PNG, 'slip.png');
    const unknownFile = await request(context.app)
      .get('/api/dock/attachments/765432')
      .set(bearer(context.tokens.viewer));

    expect(asViewer.status).toBe(403);
    expect(toUnknown.status).toBe(404);
    expect(unknownFile.status).toBe(404);
  });
});

describe('dock events', () => {
  let server: Server;

  beforeAll(() => {
    server = context.app.listen(0);
  });
  afterAll(() => {
    server.close();
  });

  it('sends a dock event with a higher version after a card moves', async () => {
    const { release } = await makeRelease('sent', [{ partNumber: 'BRUSH-20', qty: 1 }]);
    const events = await openEventStream(server, bearer(context.tokens.viewer));
    const first = await events.next<{ version: number }>('dock');

    await move(`expected-${release.id}-${today}`, 'at_dock');
    const second = await events.nextPast('dock', first.version);

    expect(second.version).toBeGreaterThan(first.version);
    events.close();
  });
});
