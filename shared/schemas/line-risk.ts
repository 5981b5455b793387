import { z } from 'zod';
import { isoDateSchema } from './master-data';

/** Horizon of GET /api/shortages and GET /api/line-risk; both ends optional (server defaults). */
export const lineRiskQuerySchema = z.object({
  from: isoDateSchema.optional(),
  to: isoDateSchema.optional(),
});

/** One slot of the build sequence, named as on the line. */
export const unitRefSchema = z.object({
  date: z.string(),
  sequence: z.number().int(),
  serial: z.string(),
  model: z.string(),
});

export const slotAtRiskSchema = unitRefSchema.extend({
  /** Quantity of the part this unit lacks. */
  lackQty: z.number(),
});

/** Move `candidate` into `slot`: every part the candidate needs is free at that moment. */
export const resequenceOptionSchema = z.object({
  slot: unitRefSchema,
  candidate: unitRefSchema,
});
export type ResequenceOptionDto = z.infer<typeof resequenceOptionSchema>;

/** One bought part that stops units; the first four fields are the published ones. */
export const shortageSchema = z.object({
  partNumber: z.string(),
  firstShortDate: z.string(),
  shortQty: z.number(),
  slotsAtRisk: z.array(slotAtRiskSchema),
  description: z.string(),
  uom: z.string(),
  supplierCode: z.string().nullable(),
  supplierName: z.string().nullable(),
  hazardous: z.boolean(),
  onHand: z.number(),
  /** Confirmed open quantity expected inside the horizon. */
  firmReceiptQty: z.number(),
  /** Working days after today up to firstShortDate; 0 means today. */
  daysUntilImpact: z.number().int(),
  inFrozenWindow: z.boolean(),
  rescue: z.object({
    expedite: z.object({ qty: z.number(), needBy: z.string() }),
    resequence: resequenceOptionSchema.nullable(),
  }),
});
export type ShortageDto = z.infer<typeof shortageSchema>;

export const shortagesResponseSchema = z.array(shortageSchema);

export const unitAtRiskSchema = unitRefSchema.extend({
  lacks: z.array(
    z.object({
      partNumber: z.string(),
      qty: z.number(),
      /** True: missing with what is free now; false: missing once the units ahead are served. */
      now: z.boolean(),
    }),
  ),
  resequence: resequenceOptionSchema.nullable().optional(),
});
export type UnitAtRiskDto = z.infer<typeof unitAtRiskSchema>;

/** Everything the planner's Line risk screen shows for one horizon. */
export const lineRiskReportSchema = z.object({
  from: z.string(),
  to: z.string(),
  today: z.string(),
  /** Working days of the horizon. */
  days: z.array(z.string()),
  frozenWindowDays: z.number().int(),
  frozenUntil: z.string().nullable(),
  unitsInHorizon: z.number().int(),
  unitsBuilt: z.number().int(),
  unitsAtRisk: z.array(unitAtRiskSchema),
  shortages: shortagesResponseSchema,
});
export type LineRiskReport = z.infer<typeof lineRiskReportSchema>;
