import { Router, type Request } from 'express';
import { z } from 'zod';
import {
  changePasswordRequestSchema,
  loginRequestSchema,
  loginResponseSchema,
  passwordResetInfoSchema,
  passwordResetRequestSchema,
  passwordResetSentSchema,
  passwordResetTokenSchema,
  sessionUserSchema,
  userIdParamsSchema,
} from '../../shared/schemas/user';
import { defineRoute, type RouteDeps } from '../http/route';
import type { Services } from '../services';

/** The client's address as Express sees it (behind a proxy on loopback, the forwarded one). */
const addressOf = (req: Request) => req.ip ?? req.socket.remoteAddress ?? 'unknown';

export function createAuthRouter(services: Services, deps: RouteDeps): Router {
  const auth = services.auth;
  const router = Router();

  defineRoute(router, deps, {
    method: 'post',
    path: '/auth/login',
    summary:
      'Sign in with e-mail and password; returns a session token. 429 after repeated failures on the account (from anywhere) or from the address (on any account).',
    access: 'public',
    body: loginRequestSchema,
    response: loginResponseSchema,
    handler: ({ body, req }) => auth.login(body, addressOf(req)),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/auth/me',
    summary: 'The signed-in user',
    access: 'signed-in',
    response: sessionUserSchema,
    handler: ({ user }) => ({ email: user.email, name: user.name, role: user.role, supplierCode: user.supplierCode }),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/auth/logout',
    summary: 'Sign out: this session’s token stops working at once (other devices stay signed in)',
    access: 'signed-in',
    status: 204,
    handler: async ({ user, res }) => {
      await auth.logout(user);
      res.status(204).end();
      return undefined;
    },
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/auth/password',
    summary: 'Change your own password; every other session of yours ends',
    access: 'signed-in',
    body: changePasswordRequestSchema,
    status: 204,
    handler: async ({ user, body, req, res }) => {
      await auth.changePassword(user, body, addressOf(req));
      res.status(204).end();
      return undefined;
    },
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/users/:id/password-reset',
    summary: 'E-mail the user a single-use link to set a new password (valid 24 hours; a newer link replaces it)',
    access: ['admin'],
    params: userIdParamsSchema,
    response: passwordResetSentSchema,
    status: 202,
    handler: ({ params, user }) => auth.sendPasswordReset(params.id, user),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/auth/password-reset/:token',
    summary: 'Whose password a reset link sets (no sign-in); 404 unknown, 409 used, 410 expired',
    access: 'public',
    params: z.object({ token: passwordResetTokenSchema }),
    response: passwordResetInfoSchema,
    handler: ({ params }) => auth.passwordResetInfo(params.token),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/auth/password-reset',
    summary: 'Set a new password from a reset link (no sign-in); the link is spent and every session of the user ends',
    access: 'public',
    body: passwordResetRequestSchema,
    status: 204,
    handler: async ({ body, res }) => {
      await auth.resetPassword(body);
      res.status(204).end();
      return undefined;
    },
  });

  return router;
}
