import { z } from 'zod';

/** Columns of the receiving board, in the order goods move through the dock. */
export const DOCK_COLUMNS = ['expected', 'at_dock', 'counted', 'to_line'] as const;
export const dockColumnSchema = z.enum(DOCK_COLUMNS);
export type DockColumn = z.infer<typeof dockColumnSchema>;

/** Release states the board shows: every open one, and received ones on the day they were received. */
export const DOCK_STATUSES = ['sent', 'confirmed', 'exception', 'shipped', 'partial', 'received'] as const;
export const dockStatusSchema = z.enum(DOCK_STATUSES);
export type DockStatus = z.infer<typeof dockStatusSchema>;

/** Release states whose open lines can be received. */
export const RECEIVABLE_STATUSES: readonly DockStatus[] = ['sent', 'confirmed', 'exception', 'shipped', 'partial'];

export const dockLineSchema = z.object({
  id: z.number().int().meta({ description: 'The release line id (receipts are posted against it).' }),
  partNumber: z.string(),
  description: z.string(),
  uom: z.string(),
  qty: z.number().meta({
    description: 'What this card brings of the line: the quantity on the ship notice, or the part not yet shipped.',
  }),
  receivedQty: z.number().meta({ description: 'What was counted in against this card.' }),
  open: z.boolean(),
  cardNumber: z.string().optional().meta({ description: 'The kanban card that asked for this line.' }),
  needDate: z.string(),
  hazardous: z.boolean(),
  unNumber: z.string().nullable().optional(),
  hazardClass: z.string().nullable().optional(),
  sdsUrl: z.string().nullable().optional(),
  unitWeightKg: z.number().nullable().optional(),
  heavyLift: z.boolean().optional(),
});
export type DockLine = z.infer<typeof dockLineSchema>;

export const dockAttachmentSchema = z.object({
  id: z.number().int(),
  fileName: z.string(),
  mimeType: z.string(),
  sizeBytes: z.number().int(),
  uploadedBy: z.string(),
  uploadedAt: z.string(),
});
export type DockAttachment = z.infer<typeof dockAttachmentSchema>;

export const DOCK_CARD_KINDS = ['shipment', 'expected'] as const;

/**
 * One card of the board: a shipment (one ship notice of a release), or the lines of a release not
 * yet shipped that are expected on one day. `id` is the card's key (`shipment-12`,
 * `expected-5-2026-12-04`).
 */
export const dockItemSchema = z.object({
  id: z.string(),
  kind: z.enum(DOCK_CARD_KINDS),
  releaseId: z.number().int(),
  shipNoticeId: z.number().int().nullable(),
  number: z.string().meta({ description: 'The release number.' }),
  supplierCode: z.string(),
  supplierName: z.string(),
  column: dockColumnSchema,
  status: dockStatusSchema.meta({ description: 'The status of the release the card belongs to.' }),
  shipDate: z.string().nullable(),
  arrivalDate: z.string().meta({
    description:
      'When the dock expects the goods: ship date plus transit working days for a shipment, the answered arrival or need date otherwise.',
  }),
  expectedToday: z.boolean().meta({ description: 'The goods are expected today and some are still to come.' }),
  overdue: z.boolean().meta({ description: 'The expected day has passed and lines are still open.' }),
  carrier: z.string().nullable(),
  trackingNumber: z.string().nullable(),
  hazardous: z.boolean().meta({ description: 'Any line’s part is hazardous.' }),
  lines: z.array(dockLineSchema),
  attachments: z.array(dockAttachmentSchema),
});
export type DockItem = z.infer<typeof dockItemSchema>;

export const dockItemParamsSchema = z.object({ id: z.string().max(40) });
export const dockReleaseParamsSchema = z.object({ id: z.coerce.number().int().positive() });
export const dockAttachmentParamsSchema = z.object({ id: z.coerce.number().int().positive() });

/** Body of PATCH /api/dock/items/:id. */
export const moveDockItemRequestSchema = z.object({ column: dockColumnSchema });

/** Packing slips: photos and PDFs only, recognised by their first bytes. */
export const ATTACHMENT_TYPES = ['image/jpeg', 'image/png', 'image/webp', 'application/pdf'] as const;
export type AttachmentType = (typeof ATTACHMENT_TYPES)[number];
export const ATTACHMENT_MAX_BYTES = 10 * 1024 * 1024;
