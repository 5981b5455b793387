import { IMPORT_DEFAULTS, supplierRowSchema } from '../../shared/schemas/imports';
import { supplierSchema, type Supplier } from '../../shared/schemas/master-data';
import type { CsvTable } from './csv';
import { cellOrKept, isComplete, KeyRegister, parseRows, RowProblems } from './import-rows';

const DEFAULTS = IMPORT_DEFAULTS.suppliers;

/** Checks a suppliers file against the suppliers on file; returns the records to upsert by code. */
export function checkSupplierRows(
  table: CsvTable,
  existing: ReadonlyMap<string, Supplier>,
): { suppliers: Supplier[]; problems: RowProblems } {
  const problems = new RowProblems(table.problems);
  const codes = new KeyRegister(problems, 'code', (code) => `supplier '${code}'`);
  const suppliers: Supplier[] = [];

  for (const row of parseRows(table.records, table.columns, supplierRowSchema, problems)) {
    const unique = row.values.code === undefined || codes.claim(row.values.code, row.line);
    if (!unique || !isComplete(row)) continue;
    const cells = row.values;
    const kept = existing.get(cells.code);
    const record: Supplier = {
      code: cells.code,
      name: cells.name,
      email: cells.email,
      leadTimeDays: cells.lead_time_days,
      cycleDays: cellOrKept<number | null>(row, 'cycle_days', cells.cycle_days, kept?.cycleDays, DEFAULTS.cycle_days),
      deliveriesPerCycle: cellOrKept<number | null>(
        row,
        'deliveries_per_cycle',
        cells.deliveries_per_cycle,
        kept?.deliveriesPerCycle,
        DEFAULTS.deliveries_per_cycle,
      ),
      deliveryDelay: cellOrKept<number | null>(
        row,
        'delivery_delay',
        cells.delivery_delay,
        kept?.deliveryDelay,
        DEFAULTS.delivery_delay,
      ),
      transitDays: cellOrKept(row, 'transit_days', cells.transit_days, kept?.transitDays, DEFAULTS.transit_days),
      deliveryWeekdays: cellOrKept(
        row,
        'delivery_weekdays',
        cells.delivery_weekdays,
        kept?.deliveryWeekdays,
        DEFAULTS.delivery_weekdays,
      ),
      overTolerancePct: cellOrKept(
        row,
        'over_tolerance_pct',
        cells.over_tolerance_pct,
        kept?.overTolerancePct,
        DEFAULTS.over_tolerance_pct,
      ),
      earlyToleranceDays: cellOrKept(
        row,
        'early_tolerance_days',
        cells.early_tolerance_days,
        kept?.earlyToleranceDays,
        DEFAULTS.early_tolerance_days,
      ),
      lateToleranceDays: cellOrKept(
        row,
        'late_tolerance_days',
        cells.late_tolerance_days,
        kept?.lateToleranceDays,
        DEFAULTS.late_tolerance_days,
      ),
    };
    const checked = supplierSchema.safeParse(record);
    if (checked.success) suppliers.push(checked.data);
    else problems.addDomainIssues(row.line, checked.error.issues, record);
  }
  return { suppliers, problems };
}
