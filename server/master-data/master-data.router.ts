import { Router } from 'express';
import { z } from 'zod';
import { PART_SOURCES, partSchema, supplierSchema } from '../../shared/schemas/master-data';
import { defineRoute, type RouteDeps } from '../http/route';
import type { Services } from '../services';
import { READ_ROLES } from '../http/roles';

export function createMasterDataRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const service = services.masterData;

  defineRoute(router, deps, {
    method: 'get',
    path: '/suppliers',
    summary: 'Suppliers (a supplier account sees only its own)',
    access: [...READ_ROLES, 'supplier'],
    response: z.array(supplierSchema),
    handler: ({ user }) => service.listSuppliers(user),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/parts',
    summary: 'Parts, optionally of one supplier or source',
    access: READ_ROLES,
    query: z.object({ supplier: z.string().max(20).optional(), source: z.enum(PART_SOURCES).optional() }),
    response: z.array(partSchema),
    handler: ({ query }) => service.listParts({ supplierCode: query.supplier, source: query.source }),
  });

  return router;
}
