import { z } from 'zod';
import { isoDateSchema, partNumberSchema } from './master-data';
import { plainText } from './text';

/** Every way on-hand changes; on-hand is the sum of a part's movements. */
export const STOCK_MOVEMENT_KINDS = [
  'opening',
  'receipt',
  'backflush',
  'build-reversal',
  'scrap',
  'count',
  'return',
] as const;
export type StockMovementKind = (typeof STOCK_MOVEMENT_KINDS)[number];

/** Largest quantity one count or scrap may name; more is a typo. */
export const MAX_STOCK_QTY = 1_000_000_000;

export const stockMovementSchema = z.object({
  id: z.number().int(),
  at: z.string(),
  kind: z.enum(STOCK_MOVEMENT_KINDS),
  /** Signed: positive adds to on-hand, negative takes away. */
  qty: z.number(),
  /** On-hand right after this movement, summed in date order. */
  balance: z.number(),
  userEmail: z.string().nullable(),
  reason: z.string().nullable(),
  refType: z.string().nullable(),
  ref: z.string().nullable(),
});
export type StockMovement = z.infer<typeof stockMovementSchema>;

export const stockMovementsQuerySchema = z.object({
  from: isoDateSchema.optional(),
  to: isoDateSchema.optional(),
});
export type StockMovementsQuery = z.infer<typeof stockMovementsQuerySchema>;

export const partNumberParamsSchema = z.object({ partNumber: partNumberSchema });

export const stockLedgerSchema = z.object({
  partNumber: z.string(),
  description: z.string(),
  uom: z.string(),
  /** On-hand before the first movement shown. */
  opening: z.number(),
  movements: z.array(stockMovementSchema),
  /** On-hand after the last movement shown. */
  closing: z.number(),
  /** On-hand now: the sum of every movement of the part. */
  onHand: z.number(),
  lastCountedAt: z.string().nullable(),
});
export type StockLedger = z.infer<typeof stockLedgerSchema>;

const reason = plainText(200);

export const stockCountRequestSchema = z.object({
  partNumber: partNumberSchema,
  counted: z.number().min(0).max(MAX_STOCK_QTY),
  reason: reason.optional(),
});
export type StockCountRequest = z.infer<typeof stockCountRequestSchema>;

export const stockScrapRequestSchema = z.object({
  partNumber: partNumberSchema,
  qty: z.number().positive().max(MAX_STOCK_QTY),
  reason,
});
export type StockScrapRequest = z.infer<typeof stockScrapRequestSchema>;

/** What a count or a scrap did: the movement and the on-hand after it. */
export const stockChangeSchema = z.object({
  partNumber: z.string(),
  movement: stockMovementSchema.nullable(),
  onHand: z.number(),
});
export type StockChange = z.infer<typeof stockChangeSchema>;

/** A part's stock at a glance, with the reasons to count it. */
export const stockItemSchema = z.object({
  partNumber: z.string(),
  description: z.string(),
  uom: z.string(),
  source: z.string(),
  supplierCode: z.string().nullable(),
  pointOfUse: z.string().nullable(),
  onHand: z.number(),
  lastCountedAt: z.string().nullable(),
  /** Negative on-hand: consumption ran ahead of a receipt; count it. */
  negative: z.boolean(),
  /** Not counted within the plant's count interval (or never). */
  countDue: z.boolean(),
});
export type StockItem = z.infer<typeof stockItemSchema>;
