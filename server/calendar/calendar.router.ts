import { Router } from 'express';
import { calendarUpdateSchema, versionedCalendarSchema } from '../../shared/schemas/master-data';
import { defineRoute, type RouteDeps } from '../http/route';
import type { Services } from '../services';
import { READ_ROLES } from '../http/roles';
import { ifMatchOf } from '../http/versions';

export function createCalendarRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const calendarService = services.calendar;

  defineRoute(router, deps, {
    method: 'get',
    path: '/calendar',
    summary: 'Working weekdays (ISO numbers, 1 = Monday) and holidays',
    access: READ_ROLES,
    response: versionedCalendarSchema,
    handler: () => calendarService.get(),
  });

  defineRoute(router, deps, {
    method: 'put',
    path: '/calendar',
    summary: 'Replace the plant calendar',
    access: ['admin', 'planner'],
    body: calendarUpdateSchema,
    response: versionedCalendarSchema,
    handler: ({ body, user, req }) => calendarService.update(body, user.email, ifMatchOf(req)),
  });

  return router;
}
