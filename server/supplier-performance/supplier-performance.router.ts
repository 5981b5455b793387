import type { OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { performanceQuerySchema, supplierPerformanceResponseSchema } from '../../shared/schemas/supplier-performance';
import { defineRoute } from '../http/route';
import { READ_ROLES } from '../http/roles';
import { PerformanceService } from './supplier-performance.service';

/** Supplier performance: on-time, fill rate and confirmation latency per supplier and month of need date. */
export function createPerformanceRouter(
  dataSource: DataSource,
  registry: OpenAPIRegistry,
  service = new PerformanceService(dataSource),
): Router {
  const router = Router();

  defineRoute(router, registry, {
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
