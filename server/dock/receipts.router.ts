import { Router } from 'express';
import {
  IDEMPOTENCY_HEADER,
  idempotencyKeySchema,
  receiptRequestSchema,
  receiptResponseSchema,
} from '../../shared/schemas/receipts';
import { BadRequestError } from '../errors';
import { defineRoute, type RouteDeps } from '../http/route';
import type { Services } from '../services';
import { RECEIVING_ROLES } from '../http/roles';

function readIdempotencyKey(header: string | undefined): string {
  const parsed = idempotencyKeySchema.safeParse(header ?? '');
  if (parsed.success) return parsed.data;
  const message = `The ${IDEMPOTENCY_HEADER} header ${parsed.error.issues[0]?.message ?? 'is invalid'}: send a fresh key (1–100 characters) with each new count.`;
  throw new BadRequestError(message, [{ path: [IDEMPOTENCY_HEADER], message }]);
}

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
    handler: async ({ body, req, res, user }) => {
      const key = readIdempotencyKey(req.get(IDEMPOTENCY_HEADER));
      const outcome = await service.receive(body, key, user);
      res.status(outcome.created ? 201 : 200).json(outcome.body);
      return undefined;
    },
  });

  return router;
}
