import { Router } from 'express';
import {
  addSequenceUnitRequestSchema,
  removeSequenceUnitQuerySchema,
  resequenceRequestSchema,
  resequenceResponseSchema,
  sequenceBoardSchema,
  sequenceQuerySchema,
  sequenceSerialParamsSchema,
  sequenceSettingsSchema,
  versionedSequenceSettingsSchema,
  sequenceUnitSchema,
} from '../../shared/schemas/sequence';
import { defineRoute, type RouteDeps } from '../http/route';
import { ifMatchOf } from '../http/versions';
import type { Services } from '../services';
import { READ_ROLES, SEQUENCE_ROLES } from '../http/roles';

/** Build sequence routes: everyone but suppliers reads, admin and planner change. */
export function createSequenceRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const service = services.sequence;

  defineRoute(router, deps, {
    method: 'get',
    path: '/sequence',
    summary:
      'Units by day and position for the working days from `from` (default today) to `to` (default 10 working days)',
    access: READ_ROLES,
    query: sequenceQuerySchema,
    response: sequenceBoardSchema,
    handler: ({ query }) => service.board(query),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/sequence/settings',
    summary: 'Frozen window (working days from today, today counted as day 1 when it is worked) and daily capacity',
    access: READ_ROLES,
    response: versionedSequenceSettingsSchema,
    handler: () => service.settings(),
  });

  defineRoute(router, deps, {
    method: 'put',
    path: '/sequence/settings',
    summary: 'Set the frozen window and daily capacity',
    access: SEQUENCE_ROLES,
    body: sequenceSettingsSchema,
    response: versionedSequenceSettingsSchema,
    handler: ({ body, user, req }) => service.updateSettings(body, user, ifMatchOf(req)),
  });

  defineRoute(router, deps, {
    method: 'put',
    path: '/sequence/days',
    summary:
      'Give each listed day its full new order of serials (units named from other days move here); all days at once or none',
    access: SEQUENCE_ROLES,
    body: resequenceRequestSchema,
    response: resequenceResponseSchema,
    handler: ({ body, user }) => service.resequence(body, user),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/sequence/units',
    summary: 'Add a unit at the end of a day',
    access: SEQUENCE_ROLES,
    body: addSequenceUnitRequestSchema,
    response: sequenceUnitSchema,
    status: 201,
    handler: ({ body, user }) => service.addUnit(body, user),
  });

  defineRoute(router, deps, {
    method: 'delete',
    path: '/sequence/units/:serial',
    summary: 'Remove a unit; the units after it on its day close up',
    access: SEQUENCE_ROLES,
    params: sequenceSerialParamsSchema,
    query: removeSequenceUnitQuerySchema,
    status: 204,
    handler: async ({ params, query, user, res }) => {
      await service.removeUnit(params.serial, query.allowFrozen, user);
      res.status(204).end();
      return undefined;
    },
  });

  return router;
}
