import { Router } from 'express';
import { z } from 'zod';
import { capturedMailSchema, outboxMessageSchema } from '../../shared/schemas/outbox';
import { NotFoundError } from '../errors';
import { defineRoute, type RouteDeps } from '../http/route';
import type { Services } from '../services';
import type { FakeSmtp } from './fake-smtp';

export function createOutboxRouter(services: Services, deps: RouteDeps, fakeSmtp: FakeSmtp | null): Router {
  const router = Router();

  defineRoute(router, deps, {
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

  defineRoute(router, deps, {
    method: 'get',
    path: '/outbox',
    summary: 'The newest 200 outgoing notices and their delivery state',
    access: ['admin'],
    response: z.array(outboxMessageSchema),
    handler: () => services.outbox.list(),
  });

  return router;
}
