import { z } from 'zod';
import { isoDateSchema } from './master-data';
import { plainText } from './text';

/** A unit of the sequence: planned, started (its kit went to the line) or built (its parts were backflushed). */
export const UNIT_STATUSES = ['planned', 'started', 'built'] as const;
export type UnitStatus = (typeof UNIT_STATUSES)[number];

const serialSchema = z.string().trim().min(1).max(40);

export const buildRequestSchema = z.object({ serial: serialSchema });

export const serialParamsSchema = z.object({ serial: serialSchema });

/** One part's movement of a build: negative when consumed, positive when a reversal puts it back. */
export const buildMovementSchema = z.object({ partNumber: z.string(), qty: z.number() });

export const buildResponseSchema = z.object({
  serial: z.string(),
  status: z.enum(UNIT_STATUSES),
  builtAt: z.string().nullable(),
  movements: z.array(buildMovementSchema),
});
export type BuildResponse = z.infer<typeof buildResponseSchema>;

export const reverseBuildQuerySchema = z.object({
  reason: plainText(200).meta({ description: 'Why the build is undone, for the ledger and the audit trail.' }),
});

export const closeDayRequestSchema = z.object({ date: isoDateSchema });

export const closeDayResponseSchema = z.object({
  date: z.string(),
  /** Serials reported built by this close, in build order; units built before are not repeated. */
  built: z.array(z.string()),
  movements: z.array(buildMovementSchema),
});
export type CloseDayResponse = z.infer<typeof closeDayResponseSchema>;

/** One component to bring to the line for a unit. */
export const kitLineSchema = z.object({
  partNumber: z.string(),
  description: z.string(),
  uom: z.string(),
  qty: z.number(),
  source: z.string(),
  hazardous: z.boolean(),
  unNumber: z.string().nullable().optional(),
  hazardClass: z.string().nullable().optional(),
  sdsUrl: z.string().nullable().optional(),
  unitWeightKg: z.number().nullable().optional(),
  heavyLift: z.boolean().optional(),
});

export const kitSchema = z.object({
  serial: z.string(),
  model: z.string(),
  modelDescription: z.string(),
  date: z.string(),
  sequence: z.number().int(),
  status: z.enum(UNIT_STATUSES),
  /** Components grouped by point of use, in point-of-use order; `null` holds those with none set. */
  pointsOfUse: z.array(z.object({ pointOfUse: z.string().nullable(), lines: z.array(kitLineSchema) })),
});
export type Kit = z.infer<typeof kitSchema>;

export const dayKitsQuerySchema = z.object({ date: isoDateSchema });

export const closeDaySettingsSchema = z.object({
  /** `HH:MM` at which the end-of-shift job closes the day, or null when it is off (the default). */
  closeDayTime: z
    .string()
    .regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'a time as HH:MM, 24-hour clock')
    .nullable(),
});
export type CloseDaySettings = z.infer<typeof closeDaySettingsSchema>;
