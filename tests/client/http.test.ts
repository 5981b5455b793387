import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { ApiError, http, onUnauthorized, request } from '@/api/http';
import { TOKEN_KEY } from '@/api/session-token';
import { jsonResponse, stubFetch } from './helpers';

describe('src/api/http', () => {
  beforeEach(() => {
    localStorage.clear();
  });

  afterEach(() => {
    onUnauthorized(null);
    vi.unstubAllGlobals();
  });

  it('prefixes /api, sends JSON and the stored token as a Bearer credential', async () => {
    localStorage.setItem(TOKEN_KEY, 'abc.def.ghi');
    const fetchMock = stubFetch(jsonResponse(201, { id: 7 }));

    const created = await http.post<{ id: number }>('/users', { name: 'Nia' });

    expect(created).toEqual({ id: 7 });
    const [url, init] = fetchMock.mock.calls[0]!;
    expect(url).toBe('/api/users');
    expect(init?.method).toBe('POST');
    expect(init?.body).toBe('{"name":"Nia"}');
    const headers = init?.headers as Record<string, string>;
    expect(headers['Content-Type']).toBe('application/json');
    // RFC 6750 "The OAuth 2.0 Authorization Framework: Bearer Token Usage", section 2.1:
    // credentials = "Bearer" 1*SP b64token.
    expect(headers.Authorization).toBe('Bearer abc.def.ghi');
  });

  it('builds an ApiError from the server error body', async () => {
    // Error body shape from PRODUCT.md, "Published API": { error: { code, message, details } }.
    stubFetch(
      jsonResponse(409, {
        error: { code: 'conflict', message: 'A user with this e-mail already exists', details: [] },
      }),
    );

    const failure = await http.get('/users').catch((error: unknown) => error);

    expect(failure).toBeInstanceOf(ApiError);
    expect(failure).toMatchObject({
      status: 409,
      code: 'conflict',
      message: 'A user with this e-mail already exists',
      details: [],
    });
  });

  it('maps zod issues in details onto field names, first message per field', async () => {
    stubFetch(
      jsonResponse(400, {
        error: {
          code: 'validation_error',
          message: 'Invalid input',
          details: [
            { path: ['email'], message: 'Invalid email address' },
            { path: ['email'], message: 'second message for the same field' },
            { path: ['lines', 0, 'qty'], message: 'Too small' },
            { path: [], message: 'form-level issue without a field' },
          ],
        },
      }),
    );

    const failure = (await http.post('/users', {}).catch((error: unknown) => error)) as ApiError;

    expect(failure.fieldErrors()).toEqual({
      email: 'Invalid email address',
      'lines.0.qty': 'Too small',
    });
    const besideFields: Record<string, string | undefined> = {};
    expect(failure.placeFieldErrors(['email', 'name'], besideFields)).toBe(true);
    expect(besideFields).toEqual({ email: 'Invalid email address' });
    expect(failure.placeFieldErrors(['name'], {})).toBe(false);
  });

  it('still gives a readable ApiError when the body is not the error format', async () => {
    stubFetch(new Response('<html>Bad gateway</html>', { status: 502 }));

    const failure = (await http.get('/users').catch((error: unknown) => error)) as ApiError;

    expect(failure.status).toBe(502);
    expect(failure.code).toBe('http_502');
    expect(failure.message).toMatch(/server/i);
  });

  it('reports an unreachable server as status 0 instead of a raw TypeError', async () => {
    vi.stubGlobal('fetch', vi.fn().mockRejectedValue(new TypeError('fetch failed')));

    const failure = (await http.get('/users').catch((error: unknown) => error)) as ApiError;

    expect(failure).toBeInstanceOf(ApiError);
    expect(failure.status).toBe(0);
  });

  it('calls the unauthorized handler on a 401 from a signed-in call', async () => {
    const sessionOver = vi.fn();
    onUnauthorized(sessionOver);
    stubFetch(jsonResponse(401, { error: { code: 'unauthorized', message: 'Token expired' } }));

    await expect(http.get('/users')).rejects.toBeInstanceOf(ApiError);

    expect(sessionOver).toHaveBeenCalledTimes(1);
  });

  it('treats a 401 on an anonymous call (sign-in) as an answer, not a lost session', async () => {
    const sessionOver = vi.fn();
    onUnauthorized(sessionOver);
    localStorage.setItem(TOKEN_KEY, 'stale');
    const fetchMock = stubFetch(
      jsonResponse(401, { error: { code: 'unauthorized', message: 'Wrong e-mail or password' } }),
    );

    const failure = (await request('/auth/login', {
      method: 'POST',
      body: { email: 'a@example.com', password: 'nope' },
      anonymous: true,
    }).catch((error: unknown) => error)) as ApiError;

    expect(failure.message).toBe('Wrong e-mail or password');
    expect(sessionOver).not.toHaveBeenCalled();
    const headers = fetchMock.mock.calls[0]![1]?.headers as Record<string, string>;
    expect(headers.Authorization).toBeUndefined();
  });

  it('encodes query parameters and leaves out undefined ones', async () => {
    const fetchMock = stubFetch(jsonResponse(200, []));

    await http.get('/demand', { query: { from: '2025-03-03', supplier: undefined, format: 'csv' } });

    expect(fetchMock.mock.calls[0]![0]).toBe('/api/demand?from=2025-03-03&format=csv');
  });
});
