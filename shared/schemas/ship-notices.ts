import { z } from 'zod';
import { isoDateSchema } from './master-data';

/** One line of a shipment: which release line, and how much of it is on the truck. */
export const shipNoticeLineSchema = z.object({
  lineId: z.number().int(),
  partNumber: z.string(),
  qty: z.number(),
});

/** A ship notice (ASN): one shipment of a release, with its carrier, tracking and arrival. */
export const shipNoticeSchema = z.object({
  id: z.number().int(),
  releaseNumber: z.string(),
  shipDate: z.string(),
  /** Ship date plus the supplier's transit days: the day the dock expects the shipment. */
  arrivalDate: z.string(),
  carrier: z.string(),
  trackingNumber: z.string(),
  createdAt: z.string(),
  lines: z.array(shipNoticeLineSchema),
});
export type ShipNotice = z.infer<typeof shipNoticeSchema>;

const text = (field: string, max: number) =>
  z.string().trim().min(1, `${field} is required`).max(max, `${field} is longer than ${max} characters`);

/** Body of POST /api/releases/:number/ship-notices and POST /api/shipping/:token. */
export const shipNoticeRequestSchema = z
  .object({
    lines: z
      .array(
        z.object({
          lineId: z.number().int().positive(),
          qty: z.number().gt(0, 'the quantity must be more than 0').max(1_000_000_000),
        }),
      )
      .min(1, 'name at least one line')
      .max(1000),
    carrier: text('the carrier', 60),
    trackingNumber: text('the tracking number', 60),
    shipDate: isoDateSchema,
  })
  .refine((body) => new Set(body.lines.map((line) => line.lineId)).size === body.lines.length, {
    path: ['lines'],
    message: 'name each line once',
  });
export type ShipNoticeRequest = z.infer<typeof shipNoticeRequestSchema>;

export const shipNoticeResponseSchema = z.object({
  notice: shipNoticeSchema,
  /** The release's status after the notice: `shipped` when nothing is left to ship, else `partial`. */
  releaseStatus: z.string(),
});
export type ShipNoticeResponse = z.infer<typeof shipNoticeResponseSchema>;

export const shippingTokenParamsSchema = z.object({ token: z.string().max(200) });

/** What the supplier's ship-notice form needs: each line with what is still to ship. */
export const shippingViewSchema = z.object({
  releaseNumber: z.string(),
  supplierName: z.string(),
  status: z.string(),
  /** The plant's today: the earliest ship date a notice may give. */
  today: z.string(),
  transitDays: z.number().int(),
  lines: z.array(
    z.object({
      id: z.number().int(),
      partNumber: z.string(),
      description: z.string(),
      uom: z.string(),
      qty: z.number(),
      /** Already on earlier notices. */
      shippedQty: z.number(),
      /** The most a notice may still carry: the open quantity plus the supplier's over tolerance. */
      maxQty: z.number(),
      needDate: z.string(),
      arrivalDate: z.string().nullable(),
    }),
  ),
  notices: z.array(shipNoticeSchema),
});
export type ShippingView = z.infer<typeof shippingViewSchema>;
