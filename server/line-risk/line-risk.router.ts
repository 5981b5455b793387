import type { OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { lineRiskQuerySchema, lineRiskReportSchema, shortagesResponseSchema } from '../../shared/schemas/line-risk';
import { defineRoute } from '../http/route';
import { READ_ROLES } from '../http/roles';
import { LineRiskService } from './line-risk.service';

/** Line risk: the published shortage list and the planner's full report over one horizon. */
export function createLineRiskRouter(
  dataSource: DataSource,
  registry: OpenAPIRegistry,
  service = new LineRiskService(dataSource),
): Router {
  const router = Router();

  defineRoute(router, registry, {
    method: 'get',
    path: '/shortages',
    summary:
      'Bought parts that stop units of the build sequence, counting only on-hand and confirmed receipts, by first short date (defaults: next working day, 20 working days)',
    access: READ_ROLES,
    query: lineRiskQuerySchema,
    response: shortagesResponseSchema,
    handler: ({ query }) => service.shortages(query.from, query.to),
  });

  defineRoute(router, registry, {
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
