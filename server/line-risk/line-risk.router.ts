import { Router } from 'express';
import { lineRiskQuerySchema, lineRiskReportSchema, shortagesResponseSchema } from '../../shared/schemas/line-risk';
import { defineRoute, type RouteDeps } from '../http/route';
import type { Services } from '../services';
import { READ_ROLES } from '../http/roles';

/** Line risk: the published shortage list and the planner's full report over one horizon. */
export function createLineRiskRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const service = services.lineRisk;

  defineRoute(router, deps, {
    method: 'get',
    path: '/shortages',
    summary:
      'Bought parts that stop units of the build sequence, counting only on-hand and confirmed receipts, by first short date (defaults: next working day, 20 working days)',
    access: READ_ROLES,
    query: lineRiskQuerySchema,
    response: shortagesResponseSchema,
    handler: ({ query }) => service.shortages(query.from, query.to),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/line-risk',
    summary: 'Line risk report: units at risk with what each lacks, short parts, frozen window and rescues',
    access: READ_ROLES,
    query: lineRiskQuerySchema,
    response: lineRiskReportSchema,
    handler: ({ query }) => service.report(query.from, query.to),
  });

  return router;
}
