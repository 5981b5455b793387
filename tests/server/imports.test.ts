import { readFileSync } from 'node:fs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addCalendarDays, isoWeekday, nextWorkingDay } from '../../shared/domain/calendar';
import { IMPORT_LAYOUTS, IMPORT_MAX_BYTES, type ImportKind } from '../../shared/schemas/imports';
import type { Role } from '../../shared/schemas/user';
import { AuditEventEntity } from '../../server/audit/audit-event.entity';
import { BomLineEntity } from '../../server/master-data/bom-line.entity';
import { PartEntity } from '../../server/master-data/part.entity';
import { plantToday } from '../../server/planning/plan-dates';
import { SequenceEntryEntity } from '../../server/sequence/sequence-entry.entity';
import { SupplierEntity } from '../../server/master-data/supplier.entity';
import { bearer, createTestContext, type TestContext } from './helpers';

const csv = (...lines: string[]) => `${lines.join('\n')}\n`;
const PARTS_HEADER = IMPORT_LAYOUTS.parts.columns.join(',');
const WEEKDAYS_ONLY = { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] };

type Entity =
  | typeof SupplierEntity
  | typeof PartEntity
  | typeof BomLineEntity
  | typeof SequenceEntryEntity
  | typeof AuditEventEntity;

function upload(context: TestContext, kind: ImportKind, body: string | Buffer, role: Role = 'buyer') {
  return request(context.app)
    .post(`/api/imports/${kind}`)
    .set(bearer(context.tokens[role]))
    .attach('file', typeof body === 'string' ? Buffer.from(body) : body, `${kind}.csv`);
}

const count = (context: TestContext, entity: Entity) => context.dataSource.getRepository(entity).count();

/** Row counts of every table an import writes, to prove a rejected upload wrote nothing. */
async function snapshot(context: TestContext) {
  return {
    suppliers: await count(context, SupplierEntity),
    parts: await count(context, PartEntity),
    bomLines: await count(context, BomLineEntity),
    sequence: await count(context, SequenceEntryEntity),
    audit: await count(context, AuditEventEntity),
    onHand: (await context.dataSource.getRepository(PartEntity).find({ order: { partNumber: 'ASC' } })).map(
      (part) => part.onHand,
    ),
  };
}

/** Parts the BOM, schedule and on-hand tests build on, written straight to the table. */
async function insertParts(
  context: TestContext,
  parts: { partNumber: string; source: string; supplierCode?: string }[],
) {
  await context.dataSource.getRepository(PartEntity).insert(
    parts.map((part) => ({
      partNumber: part.partNumber,
      description: `Test part ${part.partNumber}`,
      uom: 'H87',
      source: part.source,
      supplierCode: part.supplierCode ?? null,
      leadTimeDays: 1,
      packQty: 1,
      onHand: 0,
      replenishment: null,
      safetyStock: 0,
      pointOfUse: null,
      hazardous: false,
    })),
  );
}

describe('POST /api/imports/suppliers', () => {
  let context: TestContext;
  beforeAll(async () => {
    context = await createTestContext();
  });
  afterAll(() => context.close());

  it('adds new suppliers, updates existing ones by code and leaves an empty delivery cycle to be derived', async () => {
    const file = csv(
      'code,name,email,lead_time_days,cycle_days,deliveries_per_cycle,delivery_delay,transit_days,delivery_weekdays',
      'SUP-A,Supplier A renamed,orders@supplier-a.example.com,4,5,2,2,1,Mon;Thu',
      'SUP-C,Supplier C,orders@supplier-c.example.org,6,,,,,',
    );

    const response = await upload(context, 'suppliers', file);

    expect(response.status).toBe(200);
    expect(response.body).toEqual({ imported: 2 });
    const suppliers = await context.dataSource.getRepository(SupplierEntity).find({ order: { code: 'ASC' } });
    expect(suppliers.map((supplier) => supplier.code)).toEqual(['SUP-A', 'SUP-B', 'SUP-C']);
    expect(suppliers[0]).toMatchObject({
      name: 'Supplier A renamed',
      leadTimeDays: 4,
      cycleDays: 5,
      deliveriesPerCycle: 2,
      deliveryDelay: 2,
      transitDays: 1,
      deliveryWeekdays: [1, 4],
    });
    expect(suppliers[2]).toMatchObject({
      leadTimeDays: 6,
      cycleDays: null,
      deliveriesPerCycle: null,
      deliveryDelay: null,
      transitDays: 0,
      deliveryWeekdays: [],
      overTolerancePct: 0,
      earlyToleranceDays: 1,
      lateToleranceDays: 0,
    });
  });

  it('refuses a delivery cycle that contradicts the lead time, a partial cycle and an unknown weekday, naming each cell', async () => {
    const file = csv(
      'code,name,email,lead_time_days,cycle_days,deliveries_per_cycle,delivery_delay,transit_days,delivery_weekdays',
      'SUP-X,Supplier X,orders@supplier-x.example.org,10,1,1,1,,',
      'SUP-Y,Supplier Y,orders@supplier-y.example.org,5,5,,,,',
      'SUP-Z,Supplier Z,orders@supplier-z.example.org,5,,,,6,Mon;Funday',
    );

    const response = await upload(context, 'suppliers', file);

    expect(response.status).toBe(422);
    const details: { row: number; column: string; message: string }[] = response.body.error.details;
    expect(details).toContainEqual({
      row: 2,
      column: 'delivery_delay',
      message: expect.stringContaining('use a delay of at least 10 deliveries (1-1-10)'),
    });
    expect(details).toContainEqual({ row: 3, column: 'cycle_days', message: expect.stringContaining('whole') });
    expect(details).toContainEqual({
      row: 4,
      column: 'delivery_weekdays',
      message: expect.stringContaining("'Funday' is not a weekday"),
    });
    expect(await count(context, SupplierEntity)).toBe(3);
  });

  it('updates instead of duplicating when the same file is imported again', async () => {
    const file = csv('code,name,email,lead_time_days', 'SUP-C,Supplier C second name,orders@supplier-c.example.org,7');

    const response = await upload(context, 'suppliers', file);

    expect(response.status).toBe(200);
    expect(await count(context, SupplierEntity)).toBe(3);
    // The terms columns are left out of this header, so SUP-A keeps what it had.
    const supplierC = await context.dataSource.getRepository(SupplierEntity).findOneByOrFail({ code: 'SUP-C' });
    expect(supplierC).toMatchObject({ name: 'Supplier C second name', leadTimeDays: 7, cycleDays: null });
    const kept = await upload(
      context,
      'suppliers',
      csv('code,name,email,lead_time_days', 'SUP-A,A,orders@supplier-a.example.com,4'),
    );
    expect(kept.status).toBe(200);
    const supplierA = await context.dataSource.getRepository(SupplierEntity).findOneByOrFail({ code: 'SUP-A' });
    expect(supplierA).toMatchObject({ cycleDays: 5, deliveryDelay: 2, transitDays: 1, deliveryWeekdays: [1, 4] });
  });

  it('records one audit event per import with the kind and the count', async () => {
    const file = csv(
      'code,name,email,lead_time_days',
      'SUP-D,Supplier D,orders@supplier-d.example.net,2',
      'SUP-E,Supplier E,orders@supplier-e.example.net,2',
    );
    const before = await count(context, AuditEventEntity);

    await upload(context, 'suppliers', file, 'admin');

    const events = await context.dataSource.getRepository(AuditEventEntity).find({ order: { id: 'ASC' } });
    expect(events).toHaveLength(before + 1);
    expect(events.at(-1)).toMatchObject({ actorEmail: 'admin@example.com', action: 'import', entityKey: 'suppliers' });
    expect(events.at(-1)?.changes).toMatchObject({ kind: 'suppliers', imported: 2 });
  });

  it('rejects a malformed e-mail address and a lead time that is not a number, naming each cell', async () => {
    const file = csv(
      'code,name,email,lead_time_days',
      'SUP-F,Supplier F,not-an-address,2',
      'SUP-G,Supplier G,orders@supplier-g.example.net,two',
    );
    const before = await snapshot(context);

    const response = await upload(context, 'suppliers', file);

    expect(response.status).toBe(422);
    expect(response.body.error.code).toBe('import_rejected');
    expect(response.body.error.message).toBe('2 rows have problems; nothing was imported.');
    expect(response.body.error.details).toEqual([
      { row: 2, column: 'email', message: "'not-an-address' is not an e-mail address" },
      { row: 3, column: 'lead_time_days', message: "'two' is not a number" },
    ]);
    expect(await snapshot(context)).toEqual(before);
  });
});

describe('POST /api/imports/parts', () => {
  let context: TestContext;
  beforeAll(async () => {
    context = await createTestContext();
  });
  afterAll(() => context.close());

  it('creates parts with the documented defaults for empty cells', async () => {
    const file = csv(
      PARTS_HEADER,
      'BAT-1,Traction battery,,buy,SUP-B,,,,,,,yes',
      'FRM-1,Frame weldment,,make,,2,,,kanban,,FAB-1,',
      'MDL-1,Finished unit,,end_item,,,,,,,,',
    );

    const response = await upload(context, 'parts', file);

    expect(response.status).toBe(200);
    expect(response.body).toEqual({ imported: 3 });
    const parts = await context.dataSource.getRepository(PartEntity).find({ order: { partNumber: 'ASC' } });
    // H87 is the UN/ECE Recommendation 20 code for "piece" (Annex I; from memory).
    expect(parts[0]).toMatchObject({
      partNumber: 'BAT-1',
      uom: 'H87',
      supplierCode: 'SUP-B',
      leadTimeDays: 5,
      packQty: 1,
      onHand: 0,
      replenishment: null,
      safetyStock: 0,
      pointOfUse: null,
      hazardous: true,
    });
    expect(parts[1]).toMatchObject({
      partNumber: 'FRM-1',
      leadTimeDays: 2,
      replenishment: 'kanban',
      pointOfUse: 'FAB-1',
      hazardous: false,
    });
    expect(parts[2]).toMatchObject({ partNumber: 'MDL-1', source: 'end_item', supplierCode: null, leadTimeDays: 0 });
  });

  it('updates parts on a second import, keeping on-hand when its cell is empty', async () => {
    await upload(context, 'on-hand', csv('part_number,on_hand', 'BAT-1,12'));
    const file = csv(PARTS_HEADER, 'BAT-1,Traction battery 12 V,,buy,SUP-A,,4,,scheduled,2,L1-08,true');

    const response = await upload(context, 'parts', file);

    expect(response.status).toBe(200);
    expect(await count(context, PartEntity)).toBe(3);
    const battery = await context.dataSource.getRepository(PartEntity).findOneByOrFail({ partNumber: 'BAT-1' });
    expect(battery).toMatchObject({
      description: 'Traction battery 12 V',
      supplierCode: 'SUP-A',
      leadTimeDays: 3,
      packQty: 4,
      onHand: 12,
    });
  });

  it('keeps the hazardous flag of an existing part when the optional column is left out', async () => {
    const file = csv('part_number,description,source,supplier_code', 'BAT-1,Traction battery 12 V AGM,buy,SUP-A');

    await upload(context, 'parts', file);

    const battery = await context.dataSource.getRepository(PartEntity).findOneByOrFail({ partNumber: 'BAT-1' });
    expect(battery).toMatchObject({ description: 'Traction battery 12 V AGM', hazardous: true, packQty: 4 });
  });

  it('reads quoted cells holding commas, doubled quotes and line breaks', async () => {
    // RFC 4180, section 2, rules 5–7: a quoted field may hold commas, line breaks and "" for a quote.
    const file = csv('part_number,description,source', 'DCL-1,"Decal, ""caution"" label', 'two lines",make');

    const response = await upload(context, 'parts', file);

    expect(response.status).toBe(200);
    const decal = await context.dataSource.getRepository(PartEntity).findOneByOrFail({ partNumber: 'DCL-1' });
    expect(decal.description).toBe('Decal, "caution" label\ntwo lines');
  });

  it('reports every bad row with its line number and column, and writes nothing', async () => {
    const file = csv(
      PARTS_HEADER,
      'OK-1,Fine part,,make,,,,,,,,',
      'BAD-1,Bad pack,,make,,,abc,,,,,',
      'BAD-2,Bad source,,bought,,,,,,,,',
      'BAD-3,Bad unit and flag,XYZ,make,,,,,,,,maybe',
    );
    const before = await snapshot(context);

    const response = await upload(context, 'parts', file);

    expect(response.status).toBe(422);
    expect(response.body.error.message).toBe('3 rows have problems; nothing was imported.');
    expect(response.body.error.details).toEqual([
      { row: 3, column: 'pack_qty', message: "'abc' is not a number" },
      { row: 4, column: 'source', message: "'bought' is not one of buy, make, end_item" },
      { row: 5, column: 'uom', message: "'XYZ' is not one of H87, KGM, MTR, LTR, MTK, SET, PR" },
      { row: 5, column: 'hazardous', message: "'maybe' is not true/false, yes/no or 1/0" },
    ]);
    expect(await snapshot(context)).toEqual(before);
  });

  it('rejects an unknown supplier', async () => {
    const before = await snapshot(context);

    const response = await upload(context, 'parts', csv(PARTS_HEADER, 'MTR-1,Brush motor,,buy,SUP-Z,,,,,,,'));

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 2, column: 'supplier_code', message: "unknown supplier 'SUP-Z'" },
    ]);
    expect(await snapshot(context)).toEqual(before);
  });

  it('rejects a bought part without a supplier', async () => {
    const response = await upload(context, 'parts', csv(PARTS_HEADER, 'MTR-2,Vacuum motor,,buy,,,,,,,,'));

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 2, column: 'supplier_code', message: 'a bought part needs a supplier' },
    ]);
  });

  it('reports the second occurrence of a part number, naming the first row', async () => {
    const before = await snapshot(context);
    const file = csv('part_number,description,source', 'NEW-1,First,make', 'NEW-2,Other,make', 'NEW-1,Again,make');

    const response = await upload(context, 'parts', file);

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 4, column: 'part_number', message: "part 'NEW-1' is already on row 2" },
    ]);
    expect(await snapshot(context)).toEqual(before);
  });

  it('counts physical lines: a byte-order mark, CRLF endings, blank lines and a quoted line break', async () => {
    const file = '\uFEFFpart_number,description,source\r\nOK-2,"Two\r\nlines",make\r\n\r\nBAD-4,Bad,makes\r\n';

    const response = await upload(context, 'parts', file);

    expect(response.status).toBe(422);
    // Line 1 header, lines 2–3 the quoted record, line 4 blank, line 5 the bad row.
    expect(response.body.error.details).toEqual([
      { row: 5, column: 'source', message: "'makes' is not one of buy, make, end_item" },
    ]);
  });

  it('reports a cell outside the header columns and a quote that is never closed', async () => {
    const file = csv('part_number,description,source', 'X-1,Part,make,surplus', 'X-2,"Unclosed,make', 'X-3,Part,make');

    const response = await upload(context, 'parts', file);

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 2, column: '', message: '1 cell(s) lie outside the 3 columns of the header' },
      { row: 3, column: '', message: expect.stringContaining('the row cannot be read') },
    ]);
  });

  it('rejects a header without a required column, at row 1 naming the column', async () => {
    const response = await upload(context, 'parts', csv('part_number,source', 'X-1,make'));

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 1, column: 'description', message: "required column 'description' is missing from the header" },
    ]);
  });

  it('rejects a header with a column that is not in the format', async () => {
    const response = await upload(context, 'parts', csv('part_number,description,source,colour', 'X-1,Part,make,red'));

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 1, column: 'colour', message: expect.stringContaining("unknown column 'colour'") },
    ]);
  });

  it('rejects a file that is not UTF-8 at the line of the first bad byte', async () => {
    // 0xE9 is "é" in ISO 8859-1; in UTF-8 it opens a three-byte sequence and the ',' after it is
    // not a continuation byte, so the text is malformed (RFC 3629, section 3).
    const latin1 = Buffer.concat([
      Buffer.from('part_number,description,source\nX-1,Caf'),
      Buffer.from([0xe9]),
      Buffer.from(',make\n'),
    ]);

    const response = await upload(context, 'parts', latin1);

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 2, column: '', message: 'the file is not UTF-8 text; save it as CSV UTF-8' },
    ]);
  });

  it('imports a 5,000-row file of kanban parts whole, and the loops list still answers', async () => {
    const rows = Array.from(
      { length: 5000 },
      (_, index) => `BULK-${index},Bulk part ${index},H87,buy,SUP-A,,10,,kanban,,L1-01,`,
    );

    const response = await upload(context, 'parts', csv(PARTS_HEADER, ...rows));

    expect(response.status).toBe(200);
    expect(response.body).toEqual({ imported: 5000 });
    const [{ count }] = await context.dataSource.query(
      "SELECT COUNT(*) AS count FROM part WHERE part_number LIKE 'BULK-%'",
    );
    expect(count).toBe(5000);
    const loops = await request(context.app).get('/api/kanban/loops').set(bearer(context.tokens.buyer));
    expect(loops.status).toBe(200);
    const bulkLoops = (loops.body as { partNumber: string }[]).filter((loop) => loop.partNumber.startsWith('BULK-'));
    expect(bulkLoops).toHaveLength(5000);
  });
});

describe('POST /api/imports/bom', () => {
  let context: TestContext;
  const header = IMPORT_LAYOUTS.bom.columns.join(',');
  const linesOf = (parent: string) =>
    context.dataSource
      .getRepository(BomLineEntity)
      .find({ where: { parent }, order: { component: 'ASC', effectiveFrom: { direction: 'ASC', nulls: 'FIRST' } } });

  beforeAll(async () => {
    context = await createTestContext();
    await insertParts(context, [
      { partNumber: 'MDL-A', source: 'end_item' },
      { partNumber: 'MDL-B', source: 'end_item' },
      { partNumber: 'SUB-1', source: 'make' },
      { partNumber: 'SUB-2', source: 'make' },
      { partNumber: 'CMP-1', source: 'buy', supplierCode: 'SUP-A' },
      { partNumber: 'CMP-2', source: 'buy', supplierCode: 'SUP-A' },
    ]);
  });
  afterAll(() => context.close());

  it('imports lines with scrap and effectivity, defaulting scrap to 0 and open dates to null', async () => {
    const file = csv(
      header,
      'MDL-A,SUB-1,1,,,',
      'MDL-A,CMP-1,2,5,,2027-06-30',
      'MDL-A,CMP-1,3,5,2027-07-01,',
      'MDL-B,SUB-1,1,,,',
      'SUB-1,CMP-2,0.5,2,,',
    );

    const response = await upload(context, 'bom', file);

    expect(response.status).toBe(200);
    expect(response.body).toEqual({ imported: 5 });
    const modelA = await linesOf('MDL-A');
    expect(
      modelA.map(({ component, qtyPer, scrapPct, effectiveFrom, effectiveTo }) => ({
        component,
        qtyPer,
        scrapPct,
        effectiveFrom,
        effectiveTo,
      })),
    ).toEqual([
      { component: 'CMP-1', qtyPer: 2, scrapPct: 5, effectiveFrom: null, effectiveTo: '2027-06-30' },
      { component: 'CMP-1', qtyPer: 3, scrapPct: 5, effectiveFrom: '2027-07-01', effectiveTo: null },
      { component: 'SUB-1', qtyPer: 1, scrapPct: 0, effectiveFrom: null, effectiveTo: null },
    ]);
  });

  it('replaces the lines of the parents named in the file and leaves other parents alone', async () => {
    const response = await upload(context, 'bom', csv(header, 'MDL-A,SUB-2,1,,,'));

    expect(response.status).toBe(200);
    expect((await linesOf('MDL-A')).map((line) => line.component)).toEqual(['SUB-2']);
    expect((await linesOf('MDL-B')).map((line) => line.component)).toEqual(['SUB-1']);
    expect((await linesOf('SUB-1')).map((line) => line.component)).toEqual(['CMP-2']);
    expect(await count(context, BomLineEntity)).toBe(3);
  });

  it('rejects a component that is not a part (a BOM file cannot create parts)', async () => {
    const before = await snapshot(context);

    const response = await upload(context, 'bom', csv(header, 'MDL-A,SUB-2,1,,,', 'MDL-A,CMP-9,1,,,'));

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([{ row: 3, column: 'component', message: "unknown part 'CMP-9'" }]);
    expect(await snapshot(context)).toEqual(before);
  });

  it('rejects a line that closes a cycle with a line kept from another parent, showing the path', async () => {
    // SUB-1 → CMP-2 stays on file; naming CMP-2 as a parent of SUB-1 would make CMP-2 its own component.
    const before = await snapshot(context);

    const response = await upload(context, 'bom', csv(header, 'CMP-2,CMP-1,1,,,', 'CMP-2,SUB-1,1,,,'));

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 3, column: 'component', message: 'closes a BOM cycle: SUB-1 → CMP-2 → SUB-1' },
    ]);
    expect(await snapshot(context)).toEqual(before);
  });

  it('reports every row of a cycle that lies entirely within the file', async () => {
    const response = await upload(context, 'bom', csv(header, 'SUB-2,CMP-1,1,,,', 'CMP-1,SUB-2,1,,,'));

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 2, column: 'component', message: 'closes a BOM cycle: SUB-2 → CMP-1 → SUB-2' },
      { row: 3, column: 'component', message: 'closes a BOM cycle: SUB-2 → CMP-1 → SUB-2' },
    ]);
  });

  it('accepts a cycle-forming line when the same file replaces the kept line that closed it', async () => {
    // MDL-A → SUB-2 is on file, so SUB-2 → MDL-A alone would close a loop; the file also replaces MDL-A's lines.
    const response = await upload(context, 'bom', csv(header, 'SUB-2,MDL-A,1,,,', 'MDL-A,CMP-1,1,,,'));

    expect(response.status).toBe(200);
    expect((await linesOf('MDL-A')).map((line) => line.component)).toEqual(['CMP-1']);
  });

  it('rejects effectivity windows of the same parent and component that share a day, both ends inclusive', async () => {
    const before = await snapshot(context);
    const file = csv(header, 'MDL-B,CMP-1,1,,2027-01-01,2027-06-30', 'MDL-B,CMP-1,2,,2027-06-30,');

    const response = await upload(context, 'bom', file);

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 3, column: 'effective_from', message: 'effective dates of MDL-B → CMP-1 overlap row 2 (both ends count)' },
    ]);
    expect(await snapshot(context)).toEqual(before);
  });

  it('accepts windows that meet without sharing a day', async () => {
    const file = csv(header, 'MDL-B,CMP-1,1,,2027-01-01,2027-06-30', 'MDL-B,CMP-1,2,,2027-07-01,');

    const response = await upload(context, 'bom', file);

    expect(response.status).toBe(200);
  });

  it('reports a repeated parent, component and start date as a duplicate of the first row', async () => {
    const response = await upload(context, 'bom', csv(header, 'MDL-B,SUB-1,1,,,', 'MDL-B,SUB-1,2,,,'));

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 3, column: 'component', message: 'MDL-B → SUB-1 effective from an open start is already on row 2' },
    ]);
  });

  it('rejects dates that do not exist and a part that contains itself', async () => {
    // 2027 is not divisible by 4, so it has no 29 February (Gregorian calendar leap-year rule, as used by ISO 8601-1:2019; from memory).
    const file = csv(header, 'MDL-B,CMP-1,1,,2027-02-29,', 'SUB-1,SUB-1,1,,,', 'MDL-B,CMP-2,1,,2027-05-01,2027-04-30');

    const response = await upload(context, 'bom', file);

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 2, column: 'effective_from', message: "'2027-02-29' is not a real date (YYYY-MM-DD)" },
      { row: 3, column: 'component', message: 'a part cannot contain itself' },
      { row: 4, column: 'effective_to', message: 'effective_to is before effective_from' },
    ]);
  });
});

describe('POST /api/imports/schedule', () => {
  let context: TestContext;
  const today = plantToday();
  const header = IMPORT_LAYOUTS.schedule.columns.join(',');
  const firstDay = nextWorkingDay(addCalendarDays(today, 14), WEEKDAYS_ONLY);
  const secondDay = nextWorkingDay(addCalendarDays(firstDay, 1), WEEKDAYS_ONLY);
  const sequenceOn = (date: string) =>
    context.dataSource.getRepository(SequenceEntryEntity).find({ where: { date }, order: { sequence: 'ASC' } });

  beforeAll(async () => {
    context = await createTestContext();
    await insertParts(context, [
      { partNumber: 'MDL-A', source: 'end_item' },
      { partNumber: 'MDL-B', source: 'end_item' },
      { partNumber: 'SUB-1', source: 'make' },
    ]);
  });
  afterAll(() => context.close());

  it('lets a planner import the sequence, with qty defaulting to 1', async () => {
    const file = csv(
      header,
      `${firstDay},1,MDL-A,SN-001,1`,
      `${firstDay},2,MDL-B,SN-002,`,
      `${secondDay},1,MDL-A,SN-003,2`,
    );

    const response = await upload(context, 'schedule', file, 'planner');

    expect(response.status).toBe(200);
    expect(response.body).toEqual({ imported: 3 });
    expect(
      (await sequenceOn(firstDay)).map(({ sequence, model, serial, qty }) => ({ sequence, model, serial, qty })),
    ).toEqual([
      { sequence: 1, model: 'MDL-A', serial: 'SN-001', qty: 1 },
      { sequence: 2, model: 'MDL-B', serial: 'SN-002', qty: 1 },
    ]);
  });

  it('moves a unit named by serial instead of adding it twice, and lets another unit take its old slot', async () => {
    const file = csv(header, `${secondDay},2,MDL-A,SN-001,1`, `${firstDay},1,MDL-B,SN-004,1`);

    const response = await upload(context, 'schedule', file, 'planner');

    expect(response.status).toBe(200);
    expect(await count(context, SequenceEntryEntity)).toBe(4);
    expect((await sequenceOn(firstDay)).map((entry) => entry.serial)).toEqual(['SN-004', 'SN-002']);
    expect((await sequenceOn(secondDay)).map((entry) => entry.serial)).toEqual(['SN-003', 'SN-001']);
  });

  it('rejects a date and position held by a unit the file does not move', async () => {
    const before = await snapshot(context);

    const response = await upload(context, 'schedule', csv(header, `${firstDay},2,MDL-A,SN-005,1`), 'planner');

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 2, column: 'sequence', message: `position 2 on ${firstDay} is already taken by serial 'SN-002'` },
    ]);
    expect(await snapshot(context)).toEqual(before);
  });

  it('rejects two rows of the file on the same date and position, naming the first row', async () => {
    const file = csv(header, `${secondDay},5,MDL-A,SN-006,1`, `${secondDay},5,MDL-B,SN-007,1`);

    const response = await upload(context, 'schedule', file, 'planner');

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 3, column: 'sequence', message: `position 5 on ${secondDay} is already on row 2` },
    ]);
  });

  it('rejects a serial that appears twice in the file', async () => {
    const file = csv(header, `${secondDay},6,MDL-A,SN-008,1`, `${secondDay},7,MDL-A,SN-008,1`);

    const response = await upload(context, 'schedule', file, 'planner');

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 3, column: 'serial', message: "serial 'SN-008' is already on row 2" },
    ]);
  });

  it('rejects a model that is unknown or not an end item', async () => {
    const file = csv(header, `${secondDay},8,MDL-Z,SN-009,1`, `${secondDay},9,SUB-1,SN-010,1`);

    const response = await upload(context, 'schedule', file, 'planner');

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 2, column: 'model', message: "unknown model 'MDL-Z'" },
      { row: 3, column: 'model', message: "'SUB-1' is a make part, not an end item" },
    ]);
  });

  it('rejects dates that are not real, too far back, too far ahead or not worked', async () => {
    const longAgo = addCalendarDays(today, -400);
    const farAhead = addCalendarDays(today, 800);
    // ISO 8601 numbers the days of the week 1 = Monday … 7 = Sunday, so Saturday is 6 (ISO 8601-1:2019; from memory).
    const saturday = addCalendarDays(firstDay, 6 - isoWeekday(firstDay));
    const file = csv(
      header,
      `2027-13-01,1,MDL-A,SN-011,1`,
      `${longAgo},1,MDL-A,SN-012,1`,
      `${farAhead},1,MDL-A,SN-013,1`,
      `${saturday},1,MDL-A,SN-014,1`,
    );
    const before = await snapshot(context);

    const response = await upload(context, 'schedule', file, 'planner');

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 2, column: 'date', message: "'2027-13-01' is not a real date (YYYY-MM-DD)" },
      { row: 3, column: 'date', message: `${longAgo} is more than 1 year in the past` },
      { row: 4, column: 'date', message: `${farAhead} is more than 2 years ahead` },
      { row: 5, column: 'date', message: `${saturday} is a Saturday, not a working day of the plant calendar` },
    ]);
    expect(await snapshot(context)).toEqual(before);
  });

  it('rejects a plant holiday from the calendar', async () => {
    const holiday = nextWorkingDay(addCalendarDays(secondDay, 7), WEEKDAYS_ONLY);
    await request(context.app)
      .put('/api/calendar')
      .set(bearer(context.tokens.planner))
      .send({ workingWeekdays: [1, 2, 3, 4, 5], holidays: [holiday] });

    const response = await upload(context, 'schedule', csv(header, `${holiday},1,MDL-A,SN-015,1`), 'planner');

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([{ row: 2, column: 'date', message: `${holiday} is a plant holiday` }]);
  });
});

describe('POST /api/imports/on-hand', () => {
  let context: TestContext;
  beforeAll(async () => {
    context = await createTestContext();
    await insertParts(context, [
      { partNumber: 'CMP-1', source: 'buy', supplierCode: 'SUP-A' },
      { partNumber: 'CMP-2', source: 'buy', supplierCode: 'SUP-A' },
    ]);
  });
  afterAll(() => context.close());

  it('sets the counted stock of existing parts', async () => {
    const response = await upload(context, 'on-hand', csv('part_number,on_hand', 'CMP-1,40', 'CMP-2,12.5'));

    expect(response.status).toBe(200);
    expect(response.body).toEqual({ imported: 2 });
    const parts = await context.dataSource.getRepository(PartEntity).find({ order: { partNumber: 'ASC' } });
    expect(parts.map((part) => part.onHand)).toEqual([40, 12.5]);
  });

  it('rejects an unknown part, a negative count and a decimal comma, and writes nothing', async () => {
    const before = await snapshot(context);

    const response = await upload(
      context,
      'on-hand',
      csv('part_number,on_hand', 'CMP-1,1', 'CMP-9,5', 'CMP-2,-3', 'CMP-1,"2,5"'),
    );

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      { row: 3, column: 'part_number', message: "unknown part 'CMP-9'" },
      { row: 4, column: 'on_hand', message: 'must be at least 0' },
      { row: 5, column: 'on_hand', message: "'2,5' is not a number" },
      { row: 5, column: 'part_number', message: "part 'CMP-1' is already on row 2" },
    ]);
    expect(await snapshot(context)).toEqual(before);
  });
});

describe('import uploads and roles', () => {
  let context: TestContext;
  beforeAll(async () => {
    context = await createTestContext();
  });
  afterAll(() => context.close());

  const partsFile = csv('part_number,description,source', 'ROLE-1,Role test part,make');

  it.each([
    ['viewer', 'parts', 403],
    ['receiving', 'parts', 403],
    ['supplier', 'parts', 403],
    ['planner', 'parts', 403],
    ['buyer', 'schedule', 403],
    ['viewer', 'schedule', 403],
    ['admin', 'parts', 200],
  ] as const)('%s importing %s gets %i', async (role, kind, status) => {
    const body = kind === 'parts' ? partsFile : csv(IMPORT_LAYOUTS.schedule.columns.join(','));

    const response = await upload(context, kind, body, role);

    expect(response.status).toBe(status);
  });

  it('lets a planner import the schedule', async () => {
    await insertParts(context, [{ partNumber: 'MDL-R', source: 'end_item' }]);
    const day = nextWorkingDay(addCalendarDays(plantToday(), 10), WEEKDAYS_ONLY);

    const response = await upload(
      context,
      'schedule',
      csv(IMPORT_LAYOUTS.schedule.columns.join(','), `${day},1,MDL-R,SN-R1,1`),
      'planner',
    );

    expect(response.status).toBe(200);
    expect(response.body).toEqual({ imported: 1 });
  });

  it('answers 401 without a sign-in', async () => {
    const response = await request(context.app)
      .post('/api/imports/parts')
      .attach('file', Buffer.from(partsFile), 'parts.csv');

    expect(response.status).toBe(401);
  });

  it('answers 413 in the error shape for a file over 5 MB', async () => {
    const line = 'BIG-0,Padding part with a long description to fill the file quickly,make\n';
    const big = Buffer.from(
      `part_number,description,source\n${line.repeat(Math.ceil(IMPORT_MAX_BYTES / line.length) + 10)}`,
    );
    const before = await snapshot(context);

    const response = await upload(context, 'parts', big);

    expect(big.length).toBeGreaterThan(IMPORT_MAX_BYTES);
    expect(response.status).toBe(413);
    expect(response.body.error).toEqual({ code: 'payload_too_large', message: 'The file is larger than 5 MB.' });
    expect(await snapshot(context)).toEqual(before);
  });

  it('answers 400 when the file is sent in another field', async () => {
    const response = await request(context.app)
      .post('/api/imports/parts')
      .set(bearer(context.tokens.buyer))
      .attach('upload', Buffer.from(partsFile), 'parts.csv');

    expect(response.status).toBe(400);
    expect(response.body.error.message).toBe(
      "Send the CSV in the multipart field 'file' (got 'upload'), one file only.",
    );
  });

  it('answers 400 when no file is attached', async () => {
    const response = await request(context.app).post('/api/imports/parts').set(bearer(context.tokens.buyer)).send({});

    expect(response.status).toBe(400);
    expect(response.body.error.message).toBe("Attach the CSV as multipart/form-data in the field 'file'.");
  });

  it('answers 422 at row 1 for an empty file', async () => {
    const response = await upload(context, 'on-hand', '\n\n');

    expect(response.status).toBe(422);
    expect(response.body.error.details[0]).toMatchObject({
      row: 1,
      message: expect.stringContaining('the file is empty'),
    });
  });
});

describe('GET /api/imports/templates/:kind', () => {
  let context: TestContext;
  beforeAll(async () => {
    context = await createTestContext();
  });
  afterAll(() => context.close());

  it.each(['suppliers', 'parts', 'bom', 'schedule', 'on-hand', 'open-orders'] as const)(
    'serves the %s template as a CSV attachment with the published header',
    async (kind) => {
      const response = await request(context.app)
        .get(`/api/imports/templates/${kind}`)
        .set(bearer(context.tokens.viewer))
        .buffer(true);

      expect(response.status).toBe(200);
      expect(response.headers['content-type']).toMatch(/^text\/csv/);
      expect(response.headers['content-disposition']).toBe(`attachment; filename=cardloop-${kind}-template.csv`);
      expect(response.text.split('\n')[0]).toBe(IMPORT_LAYOUTS[kind].columns.join(','));
    },
  );

  it('refuses a supplier account', async () => {
    const response = await request(context.app)
      .get('/api/imports/templates/parts')
      .set(bearer(context.tokens.supplier));

    expect(response.status).toBe(403);
  });

  it('answers 400 for a kind that does not exist', async () => {
    const response = await request(context.app).get('/api/imports/templates/widgets').set(bearer(context.tokens.buyer));

    expect(response.status).toBe(400);
  });

  it('ships master-data templates that import cleanly one after the other', async () => {
    const imported: Record<string, number> = {};

    for (const kind of ['suppliers', 'parts', 'bom', 'on-hand'] as const) {
      const template = readFileSync(new URL(`../../seed/templates/${kind}.csv`, import.meta.url));
      const response = await upload(context, kind, template);
      expect(response.status, JSON.stringify(response.body)).toBe(200);
      imported[kind] = response.body.imported;
    }

    expect(imported).toEqual({ suppliers: 3, parts: 5, bom: 4, 'on-hand': 3 });
  });
});
