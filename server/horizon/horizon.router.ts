import { Router } from 'express';
import {
  demandQuerySchema,
  demandResponseSchema,
  demandTableQuerySchema,
  demandTableResponseSchema,
  forecastMailRequestSchema,
  forecastMailResponseSchema,
  planQuerySchema,
  planResponseSchema,
} from '../../shared/schemas/horizon';
import { defineRoute, type RouteDeps } from '../http/route';
import { sendSerialised } from '../http/serialised-body';
import type { Services } from '../services';
import { MASTER_DATA_ROLES, READ_ROLES } from '../http/roles';
import { demandToCsv, planToCsv } from './horizon-csv';
import { scopeToSupplier } from '../http/supplier-scope';

export function createHorizonRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const { planning, forecastMail } = services;

  defineRoute(router, deps, {
    method: 'get',
    path: '/plan',
    summary: 'Gross-to-net buckets of one part, one per working day from `from` to `to` (JSON, or CSV with format=csv)',
    access: READ_ROLES,
    query: planQuerySchema,
    response: planResponseSchema,
    produces: ['text/csv'],
    handler: async ({ query, res }) => {
      const plan = await planning.partPlan(query.part, query.from, query.to);
      if (query.format !== 'csv') return plan;
      res
        .type('text/csv')
        .attachment(`plan-${plan.part.partNumber}-${plan.buckets[0]?.date ?? 'empty'}.csv`)
        .send(planToCsv(plan));
      return undefined;
    },
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/demand',
    summary:
      'Gross demand of bought parts per working day (JSON, or CSV with format=csv); a supplier account gets its own parts only',
    access: [...READ_ROLES, 'supplier'],
    // The plan reads its inputs in a snapshot of its own when they changed; a cached answer needs
    // none, and holding one of the few snapshot readers per request would queue busy clients.
    unit: 'none',
    query: demandQuerySchema,
    response: demandResponseSchema,
    produces: ['text/csv'],
    handler: async ({ query: asked, user, req, res }) => {
      const query = scopeToSupplier(asked, user);
      const options = { from: query.from, to: query.to, supplierCode: query.supplier };
      if (query.format !== 'csv') {
        await sendSerialised(req, res, await planning.demandBody(options));
        return undefined;
      }
      const demand = await planning.demand(options);
      const name = `demand-${demand.days[0] ?? 'empty'}${query.supplier ? `-${query.supplier}` : ''}.csv`;
      res.type('text/csv').attachment(name).send(demandToCsv(demand));
      return undefined;
    },
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/demand/table',
    summary:
      'One page of the demand table: searched, sorted and summed by day or ISO week, with the totals and chart bands of every matched row',
    access: READ_ROLES,
    unit: 'none',
    query: demandTableQuerySchema,
    response: demandTableResponseSchema,
    handler: ({ query }) =>
      planning.demandTable(
        { from: query.from, to: query.to, supplierCode: query.supplier },
        {
          bucket: query.bucket,
          search: query.q,
          sort: { prop: query.sort ?? null, order: query.order ?? null },
          page: query.page,
          pageSize: query.pageSize,
          stackBy: query.supplier ? 'part' : 'supplier',
        },
      ),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/demand/forecast-mail',
    summary: 'E-mail a supplier its gross demand ahead, with the CSV attached (queued in the outbox)',
    access: MASTER_DATA_ROLES,
    body: forecastMailRequestSchema,
    response: forecastMailResponseSchema,
    status: 202,
    handler: ({ body, user }) => forecastMail.send(body, user),
  });

  return router;
}
