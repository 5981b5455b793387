import { z } from 'zod';
import { OVER_ACTIONS } from '../domain/over-receipt';

/** What a count at the dock can differ by; null (or omitted) when the count matched. */
export const DISCREPANCIES = ['short', 'over', 'damaged', 'wrong_part'] as const;
export const discrepancySchema = z.enum(DISCREPANCIES);
export type Discrepancy = z.infer<typeof discrepancySchema>;

/**
 * Discrepancies whose counted quantity is recorded but never reaches usable on-hand: damaged goods
 * and the wrong part cannot feed the line, so they count neither as stock nor against the line.
 */
export const UNUSABLE_DISCREPANCIES: readonly Discrepancy[] = ['damaged', 'wrong_part'];

/** True when the counted quantity of a receipt with this discrepancy goes into on-hand. */
export function addsToOnHand(discrepancy: Discrepancy | null | undefined): boolean {
  return !discrepancy || !UNUSABLE_DISCREPANCIES.includes(discrepancy);
}

/** Header that makes POST /api/receipts safe to repeat. */

export const MAX_RECEIPT_QTY = 1_000_000_000;

/** Body of POST /api/receipts. */
export const receiptRequestSchema = z
  .object({
    releaseLineId: z.number().int().positive(),
    qty: z
      .number()
      .min(0)
      .max(MAX_RECEIPT_QTY)
      .meta({ description: 'Counted quantity, in the part’s unit of measure.' }),
    discrepancy: discrepancySchema.nullable().optional().meta({
      description:
        '`damaged` and `wrong_part` are recorded but not added to usable on-hand (nor to the line’s received quantity).',
    }),
    note: z.string().trim().max(1000).nullable().optional(),
    shipNoticeId: z.number().int().positive().nullable().optional().meta({
      description:
        'The shipment (ship notice) being counted; null for goods that came without one. Omitted: the oldest notice of the line with something still to count, else none.',
    }),
    close: z.boolean().optional().meta({
      description:
        'Short counts: true closes the line short (nothing more will come); omitted or false keeps it open for the rest.',
    }),
    overAction: z
      .enum(OVER_ACTIONS)
      .nullable()
      .optional()
      .meta({
        description:
          'Required when the line’s received quantity with this count passes ordered × (1 + the supplier’s over tolerance), refused otherwise (422). ' +
          '`keep`: the excess over the ordered quantity is applied to the supplier’s other open lines of the part, first due first; ' +
          '`return`: it goes back to the supplier (a `return` stock movement) and the line closes at its ordered quantity.',
      }),
  })
  .superRefine((body, context) => {
    // A count of nothing is only news when it says what went wrong (nothing came: short).
    if (body.qty === 0 && !body.discrepancy) {
      context.addIssue({
        code: 'custom',
        path: ['qty'],
        message: 'must be greater than 0, or give the discrepancy (e.g. short)',
      });
    }
  });
export type ReceiptRequest = z.infer<typeof receiptRequestSchema>;

/** Kept excess applied to another open line of the same part and supplier. */
export const excessShareSchema = z.object({
  releaseLineId: z.number().int(),
  releaseNumber: z.string(),
  /** When the line was expected at the dock. */
  due: z.string(),
  qty: z.number(),
  closed: z.boolean().meta({ description: 'The share covered all that was still to come: the line closed.' }),
});
export type ExcessShare = z.infer<typeof excessShareSchema>;

export const receiptSchema = z.object({
  id: z.number().int(),
  releaseLineId: z.number().int(),
  releaseNumber: z.string(),
  partNumber: z.string(),
  qty: z.number(),
  shipNoticeId: z.number().int().nullable().meta({ description: 'The shipment this count belongs to.' }),
  discrepancy: discrepancySchema.nullable(),
  note: z.string().nullable(),
  final: z.boolean().meta({ description: 'The clerk marked the receipt final (close: true).' }),
  addedToOnHand: z
    .number()
    .meta({ description: 'The part of qty that went into usable on-hand (less any returned to the supplier).' }),
  overAction: z
    .enum(OVER_ACTIONS)
    .nullable()
    .meta({ description: 'The clerk’s choice for an over receipt; null otherwise.' }),
  excessQty: z
    .number()
    .meta({ description: 'Of qty, what lay above the ordered quantity of an over receipt; 0 otherwise.' }),
  returnedQty: z.number().meta({ description: 'Excess sent back to the supplier (overAction return).' }),
  appliedTo: z
    .array(excessShareSchema)
    .meta({ description: 'Kept excess applied to other open lines, first due first (overAction keep).' }),
  onHandAfter: z.number(),
  userEmail: z.string(),
  receivedAt: z.string(),
});
export type Receipt = z.infer<typeof receiptSchema>;

/** Response of POST /api/receipts, identical when the same Idempotency-Key is replayed. */
export const receiptResponseSchema = z.object({
  receipt: receiptSchema,
  onHand: z.number().meta({ description: 'The part’s on-hand after this receipt.' }),
});
export type ReceiptResponse = z.infer<typeof receiptResponseSchema>;

/** Query of GET /api/receipts/over-check: what a count would do before it is recorded. */
export const overCheckQuerySchema = z.object({
  releaseLineId: z.coerce.number().int().positive(),
  qty: z.coerce.number().min(0).max(MAX_RECEIPT_QTY),
});
export type OverCheckQuery = z.infer<typeof overCheckQuerySchema>;

export const overCheckResponseSchema = z.object({
  releaseLineId: z.number().int(),
  orderedQty: z.number(),
  receivedQty: z.number(),
  overTolerancePct: z.number(),
  limitQty: z.number().meta({ description: 'The most the line may receive in all without a choice.' }),
  over: z.boolean(),
  excessQty: z.number(),
  keep: z.object({
    appliedTo: z.array(excessShareSchema.omit({ closed: true }).extend({ closes: z.boolean() })),
    unallocatedQty: z.number().meta({ description: 'Kept excess no open line takes; it stays on this line.' }),
  }),
});
export type OverCheckResponse = z.infer<typeof overCheckResponseSchema>;
