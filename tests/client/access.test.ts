// @vitest-environment node
import { describe, expect, it } from 'vitest';
import type { RouteLocationNormalized } from 'vue-router';
import { decideAccess, safeRedirect } from '@/router/access';

type Target = Pick<RouteLocationNormalized, 'name' | 'fullPath' | 'meta' | 'query'>;

function target(partial: Partial<Target> & Pick<Target, 'name' | 'fullPath'>): Target {
  return { meta: {}, query: {}, ...partial };
}

const signedOut = { isAuthenticated: false, role: null };
const buyer = { isAuthenticated: true, role: 'buyer' as const };
const admin = { isAuthenticated: true, role: 'admin' as const };

describe('decideAccess', () => {
  it('sends a signed-out visitor to sign-in with the way back', () => {
    const decision = decideAccess(target({ name: 'admin-users', fullPath: '/admin/users?q=x' }), signedOut);

    expect(decision).toEqual({ name: 'login', query: { redirect: '/admin/users?q=x' } });
  });

  it('lets anyone see public pages', () => {
    const decision = decideAccess(
      target({ name: 'not-found', fullPath: '/nowhere', meta: { public: true } }),
      signedOut,
    );

    expect(decision).toBe(true);
  });

  it('sends a role that is not on the list to the forbidden page', () => {
    const decision = decideAccess(
      target({ name: 'admin-users', fullPath: '/admin/users', meta: { roles: ['admin'] } }),
      buyer,
    );

    expect(decision).toEqual({ name: 'forbidden', query: { from: '/admin/users' } });
  });

  it('lets a listed role in', () => {
    const decision = decideAccess(
      target({ name: 'admin-users', fullPath: '/admin/users', meta: { roles: ['admin'] } }),
      admin,
    );

    expect(decision).toBe(true);
  });

  it('moves a signed-in user away from the sign-in page to where they were going', () => {
    const decision = decideAccess(
      target({ name: 'login', fullPath: '/login', meta: { public: true }, query: { redirect: '/admin/users' } }),
      admin,
    );

    expect(decision).toBe('/admin/users');
  });
});

describe('safeRedirect', () => {
  it('keeps in-app paths', () => {
    expect(safeRedirect('/admin/users?tab=2')).toBe('/admin/users?tab=2');
  });

  // RFC 3986 "URI: Generic Syntax", section 4.2: a reference starting with "//" is a
  // network-path reference, i.e. another host. Browsers also read "/\" as "//"
  // (WHATWG URL Standard, special-scheme path parsing treats "\" like "/").
  it.each([
    ['protocol-relative URL', '//evil.example.net/x'],
    ['absolute URL', 'https://evil.example.net'],
    ['backslash trick', '/\\evil.example.net'],
    ['not a string', 42],
  ])('refuses a %s', (_kind, value) => {
    expect(safeRedirect(value)).toBeNull();
  });
});
