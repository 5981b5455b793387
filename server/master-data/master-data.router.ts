import { Router } from 'express';
import { z } from 'zod';
import { PART_SOURCES, partSchema, supplierSchema } from '../../shared/schemas/master-data';
import {
  bomDateQuerySchema,
  bomEditBodySchema,
  bomParentParamsSchema,
  bomTreeSchema,
  engineeringChangeSchema,
  partDetailSchema,
  partEditBodySchema,
  partNumberParamsSchema,
  supplierCodeParamsSchema,
  supplierEditBodySchema,
  whereUsedSchema,
} from '../../shared/schemas/master-data-edit';
import { defineRoute, Reply, type RouteDeps } from '../http/route';
import type { Services } from '../services';
import { MASTER_DATA_ROLES, READ_ROLES } from '../http/roles';

export function createMasterDataRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const service = services.masterData;
  const edits = services.masterDataEdit;
  const bom = services.bom;

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
    path: '/suppliers/:code',
    summary: 'One supplier',
    access: READ_ROLES,
    params: supplierCodeParamsSchema,
    response: supplierSchema,
    handler: ({ params }) => edits.getSupplier(params.code),
  });

  defineRoute(router, deps, {
    method: 'put',
    path: '/suppliers/:code',
    summary: 'Create or change a supplier; checked as a suppliers file row is (201 when new)',
    access: MASTER_DATA_ROLES,
    params: supplierCodeParamsSchema,
    body: supplierEditBodySchema,
    response: supplierSchema,
    handler: async ({ params, body, user }) => {
      const created = await edits.saveSupplier(params.code, body, user);
      return new Reply(created ? 201 : 200, await edits.getSupplier(params.code));
    },
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

  defineRoute(router, deps, {
    method: 'get',
    path: '/parts/:partNumber',
    summary: 'One part with its low-level code, supplier name and kanban loop',
    access: READ_ROLES,
    params: partNumberParamsSchema,
    response: partDetailSchema,
    handler: ({ params }) => edits.getPart(params.partNumber),
  });

  defineRoute(router, deps, {
    method: 'put',
    path: '/parts/:partNumber',
    summary:
      'Create or change a part; checked as a parts file row is; on-hand stays with the stock ledger (201 when new)',
    access: MASTER_DATA_ROLES,
    params: partNumberParamsSchema,
    body: partEditBodySchema,
    response: partDetailSchema,
    handler: async ({ params, body, user }) => {
      const created = await edits.savePart(params.partNumber, body, user);
      return new Reply(created ? 201 : 200, await edits.getPart(params.partNumber));
    },
  });

  defineRoute(router, deps, {
    method: 'delete',
    path: '/parts/:partNumber',
    summary: 'Delete a part nothing refers to; 409 `in_use` with the reasons otherwise',
    access: MASTER_DATA_ROLES,
    params: partNumberParamsSchema,
    status: 204,
    handler: async ({ params, user, res }) => {
      await edits.deletePart(params.partNumber, user);
      res.status(204).end();
    },
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/parts/:partNumber/where-used',
    summary: 'Parents that use the part (only those in effect on `date` when given) and the end items that reach it',
    access: READ_ROLES,
    params: partNumberParamsSchema,
    query: bomDateQuerySchema,
    response: whereUsedSchema,
    handler: ({ params, query }) => bom.whereUsed(params.partNumber, query.date ?? null),
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/bom/:parent',
    summary: 'Multi-level BOM below a part: the lines in effect on `date`, or every line without one',
    access: READ_ROLES,
    params: bomParentParamsSchema,
    query: bomDateQuerySchema,
    response: bomTreeSchema,
    handler: ({ params, query }) => bom.tree(params.parent, query.date ?? null),
  });

  defineRoute(router, deps, {
    method: 'put',
    path: '/bom/:parent',
    summary: 'Replace every single-level line of a parent; checked as a BOM file is (cycles, overlaps, unknown parts)',
    access: MASTER_DATA_ROLES,
    params: bomParentParamsSchema,
    body: bomEditBodySchema,
    response: bomTreeSchema,
    handler: ({ params, body, user }) => bom.replace(params.parent, body.lines, user),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/bom/:parent/engineering-changes',
    summary:
      'From a date, a replacement component (or new quantity) instead of the current line, which ends the day before',
    access: MASTER_DATA_ROLES,
    params: bomParentParamsSchema,
    body: engineeringChangeSchema,
    response: bomTreeSchema,
    status: 201,
    handler: ({ params, body, user }) => bom.change(params.parent, body, user),
  });

  return router;
}
