import { z } from 'zod';

export const capturedMailSchema = z.object({
  to: z.string(),
  subject: z.string(),
  text: z.string(),
  html: z.string(),
  date: z.string(),
});
export type CapturedMail = z.infer<typeof capturedMailSchema>;

export const outboxMessageSchema = z.object({
  id: z.number().int(),
  to: z.string(),
  subject: z.string(),
  status: z.enum(['pending', 'sent', 'failed']),
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  createdAt: z.string(),
  sentAt: z.string().nullable(),
});
export type OutboxMessage = z.infer<typeof outboxMessageSchema>;
