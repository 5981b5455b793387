import type { OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
import { Router } from 'express';
import { z } from 'zod';
import { PART_SOURCES, partSchema, supplierSchema } from '../../shared/schemas/master-data';
import { defineRoute } from '../http/route';
import { READ_ROLES } from '../http/roles';
import type { MasterDataService } from './master-data.service';

export function createMasterDataRouter(service: MasterDataService, registry: OpenAPIRegistry): Router {
  const router = Router();

  defineRoute(router, registry, {
    method: 'get',
    path: '/suppliers',
    summary: 'Suppliers (a supplier account sees only its own)',
    access: [...READ_ROLES, 'supplier'],
    response: z.array(supplierSchema),
    handler: ({ user }) => service.listSuppliers(user),
  });

  defineRoute(router, registry, {
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
