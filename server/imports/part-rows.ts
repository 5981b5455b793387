import { IMPORT_DEFAULTS, partRowSchema } from '../../shared/schemas/imports';
import { partSchema, type Part, type Supplier } from '../../shared/schemas/master-data';
import type { CsvTable } from './csv';
import { cellOrKept, isComplete, KeyRegister, parseRows, RowProblems } from './import-rows';

const DEFAULTS = IMPORT_DEFAULTS.parts;

/**
 * Checks a parts file: suppliers must already exist (a parts file cannot create them); returns the
 * records to upsert by part number.
 */
export function checkPartRows(
  table: CsvTable,
  suppliers: ReadonlyMap<string, Supplier>,
  existing: ReadonlyMap<string, Part>,
): { parts: Part[]; problems: RowProblems } {
  const problems = new RowProblems(table.problems);
  const partNumbers = new KeyRegister(problems, 'part_number', (partNumber) => `part '${partNumber}'`);
  const parts: Part[] = [];

  for (const row of parseRows(table.records, table.columns, partRowSchema, problems)) {
    const { part_number: partNumber, supplier_code: supplierCode } = row.values;
    const unique = partNumber === undefined || partNumbers.claim(partNumber, row.line);
    const knownSupplier = supplierCode === undefined || suppliers.has(supplierCode);
    if (!knownSupplier) problems.add(row.line, 'supplier_code', `unknown supplier '${supplierCode}'`);
    if (!unique || !knownSupplier || !isComplete(row)) continue;

    const cells = row.values;
    const kept = existing.get(cells.part_number);
    const source = cells.source;
    const supplier = cellOrKept<string | null>(
      row,
      'supplier_code',
      cells.supplier_code,
      kept?.supplierCode,
      DEFAULTS.supplier_code,
    );
    // An empty lead time on a bought part means "the supplier's quoted lead time".
    const supplierLeadTime = source === 'buy' && supplier ? (suppliers.get(supplier)?.leadTimeDays ?? 0) : 0;
    const record: Part = {
      partNumber: cells.part_number,
      description: cells.description,
      uom: cellOrKept(row, 'uom', cells.uom, kept?.uom, DEFAULTS.uom),
      source,
      supplierCode: supplier,
      leadTimeDays: cellOrKept(row, 'lead_time_days', cells.lead_time_days, kept?.leadTimeDays, supplierLeadTime),
      packQty: cellOrKept(row, 'pack_qty', cells.pack_qty, kept?.packQty, DEFAULTS.pack_qty),
      // Stock is counted, not master data: an empty cell keeps an existing part's count.
      onHand: cells.on_hand ?? kept?.onHand ?? 0,
      replenishment: cellOrKept<Part['replenishment']>(
        row,
        'replenishment',
        cells.replenishment,
        kept?.replenishment,
        DEFAULTS.replenishment,
      ),
      safetyStock: cellOrKept(row, 'safety_stock', cells.safety_stock, kept?.safetyStock, DEFAULTS.safety_stock),
      pointOfUse: cellOrKept<string | null>(
        row,
        'point_of_use',
        cells.point_of_use,
        kept?.pointOfUse,
        DEFAULTS.point_of_use,
      ),
      hazardous: cellOrKept<boolean>(row, 'hazardous', cells.hazardous, kept?.hazardous, DEFAULTS.hazardous),
      unNumber: cellOrKept<string | null>(row, 'un_number', cells.un_number, kept?.unNumber, DEFAULTS.un_number),
      hazardClass: cellOrKept<string | null>(
        row,
        'hazard_class',
        cells.hazard_class,
        kept?.hazardClass,
        DEFAULTS.hazard_class,
      ),
      sdsUrl: cellOrKept<string | null>(row, 'sds_url', cells.sds_url, kept?.sdsUrl, DEFAULTS.sds_url),
      unitWeightKg: cellOrKept<number | null>(
        row,
        'unit_weight_kg',
        cells.unit_weight_kg,
        kept?.unitWeightKg,
        DEFAULTS.unit_weight_kg,
      ),
      heavyLift: cellOrKept<boolean>(row, 'heavy_lift', cells.heavy_lift, kept?.heavyLift, DEFAULTS.heavy_lift),
    };
    const checked = partSchema.safeParse(record);
    if (checked.success) parts.push(checked.data);
    else problems.addDomainIssues(row.line, checked.error.issues, record);
  }
  return { parts, problems };
}
