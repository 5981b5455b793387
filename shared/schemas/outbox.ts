import { z } from 'zod';

export const capturedAttachmentSchema = z.object({
  fileName: z.string(),
  contentType: z.string(),
  sizeBytes: z.number().int(),
});
export type CapturedAttachment = z.infer<typeof capturedAttachmentSchema>;

export const capturedMailSchema = z.object({
  id: z.number().int(),
  to: z.string(),
  subject: z.string(),
  text: z.string(),
  html: z.string(),
  date: z.string(),
  /** Files sent with the message (inline images left out), in the order they came. */
  attachments: z.array(capturedAttachmentSchema),
});
export type CapturedMail = z.infer<typeof capturedMailSchema>;

export const OUTBOX_STATUSES = ['pending', 'sent', 'failing'] as const;

export const outboxMessageSchema = z.object({
  id: z.number().int(),
  to: z.string(),
  subject: z.string(),
  /** pending: not tried yet or due again; failing: the last attempt failed and it is retried on; sent. */
  status: z.enum(OUTBOX_STATUSES),
  /** What the notice is about, e.g. `release:R261202-FBS`. */
  ref: z.string().nullable(),
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  createdAt: z.string(),
  sentAt: z.string().nullable(),
  firstFailedAt: z.string().nullable(),
  /** When it is tried next; null once sent. */
  nextAttemptAt: z.string().nullable(),
});
export type OutboxMessage = z.infer<typeof outboxMessageSchema>;

export const outboxHealthSchema = z.object({
  pending: z.number().int(),
  failing: z.number().int(),
  /** When the oldest failing notice first failed; null when none fails. */
  failingSince: z.string().nullable(),
});
export type OutboxHealth = z.infer<typeof outboxHealthSchema>;

export const outboxMessageParamsSchema = z.object({ id: z.coerce.number().int().positive() });

export const capturedAttachmentParamsSchema = z.object({
  id: z.coerce.number().int().positive(),
  index: z.coerce.number().int().min(0),
});
