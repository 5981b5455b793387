import { Router } from 'express';
import { overviewSchema } from '../../shared/schemas/overview';
import { ROLES } from '../../shared/schemas/user';
import { defineRoute, type RouteDeps } from '../http/route';
import type { Services } from '../services';

/** The Overview: the figures each role watches; a supplier sees only its own. */
export function createOverviewRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();

  defineRoute(router, deps, {
    method: 'get',
    path: '/overview',
    summary: 'The three figures the signed-in role watches, each with where to act on it',
    access: ROLES,
    response: overviewSchema,
    handler: ({ user }) => services.overview.overview(user),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/overview/first-run-guide/dismiss',
    summary: 'Put the first-run guide away for the signed-in user',
    access: ROLES,
    status: 204,
    handler: async ({ user, res }) => {
      await services.overview.dismissGuide(user);
      res.status(204).end();
    },
  });

  return router;
}
