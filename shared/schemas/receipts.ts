import { z } from 'zod';

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
      description: 'The clerk marks this receipt final: the line closes even if less than ordered arrived.',
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
  addedToOnHand: z.number().meta({ description: 'The part of qty that went into usable on-hand.' }),
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
