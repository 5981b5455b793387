import type { EntityManager } from 'typeorm';
import type { IsoDate } from '../../shared/domain/types';
import { IMPORT_LAYOUTS, type ImportKind, type ImportResult } from '../../shared/schemas/imports';
import type { Part, Supplier } from '../../shared/schemas/master-data';
import { recordAudit } from '../audit/audit.service';
import { BomLineEntity } from '../master-data/bom-line.entity';
import { readCalendar } from '../calendar/calendar.service';
import { ImportError } from '../errors';
import { replaceBomLines, upsertSuppliers } from '../master-data/master-data.writer';
import { postCounts, savePartsWithStock } from '../stock/stock.service';
import { upsertSequenceEntries } from '../sequence/sequence.writer';
import { syncLoops } from '../loops/loop-sync';
import { PartEntity } from '../master-data/part.entity';
import { plantToday } from '../planning/plan-dates';
import { SequenceEntryEntity } from '../sequence/sequence-entry.entity';
import { SupplierEntity } from '../master-data/supplier.entity';
import { checkBomRows } from './bom-rows';
import { readCsvTable, type CsvTable } from './csv';
import type { RowProblems } from './import-rows';
import { checkOnHandRows } from './on-hand-rows';
import { checkOpenOrderRows } from './open-order-rows';
import { receivedOnOpenOrders, upsertOpenOrders } from '../releases/open-orders.writer';
import { checkPartRows } from './part-rows';
import { checkScheduleRows } from './schedule-rows';
import { checkSupplierRows } from './supplier-rows';
import type { Database } from '../db/database';

type Importer = (manager: EntityManager, table: CsvTable, today: IsoDate, actorEmail: string) => Promise<number>;

function rejectOnProblems(problems: RowProblems): void {
  if (problems.count === 0) return;
  const rows = problems.rowCount();
  throw new ImportError(
    `${rows} ${rows === 1 ? 'row has' : 'rows have'} problems; nothing was imported.`,
    problems.sorted(),
  );
}

async function suppliersByCode(manager: EntityManager): Promise<Map<string, Supplier>> {
  const rows = await manager.find(SupplierEntity);
  return new Map(rows.map(({ id: _id, ...supplier }) => [supplier.code, supplier]));
}

async function partNumbers(manager: EntityManager): Promise<Set<string>> {
  const rows = await manager.find(PartEntity, { select: { partNumber: true } });
  return new Set(rows.map((row) => row.partNumber));
}

// Each importer loads what it checks against once, checks every row, then writes through the
// shared master-data writers (which also bump the planning version).
const IMPORTERS: Record<ImportKind, Importer> = {
  suppliers: async (manager, table) => {
    const { suppliers, problems } = checkSupplierRows(table, await suppliersByCode(manager));
    rejectOnProblems(problems);
    await upsertSuppliers(manager, suppliers);
    return suppliers.length;
  },
  parts: async (manager, table, _today, actorEmail) => {
    const existing = await manager.find(PartEntity);
    const parts = new Map(existing.map(({ id: _id, ...part }) => [part.partNumber, part as Part]));
    const checked = checkPartRows(table, await suppliersByCode(manager), parts);
    rejectOnProblems(checked.problems);
    await savePartsWithStock(manager, checked.parts, actorEmail, 'Parts import');
    // A part that became a kanban part gets its loop at once.
    await syncLoops(manager);
    return checked.parts.length;
  },
  bom: async (manager, table) => {
    const existingLines = await manager.find(BomLineEntity, { select: { parent: true, component: true } });
    const { lines, problems } = checkBomRows(table, await partNumbers(manager), existingLines);
    rejectOnProblems(problems);
    await replaceBomLines(manager, lines);
    return lines.length;
  },
  schedule: async (manager, table, today) => {
    const parts = await manager.find(PartEntity, { select: { partNumber: true, source: true } });
    const existing = await manager.find(SequenceEntryEntity, {
      select: { date: true, sequence: true, serial: true, model: true, qty: true, status: true },
    });
    const { entries, problems } = checkScheduleRows(table, {
      parts: new Map(parts.map((part) => [part.partNumber, { source: part.source as Part['source'] }])),
      existing,
      calendar: await readCalendar(manager),
      today,
    });
    rejectOnProblems(problems);
    await upsertSequenceEntries(manager, entries);
    return entries.length;
  },
  'on-hand': async (manager, table, _today, actorEmail) => {
    const { counts, problems } = checkOnHandRows(table, await partNumbers(manager));
    rejectOnProblems(problems);
    await postCounts(
      manager,
      counts.map((count) => ({ partNumber: count.partNumber, counted: count.onHand })),
      actorEmail,
      'On-hand import',
    );
    return counts.length;
  },
  'open-orders': async (manager, table, today) => {
    const parts = await manager.find(PartEntity, { select: { partNumber: true, source: true, supplierCode: true } });
    const suppliers = await manager.find(SupplierEntity, { select: { code: true } });
    const { lines, problems } = checkOpenOrderRows(table, {
      suppliers: new Set(suppliers.map((supplier) => supplier.code)),
      parts: new Map(
        parts.map((part) => [
          part.partNumber,
          { source: part.source as Part['source'], supplierCode: part.supplierCode },
        ]),
      ),
      received: await receivedOnOpenOrders(manager),
    });
    rejectOnProblems(problems);
    await upsertOpenOrders(manager, lines, today);
    return lines.length;
  },
};

export interface ImportUpload {
  kind: ImportKind;
  file: Buffer;
  fileName: string;
  actorEmail: string;
}

/** CSV imports: every row checked, then all written in one transaction or nothing at all. */
export class ImportsService {
  constructor(
    private readonly db: Database,
    private readonly today: () => IsoDate = plantToday,
  ) {}

  async import(upload: ImportUpload): Promise<ImportResult> {
    const table = readCsvTable(upload.file, IMPORT_LAYOUTS[upload.kind]);
    if (table.records.length === 0 && table.problems.length === 0) return { imported: 0 };
    return this.db.write(async (manager) => {
      const imported = await IMPORTERS[upload.kind](manager, table, this.today(), upload.actorEmail);
      await recordAudit(manager, {
        actorEmail: upload.actorEmail,
        action: 'import',
        entity: 'import',
        entityKey: upload.kind,
        changes: { kind: upload.kind, imported, fileName: upload.fileName },
      });
      return { imported };
    });
  }
}
