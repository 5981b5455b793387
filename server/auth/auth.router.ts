import { Router } from 'express';
import { rateLimit } from 'express-rate-limit';
import { loginRequestSchema, loginResponseSchema, sessionUserSchema } from '../../shared/schemas/user';
import { defineRoute, type RouteDeps } from '../http/route';
import type { Services } from '../services';

interface AuthRouterOptions {
  /** Failed sign-ins allowed per client address in a 15-minute window before 429. */
  loginFailureLimit: number;
}

export function createAuthRouter(
  services: Services,
  deps: RouteDeps,
  { loginFailureLimit }: AuthRouterOptions,
): Router {
  const authService = services.auth;
  const router = Router();
  const loginLimiter = rateLimit({
    windowMs: 15 * 60 * 1000,
    limit: loginFailureLimit,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, res) => {
      res.status(429).json({
        error: { code: 'rate_limited', message: 'Too many failed sign-ins. Wait 15 minutes and try again.' },
      });
    },
  });
  router.use('/auth/login', loginLimiter);

  defineRoute(router, deps, {
    method: 'post',
    path: '/auth/login',
    summary: 'Sign in with e-mail and password; returns a session token',
    access: 'public',
    body: loginRequestSchema,
    response: loginResponseSchema,
    handler: ({ body }) => authService.login(body),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/auth/me',
    summary: 'The signed-in user',
    access: 'signed-in',
    response: sessionUserSchema,
    handler: ({ user }) => ({ email: user.email, name: user.name, role: user.role, supplierCode: user.supplierCode }),
  });

  return router;
}
