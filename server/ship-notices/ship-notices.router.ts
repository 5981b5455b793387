import { Router } from 'express';
import { rateLimit } from 'express-rate-limit';
import { IDEMPOTENCY_HEADER } from '../../shared/schemas/idempotency';
import { releaseNumberParamsSchema } from '../../shared/schemas/releases';
import {
  shipNoticeRequestSchema,
  shipNoticeResponseSchema,
  shippingTokenParamsSchema,
  shippingViewSchema,
} from '../../shared/schemas/ship-notices';
import { readIdempotencyKey } from '../http/idempotency';
import { defineRoute, Reply, type RouteDeps } from '../http/route';
import type { Services } from '../services';
import { CONFIRM_RATE_LIMIT } from '../releases/confirm.router';

const ONCE = `Header ${IDEMPOTENCY_HEADER} (1–100 characters) is required: the same key again answers 200 with the first notice and records nothing twice.`;

/** Ship notices: a signed-in supplier's own releases, or the link in the confirmation receipt. */
export function createShipNoticesRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const service = services.shipNotices;

  // The link routes need no account: limited per address like the confirmation link.
  router.use(
    '/shipping',
    rateLimit({
      windowMs: 60 * 1000,
      limit: CONFIRM_RATE_LIMIT,
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      handler: (_req, res) => {
        res.status(429).json({
          error: { code: 'rate_limited', message: 'Too many requests from this address. Wait a minute and try again.' },
        });
      },
    }),
  );

  defineRoute(router, deps, {
    method: 'get',
    path: '/releases/:number/ship-notices',
    summary: 'The signed-in supplier’s ship-notice form of its own release: lines still to ship and notices sent',
    access: ['supplier'],
    params: releaseNumberParamsSchema,
    response: shippingViewSchema,
    handler: ({ params, user }) => service.viewForUser(params.number, user),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/releases/:number/ship-notices',
    summary: `Announce one shipment of the supplier’s own release; arrival = ship date + transit. ${ONCE}`,
    access: ['supplier'],
    params: releaseNumberParamsSchema,
    body: shipNoticeRequestSchema,
    response: shipNoticeResponseSchema,
    status: 201,
    handler: async ({ params, body, user, req }) => {
      const outcome = await service.send({ user }, params.number, body, readIdempotencyKey(req, 'ship notice'));
      return new Reply(outcome.created ? 201 : 200, outcome.body);
    },
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/shipping/:token',
    summary: 'The ship-notice form behind the link in a confirmation receipt; 404 unknown or expired',
    access: 'public',
    params: shippingTokenParamsSchema,
    response: shippingViewSchema,
    handler: ({ params }) => service.viewByToken(params.token),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/shipping/:token',
    summary: `Announce one shipment through the link in the confirmation receipt. ${ONCE}`,
    access: 'public',
    params: shippingTokenParamsSchema,
    body: shipNoticeRequestSchema,
    response: shipNoticeResponseSchema,
    status: 201,
    handler: async ({ params, body, req }) => {
      const outcome = await service.send({ token: params.token }, null, body, readIdempotencyKey(req, 'ship notice'));
      return new Reply(outcome.created ? 201 : 200, outcome.body);
    },
  });

  return router;
}
