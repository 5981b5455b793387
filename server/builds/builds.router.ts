import { Router } from 'express';
import { z } from 'zod';
import {
  buildRequestSchema,
  buildResponseSchema,
  closeDayRequestSchema,
  closeDayResponseSchema,
  closeDaySettingsSchema,
  dayKitsQuerySchema,
  kitSchema,
  reverseBuildQuerySchema,
  serialParamsSchema,
} from '../../shared/schemas/builds';
import { IDEMPOTENCY_HEADER } from '../../shared/schemas/idempotency';
import { readIdempotencyKey } from '../http/idempotency';
import { BUILD_ROLES, CLOSE_DAY_ROLES, READ_ROLES } from '../http/roles';
import { defineRoute, Reply, type RouteDeps } from '../http/route';
import type { Services } from '../services';
import { LINE_UNDO_MINUTES } from './builds.service';

/** Units reported built at the end of the line, their reversal, closing a day, and kits. */
export function createBuildsRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const service = services.builds;

  defineRoute(router, deps, {
    method: 'post',
    path: '/builds',
    summary:
      `Report a unit built: its components are backflushed through the BOM effective today, once. Header ${IDEMPOTENCY_HEADER} ` +
      'is required: the same key again answers 200 with the first body; another body with it is 409. A unit already built is 409 `already_built`.',
    access: BUILD_ROLES,
    body: buildRequestSchema,
    response: buildResponseSchema,
    status: 201,
    handler: async ({ body, req, user }) => {
      const outcome = await service.build(body.serial, readIdempotencyKey(req, 'unit built'), user);
      return new Reply(outcome.created ? 201 : 200, outcome.body);
    },
  });

  defineRoute(router, deps, {
    method: 'delete',
    path: '/builds/:serial',
    summary:
      `Undo a build (query \`reason\` required): the opposite movements go back on stock and the unit is planned again. ` +
      `Planner and admin any unit; the line only a unit it reported itself in the last ${LINE_UNDO_MINUTES} minutes.`,
    access: BUILD_ROLES,
    params: serialParamsSchema,
    query: reverseBuildQuerySchema,
    response: buildResponseSchema,
    handler: ({ params, query, user }) => service.reverse(params.serial, query.reason, user),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/builds/close-day',
    summary: 'Report every unit of the day not yet built as built, in sequence order, in one transaction',
    access: CLOSE_DAY_ROLES,
    body: closeDayRequestSchema,
    response: closeDayResponseSchema,
    handler: ({ body, user }) => service.closeDay(body.date, user),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/builds/:serial/start',
    summary: 'The unit’s kit went to the line: planned → started (a built unit stays built)',
    access: BUILD_ROLES,
    params: serialParamsSchema,
    response: buildResponseSchema,
    handler: ({ params, user }) => service.start(params.serial, user),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/builds/:serial/kit',
    summary: 'The components to bring to the line for one unit, grouped by point of use',
    access: READ_ROLES,
    params: serialParamsSchema,
    response: kitSchema,
    handler: ({ params }) => service.kit(params.serial),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/builds/kits',
    summary: 'The kits of every unit of a day, in sequence order',
    access: READ_ROLES,
    query: dayKitsQuerySchema,
    response: z.array(kitSchema),
    handler: ({ query }) => service.dayKits(query.date),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/builds/settings',
    summary: 'When the end-of-shift job closes the day (null: off)',
    access: READ_ROLES,
    response: closeDaySettingsSchema,
    handler: () => service.closeDaySettings(),
  });

  defineRoute(router, deps, {
    method: 'put',
    path: '/builds/settings',
    summary: 'Set or switch off the end-of-shift close of the day',
    access: ['admin'],
    body: closeDaySettingsSchema,
    response: closeDaySettingsSchema,
    handler: ({ body, user }) => service.updateCloseDaySettings(body, user),
  });

  return router;
}
