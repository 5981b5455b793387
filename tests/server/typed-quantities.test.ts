import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PartEntity } from '../../server/master-data/part.entity';
import { ReceiptEntity } from '../../server/dock/receipt.entity';
import { ReleaseLineEntity } from '../../server/releases/release-line.entity';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { StockMovementEntity } from '../../server/stock/stock-movement.entity';
import { ShipNoticeEntity } from '../../server/ship-notices/ship-notice.entity';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { bearer, createTestContext, testPart, writeTestRelease, type TestContext } from './helpers';

/*
 * Parts counted in pieces, sets or pairs (UN/ECE Recommendation 20 codes H87, SET, PR) take whole
 * numbers only; kilograms keep their decimals. Every refusal names the field and changes nothing.
 */

let context: TestContext;
let releaseDay = 0;

beforeAll(async () => {
  context = await createTestContext();
  await context.dataSource.transaction((manager) =>
    savePartsWithStock(manager, [
      testPart('SPOKE', { onHand: 400, replenishment: 'scheduled' }),
      testPart('GLOVES', { uom: 'PR', onHand: 20, replenishment: 'scheduled' }),
      testPart('RESIN', { uom: 'KGM', onHand: 12.5, replenishment: 'scheduled' }),
    ]),
  );
});
afterAll(() => context.close());

const onHandOf = async (partNumber: string) =>
  (await context.dataSource.getRepository(PartEntity).findOneByOrFail({ partNumber })).onHand;
const movementCount = (partNumber: string) =>
  context.dataSource.getRepository(StockMovementEntity).countBy({ partNumber });

/** A release of SUP-A (sent unless said) with one line per part, written straight to the tables. */
async function sentRelease(parts: { partNumber: string; qty: number }[], status = 'sent') {
  releaseDay += 1;
  const releaseDate = `2026-10-${String(releaseDay).padStart(2, '0')}`;
  return writeTestRelease(context, { number: `R-QTY-${releaseDay}`, releaseDate, status }, parts);
}

describe('POST /api/stock/counts', () => {
  it('refuses a fraction of a piece with the field named and leaves on-hand and the ledger alone', async () => {
    const movementsBefore = await movementCount('SPOKE');

    const response = await request(context.app)
      .post('/api/stock/counts')
      .set(bearer(context.tokens.buyer))
      .send({ partNumber: 'SPOKE', counted: 399.5 });

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([{ path: ['counted'], message: 'Must be a whole number of pcs' }]);
    expect(await onHandOf('SPOKE')).toBe(400);
    expect(await movementCount('SPOKE')).toBe(movementsBefore);
  });

  it('refuses half a pair, and refuses a negative count before any rule of the part', async () => {
    const halfPair = await request(context.app)
      .post('/api/stock/counts')
      .set(bearer(context.tokens.buyer))
      .send({ partNumber: 'GLOVES', counted: 19.5 });
    const negative = await request(context.app)
      .post('/api/stock/counts')
      .set(bearer(context.tokens.buyer))
      .send({ partNumber: 'SPOKE', counted: -3 });

    expect(halfPair.status).toBe(422);
    expect(halfPair.body.error.details[0].path).toEqual(['counted']);
    expect(negative.status).toBe(400);
    expect(negative.body.error.details[0].path).toEqual(['counted']);
    expect(await onHandOf('GLOVES')).toBe(20);
    expect(await onHandOf('SPOKE')).toBe(400);
  });

  it('keeps the decimals of a part counted in kilograms', async () => {
    const response = await request(context.app)
      .post('/api/stock/counts')
      .set(bearer(context.tokens.buyer))
      .send({ partNumber: 'RESIN', counted: 11.75 });

    expect(response.status).toBe(201);
    expect(await onHandOf('RESIN')).toBe(11.75);
  });
});

describe('POST /api/stock/scrap', () => {
  it('refuses a fraction of a piece with the field named and changes nothing', async () => {
    const movementsBefore = await movementCount('SPOKE');

    const response = await request(context.app)
      .post('/api/stock/scrap')
      .set(bearer(context.tokens.line))
      .send({ partNumber: 'SPOKE', qty: 1.5, reason: 'Bent at station 2' });

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([{ path: ['qty'], message: 'Must be a whole number of pcs' }]);
    expect(await onHandOf('SPOKE')).toBe(400);
    expect(await movementCount('SPOKE')).toBe(movementsBefore);
  });
});

describe('POST /api/receipts', () => {
  it('refuses a fraction of a piece with the field named: no receipt, line and on-hand as they were', async () => {
    const { lines } = await sentRelease([{ partNumber: 'SPOKE', qty: 100 }]);

    const response = await request(context.app)
      .post('/api/receipts')
      .set(bearer(context.tokens.receiving))
      .set('Idempotency-Key', 'qty-receipt-1')
      .send({ releaseLineId: lines[0].id, qty: 99.5 });

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([{ path: ['qty'], message: 'Must be a whole number of pcs' }]);
    expect(await context.dataSource.getRepository(ReceiptEntity).countBy({ releaseLineId: lines[0].id })).toBe(0);
    expect(
      await context.dataSource.getRepository(ReleaseLineEntity).findOneByOrFail({ id: lines[0].id }),
    ).toMatchObject({ receivedQty: 0, closed: false });
    expect(await onHandOf('SPOKE')).toBe(400);
  });

  it('takes a decimal count of a part received in kilograms', async () => {
    const { lines } = await sentRelease([{ partNumber: 'RESIN', qty: 25 }]);

    const response = await request(context.app)
      .post('/api/receipts')
      .set(bearer(context.tokens.receiving))
      .set('Idempotency-Key', 'qty-receipt-2')
      .send({ releaseLineId: lines[0].id, qty: 24.5, discrepancy: 'short' });

    expect(response.status).toBe(201);
    // 11.75 counted above + 24.5 received.
    expect(await onHandOf('RESIN')).toBe(36.25);
  });
});

describe('POST /api/releases/:number/confirmation', () => {
  it('refuses a fraction of a piece on the line that has it, records nothing and keeps the release open', async () => {
    const { release, lines } = await sentRelease([
      { partNumber: 'RESIN', qty: 50 },
      { partNumber: 'SPOKE', qty: 200 },
    ]);

    const response = await request(context.app)
      .post(`/api/releases/${release.number}/confirmation`)
      .set(bearer(context.tokens.supplier))
      .send({
        lines: [
          { id: lines[0].id, confirmedQty: 49.5, shipDate: '2099-01-05' },
          { id: lines[1].id, confirmedQty: 199.5, shipDate: '2099-01-05' },
        ],
      });

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { path: ['lines', 1, 'confirmedQty'], message: 'Must be a whole number of pcs' },
    ]);
    const saved = await context.dataSource.getRepository(ReleaseLineEntity).findBy({ releaseId: release.id });
    expect(saved.map((line) => line.confirmedQty)).toEqual([null, null]);
    expect((await context.dataSource.getRepository(ReleaseEntity).findOneByOrFail({ id: release.id })).status).toBe(
      'sent',
    );
  });
});

describe('POST /api/releases/:number/ship-notices', () => {
  it('refuses a fraction of a piece on the line that has it and announces nothing', async () => {
    const { release, lines } = await sentRelease(
      [
        { partNumber: 'RESIN', qty: 50 },
        { partNumber: 'GLOVES', qty: 40 },
      ],
      'confirmed',
    );

    const response = await request(context.app)
      .post(`/api/releases/${release.number}/ship-notices`)
      .set(bearer(context.tokens.supplier))
      .set('Idempotency-Key', 'qty-notice-1')
      .send({
        lines: [
          { lineId: lines[0].id, qty: 49.5 },
          { lineId: lines[1].id, qty: 39.5 },
        ],
        carrier: 'Road Freight Co',
        trackingNumber: 'RF-9',
        shipDate: '2099-01-05',
      });

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { path: ['lines', 1, 'qty'], message: `line ${lines[1].id} (GLOVES): must be a whole number of pairs` },
    ]);
    expect(await context.dataSource.getRepository(ShipNoticeEntity).countBy({ releaseId: release.id })).toBe(0);
  });
});
