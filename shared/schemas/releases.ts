import { z } from 'zod';
import { isoDateSchema } from './master-data';
import { outboxMessageSchema } from './outbox';
import { shipNoticeSchema } from './ship-notices';
import { versionField } from './version';

/** Life of a release: draft → sent → confirmed | exception → shipped → partial → received, or cancelled. */
export const RELEASE_STATUSES = [
  'draft',
  'sent',
  'confirmed',
  'exception',
  'shipped',
  'partial',
  'received',
  'cancelled',
] as const;
export const releaseStatusSchema = z.enum(RELEASE_STATUSES);
export type ReleaseStatus = z.infer<typeof releaseStatusSchema>;

/**
 * `kanban`: an empty card asked for the line; `plan`: a planned release of a scheduled part did;
 * `open_order`: the order was already open with the supplier when the plant started with Cardloop.
 */
export const RELEASE_LINE_ORIGINS = ['kanban', 'plan', 'open_order'] as const;
export const releaseLineOriginSchema = z.enum(RELEASE_LINE_ORIGINS);
export type ReleaseLineOrigin = z.infer<typeof releaseLineOriginSchema>;

/** A release line: the published fields first, then what the screens need beside them. */
export const releaseLineSchema = z.object({
  id: z.number().int(),
  partNumber: z.string(),
  qty: z.number(),
  needDate: z.string(),
  description: z.string(),
  uom: z.string(),
  hazardous: z.boolean(),
  origin: releaseLineOriginSchema,
  /** Number of the kanban card that asked for the line; null for a planned line. */
  cardNumber: z.string().nullable(),
  confirmedQty: z.number().nullable(),
  shipDate: z.string().nullable(),
  receivedQty: z.number(),
  closed: z.boolean(),
  /** What the release first asked; qty and needDate change when the buyer accepts another answer. */
  requestedQty: z.number(),
  requestedDate: z.string(),
  /** Needed sooner than the supplier's lead time or delivery days allow. */
  expedite: z.boolean(),
  /** When the answered shipment arrives: ship date plus the supplier's transit days. */
  arrivalDate: z.string().nullable(),
  /** Ship dates that arrive inside the on-time window of the need date. */
  earliestShipDate: z.string(),
  latestShipDate: z.string(),
});
export type ReleaseLine = z.infer<typeof releaseLineSchema>;

export const releaseSchema = z.object({
  number: z.string(),
  supplierCode: z.string(),
  status: releaseStatusSchema,
  lines: z.array(releaseLineSchema),
  id: z.number().int(),
  supplierName: z.string(),
  releaseDate: z.string(),
  sentAt: z.string().nullable(),
  confirmedAt: z.string().nullable(),
  carrier: z.string().nullable(),
  trackingNumber: z.string().nullable(),
  supplierNote: z.string().nullable(),
  /** The latest e-mail of this release and whether the mail server took it; null before any. */
  notice: outboxMessageSchema.nullable(),
  /** The shipments the supplier announced, oldest first. */
  shipNotices: z.array(shipNoticeSchema),
});
export type Release = z.infer<typeof releaseSchema>;

export const runReleasesRequestSchema = z.object({ date: isoDateSchema });

export const runReleasesResponseSchema = z.object({
  date: z.string(),
  /** Releases this run created (and sent); empty when the day was already released. */
  releases: z.array(releaseSchema),
  /** Numbers of the releases an earlier run already made for this date. */
  existing: z.array(z.string()),
});
export type RunReleasesResponse = z.infer<typeof runReleasesResponseSchema>;

export const releasesQuerySchema = z.object({
  status: releaseStatusSchema.optional(),
  /** Only the releases of this release date. */
  date: isoDateSchema.optional(),
});
export type ReleasesQuery = z.infer<typeof releasesQuerySchema>;

export const releaseNumberParamsSchema = z.object({ number: z.string().trim().min(1).max(40) });

/** `HH:MM` on the 24-hour clock, plant time. */
export const jobTimeSchema = z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'a time as HH:MM, 00:00 to 23:59');

export const releaseJobSettingsRequestSchema = z.object({ jobTime: jobTimeSchema });

export const releaseJobSettingsSchema = z.object({
  jobTime: jobTimeSchema,
  /** The last day the scheduled job ran, or null when it never has. */
  lastRunDate: z.string().nullable(),
  ...versionField,
});
export type ReleaseJobSettings = z.infer<typeof releaseJobSettingsSchema>;

// --- Supplier confirmation (public, behind the e-mailed link) ---

export const confirmTokenParamsSchema = z.object({ token: z.string().max(200) });

export const confirmationLineSchema = z.object({
  id: z.number().int(),
  partNumber: z.string(),
  qty: z.number(),
  needDate: z.string(),
  description: z.string(),
  uom: z.string(),
  hazardous: z.boolean(),
  expedite: z.boolean(),
  /** Ship dates that arrive inside the on-time window of the need date, transit counted. */
  earliestShipDate: z.string(),
  latestShipDate: z.string(),
});
export type ConfirmationLine = z.infer<typeof confirmationLineSchema>;

/** Body of GET /api/confirm/:token, and of GET /api/releases/{number}/confirmation for a signed-in supplier. */
export const confirmationSchema = z.object({
  release: z.object({
    number: z.string(),
    supplierCode: z.string(),
    lines: z.array(confirmationLineSchema),
    supplierName: z.string(),
    plantName: z.string(),
    releaseDate: z.string(),
    /** Working days the supplier's goods spend on the road to the plant. */
    transitDays: z.number().int(),
  }),
  /** The plant's today: the earliest ship date an answer may give. */
  today: z.string(),
  /** When the e-mailed link stops working; null for a signed-in supplier, who needs no link. */
  expiresAt: z.string().nullable(),
});
export type Confirmation = z.infer<typeof confirmationSchema>;

const optionalText = (max: number) => z.string().trim().max(max).optional();

export const confirmAnswerSchema = z
  .object({
    lines: z
      .array(
        z.object({
          id: z.number().int().positive(),
          confirmedQty: z.number().min(0).max(1_000_000_000),
          shipDate: isoDateSchema,
        }),
      )
      .min(1)
      .max(1000),
    note: optionalText(2000),
    carrier: optionalText(60),
    trackingNumber: optionalText(60),
  })
  .refine((answer) => new Set(answer.lines.map((line) => line.id)).size === answer.lines.length, {
    path: ['lines'],
    message: 'answer each line once',
  });
export type ConfirmAnswer = z.infer<typeof confirmAnswerSchema>;

export const confirmResultSchema = z.object({
  status: z.enum(['confirmed', 'exception']),
  number: z.string(),
  /** Lines whose answer differs from the request. */
  changedLines: z.number().int().nonnegative(),
  /** Opens the ship-notice form of this release (GET/POST /api/shipping/:token); reusable until it expires. */
  shippingToken: z.string(),
});
export type ConfirmResult = z.infer<typeof confirmResultSchema>;
