import { z } from 'zod';
import { versionField } from './version';
import { CARD_EVENTS, CARD_STATES } from '../domain/card-cycle';

export const LOOP_KINDS = ['supplier', 'supermarket'] as const;
export const loopKindSchema = z.enum(LOOP_KINDS).meta({
  description: '`supplier`: cards go to an outside supplier; `supermarket`: cards go to an in-house maker.',
});
export type LoopKind = z.infer<typeof loopKindSchema>;

export const cardStateSchema = z.enum(CARD_STATES);
export const cardEventSchema = z.enum(CARD_EVENTS);

/** The sizing window is capped so a loop can never ask the engine for an unreasonably long plan. */
export const MAX_SIZING_WINDOW_DAYS = 120;

export const loopProposalSchema = z
  .object({
    action: z.enum(['add', 'pull', 'none']),
    count: z.number().int().nonnegative(),
  })
  .meta({ description: 'Cards to add or pull so that active cards equal the recommendation.' });
export type LoopProposal = z.infer<typeof loopProposalSchema>;

export const cardStateCountsSchema = z.object({
  full: z.number().int().nonnegative(),
  empty: z.number().int().nonnegative(),
  ordered: z.number().int().nonnegative(),
  shipped: z.number().int().nonnegative(),
});
export type CardStateCounts = z.infer<typeof cardStateCountsSchema>;

/** One row of GET /api/kanban/loops: the published fields first, then what the screens need beside them. */
export const kanbanLoopSchema = z.object({
  ...versionField,
  partNumber: z.string(),
  supplierCode: z.string().nullable(),
  containerQty: z.number(),
  safetyFactor: z.number(),
  averageDailyDemand: z.number().meta({ description: 'Mean gross demand per working day over the sizing window.' }),
  replenishmentDays: z.number().meta({ description: 'T in working days.' }),
  recommendedCards: z.number().int().nonnegative(),
  activeCards: z.number().int().nonnegative(),
  id: z.number().int(),
  description: z.string(),
  kind: loopKindSchema,
  pointOfUse: z.string().nullable(),
  uom: z.string(),
  peakDailyDemand: z.number(),
  safetyDays: z.number(),
  safetyUnits: z.number(),
  sizingWindowDays: z.number().int(),
  /** First and last working day of the sizing window. */
  windowFrom: z.string(),
  windowTo: z.string(),
  exactCards: z.number(),
  formula: z.string(),
  proposal: loopProposalSchema,
  cardStates: cardStateCountsSchema,
  /** False when the part no longer uses kanban; such a loop recommends 0 cards until its cards are pulled. */
  partIsKanban: z.boolean(),
});
export type KanbanLoop = z.infer<typeof kanbanLoopSchema>;

export const kanbanLoopsQuerySchema = z.object({
  supplier: z.string().trim().min(1).max(20).optional(),
});

export const kanbanLoopIdParamsSchema = z.object({ id: z.coerce.number().int().positive() });

/** Body of PATCH /api/kanban/loops/:id; at least one field. */
export const updateKanbanLoopRequestSchema = z
  .object({
    containerQty: z.number().positive().max(1_000_000),
    // A fraction of the demand over the replenishment time: 0.1 = 10 %. Above 1 (twice the demand
    // in circulation) is far more likely a percentage typed as a whole number than a plan
    // (common practice, no source).
    safetyFactor: z.number().min(0).max(1, 'must be at most 1 (100 %); 0.1 = 10 %'),
    safetyDays: z.number().min(0).max(365),
    safetyUnits: z.number().min(0).max(10_000_000),
    sizingWindowDays: z.number().int().min(1).max(MAX_SIZING_WINDOW_DAYS),
  })
  .partial()
  .refine((body) => Object.values(body).some((value) => value !== undefined), {
    message: 'give at least one of containerQty, safetyFactor, safetyDays, safetyUnits, sizingWindowDays',
  });
export type UpdateKanbanLoopRequest = z.infer<typeof updateKanbanLoopRequestSchema>;

/** Body of POST /api/kanban/loops/:id/accept. */
export const acceptKanbanLoopRequestSchema = z.object({
  expectedRecommended: z
    .number()
    .int()
    .nonnegative()
    .optional()
    .meta({ description: 'The recommendation the buyer saw; when it has changed since, nothing is changed (409).' }),
});
export type AcceptKanbanLoopRequest = z.infer<typeof acceptKanbanLoopRequestSchema>;

export const acceptKanbanLoopResponseSchema = kanbanLoopSchema.extend({
  added: z.array(z.string()),
  retired: z.array(z.string()),
  stillToPull: z.number().int().nonnegative().meta({
    description: 'Cards still to pull once they come back in hand (ordered or shipped cards are never pulled).',
  }),
});
export type AcceptKanbanLoopResponse = z.infer<typeof acceptKanbanLoopResponseSchema>;

export const cardScanSchema = z.object({
  id: z.number().int(),
  event: cardEventSchema,
  fromState: cardStateSchema,
  toState: cardStateSchema,
  userEmail: z.string().nullable(),
  scannedAt: z.string(),
});
export type CardScan = z.infer<typeof cardScanSchema>;

export const kanbanCardSchema = z.object({
  id: z.number().int(),
  loopId: z.number().int(),
  partNumber: z.string(),
  cardNumber: z.string(),
  cardIndex: z.number().int(),
  state: cardStateSchema,
  stateChangedAt: z.string(),
  retired: z.boolean(),
  retiredAt: z.string().nullable(),
  releaseLineId: z.number().int().nullable(),
});
export type KanbanCard = z.infer<typeof kanbanCardSchema>;

/** A card in GET /api/kanban/loops/:id/cards, with its latest scans (newest first). */
export const kanbanCardWithScansSchema = kanbanCardSchema.extend({
  scans: z.array(cardScanSchema),
});
export type KanbanCardWithScans = z.infer<typeof kanbanCardWithScansSchema>;

export const cardNumberParamsSchema = z.object({ cardNumber: z.string().max(40) });

/** Body of POST /api/kanban/scans: the number as a keyboard-wedge scanner types it. */
export const cardScanRequestSchema = z.object({
  cardNumber: z.string().max(40),
  event: cardEventSchema.optional().meta({
    description:
      'Omitted: `consume` for a full card (the signal at the line). Only `consume` is recorded by a scan; `release`, `ship` and `receive` are refused with 409 (they come from release lines, ship notices and receipts).',
  }),
});
export type CardScanRequest = z.infer<typeof cardScanRequestSchema>;

export const cardScanResponseSchema = z.object({
  card: kanbanCardSchema,
  scan: cardScanSchema,
});
export type CardScanResponse = z.infer<typeof cardScanResponseSchema>;

export const cardLabelsQuerySchema = z.object({
  cards: z.enum(['all', 'active']).default('active'),
});

/** Everything one printed card label shows. */
export const cardLabelSchema = z.object({
  loopId: z.number().int(),
  kind: loopKindSchema,
  cardNumber: z.string(),
  cardIndex: z.number().int(),
  /** "card {position} of {count}" among the printed set, ordered by card index. */
  position: z.number().int(),
  count: z.number().int(),
  retired: z.boolean(),
  partNumber: z.string(),
  description: z.string(),
  pointOfUse: z.string().nullable(),
  supplierCode: z.string().nullable(),
  supplierName: z.string().nullable(),
  containerQty: z.number(),
  uom: z.string(),
  hazardous: z.boolean(),
  qrSvg: z.string().meta({ description: 'SVG markup of a QR code holding the card number.' }),
});
export type CardLabel = z.infer<typeof cardLabelSchema>;

/** GET /api/kanban/cards/:cardNumber: one card, what its loop is for, and its whole scan log. */
export const kanbanCardDetailSchema = kanbanCardWithScansSchema.extend({
  kind: loopKindSchema,
  description: z.string(),
  pointOfUse: z.string().nullable(),
  supplierCode: z.string().nullable(),
});
export type KanbanCardDetail = z.infer<typeof kanbanCardDetailSchema>;
