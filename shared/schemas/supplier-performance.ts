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

/** One supplier in one month of requested date. Rates are fractions 0–1, null when there is nothing to measure. */
export const supplierMonthPerformanceSchema = z.object({
  supplierCode: z.string(),
  supplierName: z.string(),
  month: z.string().meta({ description: 'YYYY-MM of the arrival date first asked for.' }),
  lines: z.number().int().meta({
    description:
      'Release lines of releases not cancelled whose on-time window (requested date − early, + late tolerance) has closed.',
  }),
  onTimeLines: z.number().int().meta({
    description: 'Lines whose usable receipts all came inside the on-time window around the date first asked for.',
  }),
  earlyLines: z.number().int().meta({ description: 'Lines with usable goods received before the window.' }),
  lateLines: z
    .number()
    .int()
    .meta({ description: 'Lines with usable goods received after the window, or none at all.' }),
  onTimeRate: z.number().nullable(),
  requestedQty: z.number().meta({ description: 'Σ quantity first asked for (never the confirmed one).' }),
  filledQty: z.number().meta({ description: 'Σ usable quantity received, capped at each line’s requested quantity.' }),
  fillRate: z.number().nullable(),
  promisedLines: z
    .number()
    .int()
    .meta({ description: 'Lines the supplier answered whose promised window has closed.' }),
  promiseKeptLines: z.number().int().meta({
    description: 'Of those, lines received in the confirmed quantity inside the window around the confirmed arrival.',
  }),
  promiseKeptRate: z.number().nullable(),
  releases: z
    .number()
    .int()
    .meta({ description: 'Releases sent whose earliest requested date is in the month and has passed.' }),
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
