import { Router } from 'express';
import { IDEMPOTENCY_HEADER } from '../../shared/schemas/idempotency';
import {
  overCheckQuerySchema,
  overCheckResponseSchema,
  receiptRequestSchema,
  receiptResponseSchema,
} from '../../shared/schemas/receipts';
import { readIdempotencyKey } from '../http/idempotency';
import { defineRoute, Reply, type RouteDeps } from '../http/route';
import type { Services } from '../services';
import { RECEIVING_ROLES } from '../http/roles';

/** Check-in of counted goods against release lines. */
export function createReceiptsRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const service = services.receipts;

  defineRoute(router, deps, {
    method: 'post',
    path: '/receipts',
    summary:
      `Record a count against an open release line. Header ${IDEMPOTENCY_HEADER} (1–100 characters) is required: ` +
      'the same key again answers 200 with the first body and counts nothing twice; the same key with another body is 409.',
    access: RECEIVING_ROLES,
    body: receiptRequestSchema,
    response: receiptResponseSchema,
    status: 201,
    handler: async ({ body, req, user }) => {
      const outcome = await service.receive(body, readIdempotencyKey(req, 'count'), user);
      return new Reply(outcome.created ? 201 : 200, outcome.body);
    },
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/receipts/over-check',
    summary:
      'What a count of `qty` on a release line would do, before it is recorded: whether it passes the supplier’s over ' +
      'tolerance, and which open lines kept excess would go to (first due first). Changes nothing.',
    access: RECEIVING_ROLES,
    query: overCheckQuerySchema,
    response: overCheckResponseSchema,
    handler: ({ query }) => service.check(query),
  });

  return router;
}
