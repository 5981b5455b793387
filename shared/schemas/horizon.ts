import { z } from 'zod';
import { isoDateSchema } from './master-data';

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

export const demandResponseSchema = z.object({
  days: z.array(z.string()),
  rows: z.array(
    z.object({
      partNumber: z.string(),
      supplierCode: z.string().nullable(),
      /** Unit of measure of the row's quantities; totals across parts are per unit. */
      uom: z.string(),
      total: z.number(),
      byDay: z.record(z.string(), z.number()),
    }),
  ),
  /** The last day of the build sequence still to build: no demand is known after it; null with no sequence. */
  sequenceEnds: z.string().nullable(),
});
export type DemandResponse = z.infer<typeof demandResponseSchema>;

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
