import { Router } from 'express';
import { z } from 'zod';
import {
  partNumberParamsSchema,
  stockChangeSchema,
  stockCountRequestSchema,
  stockItemSchema,
  stockLedgerSchema,
  stockMovementsQuerySchema,
  stockScrapRequestSchema,
} from '../../shared/schemas/stock';
import { COUNT_ROLES, READ_ROLES, SCRAP_ROLES } from '../http/roles';
import { defineRoute, type RouteDeps } from '../http/route';
import type { Services } from '../services';

/** The stock ledger: on-hand, movements with running balance, counts and scrap. */
export function createStockRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const service = services.stock;

  defineRoute(router, deps, {
    method: 'get',
    path: '/stock',
    summary: 'Every part’s on-hand, flagged when negative or due a count',
    access: READ_ROLES,
    response: z.array(stockItemSchema),
    handler: () => service.list(),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/stock/:partNumber/movements',
    summary: 'A part’s stock movements between two days (inclusive) with the running balance; on-hand is their sum',
    access: READ_ROLES,
    params: partNumberParamsSchema,
    query: stockMovementsQuerySchema,
    response: stockLedgerSchema,
    handler: ({ params, query }) => service.ledger(params.partNumber, query),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/stock/counts',
    summary: 'Record a count: the difference to on-hand is posted as a count adjustment',
    access: COUNT_ROLES,
    body: stockCountRequestSchema,
    response: stockChangeSchema,
    status: 201,
    handler: ({ body, user }) => service.count(body, user),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/stock/scrap',
    summary: 'Record scrap that really happened (dropped, damaged, wrong): it leaves stock with its reason',
    access: SCRAP_ROLES,
    body: stockScrapRequestSchema,
    response: stockChangeSchema,
    status: 201,
    handler: ({ body, user }) => service.scrap(body, user),
  });

  return router;
}
