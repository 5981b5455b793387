import { z } from 'zod';
import { isoDateSchema } from './master-data';
import { DEMAND_SORT_PROPS, SORT_ORDERS } from '../domain/demand-table';

export const planQuerySchema = z.object({
  part: z.string().trim().min(1).max(40),
  from: isoDateSchema.optional(),
  to: isoDateSchema.optional(),
  format: z.enum(['json', 'csv']).default('json'),
});

export const demandQuerySchema = z.object({
  from: isoDateSchema.optional(),
  to: isoDateSchema.optional(),
  supplier: z.string().trim().min(1).max(20).optional(),
  format: z.enum(['json', 'csv']).default('json'),
});

export const planBucketSchema = z.object({
  date: z.string(),
  gross: z.number(),
  scheduledReceipts: z.number(),
  projectedAvailable: z.number(),
  net: z.number(),
  plannedReceipt: z.number(),
  plannedRelease: z.number(),
});
export type PlanBucketDto = z.infer<typeof planBucketSchema>;

export const planPartSchema = z.object({
  partNumber: z.string(),
  description: z.string(),
  uom: z.string(),
  source: z.string(),
  supplierCode: z.string().nullable(),
  leadTimeDays: z.number(),
  packQty: z.number(),
  onHand: z.number(),
  safetyStock: z.number(),
  lowLevelCode: z.number().int(),
});

export const planResponseSchema = z.object({
  part: planPartSchema,
  buckets: z.array(planBucketSchema),
  pastDue: z.array(z.object({ date: z.string(), qty: z.number() })),
});
export type PlanResponse = z.infer<typeof planResponseSchema>;

/** One bought part's demand over the horizon; `byDay` or `byBucket` adds the breakdown. */
const demandRowSchema = z.object({
  partNumber: z.string(),
  supplierCode: z.string().nullable(),
  /** Unit of measure of the row's quantities; totals across parts are per unit. */
  uom: z.string(),
  total: z.number(),
});

export const demandResponseSchema = z.object({
  days: z.array(z.string()),
  rows: z.array(demandRowSchema.extend({ byDay: z.record(z.string(), z.number()) })),
  /** The last day of the build sequence still to build: no demand is known after it; null with no sequence. */
  sequenceEnds: z.string().nullable(),
});
export type DemandResponse = z.infer<typeof demandResponseSchema>;

/** Most rows one page of the demand table may ask for. */
export const MAX_DEMAND_PAGE_SIZE = 500;

export const demandTableQuerySchema = demandQuerySchema.omit({ format: true }).extend({
  bucket: z.enum(['day', 'week']).default('day'),
  q: z.string().trim().max(40).optional(),
  sort: z.enum(DEMAND_SORT_PROPS).optional(),
  order: z.enum(SORT_ORDERS).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(MAX_DEMAND_PAGE_SIZE).default(50),
});

const unitTotalSchema = z.object({ uom: z.string(), qty: z.number() });

export const demandTableResponseSchema = z.object({
  buckets: z.array(z.object({ key: z.string(), days: z.array(z.string()) })),
  rows: z.array(demandRowSchema.extend({ byBucket: z.record(z.string(), z.number()) })),
  page: z.number().int(),
  pageSize: z.number().int(),
  matched: z.number().int().meta({ description: 'Rows the search lets through, on every page.' }),
  partsWithDemand: z.number().int().meta({ description: 'Rows before the search.' }),
  exactMatch: z
    .string()
    .nullable()
    .meta({ description: 'The part whose number is the search text (or the only match), else null.' }),
  bucketTotals: z.record(z.string(), z.array(unitTotalSchema)),
  grandTotal: z.array(unitTotalSchema),
  units: z.array(z.string()).meta({ description: 'Units of measure among the matched rows, most used first.' }),
  stacks: z
    .record(
      z.string(),
      z.array(
        z.object({
          name: z.string().nullable(),
          values: z.array(z.number()),
          total: z.number(),
          rest: z.number().int(),
        }),
      ),
    )
    .meta({
      description:
        'Chart bands per unit of measure, by supplier (or by part for one supplier), largest first; a band with rest > 0 sums that many smaller ones.',
    }),
  sequenceEnds: z.string().nullable(),
});
export type DemandTableResponse = z.infer<typeof demandTableResponseSchema>;

export const forecastMailRequestSchema = z.object({
  supplier: z.string().trim().min(1).max(20),
  from: isoDateSchema.optional(),
  to: isoDateSchema.optional(),
});
export type ForecastMailRequest = z.infer<typeof forecastMailRequestSchema>;

export const forecastMailResponseSchema = z.object({
  to: z.string(),
  subject: z.string(),
  parts: z.number().int(),
  from: z.string(),
  until: z.string(),
});
export type ForecastMailResponse = z.infer<typeof forecastMailResponseSchema>;
