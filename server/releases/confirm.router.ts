import { Router } from 'express';
import { rateLimit } from 'express-rate-limit';
import {
  confirmAnswerSchema,
  confirmationSchema,
  confirmResultSchema,
  confirmTokenParamsSchema,
  releaseNumberParamsSchema,
} from '../../shared/schemas/releases';
import { defineRoute, type RouteDeps } from '../http/route';
import type { Services } from '../services';

/** Requests per client address per minute on the public confirmation routes. */
export const CONFIRM_RATE_LIMIT = 30;

/**
 * The supplier's answer to a release: through the e-mailed link (no sign-in, rate-limited per
 * address), or signed in to its own account.
 */
export function createConfirmRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const service = services.confirm;

  // Guessing a 256-bit token is hopeless anyway; the limit keeps a scripted client from
  // hammering the database through a route that needs no account.
  router.use(
    '/confirm',
    rateLimit({
      windowMs: 60 * 1000,
      limit: CONFIRM_RATE_LIMIT,
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      handler: (_req, res) => {
        res.status(429).json({
          error: {
            code: 'rate_limited',
            message: 'Too many requests from this address. Wait a minute and try again.',
          },
        });
      },
    }),
  );

  defineRoute(router, deps, {
    method: 'get',
    path: '/confirm/:token',
    summary: 'The release behind a confirmation link; 409 used, 410 expired, 404 unknown or altered',
    access: 'public',
    params: confirmTokenParamsSchema,
    response: confirmationSchema,
    handler: ({ params }) => service.view(params.token),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/confirm/:token',
    summary: 'The supplier’s answer: confirmed when every line is as asked, otherwise an exception for the buyer',
    access: 'public',
    params: confirmTokenParamsSchema,
    body: confirmAnswerSchema,
    response: confirmResultSchema,
    handler: ({ params, body }) => service.answer(params.token, body),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/releases/:number/confirmation',
    summary: 'A signed-in supplier’s own release, to answer as from the e-mailed link; another’s is 404',
    access: ['supplier'],
    params: releaseNumberParamsSchema,
    response: confirmationSchema,
    handler: ({ params, user }) => service.viewOwn(params.number, user),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/releases/:number/confirmation',
    summary: 'A signed-in supplier’s answer; the e-mailed link is spent with it (409 once answered either way)',
    access: ['supplier'],
    params: releaseNumberParamsSchema,
    body: confirmAnswerSchema,
    response: confirmResultSchema,
    handler: ({ params, body, user }) => service.answerOwn(params.number, user, body),
  });

  return router;
}
