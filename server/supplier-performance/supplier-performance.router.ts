import { Router } from 'express';
import { performanceQuerySchema, supplierPerformanceResponseSchema } from '../../shared/schemas/supplier-performance';
import { defineRoute, type RouteDeps } from '../http/route';
import type { Services } from '../services';
import { READ_ROLES } from '../http/roles';

/** Supplier performance: on-time, fill rate and confirmation latency per supplier and month of need date. */
export function createSupplierPerformanceRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const service = services.supplierPerformance;

  defineRoute(router, deps, {
    method: 'get',
    path: '/suppliers/performance',
    summary:
      'On-time rate, fill rate and confirmation latency per supplier and month of need date (defaults: the last six months through the current one; at most 24 months)',
    // Suppliers are kept out for now: the figures compare suppliers with one another.
    access: READ_ROLES,
    query: performanceQuerySchema,
    response: supplierPerformanceResponseSchema,
    handler: ({ query }) => service.performance(query),
  });

  return router;
}
