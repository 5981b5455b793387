import { z } from 'zod';
import { DEFAULT_FROZEN_WINDOW_DAYS } from '../domain/line-risk';
import { isoDateSchema } from './master-data';
import { UNIT_STATUSES } from './builds';
import { versionField } from './version';

export { DEFAULT_FROZEN_WINDOW_DAYS };

/** Limits of the planner's sequence settings. */
export const FROZEN_WINDOW_MAX_DAYS = 15;
export const DAILY_CAPACITY_MAX = 500;
export const DEFAULT_DAILY_CAPACITY = 24;
/** Working days the board shows when the caller names no end date. */
export const DEFAULT_BOARD_WORKING_DAYS = 10;
export const MAX_BOARD_WORKING_DAYS = 60;
/** More units than this on one day is a typo, whatever the capacity. */
const MAX_UNITS_PER_DAY = 1000;
const MAX_DAYS_PER_CHANGE = 31;

const serialSchema = z.string().trim().min(1).max(40);
const modelSchema = z.string().trim().min(1).max(40);

/** A flag sent as a query string: `true`/`1` or `false`/`0`. */
const queryFlag = z
  .enum(['true', 'false', '1', '0'])
  .optional()
  .transform((value) => value === 'true' || value === '1');

export const sequenceSettingsSchema = z.object({
  frozenWindowDays: z.number().int().min(0).max(FROZEN_WINDOW_MAX_DAYS).meta({
    description:
      'Working days from today (today is day 1 when it is a working day) that only a deliberate planner change may touch; 0 freezes nothing.',
  }),
  dailyCapacity: z
    .number()
    .int()
    .min(1)
    .max(DAILY_CAPACITY_MAX)
    .meta({ description: 'Units the line builds per working day.' }),
});
export type SequenceSettings = z.infer<typeof sequenceSettingsSchema>;
export const versionedSequenceSettingsSchema = sequenceSettingsSchema.extend(versionField);
export type VersionedSequenceSettings = z.infer<typeof versionedSequenceSettingsSchema>;

export const sequenceQuerySchema = z.object({
  from: isoDateSchema.optional(),
  to: isoDateSchema.optional(),
  days: z.coerce
    .number()
    .int()
    .min(1)
    .max(MAX_BOARD_WORKING_DAYS)
    .optional()
    .meta({ description: 'Working days to show when `to` is not given (default 10).' }),
});
export type SequenceQuery = z.infer<typeof sequenceQuerySchema>;

export const sequenceUnitSchema = z.object({
  id: z.number().int(),
  date: z.string(),
  sequence: z.number().int(),
  model: z.string(),
  serial: z.string(),
  qty: z.number().int(),
  status: z.enum(UNIT_STATUSES),
  builtAt: z.string().nullable(),
});
export type SequenceUnit = z.infer<typeof sequenceUnitSchema>;

export const sequenceDaySchema = z.object({
  date: z.string(),
  working: z.boolean().meta({ description: 'False for a non-working day that still holds units (move them off).' }),
  frozen: z.boolean().meta({ description: 'Inside the frozen window, or before today.' }),
  past: z.boolean().meta({ description: 'Before today: its units count as built.' }),
  capacity: z.number().int(),
  load: z.number().int().meta({ description: 'Units planned: the sum of qty over the day’s slots.' }),
  units: z.array(sequenceUnitSchema),
  version: z.string().meta({
    description:
      'Version of the day’s order; send it in `basedOn` when reordering, to get 409 `stale` if someone changed the day first.',
  }),
});
export type SequenceDay = z.infer<typeof sequenceDaySchema>;

export const sequenceModelSchema = z.object({ partNumber: z.string(), description: z.string() });
export type SequenceModel = z.infer<typeof sequenceModelSchema>;

export const sequenceBoardSchema = z.object({
  from: z.string(),
  to: z.string(),
  today: z.string(),
  /** Last day of the frozen window, or null when it is 0 days long. */
  frozenUntil: z.string().nullable(),
  frozenWindowDays: z.number().int(),
  dailyCapacity: z.number().int(),
  days: z.array(sequenceDaySchema),
  models: z.array(sequenceModelSchema),
});
export type SequenceBoard = z.infer<typeof sequenceBoardSchema>;

export const allowFrozenSchema = z.boolean().optional().meta({
  description: 'Set to change days inside the frozen window on purpose; without it such a change is refused (409).',
});

/** Body of PUT /api/sequence/days: the full new order of each listed day. */
export const resequenceRequestSchema = z
  .object({
    days: z
      .array(
        z.object({
          date: isoDateSchema,
          serials: z.array(serialSchema).max(MAX_UNITS_PER_DAY),
        }),
      )
      .min(1)
      .max(MAX_DAYS_PER_CHANGE),
    allowFrozen: allowFrozenSchema,
    basedOn: z
      .array(z.object({ date: isoDateSchema, version: z.string().max(40) }))
      .max(MAX_DAYS_PER_CHANGE * 2)
      .optional()
      .meta({
        description:
          'The versions of the days (those listed and those units leave) the board showed; a day changed since answers 409 `stale` with the current days and who changed them.',
      }),
  })
  .superRefine((body, context) => {
    const dates = new Set<string>();
    const serials = new Map<string, string>();
    body.days.forEach((day, dayIndex) => {
      if (dates.has(day.date))
        context.addIssue({ code: 'custom', path: ['days', dayIndex, 'date'], message: `${day.date} is listed twice` });
      dates.add(day.date);
      day.serials.forEach((serial, serialIndex) => {
        const first = serials.get(serial);
        if (first !== undefined) {
          context.addIssue({
            code: 'custom',
            path: ['days', dayIndex, 'serials', serialIndex],
            message: `serial '${serial}' is listed twice (first on ${first})`,
          });
        } else {
          serials.set(serial, day.date);
        }
      });
    });
  });
export type ResequenceRequest = z.infer<typeof resequenceRequestSchema>;

export const resequenceResponseSchema = z.object({
  days: z.array(sequenceDaySchema).meta({ description: 'Every day whose order changed, renumbered 1..n.' }),
});
export type ResequenceResponse = z.infer<typeof resequenceResponseSchema>;

export const addSequenceUnitRequestSchema = z.object({
  date: isoDateSchema,
  model: modelSchema,
  serial: serialSchema,
  qty: z.number().int().min(1).max(1000).default(1),
  allowFrozen: allowFrozenSchema,
});
export type AddSequenceUnitRequest = z.input<typeof addSequenceUnitRequestSchema>;

export const sequenceSerialParamsSchema = z.object({ serial: serialSchema });

export const removeSequenceUnitQuerySchema = z.object({ allowFrozen: queryFlag });
