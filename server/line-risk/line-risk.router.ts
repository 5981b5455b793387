import { Router } from 'express';
import { z } from 'zod';
import {
  lineRiskQuerySchema,
  lineRiskReportSchema,
  pageQuerySchema,
  shortagesResponseSchema,
  slotsPageSchema,
  unitsPageSchema,
} from '../../shared/schemas/line-risk';
import { partNumberSchema } from '../../shared/schemas/master-data';
import { READ_ROLES } from '../http/roles';
import { defineRoute, type RouteDeps } from '../http/route';
import { sendSerialised } from '../http/serialised-body';
import type { Services } from '../services';

/** Line risk: the published shortage list, the planner's report, its pages, and the engine's input for a what-if. */
export function createLineRiskRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const service = services.lineRisk;

  defineRoute(router, deps, {
    method: 'get',
    path: '/shortages',
    // Computed in a worker thread, maybe for seconds: no read snapshot held open meanwhile.
    unit: 'none',
    summary:
      'Parts that stop units of the build sequence, each with its action (expedite, loop, count, release) and dated need, counting on-hand, confirmed receipts and kanban loops (defaults: next working day, 20 working days)',
    access: READ_ROLES,
    query: lineRiskQuerySchema,
    response: shortagesResponseSchema,
    handler: async ({ query, req, res }) => {
      await sendSerialised(req, res, await service.shortagesBody(query));
      return undefined;
    },
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/line-risk',
    unit: 'none',
    summary: 'Line risk report: units at risk with what each lacks, short parts by action, frozen window and rescues',
    access: READ_ROLES,
    query: lineRiskQuerySchema,
    response: lineRiskReportSchema,
    handler: async ({ query, req, res }) => {
      await sendSerialised(req, res, await service.reportBody(query));
      return undefined;
    },
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/line-risk/units',
    unit: 'none',
    summary: 'Units at risk in build order, a page at a time',
    access: READ_ROLES,
    query: pageQuerySchema,
    response: unitsPageSchema,
    handler: ({ query }) => service.units(query, query.offset, query.limit),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/line-risk/parts/:partNumber/slots',
    unit: 'none',
    summary: 'The units that lack one short part, a page at a time',
    access: READ_ROLES,
    params: z.object({ partNumber: partNumberSchema }),
    query: pageQuerySchema,
    response: slotsPageSchema,
    handler: ({ params, query }) => service.slots(params.partNumber, query, query.offset, query.limit),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/line-risk/engine-input',
    summary:
      'The inputs of the line-risk engine (parts, BOM, units not built, firm receipts, loops, calendar) for a what-if computed in the browser',
    access: READ_ROLES,
    query: lineRiskQuerySchema,
    response: z.object({}).passthrough(),
    handler: ({ query }) => service.engineInput(query),
  });

  return router;
}
