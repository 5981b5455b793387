import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ReceiptEntity } from '../../server/dock/receipt.entity';
import { KanbanCardEntity } from '../../server/loops/kanban-card.entity';
import { KanbanLoopEntity } from '../../server/loops/kanban-loop.entity';
import { SupplierEntity } from '../../server/master-data/supplier.entity';
import { PartEntity } from '../../server/master-data/part.entity';
import { plantToday } from '../../server/planning/plan-dates';
import { ReleaseLineEntity } from '../../server/releases/release-line.entity';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { addCalendarDays } from '../../shared/domain/date';
import { cardNumber } from '../../shared/domain/gs1';
import { bearer, createTestContext, testPart, writeTestRelease, type TestContext } from './helpers';

let context: TestContext;
let releaseCounter = 0;
let keyCounter = 0;

interface LineSpec {
  partNumber: string;
  qty: number;
  needDate: string;
  cardId?: number | null;
}

/** A release as the release job and the supplier would leave it, on the dock board's expected column. */
async function makeRelease(
  lines: LineSpec[],
  options: { status?: string; supplierCode?: string } = {},
): Promise<{ release: ReleaseEntity; lines: ReleaseLineEntity[] }> {
  releaseCounter += 1;
  return writeTestRelease(
    context,
    {
      number: `R-OVER-${releaseCounter}`,
      releaseDate: lines[0].needDate,
      status: options.status ?? 'sent',
      supplierCode: options.supplierCode,
      reference: `test-${releaseCounter}`,
      dockColumn: 'expected',
    },
    lines.map((line) => ({ ...line, requestedQty: line.qty, requestedDate: line.needDate })),
  );
}

const freshKey = () => `over-key-${(keyCounter += 1)}`;

function receive(body: object, key: string = freshKey()) {
  return request(context.app)
    .post('/api/receipts')
    .set(bearer(context.tokens.receiving))
    .set('Idempotency-Key', key)
    .send(body);
}

async function setTolerance(code: string, overTolerancePct: number): Promise<void> {
  await context.dataSource.getRepository(SupplierEntity).update({ code }, { overTolerancePct });
}

const onHandOf = async (partNumber: string) =>
  (await context.dataSource.getRepository(PartEntity).findOneByOrFail({ partNumber })).onHand;
const lineOf = (id: number) => context.dataSource.getRepository(ReleaseLineEntity).findOneByOrFail({ id });
const statusOf = async (id: number) =>
  (await context.dataSource.getRepository(ReleaseEntity).findOneByOrFail({ id })).status;
const receiptCount = (releaseLineId: number) =>
  context.dataSource.getRepository(ReceiptEntity).countBy({ releaseLineId });

/** What the plan counts as still coming for a part: open lines' ordered less received. */
async function openSupplyOf(partNumber: string): Promise<number> {
  const lines = await context.dataSource.getRepository(ReleaseLineEntity).findBy({ partNumber, closed: false });
  return lines.reduce((sum, line) => sum + (line.confirmedQty ?? line.qty) - line.receivedQty, 0);
}

beforeAll(async () => {
  context = await createTestContext();
  await context.dataSource.transaction((manager) =>
    savePartsWithStock(manager, [
      testPart('HOSE-12', { onHand: 5 }),
      testPart('CLAMP-40', { onHand: 0 }),
      testPart('VALVE-3', { onHand: 2 }),
      testPart('SEAL-8', { onHand: 0 }),
      testPart('BOLT-M8', { onHand: 0 }),
      testPart('NUT-M8', { onHand: 0 }),
      testPart('GASKET-2', { onHand: 0, supplierCode: 'SUP-B' }),
    ]),
  );
});
afterAll(() => context.close());

describe('POST /api/receipts over the supplier’s tolerance', () => {
  it('keeps the excess and applies it to the later open lines of the part, first due first', async () => {
    await setTolerance('SUP-A', 0);
    const loop = await context.dataSource
      .getRepository(KanbanLoopEntity)
      .save({ partNumber: 'HOSE-12', kind: 'supplier', containerQty: 10 });
    const card = await context.dataSource.getRepository(KanbanCardEntity).save({
      loopId: loop.id,
      cardIndex: 1,
      cardNumber: cardNumber(loop.id, 1),
      state: 'ordered',
      stateChangedAt: '2026-11-30T08:00:00.000Z',
      retiredAt: null,
      releaseLineId: null,
    });
    const first = await makeRelease([{ partNumber: 'HOSE-12', qty: 12, needDate: '2026-12-07' }]);
    // Created before the other, due after it: the order is the due date, not the release.
    const dueLast = await makeRelease([{ partNumber: 'HOSE-12', qty: 12, needDate: '2026-12-14' }]);
    const dueNext = await makeRelease([{ partNumber: 'HOSE-12', qty: 10, needDate: '2026-12-09', cardId: card.id }], {
      status: 'confirmed',
    });
    // Neither another supplier's line of the part nor a draft the supplier was never sent takes any.
    const otherSupplier = await makeRelease([{ partNumber: 'HOSE-12', qty: 50, needDate: '2026-12-08' }], {
      supplierCode: 'SUP-B',
    });
    const draft = await makeRelease([{ partNumber: 'HOSE-12', qty: 50, needDate: '2026-12-08' }], {
      status: 'draft',
    });
    // The other supplier's and the draft's 100 stay out of it.
    const supplyBefore = (await onHandOf('HOSE-12')) + (await openSupplyOf('HOSE-12')) - 100;

    const response = await receive({ releaseLineId: first.lines[0].id, qty: 30, overAction: 'keep' });

    // 30 counted on a line of 12: 18 above it; 10 close the line due 9 Dec, 8 go to the one due 14 Dec.
    expect(response.status).toBe(201);
    expect(response.body.receipt).toMatchObject({
      qty: 30,
      discrepancy: 'over',
      overAction: 'keep',
      excessQty: 18,
      returnedQty: 0,
      addedToOnHand: 30,
    });
    expect(response.body.receipt.appliedTo).toEqual([
      {
        releaseLineId: dueNext.lines[0].id,
        releaseNumber: dueNext.release.number,
        due: '2026-12-09',
        qty: 10,
        closed: true,
      },
      {
        releaseLineId: dueLast.lines[0].id,
        releaseNumber: dueLast.release.number,
        due: '2026-12-14',
        qty: 8,
        closed: false,
      },
    ]);
    expect(await onHandOf('HOSE-12')).toBe(35);
    expect(await lineOf(first.lines[0].id)).toMatchObject({ receivedQty: 12, closed: true });
    expect(await lineOf(dueNext.lines[0].id)).toMatchObject({ receivedQty: 10, closed: true });
    expect(await lineOf(dueLast.lines[0].id)).toMatchObject({ receivedQty: 8, closed: false });
    expect(await lineOf(otherSupplier.lines[0].id)).toMatchObject({ receivedQty: 0, closed: false });
    expect(await lineOf(draft.lines[0].id)).toMatchObject({ receivedQty: 0, closed: false });
    expect([
      await statusOf(first.release.id),
      await statusOf(dueNext.release.id),
      await statusOf(dueLast.release.id),
    ]).toEqual(['received', 'received', 'partial']);
    // The card behind the closed line is full again, not stranded on order.
    expect((await context.dataSource.getRepository(KanbanCardEntity).findOneByOrFail({ id: card.id })).state).toBe(
      'full',
    );
    // Conservation (arithmetic): all 30 were on order (12 + 10 + 8), so on hand plus still to come
    // is what it was: the excess moved from open lines into stock and is counted once, not twice.
    expect((await onHandOf('HOSE-12')) + (await openSupplyOf('HOSE-12')) - 100).toBe(supplyBefore);
  });

  it('keeps on the received line what no open line can take', async () => {
    await setTolerance('SUP-A', 0);
    const only = await makeRelease([{ partNumber: 'NUT-M8', qty: 10, needDate: '2026-12-07' }]);
    const later = await makeRelease([{ partNumber: 'NUT-M8', qty: 5, needDate: '2026-12-10' }]);

    const response = await receive({ releaseLineId: only.lines[0].id, qty: 25, overAction: 'keep' });

    expect(response.status).toBe(201);
    expect(response.body.receipt.appliedTo.map((share: { qty: number }) => share.qty)).toEqual([5]);
    expect(await lineOf(only.lines[0].id)).toMatchObject({ receivedQty: 20, closed: true });
    expect(await lineOf(later.lines[0].id)).toMatchObject({ receivedQty: 5, closed: true });
    expect(await onHandOf('NUT-M8')).toBe(25);
  });

  it('returns the excess to the supplier as a return movement and closes the line at its ordered quantity', async () => {
    await setTolerance('SUP-A', 0);
    const { release, lines } = await makeRelease([{ partNumber: 'CLAMP-40', qty: 12, needDate: '2026-12-07' }]);
    const later = await makeRelease([{ partNumber: 'CLAMP-40', qty: 12, needDate: '2026-12-10' }]);

    const response = await receive({ releaseLineId: lines[0].id, qty: 60, overAction: 'return', note: 'Five boxes' });

    expect(response.status).toBe(201);
    expect(response.body.receipt).toMatchObject({
      discrepancy: 'over',
      overAction: 'return',
      excessQty: 48,
      returnedQty: 48,
      addedToOnHand: 12,
      appliedTo: [],
      onHandAfter: 12,
    });
    expect(response.body.onHand).toBe(12);
    expect(await onHandOf('CLAMP-40')).toBe(12);
    const ledger = await request(context.app).get('/api/stock/CLAMP-40/movements').set(bearer(context.tokens.buyer));
    expect(ledger.body.movements.slice(-2)).toMatchObject([
      { kind: 'receipt', qty: 60, balance: 60, refType: 'release', ref: release.number },
      { kind: 'return', qty: -48, balance: 12, refType: 'receipt', ref: String(response.body.receipt.id) },
    ]);
    expect(await lineOf(lines[0].id)).toMatchObject({ receivedQty: 12, closed: true });
    expect(await lineOf(later.lines[0].id)).toMatchObject({ receivedQty: 0, closed: false });
    expect(await statusOf(release.id)).toBe('received');
  });

  it('receives a count within the tolerance as it is, with no choice asked', async () => {
    await setTolerance('SUP-A', 10);
    const { lines } = await makeRelease([{ partNumber: 'VALVE-3', qty: 20, needDate: '2026-12-07' }]);
    const later = await makeRelease([{ partNumber: 'VALVE-3', qty: 20, needDate: '2026-12-10' }]);

    // 10 % over 20 allows 22 in all.
    const response = await receive({ releaseLineId: lines[0].id, qty: 22 });
    const withChoice = await receive({ releaseLineId: later.lines[0].id, qty: 21, overAction: 'keep' });

    expect(response.status).toBe(201);
    expect(response.body.receipt).toMatchObject({
      discrepancy: null,
      overAction: null,
      excessQty: 0,
      addedToOnHand: 22,
    });
    expect(await lineOf(lines[0].id)).toMatchObject({ receivedQty: 22, closed: true });
    expect(withChoice.status).toBe(422);
    expect(withChoice.body.error.details[0].path).toEqual(['overAction']);
    expect(await lineOf(later.lines[0].id)).toMatchObject({ receivedQty: 0, closed: false });
    expect(await onHandOf('VALVE-3')).toBe(24);
  });

  it('answers 422 naming overAction for a count above the tolerance without a choice, and writes nothing', async () => {
    await setTolerance('SUP-A', 10);
    const { lines } = await makeRelease([{ partNumber: 'SEAL-8', qty: 20, needDate: '2026-12-07' }]);
    await receive({ releaseLineId: lines[0].id, qty: 15, discrepancy: 'short' });

    // 15 received and 8 more is 23 in all, above the 22 allowed.
    const response = await receive({ releaseLineId: lines[0].id, qty: 8 });
    const shortToo = await receive({ releaseLineId: lines[0].id, qty: 8, discrepancy: 'short', overAction: 'keep' });

    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('over_choice_needed');
    expect(response.body.error.details[0].path).toEqual(['overAction']);
    expect(response.body.error.message).toContain('keep or return');
    expect(shortToo.status).toBe(422);
    expect(shortToo.body.error.details[0].path).toEqual(['discrepancy']);
    expect(await onHandOf('SEAL-8')).toBe(15);
    expect(await receiptCount(lines[0].id)).toBe(1);
    expect(await lineOf(lines[0].id)).toMatchObject({ receivedQty: 15, closed: false });
  });

  it('tells beforehand what a count would do, and the receipt then does just that', async () => {
    await setTolerance('SUP-A', 0);
    const { lines } = await makeRelease([{ partNumber: 'BOLT-M8', qty: 10, needDate: '2026-12-07' }]);
    const later = await makeRelease([{ partNumber: 'BOLT-M8', qty: 6, needDate: '2026-12-11' }]);

    const within = await request(context.app)
      .get('/api/receipts/over-check')
      .query({ releaseLineId: lines[0].id, qty: 10 })
      .set(bearer(context.tokens.receiving));
    const check = await request(context.app)
      .get('/api/receipts/over-check')
      .query({ releaseLineId: lines[0].id, qty: 14 })
      .set(bearer(context.tokens.receiving));
    const recorded = await receive({ releaseLineId: lines[0].id, qty: 14, overAction: 'keep' });

    expect(within.body).toMatchObject({ over: false, excessQty: 0, limitQty: 10 });
    expect(check.status).toBe(200);
    expect(check.body).toMatchObject({ orderedQty: 10, receivedQty: 0, overTolerancePct: 0, over: true, excessQty: 4 });
    expect(check.body.keep).toEqual({
      appliedTo: [
        {
          releaseLineId: later.lines[0].id,
          releaseNumber: later.release.number,
          due: '2026-12-11',
          qty: 4,
          closes: false,
        },
      ],
      unallocatedQty: 0,
    });
    expect(recorded.body.receipt.appliedTo).toEqual([
      {
        releaseLineId: later.lines[0].id,
        releaseNumber: later.release.number,
        due: '2026-12-11',
        qty: 4,
        closed: false,
      },
    ]);
  });
});

describe('POST /api/receipts over the tolerance, exactly once', () => {
  it('applies the excess once when the same request races itself with one key', async () => {
    await setTolerance('SUP-A', 0);
    await context.dataSource.transaction((manager) => savePartsWithStock(manager, [testPart('PIN-6', { onHand: 0 })]));
    const { lines } = await makeRelease([{ partNumber: 'PIN-6', qty: 10, needDate: '2026-12-07' }]);
    const later = await makeRelease([{ partNumber: 'PIN-6', qty: 30, needDate: '2026-12-10' }]);
    const key = freshKey();
    const body = { releaseLineId: lines[0].id, qty: 25, overAction: 'keep' };

    const [a, b] = await Promise.all([receive(body, key), receive(body, key)]);

    expect([a.status, b.status].sort()).toEqual([200, 201]);
    expect(a.body).toEqual(b.body);
    expect(await lineOf(later.lines[0].id)).toMatchObject({ receivedQty: 15, closed: false });
    expect(await onHandOf('PIN-6')).toBe(25);
    expect(await receiptCount(lines[0].id)).toBe(1);
  });

  it('applies the excess once when two keys race for the same line', async () => {
    await setTolerance('SUP-A', 0);
    await context.dataSource.transaction((manager) => savePartsWithStock(manager, [testPart('PIN-7', { onHand: 0 })]));
    const { lines } = await makeRelease([{ partNumber: 'PIN-7', qty: 10, needDate: '2026-12-07' }]);
    const later = await makeRelease([{ partNumber: 'PIN-7', qty: 30, needDate: '2026-12-10' }]);
    const body = { releaseLineId: lines[0].id, qty: 25, overAction: 'keep' };

    const [a, b] = await Promise.all([receive(body), receive(body)]);

    // The second finds the line closed by the first.
    expect([a.status, b.status].sort()).toEqual([201, 409]);
    expect(await lineOf(later.lines[0].id)).toMatchObject({ receivedQty: 15, closed: false });
    expect(await onHandOf('PIN-7')).toBe(25);
  });

  it('never lets two over receipts of the part fill the same later line twice', async () => {
    await setTolerance('SUP-A', 0);
    await context.dataSource.transaction((manager) => savePartsWithStock(manager, [testPart('PIN-8', { onHand: 0 })]));
    const one = await makeRelease([{ partNumber: 'PIN-8', qty: 12, needDate: '2026-12-07' }]);
    const two = await makeRelease([{ partNumber: 'PIN-8', qty: 12, needDate: '2026-12-07' }]);
    const later = await makeRelease([{ partNumber: 'PIN-8', qty: 10, needDate: '2026-12-10' }]);

    const [a, b] = await Promise.all([
      receive({ releaseLineId: one.lines[0].id, qty: 20, overAction: 'keep' }),
      receive({ releaseLineId: two.lines[0].id, qty: 20, overAction: 'keep' }),
    ]);

    // Whichever comes second finds the other's line part-filled by the first's excess (it is open
    // and due no later), and the later line can take only its 10: nothing is applied twice.
    expect([a.status, b.status]).toEqual([201, 201]);
    const shares = [...a.body.receipt.appliedTo, ...b.body.receipt.appliedTo] as {
      releaseLineId: number;
      qty: number;
    }[];
    const sharedTo = (id: number) =>
      shares.filter((share) => share.releaseLineId === id).reduce((sum, share) => sum + share.qty, 0);
    expect(sharedTo(later.lines[0].id)).toBe(10);
    expect(await lineOf(later.lines[0].id)).toMatchObject({ receivedQty: 10, closed: true });
    const received = await Promise.all(
      [one, two, later].map(async ({ lines }) => (await lineOf(lines[0].id)).receivedQty),
    );
    expect(received.reduce((sum, qty) => sum + qty, 0)).toBe(40);
    expect(await onHandOf('PIN-8')).toBe(40);
  });
});

describe('over receipts in claims and the scorecard', () => {
  it('lists an over receipt as a claim of kind over, with what the dock did', async () => {
    await setTolerance('SUP-A', 0);
    await context.dataSource.transaction((manager) => savePartsWithStock(manager, [testPart('PIN-9', { onHand: 0 })]));
    const { release, lines } = await makeRelease([{ partNumber: 'PIN-9', qty: 4, needDate: '2026-12-07' }]);
    const recorded = await receive({ releaseLineId: lines[0].id, qty: 9, overAction: 'return' });

    const claims = await request(context.app).get('/api/suppliers/SUP-A/claims').set(bearer(context.tokens.supplier));

    expect(claims.status).toBe(200);
    expect(
      claims.body.find((claim: { receiptId: number }) => claim.receiptId === recorded.body.receipt.id),
    ).toMatchObject({
      releaseNumber: release.number,
      partNumber: 'PIN-9',
      lineQty: 4,
      qty: 9,
      discrepancy: 'over',
      overAction: 'return',
      excessQty: 5,
    });
  });

  it('measures fill against the quantity first asked for, with kept excess filling the later line it went to', async () => {
    // Fill rate = Σ min(delivered, requested) ÷ Σ requested, per line (Chopra & Meindl, Supply
    // Chain Management, 6th ed., ch. 3 — from memory). Asked 12 and 12; 24 came on the first line,
    // 12 of them kept for the second: each line got its 12, so 24 ÷ 24 = 1, not 24 ÷ 12 on one and 0 on the other.
    await setTolerance('SUP-B', 0);
    const today = plantToday();
    const firstDay = addCalendarDays(today, -20);
    const secondDay = addCalendarDays(today, -15);
    const first = await makeRelease([{ partNumber: 'GASKET-2', qty: 12, needDate: firstDay }], {
      supplierCode: 'SUP-B',
    });
    const second = await makeRelease([{ partNumber: 'GASKET-2', qty: 12, needDate: secondDay }], {
      supplierCode: 'SUP-B',
    });
    await receive({ releaseLineId: first.lines[0].id, qty: 24, overAction: 'keep' });

    const scorecard = await request(context.app)
      .get('/api/suppliers/performance')
      .query({ supplier: 'SUP-B', from: firstDay.slice(0, 7), to: today.slice(0, 7) })
      .set(bearer(context.tokens.buyer));

    expect(await lineOf(second.lines[0].id)).toMatchObject({ receivedQty: 12, closed: true });
    const rows = scorecard.body as { requestedQty: number; filledQty: number }[];
    const requested = rows.reduce((sum, row) => sum + row.requestedQty, 0);
    const filled = rows.reduce((sum, row) => sum + row.filledQty, 0);
    expect([requested, filled]).toEqual([24, 24]);
  });
});
