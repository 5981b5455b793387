import fc from 'fast-check';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { afterEach, describe, expect, it } from 'vitest';
import type { ImportKind } from '../../shared/schemas/imports';
import { bearer, createTestContext, type TestContext } from './helpers';

const csv = (...lines: string[]) => `${lines.join('\n')}\n`;

function upload(context: TestContext, kind: ImportKind, body: string, role = 'admin' as const) {
  return request(context.app)
    .post(`/api/imports/${kind}`)
    .set(bearer(context.tokens[role]))
    .attach('file', Buffer.from(body), `${kind}.csv`);
}

/**
 * Every table an import writes, in a stable order. Left out by design: ids, when stock was last
 * counted (an on-hand file is a count each time it is imported, and the ledger keeps each count),
 * and so the part's revision (a count revises the part).
 */
async function state(dataSource: DataSource) {
  return {
    suppliers: await dataSource.query('SELECT * FROM supplier ORDER BY code'),
    parts: (await dataSource.query('SELECT * FROM part ORDER BY part_number')).map(
      ({ last_counted_at: _counted, revision: _revision, ...part }: Record<string, unknown>) => part,
    ),
    bom: await dataSource.query(
      'SELECT parent, component, qty_per, scrap_pct, effective_from, effective_to FROM bom_line ORDER BY parent, component, effective_from',
    ),
    sequence: await dataSource.query('SELECT date, sequence, model, serial, qty FROM sequence_entry ORDER BY serial'),
  };
}

const PARTS = csv(
  'part_number,description,uom,source,supplier_code,lead_time_days,pack_qty,on_hand,replenishment,safety_stock,point_of_use,hazardous',
  'MDL-1,Finished unit one,H87,end_item,,0,1,0,,0,,false',
  'MDL-2,Finished unit two,H87,end_item,,0,1,0,,0,,false',
  'FRM-1,Frame weldment,H87,make,,2,1,4,,0,FAB-1,false',
  'BAT-1,Traction battery,H87,buy,SUP-A,,4,16,scheduled,4,L1-08,true',
  'STL-1,Sheet steel,KGM,buy,SUP-B,,500,1200.5,kanban,0,FAB-1,false',
);
const SUPPLIERS = csv(
  'code,name,email,lead_time_days,cycle_days,deliveries_per_cycle,delivery_delay',
  'SUP-A,Supplier A again,orders@supplier-a.example.com,4,5,2,2',
  'SUP-C,Supplier C,orders@supplier-c.example.org,6,,,',
  'SUP-D,Supplier D,orders@supplier-d.example.net,2,1,1,2',
);
const BOM = csv(
  'parent,component,qty_per,scrap_pct,effective_from,effective_to',
  'MDL-1,FRM-1,1,0,,',
  'MDL-1,BAT-1,2,0,,',
  'MDL-2,BAT-1,4,0,,',
  'FRM-1,STL-1,18.5,3,,',
);
const ON_HAND = csv('part_number,on_hand', 'BAT-1,20', 'STL-1,900', 'FRM-1,3');
const SCHEDULE = csv(
  'date,sequence,model,serial,qty',
  '2027-03-01,1,MDL-1,SN-1,1',
  '2027-03-01,2,MDL-2,SN-2,1',
  '2027-03-02,1,MDL-1,SN-3,1',
  '2027-03-02,2,MDL-2,SN-4,1',
);

describe('importing the same multi-row file again', () => {
  let context: TestContext;
  afterEach(() => context.close());

  it('keeps on-hand of the rows whose cell is empty, beside rows that set it', async () => {
    context = await createTestContext();
    await upload(context, 'parts', PARTS);
    const header =
      'part_number,description,uom,source,supplier_code,lead_time_days,pack_qty,on_hand,replenishment,safety_stock';

    const response = await upload(
      context,
      'parts',
      csv(
        header,
        'BAT-1,Traction battery,H87,buy,SUP-A,,4,,scheduled,4',
        'STL-1,Sheet steel,KGM,buy,SUP-B,,500,7,kanban,0',
      ),
    );

    expect(response.status).toBe(200);
    const rows = await context.dataSource.query(
      "SELECT part_number, on_hand FROM part WHERE part_number IN ('BAT-1', 'STL-1') ORDER BY part_number",
    );
    expect(rows).toEqual([
      { part_number: 'BAT-1', on_hand: 16 },
      { part_number: 'STL-1', on_hand: 7 },
    ]);
  });

  it.each<[ImportKind, string]>([
    ['suppliers', SUPPLIERS],
    ['parts', PARTS],
    ['bom', BOM],
    ['on-hand', ON_HAND],
    ['schedule', SCHEDULE],
  ])('answers 200 for %s both times and ends in the same state as once', async (kind, file) => {
    context = await createTestContext();
    // Parts come before the files that name them; the BOM before nothing else needs it.
    if (kind !== 'suppliers' && kind !== 'parts') expect((await upload(context, 'parts', PARTS)).status).toBe(200);

    const first = await upload(context, kind, file);
    const once = await state(context.dataSource);
    const second = await upload(context, kind, file);
    const twice = await state(context.dataSource);

    expect(first.status).toBe(200);
    expect(second.status).toBe(200);
    expect(second.body).toEqual(first.body);
    expect(twice).toEqual(once);
  });

  it('moves several existing serials in one schedule upload', async () => {
    context = await createTestContext();
    await upload(context, 'parts', PARTS);
    await upload(context, 'schedule', SCHEDULE);
    const swapped = csv(
      'date,sequence,model,serial,qty',
      '2027-03-02,1,MDL-1,SN-1,1',
      '2027-03-02,2,MDL-2,SN-2,1',
      '2027-03-01,1,MDL-1,SN-3,1',
      '2027-03-01,2,MDL-2,SN-4,1',
    );

    const response = await upload(context, 'schedule', swapped);

    expect(response.status).toBe(200);
    const rows = await context.dataSource.query(
      'SELECT date, sequence, serial FROM sequence_entry ORDER BY date, sequence',
    );
    expect(rows.map((row: { serial: string }) => row.serial)).toEqual(['SN-3', 'SN-4', 'SN-1', 'SN-2']);
  });
});

// Property: for any valid parts file, importing it twice ends in the same state as importing it once.
describe('importing any valid parts file twice', () => {
  const partRow = fc.record({
    partNumber: fc.stringMatching(/^[A-Z]{2,4}-[0-9]{1,4}$/),
    description: fc.stringMatching(/^[A-Za-z][A-Za-z0-9 ]{0,20}$/),
    source: fc.constantFrom('buy', 'make', 'end_item'),
    packQty: fc.integer({ min: 1, max: 500 }),
    onHand: fc.integer({ min: 0, max: 10_000 }),
    safetyStock: fc.integer({ min: 0, max: 50 }),
  });

  it('ends in the same state', async () => {
    const context = await createTestContext();
    try {
      await fc.assert(
        fc.asyncProperty(
          fc.uniqueArray(partRow, { minLength: 1, maxLength: 12, selector: (row) => row.partNumber }),
          async (rows) => {
            const file = csv(
              'part_number,description,uom,source,supplier_code,lead_time_days,pack_qty,on_hand,replenishment,safety_stock',
              ...rows.map(
                (row) =>
                  `${row.partNumber},${row.description},H87,${row.source},${row.source === 'buy' ? 'SUP-A' : ''},,${row.packQty},${row.onHand},,${row.safetyStock}`,
              ),
            );

            const first = await upload(context, 'parts', file);
            const once = await state(context.dataSource);
            const second = await upload(context, 'parts', file);

            expect(first.status).toBe(200);
            expect(second.status).toBe(200);
            expect(await state(context.dataSource)).toEqual(once);
          },
        ),
        { numRuns: 25 },
      );
    } finally {
      await context.close();
    }
  });
});
