import type { OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
import { createReadStream } from 'node:fs';
import { dirname, join } from 'node:path';
import { pipeline } from 'node:stream/promises';
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import {
  ATTACHMENT_MAX_BYTES,
  ATTACHMENT_TYPES,
  dockAttachmentParamsSchema,
  dockAttachmentSchema,
  dockItemParamsSchema,
  dockItemSchema,
  moveDockItemRequestSchema,
} from '../../shared/schemas/dock';
import { defineRoute } from '../http/route';
import { READ_ROLES, RECEIVING_ROLES } from '../http/roles';
import { ATTACHMENT_FIELD, receiveAttachmentFile } from './attachment-upload';
import { AttachmentsService } from './attachments.service';
import { DockService } from './dock.service';

/** RFC 6266 inline disposition with an ASCII fallback name and the real one in RFC 8187 form. */
function inlineDisposition(fileName: string): string {
  const fallback = fileName.replace(/[^\x20-\x7e]/g, '_').replace(/[\\"]/g, '_');
  return `inline; filename="${fallback}"; filename*=UTF-8''${encodeURIComponent(fileName)}`;
}

/** Files live beside the database (`<its folder>/attachments`), or under data/ for an in-memory one. */
function defaultAttachmentsDir(dataSource: DataSource): string {
  const database = dataSource.options.database;
  return typeof database === 'string' && database !== ':memory:'
    ? join(dirname(database), 'attachments')
    : join('data', 'attachments');
}

/** The receiving board and its packing slips; `attachmentsDir` is where the files are kept. */
export function createDockRouter(dataSource: DataSource, registry: OpenAPIRegistry, attachmentsDir?: string): Router {
  const router = Router();
  const dock = new DockService(dataSource);
  const attachments = new AttachmentsService(dataSource, attachmentsDir ?? defaultAttachmentsDir(dataSource));

  defineRoute(router, registry, {
    method: 'get',
    path: '/dock',
    summary:
      'The receiving board: every sent, confirmed, exception, shipped or partly received release, and those received today',
    access: READ_ROLES,
    response: z.array(dockItemSchema),
    handler: () => dock.list(),
  });

  defineRoute(router, registry, {
    method: 'patch',
    path: '/dock/items/:id',
    summary:
      'Move a release to another column of the board (expected, at_dock, counted, to_line); a fully received release at the line stays there (409)',
    access: RECEIVING_ROLES,
    params: dockItemParamsSchema,
    body: moveDockItemRequestSchema,
    response: dockItemSchema,
    handler: ({ params, body, user }) => dock.move(params.id, body.column, user),
  });

  defineRoute(router, registry, {
    method: 'post',
    path: '/dock/items/:id/attachments',
    summary:
      `Attach a packing slip to a release: multipart/form-data field '${ATTACHMENT_FIELD}', ${ATTACHMENT_TYPES.join(', ')} ` +
      `recognised by content (other files 415), at most ${ATTACHMENT_MAX_BYTES / 1024 / 1024} MB (413)`,
    access: RECEIVING_ROLES,
    params: dockItemParamsSchema,
    response: dockAttachmentSchema,
    status: 201,
    handler: async ({ params, req, res, user }) => {
      const file = await receiveAttachmentFile(req, res);
      return attachments.add(params.id, file, user);
    },
  });

  defineRoute(router, registry, {
    method: 'get',
    path: '/dock/attachments/:id',
    summary: 'The packing slip file itself, with its content type, shown inline',
    access: READ_ROLES,
    params: dockAttachmentParamsSchema,
    produces: [...ATTACHMENT_TYPES],
    handler: async ({ params, res }) => {
      const { attachment, absolutePath } = await attachments.find(params.id);
      res.status(200);
      res.setHeader('Content-Type', attachment.mimeType);
      res.setHeader('Content-Length', String(attachment.sizeBytes));
      res.setHeader('Content-Disposition', inlineDisposition(attachment.fileName));
      res.setHeader('Cache-Control', 'private, max-age=3600');
      await pipeline(createReadStream(absolutePath), res);
      return undefined;
    },
  });

  return router;
}
