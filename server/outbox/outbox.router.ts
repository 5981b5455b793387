import { Router } from 'express';
import { z } from 'zod';
import {
  capturedAttachmentParamsSchema,
  capturedMailSchema,
  outboxHealthSchema,
  outboxMessageParamsSchema,
  outboxMessageSchema,
} from '../../shared/schemas/outbox';
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
    path: '/dev/mail/:id/attachments/:index',
    summary: 'One file attached to a captured message, as a download',
    access: ['admin'],
    params: capturedAttachmentParamsSchema,
    produces: ['application/octet-stream'],
    handler: ({ params, res }) => {
      if (!fakeSmtp) throw new NotFoundError('The embedded mail server is not running; SMTP_URL points elsewhere.');
      const file = fakeSmtp.attachment(params.id, params.index);
      if (!file) throw new NotFoundError('No such attachment among the captured mail.');
      const fallback = file.fileName.replace(/[^\x20-\x7e]/g, '_').replace(/[\\"]/g, '_');
      res.status(200);
      // Always a download: a captured file is untrusted and must not render on the app's origin.
      res.setHeader('Content-Type', 'application/octet-stream');
      res.setHeader(
        'Content-Disposition',
        `attachment; filename="${fallback}"; filename*=UTF-8''${encodeURIComponent(file.fileName)}`,
      );
      res.setHeader('X-Content-Type-Options', 'nosniff');
      res.send(file.content);
      return undefined;
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

  defineRoute(router, deps, {
    method: 'get',
    path: '/outbox/health',
    summary: 'How many notices wait and fail, and since when the oldest failing one fails',
    access: ['admin'],
    response: outboxHealthSchema,
    handler: () => services.outbox.health(),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/outbox/:id/send-again',
    summary: 'Try a waiting or failing notice again at once (a sent one is left as it is)',
    access: ['admin'],
    params: outboxMessageParamsSchema,
    response: outboxMessageSchema,
    handler: ({ params }) => services.outbox.sendAgain(params.id),
  });

  return router;
}
