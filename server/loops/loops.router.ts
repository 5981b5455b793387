import { Router } from 'express';
import { z } from 'zod';
import type { Role } from '../../shared/schemas/user';
import { kanbanSizeRequestSchema, kanbanSizeResponseSchema } from '../../shared/schemas/loops-sizing';
import {
  acceptKanbanLoopRequestSchema,
  acceptKanbanLoopResponseSchema,
  cardLabelSchema,
  cardLabelsQuerySchema,
  cardNumberParamsSchema,
  cardScanRequestSchema,
  cardScanResponseSchema,
  kanbanCardDetailSchema,
  kanbanCardWithScansSchema,
  kanbanLoopIdParamsSchema,
  kanbanLoopSchema,
  kanbanLoopsQuerySchema,
  updateKanbanLoopRequestSchema,
} from '../../shared/schemas/loops';
import { defineRoute, type RouteDeps } from '../http/route';
import type { Services } from '../services';
import { MASTER_DATA_ROLES, READ_ROLES } from '../http/roles';
import { ifMatchOf } from '../http/versions';

/** Loops are the buyer's; cards are scanned wherever they travel — at the line, the desk and the dock. */
const SCAN_ROLES: readonly Role[] = ['admin', 'buyer', 'planner', 'receiving'];

/** Kanban loops, cards and scans (published under /api/kanban). */
export function createLoopsRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const service = services.loops;

  defineRoute(router, deps, {
    method: 'post',
    path: '/kanban/size',
    summary: 'Card count N = ⌈(D · (T · (1 + α) + safety days) + safety units) / C⌉ for the numbers given',
    access: READ_ROLES,
    body: kanbanSizeRequestSchema,
    response: kanbanSizeResponseSchema,
    handler: ({ body }) => service.size(body),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/kanban/loops',
    summary: 'Kanban loops with demand, replenishment time, recommended and active cards',
    access: READ_ROLES,
    query: kanbanLoopsQuerySchema,
    response: z.array(kanbanLoopSchema),
    handler: ({ query }) => service.listLoops({ supplierCode: query.supplier }),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/kanban/loops/:id',
    summary: 'One kanban loop',
    access: READ_ROLES,
    params: kanbanLoopIdParamsSchema,
    response: kanbanLoopSchema,
    handler: ({ params }) => service.getLoop(params.id),
  });

  defineRoute(router, deps, {
    method: 'patch',
    path: '/kanban/loops/:id',
    summary: 'Change a loop’s container quantity, safety allowance or sizing window',
    access: MASTER_DATA_ROLES,
    params: kanbanLoopIdParamsSchema,
    body: updateKanbanLoopRequestSchema,
    response: kanbanLoopSchema,
    handler: ({ params, body, user, req }) => service.updateLoop(params.id, body, user, ifMatchOf(req)),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/kanban/loops/:id/accept',
    summary: 'Add or pull cards so that active cards equal the recommendation',
    access: MASTER_DATA_ROLES,
    params: kanbanLoopIdParamsSchema,
    body: acceptKanbanLoopRequestSchema,
    response: acceptKanbanLoopResponseSchema,
    handler: ({ params, body, user }) => service.acceptLoop(params.id, body, user),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/kanban/loops/:id/cards',
    summary: 'Cards of a loop, pulled ones included, each with its latest scans',
    access: READ_ROLES,
    params: kanbanLoopIdParamsSchema,
    response: z.array(kanbanCardWithScansSchema),
    handler: ({ params }) => service.listCards(params.id),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/kanban/loops/:id/labels',
    summary: 'Everything a print view shows per card label, with the QR code as SVG',
    access: READ_ROLES,
    params: kanbanLoopIdParamsSchema,
    query: cardLabelsQuerySchema,
    response: z.array(cardLabelSchema),
    handler: ({ params, query }) => service.labels(params.id, query.cards),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/kanban/loops/:id/labels.pdf',
    summary: 'Printable card labels, eight to an A4 page',
    access: READ_ROLES,
    params: kanbanLoopIdParamsSchema,
    query: cardLabelsQuerySchema,
    produces: ['application/pdf'],
    handler: async ({ params, query, res }) => {
      const { fileName, pdf } = await service.labelsPdf(params.id, query.cards);
      res.type('application/pdf').attachment(fileName).send(pdf);
      return undefined;
    },
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/kanban/cards/:cardNumber',
    summary: 'One card by its number, with its whole scan log',
    access: READ_ROLES,
    params: cardNumberParamsSchema,
    response: kanbanCardDetailSchema,
    handler: ({ params }) => service.getCard(params.cardNumber),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/kanban/scans',
    summary:
      'Record a card scan: a full card is emptied at the line. release, ship and receive are refused (409): a release line orders a card, a ship notice ships it and a receipt at the dock fills it',
    access: SCAN_ROLES,
    body: cardScanRequestSchema,
    response: cardScanResponseSchema,
    status: 201,
    handler: ({ body, user }) => service.scan(body, user),
  });

  return router;
}
