import type { RouteLocationNormalized, RouteLocationRaw } from 'vue-router';
import type { Role } from '@shared/schemas/user';

export interface SessionState {
  isAuthenticated: boolean;
  role: Role | null;
}

/**
 * Where a navigation may go: `true` to let it through, or the location to send the user to
 * instead (sign-in with a way back, or the page that explains a role mismatch).
 */
export function decideAccess(
  to: Pick<RouteLocationNormalized, 'name' | 'fullPath' | 'meta' | 'query'>,
  session: SessionState,
): true | RouteLocationRaw {
  if (to.name === 'login' && session.isAuthenticated) {
    return safeRedirect(to.query.redirect) ?? { name: 'home' };
  }
  if (to.meta.public) return true;
  if (!session.isAuthenticated) {
    return to.fullPath === '/' ? { name: 'login' } : { name: 'login', query: { redirect: to.fullPath } };
  }
  if (!mayEnter(to.meta.roles, session.role)) {
    return { name: 'forbidden', query: { from: to.fullPath } };
  }
  return true;
}

/** Whether a role passes a route's role list; no list means any signed-in role. */
export function mayEnter(roles: readonly Role[] | undefined, role: Role | null): boolean {
  if (!roles) return true;
  return role !== null && roles.includes(role);
}

/**
 * An in-app path taken from the query, or null. Anything that could leave the site
 * (`//host`, `https://…`) is refused so a crafted sign-in link cannot send users elsewhere.
 */
export function safeRedirect(value: unknown): string | null {
  const candidate = Array.isArray(value) ? value[0] : value;
  if (typeof candidate !== 'string') return null;
  if (!candidate.startsWith('/') || candidate.startsWith('//') || candidate.startsWith('/\\')) {
    return null;
  }
  return candidate;
}
