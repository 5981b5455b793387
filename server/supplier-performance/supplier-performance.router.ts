import { Router } from 'express';
import { performanceQuerySchema, supplierPerformanceResponseSchema } from '../../shared/schemas/supplier-performance';
import { defineRoute, type RouteDeps } from '../http/route';
import type { Services } from '../services';
import { READ_ROLES } from '../http/roles';
import { scopeToSupplier } from '../http/supplier-scope';

/** Supplier performance: on-time, fill rate and confirmation latency per supplier and month of need date. */
export function createSupplierPerformanceRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const service = services.supplierPerformance;

  defineRoute(router, deps, {
    method: 'get',
    path: '/suppliers/performance',
    summary:
      'On-time and fill rate against what was first asked, promise kept against the answer, and confirmation latency per supplier and month (defaults: the last six months through the current one; at most 24 months)',
    // A supplier account reads its own figures only: never another's, nor the comparison.
    access: [...READ_ROLES, 'supplier'],
    query: performanceQuerySchema,
    response: supplierPerformanceResponseSchema,
    handler: ({ query, user }) => service.performance(scopeToSupplier(query, user)),
  });

  return router;
}
