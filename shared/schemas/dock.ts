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
  id: z.number().int(),
  partNumber: z.string(),
  description: z.string(),
  uom: z.string(),
  qty: z.number().meta({ description: 'Quantity requested.' }),
  confirmedQty: z
    .number()
    .nullable()
    .meta({ description: 'Quantity the supplier confirmed; the line is ordered for this when set.' }),
  receivedQty: z.number(),
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

/** One card of the board: a release with its lines. `id` is the release id. */
export const dockItemSchema = z.object({
  id: z.number().int(),
  number: z.string(),
  supplierCode: z.string(),
  supplierName: z.string(),
  column: dockColumnSchema,
  status: dockStatusSchema,
  needDate: z.string().meta({ description: 'Earliest need date of the open lines (of all lines once none is open).' }),
  expectedToday: z.boolean().meta({ description: 'The need date is today.' }),
  overdue: z.boolean().meta({ description: 'The need date has passed and lines are still open.' }),
  carrier: z.string().nullable(),
  trackingNumber: z.string().nullable(),
  hazardous: z.boolean().meta({ description: 'Any line’s part is hazardous.' }),
  lines: z.array(dockLineSchema),
  attachments: z.array(dockAttachmentSchema),
});
export type DockItem = z.infer<typeof dockItemSchema>;

export const dockItemParamsSchema = z.object({ id: z.coerce.number().int().positive() });
export const dockAttachmentParamsSchema = z.object({ id: z.coerce.number().int().positive() });

/** Body of PATCH /api/dock/items/:id. */
export const moveDockItemRequestSchema = z.object({ column: dockColumnSchema });

/** Packing slips: photos and PDFs only, recognised by their first bytes. */
export const ATTACHMENT_TYPES = ['image/jpeg', 'image/png', 'image/webp', 'application/pdf'] as const;
export type AttachmentType = (typeof ATTACHMENT_TYPES)[number];
export const ATTACHMENT_MAX_BYTES = 10 * 1024 * 1024;
