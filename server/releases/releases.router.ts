import { Router } from 'express';
import { z } from 'zod';
import type { Role } from '../../shared/schemas/user';
import {
  releaseJobSettingsRequestSchema,
  releaseJobSettingsSchema,
  releaseNumberParamsSchema,
  releaseSchema,
  releasesQuerySchema,
  runReleasesRequestSchema,
  runReleasesResponseSchema,
} from '../../shared/schemas/releases';
import { defineRoute, type RouteDeps } from '../http/route';
import { ifMatchOf } from '../http/versions';
import type { Services } from '../services';
import { MASTER_DATA_ROLES, READ_ROLES } from '../http/roles';

/** Everyone who reads releases; a supplier's account is narrowed to its own in the service. */
const RELEASE_READERS: readonly Role[] = [...READ_ROLES, 'supplier'];

/** Release routes: the buyer's desk actions and the readers' lists. */
export function createReleasesRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const service = services.releases;

  defineRoute(router, deps, {
    method: 'post',
    path: '/releases/run',
    summary: 'Build and send one release per supplier for the date; the same date again creates nothing new',
    access: MASTER_DATA_ROLES,
    body: runReleasesRequestSchema,
    response: runReleasesResponseSchema,
    handler: ({ body, user }) => service.run(body.date, user),
  });

  // Registered before /releases/:number so "settings" is never read as a release number.
  defineRoute(router, deps, {
    method: 'get',
    path: '/releases/settings',
    summary: 'Time of day (plant time) the release job runs, and the last day it ran',
    access: MASTER_DATA_ROLES,
    response: releaseJobSettingsSchema,
    handler: () => service.jobSettings(),
  });

  defineRoute(router, deps, {
    method: 'put',
    path: '/releases/settings',
    summary: 'Set the time of day (HH:MM, plant time) the release job runs',
    access: ['admin'],
    body: releaseJobSettingsRequestSchema,
    response: releaseJobSettingsSchema,
    handler: ({ body, user, req }) => service.updateJobSettings(body.jobTime, user, ifMatchOf(req)),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/releases',
    summary: 'Releases, newest release date first; a supplier sees only its own',
    access: RELEASE_READERS,
    query: releasesQuerySchema,
    response: z.array(releaseSchema),
    handler: ({ query, user }) => service.list(query, user),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/releases/:number',
    summary: 'One release with its lines; another supplier’s release is 404',
    access: RELEASE_READERS,
    params: releaseNumberParamsSchema,
    response: releaseSchema,
    handler: ({ params, user }) => service.get(params.number, user),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/releases/:number/resend',
    summary: 'E-mail the release again with a new link; earlier links stop working',
    access: MASTER_DATA_ROLES,
    params: releaseNumberParamsSchema,
    response: releaseSchema,
    handler: ({ params, user }) => service.resend(params.number, user),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/releases/:number/notice/send-again',
    summary: 'Try the release’s latest e-mail again at once, same link (for a notice the mail server has not taken)',
    access: MASTER_DATA_ROLES,
    params: releaseNumberParamsSchema,
    response: releaseSchema,
    handler: ({ params, user }) => service.sendNoticeAgain(params.number, user),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/releases/:number/cancel',
    summary: 'Call a release off before anything is received; its kanban cards go back to empty',
    access: MASTER_DATA_ROLES,
    params: releaseNumberParamsSchema,
    response: releaseSchema,
    handler: ({ params, user }) => service.cancel(params.number, user),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/releases/:number/accept-exception',
    summary: 'Accept the supplier’s changed quantities or dates: exception → confirmed',
    access: MASTER_DATA_ROLES,
    params: releaseNumberParamsSchema,
    response: releaseSchema,
    handler: ({ params, user }) => service.acceptException(params.number, user),
  });

  return router;
}
