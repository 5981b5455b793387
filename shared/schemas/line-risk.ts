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
  /** Quantity of the part this unit lacks (whole for pieces, sets and pairs). */
  lackQty: z.number(),
  /** The made subassembly that needs the part, when the unit lacks it through one. */
  via: z.string().nullable(),
});

/** What to do about a short part; `release` is not an alarm. */
export const SHORTAGE_ACTIONS = ['expedite', 'loop', 'count', 'release'] as const;
export const shortageActionSchema = z.enum(SHORTAGE_ACTIONS).meta({
  description:
    'expedite: short inside the supplier lead time (only an expedite or a resequence saves the units); loop: the kanban loop has too few cards or cannot keep up; count: on-hand is negative or due a count; release: later than the lead time — the normal release covers it if sent by releaseBy.',
});

/** Units listed per short part in a report; the rest come from the slots route. */
export const SLOTS_PER_SHORTAGE = 5;
/** Units at risk listed in a report; the rest come from the units route. */
export const UNITS_PER_REPORT = 100;

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
  shortQty: z.number().meta({ description: 'All that must arrive over the horizon: the sum of needBy.' }),
  slotsAtRisk: z.array(slotAtRiskSchema).meta({
    description: `The first ${SLOTS_PER_SHORTAGE} units that lack the part, in build order; slotsAtRiskCount says how many in all.`,
  }),
  slotsAtRiskCount: z.number().int(),
  action: shortageActionSchema,
  needBy: z.array(z.object({ date: z.string(), qty: z.number() })).meta({
    description: 'How much must arrive by each date (beyond the earlier entries) to keep every unit building.',
  }),
  /** For `release`: the last day the normal release can go out and arrive in time. */
  releaseBy: z.string().nullable(),
  leadTimeDays: z.number().int(),
  /** For `loop`: cards in circulation against those the loop needs. */
  loop: z.object({ activeCards: z.number().int(), recommendedCards: z.number().int() }).nullable(),
  description: z.string(),
  uom: z.string(),
  supplierCode: z.string().nullable(),
  supplierName: z.string().nullable(),
  hazardous: z.boolean(),
  onHand: z.number(),
  /** Confirmed open quantity expected inside the horizon. */
  firmReceiptQty: z.number(),
  awaitingConfirmation: z
    .object({ qty: z.number(), releaseNumbers: z.array(z.string()) })
    .nullable()
    .meta({
      description:
        'Open quantity on releases sent to the supplier and not yet confirmed (unanswered, or answered with changes the buyer has still to accept). It is not counted as supply until confirmed, but the request is out: chase the confirmation before expediting again.',
    }),
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
      /** The made subassembly that needs the part, when the unit lacks it through one. */
      via: z.string().nullable(),
      /** The day the part is needed: the build date, or the subassembly's start. */
      neededOn: z.string(),
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
  /** The first units at risk, in build order; unitsAtRiskCount says how many in all. */
  unitsAtRisk: z.array(unitAtRiskSchema),
  unitsAtRiskCount: z.number().int(),
  shortages: shortagesResponseSchema,
});
export type LineRiskReport = z.infer<typeof lineRiskReportSchema>;

export const pageQuerySchema = lineRiskQuerySchema.extend({
  offset: z.coerce.number().int().min(0).default(0),
  limit: z.coerce.number().int().min(1).max(500).default(100),
});

export const unitsPageSchema = z.object({ total: z.number().int(), units: z.array(unitAtRiskSchema) });
export const slotsPageSchema = z.object({ total: z.number().int(), slots: z.array(slotAtRiskSchema) });
export type SlotsPageDto = z.infer<typeof slotsPageSchema>;
export type SlotAtRiskDto = z.infer<typeof slotAtRiskSchema>;
