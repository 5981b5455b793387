import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addCalendarDays } from '../../shared/domain/date';
import { releaseNumber } from '../../shared/domain/release-rules';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { plantToday } from '../../server/planning/plan-dates';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';

let context: TestContext;
const today = plantToday();
const due = addCalendarDays(today, 5);
const csv = (...lines: string[]) => `${lines.join('\n')}\n`;
const HEADER = 'supplier_code,part_number,qty,due_date,reference';

beforeAll(async () => {
  context = await createTestContext();
  await context.db.write(async (manager) => {
    await writeCalendar(manager, { workingWeekdays: [1, 2, 3, 4, 5, 6, 7], holidays: [] });
    await savePartsWithStock(manager, [
      testPart('CASTER', { replenishment: 'scheduled' }),
      testPart('PLATE', { supplierCode: 'SUP-B', replenishment: 'scheduled', uom: 'KGM' }),
      testPart('FRAME', { source: 'make', supplierCode: null, replenishment: null }),
    ]);
  });
});
afterAll(() => context.close());

const upload = (body: string, role: 'buyer' | 'planner' | 'viewer' = 'buyer') =>
  request(context.app)
    .post('/api/imports/open-orders')
    .set(bearer(context.tokens[role]))
    .attach('file', Buffer.from(body), 'open-orders.csv');

const openLines = () =>
  context.dataSource.query(
    `SELECT r.number, r.status, r.reference, l.part_number AS "partNumber", l.qty, l.need_date AS "needDate", l.origin
     FROM release_line l JOIN release r ON r.id = l.release_id ORDER BY r.number, l.part_number`,
  );

describe('POST /api/imports/open-orders', () => {
  const file = csv(HEADER, `SUP-A,CASTER,40,${due},PO-100`, `SUP-B,PLATE,250.5,${due},B-7`);

  it('loads each order as a confirmed release, and loading the file again changes nothing', async () => {
    const first = await upload(file);
    const afterFirst = await openLines();
    const second = await upload(file);

    expect(first.status).toBe(200);
    expect(first.body).toEqual({ imported: 2 });
    expect(second.status).toBe(200);
    expect(afterFirst).toEqual([
      {
        number: 'O-SUP-A-PO-100',
        status: 'confirmed',
        reference: 'PO-100',
        partNumber: 'CASTER',
        qty: 40,
        needDate: due,
        origin: 'open_order',
      },
      {
        number: 'O-SUP-B-B-7',
        status: 'confirmed',
        reference: 'B-7',
        partNumber: 'PLATE',
        qty: 250.5,
        needDate: due,
        origin: 'open_order',
      },
    ]);
    expect(await openLines()).toEqual(afterFirst);
  });

  it('counts an open order as a scheduled receipt on its due date', async () => {
    const response = await request(context.app)
      .get('/api/plan')
      .query({ part: 'CASTER', from: today, to: due })
      .set(bearer(context.tokens.viewer));

    expect(response.status).toBe(200);
    const bucket = response.body.buckets.find((entry: { date: string }) => entry.date === due);
    expect(bucket.scheduledReceipts).toBe(40);
  });

  it('puts the order on the dock, where it can be received once', async () => {
    const dock = await request(context.app).get('/api/dock').set(bearer(context.tokens.receiving));
    const item = dock.body.find((entry: { number: string }) => entry.number === 'O-SUP-A-PO-100');
    const lineId = item.lines[0].id;

    const receipt = await request(context.app)
      .post('/api/receipts')
      .set(bearer(context.tokens.receiving))
      .set('Idempotency-Key', 'open-order-receipt-1')
      .send({ releaseLineId: lineId, qty: 40 });

    expect(receipt.status).toBe(201);
    expect(receipt.body.onHand).toBe(40);
  });

  it('refuses a quantity below what was already received, naming row and column', async () => {
    const response = await upload(csv(HEADER, `SUP-A,CASTER,30,${due},PO-100`));

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 2, column: 'qty', message: '40 already received on this order line' },
    ]);
  });

  it('refuses unknown suppliers and parts, a part of another supplier, a made part and bad cells, writing nothing', async () => {
    const before = await openLines();

    const response = await upload(
      csv(
        HEADER,
        `SUP-Z,CASTER,1,${due},X1`,
        `SUP-A,GHOST,1,${due},X1`,
        `SUP-A,PLATE,1,${due},X1`,
        `SUP-A,FRAME,1,${due},X1`,
        `SUP-A,CASTER,0,2026-02-30,X 1`,
        `SUP-A,CASTER,5,${addCalendarDays(due, 1)},X1`,
      ),
    );

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 2, column: 'supplier_code', message: "unknown supplier 'SUP-Z'" },
      { row: 2, column: 'part_number', message: "part 'CASTER' is bought from SUP-A, not SUP-Z" },
      { row: 3, column: 'part_number', message: "unknown part 'GHOST'" },
      { row: 4, column: 'part_number', message: "part 'PLATE' is bought from SUP-B, not SUP-A" },
      { row: 5, column: 'part_number', message: "part 'FRAME' is not bought" },
      { row: 6, column: 'qty', message: 'must be greater than 0' },
      { row: 6, column: 'due_date', message: "'2026-02-30' is not a real date (YYYY-MM-DD)" },
      { row: 6, column: 'reference', message: "'X 1': letters, digits, . _ / - only" },
    ]);
    expect(await openLines()).toEqual(before);
  });

  it('leaves room for the supplier’s daily release on the day the orders were loaded', async () => {
    const daily = context.dataSource.getRepository(ReleaseEntity).create({
      number: releaseNumber('SUP-A', today),
      supplierCode: 'SUP-A',
      releaseDate: today,
      status: 'draft',
    });

    await expect(context.dataSource.getRepository(ReleaseEntity).save(daily)).resolves.toMatchObject({ reference: '' });
    await expect(
      context.dataSource.getRepository(ReleaseEntity).save({ ...daily, id: undefined, number: `${daily.number}-2` }),
    ).rejects.toThrow(/unique/i);
  });

  it('is for buyers and admins, and has a template', async () => {
    expect((await upload(file, 'planner')).status).toBe(403);
    expect((await upload(file, 'viewer')).status).toBe(403);
    const template = await request(context.app)
      .get('/api/imports/templates/open-orders')
      .set(bearer(context.tokens.buyer));
    expect(template.status).toBe(200);
    expect(template.text.split('\n')[0]).toBe(HEADER);
  });
});
