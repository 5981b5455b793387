import { Router } from 'express';
import { z } from 'zod';
import { auditListSchema, auditQuerySchema } from '../../shared/schemas/audit';
import type { Role } from '../../shared/schemas/user';
import { defineRoute, type RouteDeps } from '../http/route';
import type { Services } from '../services';
import { auditToCsv } from './audit-trail.service';

/** Who reads the trail: the admin who keeps the system and the planner who answers for the plan. */
const AUDIT_ROLES: readonly Role[] = ['admin', 'planner'];

export function createAuditRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const service = services.auditTrail;

  defineRoute(router, deps, {
    method: 'get',
    path: '/audit',
    summary:
      'Who changed what and when, newest first (JSON, or CSV with format=csv); filters by kind, user, subject and days',
    access: AUDIT_ROLES,
    query: auditQuerySchema,
    response: auditListSchema,
    produces: ['text/csv'],
    handler: async ({ query, res }) => {
      const list = await service.list(query);
      if (query.format !== 'csv') return list;
      res
        .type('text/csv')
        .attachment(`audit-${query.from ?? 'start'}-${query.to ?? 'now'}.csv`)
        .send(auditToCsv(list.events));
      return undefined;
    },
  });

  defineRoute(router, deps, {
    method: 'get',
    path: '/audit/kinds',
    summary: 'The kinds of record the audit trail holds',
    access: AUDIT_ROLES,
    response: z.array(z.string()),
    handler: () => service.kinds(),
  });

  return router;
}
