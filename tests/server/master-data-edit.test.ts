import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEventEntity } from '../../server/audit/audit-event.entity';
import { syncLoops } from '../../server/loops/loop-sync';
import { replaceBomLines } from '../../server/master-data/master-data.writer';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';

let context: TestContext;

const line = (parent: string, component: string, qtyPer: number, scrapPct = 0) => ({
  parent,
  component,
  qtyPer,
  scrapPct,
  effectiveFrom: null,
  effectiveTo: null,
});

beforeAll(async () => {
  context = await createTestContext();
  await context.db.write(async (manager) => {
    await savePartsWithStock(manager, [
      testPart('MODEL', { source: 'end_item', supplierCode: null, replenishment: null }),
      testPart('FRAME', { source: 'make', supplierCode: null, replenishment: null }),
      testPart('TUBE', { uom: 'MTR', onHand: 12 }),
      testPart('BOLT'),
      testPart('NUT'),
      testPart('SPARE'),
    ]);
    await replaceBomLines(manager, [
      line('MODEL', 'FRAME', 2, 10),
      line('MODEL', 'BOLT', 4),
      line('FRAME', 'TUBE', 3, 5),
      line('FRAME', 'BOLT', 6),
    ]);
    await syncLoops(manager);
  });
});
afterAll(() => context.close());

const api = () => request(context.app);

async function lastAudit(entity: string, entityKey: string) {
  const events = await context.dataSource
    .getRepository(AuditEventEntity)
    .find({ where: { entity, entityKey }, order: { id: 'DESC' }, take: 1 });
  return events[0];
}

describe('GET /api/parts/:partNumber', () => {
  it('answers the part with its low-level code, supplier name and loop', async () => {
    const response = await api().get('/api/parts/BOLT').set(bearer(context.tokens.viewer));

    expect(response.status).toBe(200);
    // BOLT is used on MODEL (level 1) and FRAME (level 2): its low-level code is the deepest, 2
    // (Orlicky's MRP, low-level coding; from memory).
    expect(response.body).toMatchObject({
      part: { partNumber: 'BOLT', supplierCode: 'SUP-A' },
      lowLevelCode: 2,
      supplierName: 'Supplier A',
      loop: { containerQty: 1 },
    });
  });

  it('answers 404 for an unknown part and 403 to a supplier account', async () => {
    expect((await api().get('/api/parts/NOPE').set(bearer(context.tokens.buyer))).status).toBe(404);
    expect((await api().get('/api/parts/BOLT').set(bearer(context.tokens.supplier))).status).toBe(403);
  });
});

describe('PUT /api/parts/:partNumber', () => {
  it('changes the lead time and records from → to in the audit trail', async () => {
    const response = await api().put('/api/parts/NUT').set(bearer(context.tokens.buyer)).send({ leadTimeDays: 7 });

    expect(response.status).toBe(200);
    expect(response.body.part.leadTimeDays).toBe(7);
    const event = await lastAudit('part', 'NUT');
    expect(event).toMatchObject({
      actorEmail: 'buyer@example.com',
      action: 'update',
      changes: { before: { leadTimeDays: 0 }, after: { leadTimeDays: 7 } },
    });
  });

  it('creates a new part with 201 and never sets its stock from the form', async () => {
    const response = await api()
      .put('/api/parts/WASHER')
      .set(bearer(context.tokens.admin))
      .send({ ...testPart('WASHER'), onHand: 500 });

    expect(response.status).toBe(201);
    expect(response.body.part.onHand).toBe(0);
  });

  it('refuses what the parts import refuses, naming the field in the import’s words, and changes nothing', async () => {
    const response = await api()
      .put('/api/parts/NUT')
      .set(bearer(context.tokens.buyer))
      .send({ leadTimeDays: 2.5, uom: 'XYZ', packQty: 0 });

    expect(response.status).toBe(400);
    expect(response.body.error.details).toEqual(
      expect.arrayContaining([
        { path: ['leadTimeDays'], message: '2.5 is not a whole number' },
        { path: ['uom'], message: "'XYZ' is not one of H87, KGM, MTR, LTR, MTK, SET, PR" },
        { path: ['packQty'], message: 'must be greater than 0' },
      ]),
    );
    const nut = await api().get('/api/parts/NUT').set(bearer(context.tokens.buyer));
    expect(nut.body.part.leadTimeDays).toBe(7);
  });

  it('keeps safety data, and refuses a UN number or data-sheet link the parts import would refuse', async () => {
    const saved = await api()
      .put('/api/parts/NUT')
      .set(bearer(context.tokens.buyer))
      .send({ hazardous: true, unNumber: 'UN2800', hazardClass: '8', unitWeightKg: 31, heavyLift: true });
    const bad = await api()
      .put('/api/parts/NUT')
      .set(bearer(context.tokens.buyer))
      .send({ unNumber: '28', sdsUrl: 'file:///sheet.pdf' });

    expect(saved.status).toBe(200);
    expect(saved.body.part).toMatchObject({ unNumber: '2800', hazardClass: '8', unitWeightKg: 31, heavyLift: true });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details).toEqual([
      { path: ['unNumber'], message: "'28': four digits, e.g. 2794" },
      { path: ['sdsUrl'], message: "'file:///sheet.pdf': a web link (http or https)" },
    ]);
  });

  it('refuses an unknown supplier and a bought part without one', async () => {
    const unknown = await api().put('/api/parts/NUT').set(bearer(context.tokens.buyer)).send({ supplierCode: 'SUP-Z' });
    const none = await api().put('/api/parts/NUT').set(bearer(context.tokens.buyer)).send({ supplierCode: null });

    expect(unknown.status).toBe(400);
    expect(unknown.body.error.details).toEqual([{ path: ['supplierCode'], message: "unknown supplier 'SUP-Z'" }]);
    expect(none.status).toBe(400);
    expect(none.body.error.details).toEqual([{ path: ['supplierCode'], message: 'a bought part needs a supplier' }]);
  });

  it('lets only buyers and admins change master data', async () => {
    for (const role of ['planner', 'receiving', 'line', 'viewer', 'supplier'] as const) {
      const response = await api().put('/api/parts/NUT').set(bearer(context.tokens[role])).send({ leadTimeDays: 1 });
      expect(response.status, role).toBe(403);
    }
  });
});

describe('DELETE /api/parts/:partNumber', () => {
  it('refuses a part in use with every reason', async () => {
    const response = await api().delete('/api/parts/TUBE').set(bearer(context.tokens.buyer));

    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('in_use');
    expect(response.body.error.message).toContain('component on 1 BOM line(s)');
    expect(response.body.error.message).toContain('stock movement');
  });

  it('deletes a part nothing refers to, and records it', async () => {
    const response = await api().delete('/api/parts/SPARE').set(bearer(context.tokens.buyer));

    expect(response.status).toBe(204);
    expect((await api().get('/api/parts/SPARE').set(bearer(context.tokens.buyer))).status).toBe(404);
    expect(await lastAudit('part', 'SPARE')).toMatchObject({ action: 'delete' });
  });
});

describe('GET/PUT /api/suppliers/:code', () => {
  it('reads and changes a supplier, auditing from → to', async () => {
    const before = await api().get('/api/suppliers/SUP-B').set(bearer(context.tokens.viewer));
    const response = await api()
      .put('/api/suppliers/SUP-B')
      .set(bearer(context.tokens.buyer))
      .send({ ...before.body, leadTimeDays: 4 });

    expect(before.body).toMatchObject({ code: 'SUP-B', leadTimeDays: 5 });
    expect(response.status).toBe(200);
    expect(response.body.leadTimeDays).toBe(4);
    expect(await lastAudit('supplier', 'SUP-B')).toMatchObject({
      changes: { before: { leadTimeDays: 5 }, after: { leadTimeDays: 4 } },
    });
  });

  it('refuses a lead time its stated delivery cycle cannot bring, naming the delay', async () => {
    // SUP-B's cycle 5-2-2 brings goods 5 working days after a card leaves: an 8-day lead time contradicts it.
    const before = await api().get('/api/suppliers/SUP-B').set(bearer(context.tokens.buyer));
    const response = await api()
      .put('/api/suppliers/SUP-B')
      .set(bearer(context.tokens.buyer))
      .send({ ...before.body, leadTimeDays: 8 });

    expect(response.status).toBe(400);
    expect(response.body.error.details).toEqual([
      expect.objectContaining({ path: ['deliveryDelay'], message: expect.stringContaining('at least 4 deliveries') }),
    ]);
  });

  it('refuses a bad e-mail and a missing name of a new supplier, naming each field', async () => {
    const response = await api()
      .put('/api/suppliers/SUP-C')
      .set(bearer(context.tokens.buyer))
      .send({ email: 'not-mail', leadTimeDays: 1, cycleDays: 1, deliveriesPerCycle: 1, deliveryDelay: 1 });

    expect(response.status).toBe(400);
    expect(response.body.error.details).toEqual(
      expect.arrayContaining([
        { path: ['name'], message: 'is required' },
        { path: ['email'], message: "'not-mail' is not an e-mail address" },
      ]),
    );
    expect((await api().get('/api/suppliers/SUP-C').set(bearer(context.tokens.buyer))).status).toBe(404);
  });

  it('answers 403 to a viewer and 404 for an unknown supplier', async () => {
    expect((await api().put('/api/suppliers/SUP-B').set(bearer(context.tokens.viewer)).send({})).status).toBe(403);
    expect((await api().get('/api/suppliers/SUP-Q').set(bearer(context.tokens.viewer))).status).toBe(404);
  });
});

describe('GET /api/bom/:parent', () => {
  it('explodes every level with the scrap allowance compounding down the tree', async () => {
    const response = await api().get('/api/bom/MODEL').set(bearer(context.tokens.viewer));

    expect(response.status).toBe(200);
    const frame = response.body.lines.find((node: { component: string }) => node.component === 'FRAME');
    const tube = frame.children.find((node: { component: string }) => node.component === 'TUBE');
    // Scrap allowance is added to the quantity per, qty × (1 + s), and multiplies down the levels:
    // 2 × 1.10 × 3 × 1.05 = 6.93 m of tube per model (APICS Dictionary, "scrap factor"; from memory).
    expect(frame).toMatchObject({ level: 1, qtyPer: 2, scrapPct: 10, lowLevelCode: 1 });
    expect(frame.extendedQty).toBeCloseTo(2.2, 10);
    expect(tube).toMatchObject({ level: 2, uom: 'MTR', lowLevelCode: 2 });
    expect(tube.extendedQty).toBeCloseTo(6.93, 10);
  });

  it('answers 400 naming the date when it is not a date', async () => {
    const response = await api().get('/api/bom/MODEL').query({ date: '2026-02-30' }).set(bearer(context.tokens.viewer));

    expect(response.status).toBe(400);
    expect(response.body.error.details[0].path).toEqual(['date']);
  });
});

describe('engineering changes and BOM edits', () => {
  it('ends the old line the day before and starts the replacement, visible by date', async () => {
    const change = await api()
      .post('/api/bom/FRAME/engineering-changes')
      .set(bearer(context.tokens.buyer))
      .send({ component: 'BOLT', replacement: 'NUT', qtyPer: 6, scrapPct: 0, effectiveFrom: '2027-03-01' });

    expect(change.status).toBe(201);
    const before = await api().get('/api/bom/FRAME').query({ date: '2027-02-28' }).set(bearer(context.tokens.viewer));
    const after = await api().get('/api/bom/FRAME').query({ date: '2027-03-01' }).set(bearer(context.tokens.viewer));
    const components = (body: { lines: { component: string }[] }) => body.lines.map((node) => node.component).sort();
    expect(components(before.body)).toEqual(['BOLT', 'TUBE']);
    expect(components(after.body)).toEqual(['NUT', 'TUBE']);
    expect(await lastAudit('bom', 'FRAME')).toMatchObject({
      action: 'engineering-change',
      changes: { change: { component: 'BOLT', replacement: 'NUT', effectiveFrom: '2027-03-01' } },
    });
  });

  it('shows where a part is used, directly and by end item', async () => {
    const response = await api().get('/api/parts/NUT/where-used').set(bearer(context.tokens.viewer));

    expect(response.status).toBe(200);
    expect(response.body.parents).toEqual([
      expect.objectContaining({ parent: 'FRAME', qtyPer: 6, effectiveFrom: '2027-03-01', effectiveTo: null }),
    ]);
    expect(response.body.endItems).toEqual(['MODEL']);
  });

  it('refuses a change that would make a cycle, with the cycle as the reason', async () => {
    const response = await api()
      .put('/api/bom/TUBE')
      .set(bearer(context.tokens.buyer))
      .send({ lines: [{ component: 'MODEL', qtyPer: 1 }] });

    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('bom_cycle');
    expect(response.body.error.message).toContain('TUBE → MODEL → FRAME');
    const tube = await api().get('/api/bom/TUBE').set(bearer(context.tokens.viewer));
    expect(tube.body.lines).toEqual([]);
  });

  it('refuses bad lines naming the line and field in the import’s words', async () => {
    const response = await api()
      .put('/api/bom/MODEL')
      .set(bearer(context.tokens.buyer))
      .send({
        lines: [
          { component: 'FRAME', qtyPer: 0 },
          { component: 'GHOST', qtyPer: 1 },
          { component: 'BOLT', qtyPer: 1, effectiveFrom: '2027-05-01', effectiveTo: '2027-04-01' },
        ],
      });

    expect(response.status).toBe(400);
    expect(response.body.error.details).toEqual([
      { path: ['lines', 0, 'qtyPer'], message: 'must be greater than 0' },
      { path: ['lines', 2, 'effectiveTo'], message: 'effective_to is before effective_from' },
    ]);
  });

  it('refuses overlapping windows and unknown parts, and lets only buyers and admins edit', async () => {
    const overlap = await api()
      .put('/api/bom/MODEL')
      .set(bearer(context.tokens.buyer))
      .send({
        lines: [
          { component: 'BOLT', qtyPer: 1, effectiveTo: '2027-04-01' },
          { component: 'BOLT', qtyPer: 2, effectiveFrom: '2027-04-01' },
          { component: 'GHOST', qtyPer: 1 },
        ],
      });
    const planner = await api().put('/api/bom/MODEL').set(bearer(context.tokens.planner)).send({ lines: [] });

    expect(overlap.status).toBe(400);
    expect(overlap.body.error.details).toEqual([
      { path: ['lines', 2, 'component'], message: "unknown part 'GHOST'" },
      {
        path: ['lines', 1, 'effectiveFrom'],
        message: 'effective dates of MODEL → BOLT overlap line 1 (both ends count)',
      },
    ]);
    expect(planner.status).toBe(403);
  });

  it('refuses an engineering change for a component with no line in effect that day', async () => {
    const response = await api()
      .post('/api/bom/MODEL/engineering-changes')
      .set(bearer(context.tokens.buyer))
      .send({ component: 'TUBE', replacement: 'NUT', qtyPer: 1, scrapPct: 0, effectiveFrom: '2027-03-01' });

    expect(response.status).toBe(400);
    expect(response.body.error.details).toEqual([
      { path: ['component'], message: "no line of 'TUBE' is in effect on 2027-03-01" },
    ]);
  });
});
