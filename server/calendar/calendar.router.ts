import type { OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
import { Router } from 'express';
import { calendarSchema } from '../../shared/schemas/master-data';
import { defineRoute } from '../http/route';
import { READ_ROLES } from '../http/roles';
import type { CalendarService } from './calendar.service';

export function createCalendarRouter(calendarService: CalendarService, registry: OpenAPIRegistry): Router {
  const router = Router();

  defineRoute(router, registry, {
    method: 'get',
    path: '/calendar',
    summary: 'Working weekdays (ISO numbers, 1 = Monday) and holidays',
    access: READ_ROLES,
    response: calendarSchema,
    handler: () => calendarService.get(),
  });

  defineRoute(router, registry, {
    method: 'put',
    path: '/calendar',
    summary: 'Replace the plant calendar',
    access: ['admin', 'planner'],
    body: calendarSchema,
    response: calendarSchema,
    handler: ({ body, user }) => calendarService.update(body, user.email),
  });

  return router;
}
