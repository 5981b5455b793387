import type { OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { capturedMailSchema, outboxMessageSchema, type OutboxMessage } from '../../shared/schemas/mail';
import { NotFoundError } from '../errors';
import { defineRoute } from '../http/route';
import type { FakeSmtp } from './fake-smtp';
import { OutboxMessageEntity } from './outbox-message.entity';

export function createMailRouter(dataSource: DataSource, fakeSmtp: FakeSmtp | null, registry: OpenAPIRegistry): Router {
  const router = Router();

  defineRoute(router, registry, {
    method: 'get',
    path: '/dev/mail',
    summary: 'Messages captured by the embedded fake SMTP server (only while it runs)',
    access: ['admin'],
    response: z.array(capturedMailSchema),
    handler: () => {
      if (!fakeSmtp) throw new NotFoundError('The embedded mail server is not running; SMTP_URL points elsewhere.');
      return fakeSmtp.messages;
    },
  });

  defineRoute(router, registry, {
    method: 'get',
    path: '/outbox',
    summary: 'The newest 200 outgoing notices and their delivery state',
    access: ['admin'],
    response: z.array(outboxMessageSchema),
    handler: async (): Promise<OutboxMessage[]> => {
      const rows = await dataSource.getRepository(OutboxMessageEntity).find({ order: { id: 'DESC' }, take: 200 });
      return rows.map((row) => ({
        id: row.id,
        to: row.to,
        subject: row.subject,
        status: row.status as OutboxMessage['status'],
        attempts: row.attempts,
        lastError: row.lastError,
        createdAt: row.createdAt,
        sentAt: row.sentAt,
      }));
    },
  });

  return router;
}
