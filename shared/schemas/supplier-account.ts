import { z } from 'zod';
import { isoDateSchema } from './master-data';
import { OVER_ACTIONS } from '../domain/over-receipt';
import { DISCREPANCIES } from './receipts';

export const supplierCodeParamsSchema = z.object({ code: z.string().trim().min(1).max(20) });

/** Query of GET /api/suppliers/{code}/forecast; the plan's horizon when from/to are left out. */
export const supplierForecastQuerySchema = z.object({
  from: isoDateSchema.optional(),
  to: isoDateSchema.optional(),
  format: z.enum(['json', 'csv']).default('json'),
});

export const forecastZoneSchema = z.enum(['firm', 'planned', 'forecast']);

export const supplierForecastSchema = z.object({
  supplierCode: z.string(),
  supplierName: z.string(),
  today: z.string(),
  frozenUntil: z.string().nullable().meta({ description: 'Last day of the plant’s frozen window; null when none.' }),
  days: z.array(z.string()),
  sequenceEnds: z
    .string()
    .nullable()
    .meta({ description: 'Last day of the build sequence: no demand is known after it; null with no sequence.' }),
  parts: z.array(
    z.object({
      partNumber: z.string(),
      description: z.string(),
      uom: z.string(),
      leadTimeDays: z.number().int(),
      plannedUntil: z.string().meta({ description: 'Last day inside the part’s lead time.' }),
      total: z.number(),
      days: z.array(z.object({ date: z.string(), qty: z.number(), zone: forecastZoneSchema })),
    }),
  ),
});
export type SupplierForecast = z.infer<typeof supplierForecastSchema>;

export const receivingClaimSchema = z.object({
  receiptId: z.number().int(),
  releaseNumber: z.string(),
  partNumber: z.string(),
  lineQty: z.number(),
  qty: z.number(),
  discrepancy: z.enum(DISCREPANCIES),
  overAction: z
    .enum(OVER_ACTIONS)
    .nullable()
    .meta({ description: 'For `over`: the dock kept the excess against later open lines, or returned it.' }),
  excessQty: z.number().meta({ description: 'For `over`: the quantity above the line’s ordered quantity.' }),
  note: z.string().nullable(),
  receivedAt: z.string(),
});
export type ReceivingClaim = z.infer<typeof receivingClaimSchema>;
export const receivingClaimsResponseSchema = z.array(receivingClaimSchema);
