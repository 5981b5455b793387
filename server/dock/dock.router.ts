import { Router } from 'express';
import { z } from 'zod';
import {
  ATTACHMENT_MAX_BYTES,
  ATTACHMENT_TYPES,
  dockAttachmentParamsSchema,
  dockAttachmentSchema,
  dockItemParamsSchema,
  dockItemSchema,
  dockReleaseParamsSchema,
  moveDockItemRequestSchema,
} from '../../shared/schemas/dock';
import { defineRoute, type RouteDeps } from '../http/route';
import type { Services } from '../services';
import { READ_ROLES, RECEIVING_ROLES } from '../http/roles';
import { FILE_FIELD, receiveFile } from '../http/upload';

/** RFC 6266 inline disposition with an ASCII fallback name and the real one in RFC 8187 form. */
function inlineDisposition(fileName: string): string {
  const fallback = fileName.replace(/[^\x20-\x7e]/g, '_').replace(/[\\"]/g, '_');
  return `inline; filename="${fallback}"; filename*=UTF-8''${encodeURIComponent(fileName)}`;
}

/** The receiving board and its packing slips. */
export function createDockRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const { dock, attachments } = services;

  defineRoute(router, deps, {
    method: 'get',
    path: '/dock',
    summary:
      'The receiving board: one card per shipment (ship notice) and one per day on which lines not yet shipped are expected, of every open release; cards counted in today stay',
    access: READ_ROLES,
    response: z.array(dockItemSchema),
    handler: () => dock.list(),
  });

  defineRoute(router, deps, {
    method: 'patch',
    path: '/dock/items/:id',
    summary:
      'Move a card (by its key, e.g. shipment-12) to another column of the board (expected, at_dock, counted, to_line); a fully received card at the line stays there (409)',
    access: RECEIVING_ROLES,
    params: dockItemParamsSchema,
    body: moveDockItemRequestSchema,
    response: dockItemSchema,
    handler: ({ params, body, user }) => dock.move(params.id, body.column, user),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/dock/releases/:id/attachments',
    summary:
      `Attach a packing slip to a release: multipart/form-data field '${FILE_FIELD}', ${ATTACHMENT_TYPES.join(', ')} ` +
      `recognised by content (other files 415), at most ${ATTACHMENT_MAX_BYTES / 1024 / 1024} MB (413)`,
    access: RECEIVING_ROLES,
    params: dockReleaseParamsSchema,
    response: dockAttachmentSchema,
    status: 201,
    handler: async ({ params, req, res, user }) => {
      const file = await receiveFile(req, res, { maxBytes: ATTACHMENT_MAX_BYTES, what: 'the photo or PDF' });
      return attachments.add(params.id, file, user);
    },
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/dock/attachments/:id',
    summary: 'The packing slip file itself, with its content type, shown inline',
    access: READ_ROLES,
    params: dockAttachmentParamsSchema,
    produces: [...ATTACHMENT_TYPES],
    handler: async ({ params, res }) => {
      const { attachment, content } = await attachments.find(params.id);
      res.status(200);
      res.setHeader('Content-Type', attachment.mimeType);
      res.setHeader('Content-Length', String(attachment.sizeBytes));
      res.setHeader('Content-Disposition', inlineDisposition(attachment.fileName));
      res.setHeader('Cache-Control', 'private, max-age=3600');
      res.end(content);
      return undefined;
    },
  });

  return router;
}
