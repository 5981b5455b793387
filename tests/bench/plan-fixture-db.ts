import type { Database } from '../../server/db/database';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { replaceBomLines, upsertSuppliers } from '../../server/master-data/master-data.writer';
import { upsertSequenceEntries } from '../../server/sequence/sequence.writer';
import { savePartsWithStock } from '../../server/stock/stock.service';
import type { PlanInput } from '../../shared/domain/types';
import { SUPPLIER_DEFAULT_TERMS } from '../../shared/schemas/master-data';

/** Writes a generated plant (calendar, suppliers, parts with stock, BOM, sequence) into a database. */
export async function writeFixture(db: Database, fixture: PlanInput): Promise<void> {
  const suppliers = [
    ...new Set(fixture.parts.map((part) => part.supplierCode).filter((code): code is string => !!code)),
  ];
  await db.write(async (manager) => {
    await writeCalendar(manager, fixture.calendar);
    await upsertSuppliers(
      manager,
      suppliers.map((code) => ({
        code,
        name: code,
        email: `${code.toLowerCase()}@example.com`,
        leadTimeDays: 5,
        ...SUPPLIER_DEFAULT_TERMS,
      })),
    );
    await savePartsWithStock(
      manager,
      fixture.parts.map((part) => ({
        partNumber: part.partNumber,
        description: part.partNumber,
        uom: 'H87' as const,
        source: part.source,
        supplierCode: part.supplierCode ?? null,
        leadTimeDays: part.leadTimeDays,
        packQty: part.packQty,
        onHand: part.onHand,
        replenishment: null,
        safetyStock: part.safetyStock,
        pointOfUse: null,
        hazardous: false,
      })),
    );
    await replaceBomLines(
      manager,
      fixture.bom.map((line) => ({
        ...line,
        effectiveFrom: line.effectiveFrom ?? null,
        effectiveTo: line.effectiveTo ?? null,
      })),
    );
    await upsertSequenceEntries(manager, fixture.sequence);
  });
}
