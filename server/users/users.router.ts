import { Router } from 'express';
import { z } from 'zod';
import {
  createUserRequestSchema,
  updateUserRequestSchema,
  userIdParamsSchema,
  userSchema,
} from '../../shared/schemas/user';
import { defineRoute, type RouteDeps } from '../http/route';
import type { Services } from '../services';
import { ifMatchOf } from '../http/versions';

export function createUsersRouter(services: Services, deps: RouteDeps): Router {
  const router = Router();
  const usersService = services.users;

  defineRoute(router, deps, {
    method: 'get',
    path: '/users',
    summary: 'All user accounts',
    access: ['admin'],
    response: z.array(userSchema),
    handler: () => usersService.list(),
  });

  defineRoute(router, deps, {
    method: 'post',
    path: '/users',
    summary: 'Add a user account',
    access: ['admin'],
    body: createUserRequestSchema,
    response: userSchema,
    status: 201,
    handler: ({ body, user }) => usersService.create(body, user),
  });

  defineRoute(router, deps, {
    method: 'patch',
    path: '/users/:id',
    summary: 'Change a user’s role, password or whether it may sign in',
    access: ['admin'],
    params: userIdParamsSchema,
    body: updateUserRequestSchema,
    response: userSchema,
    handler: ({ params, body, user, req }) => usersService.update(params.id, body, user, ifMatchOf(req)),
  });

  return router;
}
