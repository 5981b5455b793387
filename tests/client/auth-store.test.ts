import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import { http } from '@/api/http';
import { TOKEN_KEY } from '@/api/session-token';
import { useAuthStore } from '@/stores/auth';
import { demoUsers, jsonResponse, stubFetch } from './helpers';

describe('useAuthStore', () => {
  beforeEach(() => {
    localStorage.clear();
    setActivePinia(createPinia());
  });

  afterEach(() => {
    vi.unstubAllGlobals();
  });

  it('keeps the token under cardloop.token after signing in', async () => {
    stubFetch(jsonResponse(200, { token: 'jwt-1', user: demoUsers.buyer }));
    const auth = useAuthStore();

    const signedIn = await auth.login({ email: 'buyer@example.com', password: 'secret-pass' });

    expect(signedIn).toBe(true);
    expect(localStorage.getItem(TOKEN_KEY)).toBe('jwt-1');
    expect(auth.isAuthenticated).toBe(true);
    expect(auth.hasRole('buyer', 'admin')).toBe(true);
    expect(auth.hasRole('admin')).toBe(false);
  });

  it('keeps the server message when sign-in is refused, and stays signed out', async () => {
    stubFetch(
      jsonResponse(429, { error: { code: 'rate_limited', message: 'Too many attempts, try again in 15 minutes' } }),
    );
    const auth = useAuthStore();

    const signedIn = await auth.login({ email: 'buyer@example.com', password: 'wrong' });

    expect(signedIn).toBe(false);
    expect(auth.error?.status).toBe(429);
    expect(auth.error?.message).toBe('Too many attempts, try again in 15 minutes');
    expect(auth.isAuthenticated).toBe(false);
    expect(localStorage.getItem(TOKEN_KEY)).toBeNull();
  });

  it('ends the session as expired when a later call answers 401', async () => {
    stubFetch(
      jsonResponse(200, { token: 'jwt-2', user: demoUsers.admin }),
      jsonResponse(401, { error: { code: 'unauthorized', message: 'Token expired' } }),
    );
    const auth = useAuthStore();
    await auth.login({ email: 'admin@example.com', password: 'secret-pass' });

    await http.get('/users').catch(() => undefined);

    expect(auth.isAuthenticated).toBe(false);
    expect(auth.sessionEnd).toBe('expired');
    expect(localStorage.getItem(TOKEN_KEY)).toBeNull();
  });

  it('restores the user behind a stored token with one request however often it is asked', async () => {
    localStorage.setItem(TOKEN_KEY, 'jwt-3');
    const fetchMock = stubFetch(jsonResponse(200, demoUsers.buyer));
    const auth = useAuthStore();

    const [first, second] = await Promise.all([auth.fetchMe(), auth.fetchMe()]);

    expect([first, second]).toEqual([true, true]);
    expect(fetchMock).toHaveBeenCalledTimes(1);
    expect(auth.user?.role).toBe('buyer');
  });
});
