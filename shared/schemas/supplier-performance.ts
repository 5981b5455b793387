import { z } from 'zod';
import { isYearMonth } from '../domain/supplier-performance';

/** Longest range GET /api/suppliers/performance answers, in calendar months. */
export const MAX_PERFORMANCE_MONTHS = 24;
/** Months shown when the range is not given: the current month and the five before it. */
export const DEFAULT_PERFORMANCE_MONTHS = 6;

const yearMonthSchema = z.string().refine(isYearMonth, 'a month as YYYY-MM');
const supplierCodeSchema = z.string().trim().min(1).max(20);

/** Query of GET /api/suppliers/performance; both ends optional (server defaults to the last six months). */
export const performanceQuerySchema = z.object({
  from: yearMonthSchema.optional().meta({ description: 'First month, YYYY-MM (month of the need date).' }),
  to: yearMonthSchema.optional().meta({ description: 'Last month, YYYY-MM; at most 24 months after from.' }),
  supplier: supplierCodeSchema.optional(),
});
export type PerformanceQuery = z.infer<typeof performanceQuerySchema>;

/** One supplier in one month of need date. Rates are fractions 0–1, null when there is nothing to measure. */
export const supplierMonthPerformanceSchema = z.object({
  supplierCode: z.string(),
  supplierName: z.string(),
  month: z.string().meta({ description: 'YYYY-MM of the lines’ need date.' }),
  lines: z
    .number()
    .int()
    .meta({ description: 'Release lines due in the month (need date passed), of releases not cancelled.' }),
  onTimeLines: z
    .number()
    .int()
    .meta({ description: 'Lines whose usable received quantity reached the ordered quantity by the need date.' }),
  onTimeRate: z.number().nullable(),
  orderedQty: z.number().meta({ description: 'Σ confirmed quantity, else requested quantity.' }),
  filledQty: z
    .number()
    .meta({ description: 'Σ usable quantity received by the need date, capped at each line’s ordered quantity.' }),
  fillRate: z.number().nullable(),
  releases: z
    .number()
    .int()
    .meta({ description: 'Releases sent whose earliest need date is in the month and has passed.' }),
  confirmedReleases: z
    .number()
    .int()
    .meta({ description: 'Of those, releases the supplier answered (confirmed or proposed changes).' }),
  unansweredReleases: z.number().int(),
  confirmationHoursMedian: z.number().nullable(),
  confirmationHoursMean: z.number().nullable(),
});
export type SupplierMonthPerformanceDto = z.infer<typeof supplierMonthPerformanceSchema>;

export const supplierPerformanceResponseSchema = z.array(supplierMonthPerformanceSchema);
