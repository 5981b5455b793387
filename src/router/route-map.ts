import type { ParamValueZeroOrMore, RouteRecordInfo } from 'vue-router';
import type { Role } from '@shared/schemas/user';

type NoParams = Record<never, never>;

/**
 * Every named route with its path and params. Adding a screen means one entry here,
 * one in routes.ts and, if it belongs in the rail, one in navigation.ts.
 */
export interface RouteNamedMap {
  login: RouteRecordInfo<'login', '/login', NoParams, NoParams>;
  home: RouteRecordInfo<'home', '/', NoParams, NoParams>;
  'line-risk': RouteRecordInfo<'line-risk', '/line-risk', NoParams, NoParams>;
  sequence: RouteRecordInfo<'sequence', '/sequence', NoParams, NoParams>;
  'line-end': RouteRecordInfo<'line-end', '/line-end', NoParams, NoParams>;
  'line-end-kits': RouteRecordInfo<'line-end-kits', '/line-end/kits', NoParams, NoParams>;
  stock: RouteRecordInfo<'stock', '/stock', NoParams, NoParams>;
  'stock-part': RouteRecordInfo<'stock-part', '/stock/:partNumber', { partNumber: string }, { partNumber: string }>;
  horizon: RouteRecordInfo<'horizon', '/horizon', NoParams, NoParams>;
  loops: RouteRecordInfo<'loops', '/loops', NoParams, NoParams>;
  releases: RouteRecordInfo<'releases', '/releases', NoParams, NoParams>;
  'supplier-account': RouteRecordInfo<'supplier-account', '/supplier', NoParams, NoParams>;
  'supplier-performance': RouteRecordInfo<'supplier-performance', '/suppliers/performance', NoParams, NoParams>;
  confirm: RouteRecordInfo<'confirm', '/confirm/:token', { token: string }, { token: string }>;
  'release-confirm': RouteRecordInfo<
    'release-confirm',
    '/releases/:number/confirm',
    { number: string },
    { number: string }
  >;
  'ship-notice-link': RouteRecordInfo<'ship-notice-link', '/ship/:token', { token: string }, { token: string }>;
  'ship-notice': RouteRecordInfo<
    'ship-notice',
    '/releases/:number/ship-notice',
    { number: string },
    { number: string }
  >;
  'reset-password': RouteRecordInfo<'reset-password', '/reset-password/:token', { token: string }, { token: string }>;
  'loop-print': RouteRecordInfo<'loop-print', '/loops/:id/print', { id: string | number }, { id: string }>;
  'card-scan': RouteRecordInfo<'card-scan', '/scan', NoParams, NoParams>;
  dock: RouteRecordInfo<'dock', '/dock', NoParams, NoParams>;
  'admin-users': RouteRecordInfo<'admin-users', '/admin/users', NoParams, NoParams>;
  imports: RouteRecordInfo<'imports', '/imports', NoParams, NoParams>;
  calendar: RouteRecordInfo<'calendar', '/calendar', NoParams, NoParams>;
  'admin-outbox': RouteRecordInfo<'admin-outbox', '/admin/outbox', NoParams, NoParams>;
  parts: RouteRecordInfo<'parts', '/parts', NoParams, NoParams>;
  part: RouteRecordInfo<'part', '/parts/:partNumber', { partNumber: string }, { partNumber: string }>;
  suppliers: RouteRecordInfo<'suppliers', '/suppliers', NoParams, NoParams>;
  supplier: RouteRecordInfo<'supplier', '/suppliers/:code', { code: string }, { code: string }>;
  bom: RouteRecordInfo<'bom', '/bom/:parent', { parent: string }, { parent: string }>;
  audit: RouteRecordInfo<'audit', '/admin/audit', NoParams, NoParams>;
  forbidden: RouteRecordInfo<'forbidden', '/forbidden', NoParams, NoParams>;
  'not-found': RouteRecordInfo<
    'not-found',
    '/:pathMatch(.*)*',
    { pathMatch?: ParamValueZeroOrMore<true> },
    { pathMatch?: ParamValueZeroOrMore<false> }
  >;
}

export type RouteName = keyof RouteNamedMap;

/** Routes that take no params: the only ones a menu can link to by name alone. */
export type PlainRouteName = {
  [Name in RouteName]: keyof RouteNamedMap[Name]['paramsRaw'] extends never ? Name : never;
}[RouteName];

declare module 'vue-router' {
  interface TypesConfig {
    RouteNamedMap: RouteNamedMap;
  }

  interface RouteMeta {
    /** Shown in the browser tab and as the page heading's source of truth. */
    title?: string;
    /** Roles allowed in; absent means every signed-in role. */
    roles?: readonly Role[];
    /** Reachable without signing in. */
    public?: boolean;
    /** A page that stands alone, without the app shell, even for a signed-in user. */
    bare?: boolean;
  }
}
