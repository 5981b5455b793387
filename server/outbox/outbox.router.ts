import { Router, type Response } from 'express';
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
      sendAsDownload(res, file);
      return undefined;
    },
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/outbox/:id/mail',
    summary: 'One notice as written (text, HTML and files), to read as its recipient does',
    access: ['admin'],
    params: outboxMessageParamsSchema,
    response: capturedMailSchema,
    handler: ({ params }) => services.outbox.mail(params.id),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/outbox/:id/attachments/:index',
    summary: 'One file attached to a notice, as a download',
    access: ['admin'],
    params: capturedAttachmentParamsSchema,
    produces: ['application/octet-stream'],
    handler: async ({ params, res }) => {
      const file = await services.outbox.attachment(params.id, params.index);
      if (!file) throw new NotFoundError(`Notice ${params.id} has no attachment ${params.index}.`);
      sendAsDownload(res, file);
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

/** Always a download: a file sent by mail is untrusted and must not render on the app's origin. */
function sendAsDownload(res: Response, file: { fileName: string; content: Buffer }): void {
  const fallback = file.fileName.replace(/[^\x20-\x7e]/g, '_').replace(/[\\"]/g, '_');
  res.status(200);
  res.setHeader('Content-Type', 'application/octet-stream');
  res.setHeader(
    'Content-Disposition',
    `attachment; filename="${fallback}"; filename*=UTF-8''${encodeURIComponent(file.fileName)}`,
  );
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.send(file.content);
}
