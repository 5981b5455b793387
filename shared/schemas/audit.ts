import { z } from 'zod';
import { isoDateSchema } from './master-data';

/** Most events one request returns; narrow the filters to see older ones. */
export const AUDIT_LIMIT = 1000;

export const auditQuerySchema = z
  .object({
    /** What kind of record changed (part, supplier, bom, sequence, release, receipt, stock, user…). */
    kind: z.string().trim().max(40).optional(),
    /** E-mail of who made the change; part of it is enough. */
    user: z.string().trim().max(254).optional(),
    /** The changed record's key (part number, serial, release number…); part of it is enough. */
    subject: z.string().trim().max(80).optional(),
    /** First and last day (UTC, inclusive) of the changes shown. */
    from: isoDateSchema.optional(),
    to: isoDateSchema.optional(),
    format: z.enum(['json', 'csv']).optional(),
  })
  .refine((query) => !query.from || !query.to || query.from <= query.to, {
    path: ['to'],
    message: 'the last day is before the first',
  });
export type AuditQuery = z.infer<typeof auditQuerySchema>;

export const auditEventSchema = z.object({
  id: z.number().int(),
  at: z.string(),
  actorEmail: z.string().nullable(),
  action: z.string(),
  kind: z.string(),
  subject: z.string(),
  changes: z.record(z.string(), z.unknown()).nullable(),
  /** The changes in one line: "field: from → to" where both were recorded. */
  summary: z.string(),
});
export type AuditEvent = z.infer<typeof auditEventSchema>;

export const auditListSchema = z.object({
  events: z.array(auditEventSchema),
  /** True when more events matched than were returned. */
  truncated: z.boolean(),
});
export type AuditList = z.infer<typeof auditListSchema>;
