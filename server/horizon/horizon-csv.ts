import { toCsv } from '../../shared/domain/csv';
import type { DemandResponse, PlanResponse } from '../../shared/schemas/horizon';

/** Demand as CSV: one row per part, one column per day, then the total. */
export function demandToCsv(demand: DemandResponse): string {
  const fields = ['part_number', 'supplier_code', ...demand.days, 'total'];
  const data = demand.rows.map((row) => [
    row.partNumber,
    row.supplierCode ?? '',
    ...demand.days.map((day) => row.byDay[day] ?? 0),
    row.total,
  ]);
  return toCsv(fields, data);
}

/** One part's gross-to-net record as CSV, one row per working day, past-due releases last. */
export function planToCsv(plan: PlanResponse): string {
  const fields = [
    'date',
    'gross',
    'scheduled_receipts',
    'projected_available',
    'net',
    'planned_receipt',
    'planned_release',
  ];
  const data: (string | number)[][] = plan.buckets.map((bucket) => [
    bucket.date,
    bucket.gross,
    bucket.scheduledReceipts,
    bucket.projectedAvailable,
    bucket.net,
    bucket.plannedReceipt,
    bucket.plannedRelease,
  ]);
  for (const release of plan.pastDue) data.push([`past due ${release.date}`, '', '', '', '', '', release.qty]);
  return toCsv(fields, data);
}
