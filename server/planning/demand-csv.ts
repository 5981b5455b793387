import Papa from 'papaparse';
import type { DemandResponse } from '../../shared/schemas/planning';

/** Demand as CSV: one row per part, one column per day, then the total. */
export function demandToCsv(demand: DemandResponse): string {
  const fields = ['part_number', 'supplier_code', ...demand.days, 'total'];
  const data = demand.rows.map((row) => [row.partNumber, row.supplierCode ?? '', ...demand.days.map((day) => row.byDay[day] ?? 0), row.total]);
  return Papa.unparse({ fields, data }, { newline: '\r\n' });
}
