import type { OpenAPIRegistry, RouteConfig } from '@asteasolutions/zod-to-openapi';
import type { Request, Response, Router } from 'express';
import { z, type ZodType } from 'zod';
import type { Role } from '../../shared/schemas/user';
import { errorBodySchema } from '../../shared/schemas/error';
import { ForbiddenError, UnauthorizedError } from '../errors';
import type { Database } from '../db/database';
import type { AuthenticatedUser } from './request-user';

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** Who may call a route: nobody signed in needed, any signed-in user, or the listed roles. */
export type Access = 'public' | 'signed-in' | readonly Role[];

interface RouteContext<B, Q, P> {
  body: B;
  query: Q;
  params: P;
  user: AuthenticatedUser;
  req: Request;
  res: Response;
}

/** What every router needs: the OpenAPI registry routes document themselves in, and the database. */
export interface RouteDeps {
  registry: OpenAPIRegistry;
  db: Database;
}

/**
 * A reply whose status (or headers) the handler decides, e.g. 201 for a new receipt and 200 for a
 * replayed one. Returned, never written: the response leaves only after the unit of work committed.
 */
export class Reply {
  constructor(
    readonly status: number,
    readonly body: unknown,
    readonly headers: Record<string, string> = {},
  ) {}
}

interface RouteSpec<B, Q, P> {
  method: Method;
  path: string;
  summary: string;
  access: Access;
  body?: ZodType<B>;
  query?: ZodType<Q>;
  params?: ZodType<P>;
  /** Schema of the success body, for the OpenAPI document. */
  response?: ZodType;
  status?: number;
  /** Extra documented content types of the success response (e.g. text/csv). */
  produces?: string[];
  /**
   * A GET runs in one read snapshot of committed data unless it says `none` (an event stream, which
   * must not hold a snapshot open for hours). Other methods write through the services' write units.
   */
  unit?: 'snapshot' | 'none';
  /** Returns the body to send as JSON (or a Reply); return undefined after writing `res` yourself. */
  handler: (context: RouteContext<B, Q, P>) => unknown | Promise<unknown>;
}

const errorResponse = (description: string) => ({
  description,
  content: { 'application/json': { schema: errorBodySchema } },
});

/** Declares one API route: validates input with zod, enforces the role rule, documents it in OpenAPI. */
export function defineRoute<B = undefined, Q = undefined, P = undefined>(
  router: Router,
  { registry, db }: RouteDeps,
  spec: RouteSpec<B, Q, P>,
): void {
  registry.registerPath(describeRoute(spec));
  const inSnapshot = spec.method === 'get' && spec.unit !== 'none';
  router[spec.method](spec.path, async (req, res) => {
    const user = authorise(req, spec.access);
    const context: RouteContext<B, Q, P> = {
      body: spec.body ? spec.body.parse(req.body ?? {}) : (undefined as B),
      query: spec.query ? spec.query.parse(req.query) : (undefined as Q),
      params: spec.params ? spec.params.parse(req.params) : (undefined as P),
      user: user as AuthenticatedUser,
      req,
      res,
    };
    const result = inSnapshot ? await db.read(async () => spec.handler(context)) : await spec.handler(context);
    if (result === undefined || res.headersSent) return;
    if (result instanceof Reply) {
      res.status(result.status).set(result.headers).json(result.body);
    } else {
      res.status(spec.status ?? 200).json(result);
    }
  });
}

function authorise(req: Request, access: Access): AuthenticatedUser | undefined {
  if (access === 'public') return req.user;
  if (!req.user) throw new UnauthorizedError();
  if (access === 'signed-in') return req.user;
  if (!access.includes(req.user.role)) throw new ForbiddenError();
  return req.user;
}

function describeRoute<B, Q, P>(spec: RouteSpec<B, Q, P>): RouteConfig {
  const openApiPath = spec.path.replace(/:(\w+)/g, '{$1}');
  const successContent: Record<string, { schema: ZodType }> = {};
  if (spec.response) successContent['application/json'] = { schema: spec.response };
  for (const type of spec.produces ?? []) successContent[type] = { schema: z.string() };
  const roles =
    spec.access === 'public'
      ? 'no sign-in'
      : spec.access === 'signed-in'
        ? 'any signed-in user'
        : spec.access.join(', ');
  return {
    method: spec.method,
    path: openApiPath,
    summary: spec.summary,
    description: `Access: ${roles}.`,
    security: spec.access === 'public' ? [] : [{ bearer: [] }],
    request: {
      ...(spec.body && { body: { content: { 'application/json': { schema: spec.body } } } }),
      ...(spec.query && { query: spec.query as never }),
      ...(spec.params && { params: spec.params as never }),
    },
    responses: {
      [spec.status ?? 200]: {
        description: 'Success',
        ...(Object.keys(successContent).length > 0 && { content: successContent }),
      },
      400: errorResponse('Invalid input; zod issues in details'),
      ...(spec.access !== 'public' && { 401: errorResponse('Not signed in'), 403: errorResponse('Role not allowed') }),
    },
  };
}
