import { createAppContext, demoUsers, eventStream, jsonResponse, mountInApp, mountListener, waitFor } from './helpers';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { http } from '@/api/http';
import { TOKEN_KEY } from '@/api/session-token';
import App from '@/App.vue';
import AppShellNotices from '@/components/AppShellNotices.vue';
import { PAUSED_RETRY_MS, useLiveUpdatesPaused, useVersionEvents } from '@/composables/useServerEvents';
import { useAuthStore } from '@/stores/auth';

const SESSION_ENDED_WORDS =
  'Your session ended: you signed out elsewhere, your password changed, or your account was changed by an administrator';

function unauthorized(): Response {
  return jsonResponse(401, { error: { code: 'unauthorized', message: 'Please sign in.' } });
}

/** A streamed 200 response that sends its chunks and then ends, as the server does when it ends a session. */
function closingStream(chunks: string[]): Response {
  const encoder = new TextEncoder();
  const body = new ReadableStream<Uint8Array>({
    start(controller) {
      for (const chunk of chunks) controller.enqueue(encoder.encode(chunk));
      controller.close();
    },
  });
  return new Response(body, { status: 200, headers: { 'Content-Type': 'text/event-stream' } });
}

function signIn(): ReturnType<typeof useAuthStore> {
  localStorage.setItem(TOKEN_KEY, 'jwt-live');
  const auth = useAuthStore();
  auth.token = 'jwt-live';
  auth.user = demoUsers.buyer;
  return auth;
}

describe('signing out', () => {
  beforeEach(() => {
    localStorage.clear();
    setActivePinia(createPinia());
  });

  afterEach(() => {
    vi.unstubAllGlobals();
  });

  it('ends the session on the server with its own token before forgetting the token here', async () => {
    const auth = signIn();
    let storedWhileAsking: string | null = null;
    const fetchMock = vi.fn<typeof fetch>(() => {
      storedWhileAsking = localStorage.getItem(TOKEN_KEY);
      return Promise.resolve(new Response(null, { status: 204 }));
    });
    vi.stubGlobal('fetch', fetchMock);

    await auth.logout();

    const [url, init] = fetchMock.mock.calls[0]!;
    expect(url).toBe('/api/auth/logout');
    expect(init?.method).toBe('POST');
    expect((init?.headers as Record<string, string>).Authorization).toBe('Bearer jwt-live');
    expect(storedWhileAsking).toBe('jwt-live');
    expect(localStorage.getItem(TOKEN_KEY)).toBeNull();
    expect(auth.isAuthenticated).toBe(false);
    expect(auth.sessionEnd).toBe('signed-out');
  });

  it('signs out here all the same when the server cannot be reached', async () => {
    const auth = signIn();
    vi.stubGlobal(
      'fetch',
      vi.fn<typeof fetch>(() => Promise.reject(new TypeError('Failed to fetch'))),
    );

    await auth.logout();

    expect(localStorage.getItem(TOKEN_KEY)).toBeNull();
    expect(auth.isAuthenticated).toBe(false);
    expect(auth.sessionEnd).toBe('signed-out');
  });

  it('says "signed out", not "session ended", when the session was already over on the server', async () => {
    const auth = signIn();
    vi.stubGlobal(
      'fetch',
      vi.fn<typeof fetch>(() => Promise.resolve(unauthorized())),
    );

    await auth.logout();

    expect(auth.isAuthenticated).toBe(false);
    expect(auth.sessionEnd).toBe('signed-out');
  });
});

describe('a session the server ends', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
    vi.useRealTimers();
  });

  it('sends the user to sign-in with the way back, and the page says in plain words why', async () => {
    const context = await createAppContext({ user: demoUsers.buyer, path: '/calendar' });
    vi.stubGlobal(
      'fetch',
      vi.fn<typeof fetch>((input) => {
        const path = new URL(String(input), 'http://localhost').pathname;
        if (path === '/api/events') return new Promise<Response>(() => undefined);
        return Promise.resolve(unauthorized());
      }),
    );

    const wrapper = await mountInApp(App, context);
    await waitFor(() => expect(context.router.currentRoute.value.name).toBe('login'));
    await waitFor(() => expect(wrapper.text()).toContain(SESSION_ENDED_WORDS));

    expect(context.router.currentRoute.value.query.redirect).toBe('/calendar');
    expect(localStorage.getItem(TOKEN_KEY)).toBeNull();
    wrapper.unmount();
  });

  it('signs out when the event stream closes and the next request answers 401', async () => {
    vi.useFakeTimers();
    setActivePinia(createPinia());
    const auth = signIn();
    const fetchMock = vi
      .fn<typeof fetch>()
      .mockResolvedValueOnce(closingStream(['event: planning\ndata: {"version":3}\n\n']))
      .mockResolvedValueOnce(unauthorized());
    vi.stubGlobal('fetch', fetchMock);

    const wrapper = mountListener(() => useVersionEvents('planning', vi.fn()));
    await flushPromises();
    expect(auth.isAuthenticated).toBe(true);
    await vi.advanceTimersByTimeAsync(1000);

    expect(fetchMock).toHaveBeenCalledTimes(2);
    expect(auth.isAuthenticated).toBe(false);
    expect(auth.sessionEnd).toBe('expired');
    await vi.advanceTimersByTimeAsync(120_000);
    expect(fetchMock).toHaveBeenCalledTimes(2);
    wrapper.unmount();
  });

  it('treats a 401 on any call of a signed-in user as the end of the session', async () => {
    setActivePinia(createPinia());
    const auth = signIn();
    vi.stubGlobal(
      'fetch',
      vi.fn<typeof fetch>(() => Promise.resolve(unauthorized())),
    );

    await http.get('/loops').catch(() => undefined);

    expect(auth.isAuthenticated).toBe(false);
    expect(auth.sessionEnd).toBe('expired');
  });
});

describe('live updates refused for too many open windows (429)', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
    vi.useRealTimers();
  });

  it('pauses quietly, says so in the shell, asks again only minutes later, and resumes', async () => {
    vi.useFakeTimers();
    const context = await createAppContext({ user: demoUsers.buyer, path: '/' });
    const tooMany = jsonResponse(429, {
      error: { code: 'rate_limited', message: 'You have 8 live-update connections open.' },
    });
    const fetchMock = vi
      .fn<typeof fetch>()
      .mockResolvedValueOnce(tooMany)
      .mockImplementation((_input, init) => Promise.resolve(eventStream([], init?.signal)));
    vi.stubGlobal('fetch', fetchMock);
    const notices = await mountInApp(AppShellNotices, context);

    const listener = mountListener(() => useVersionEvents('planning', vi.fn()));
    await flushPromises();
    await vi.advanceTimersByTimeAsync(60_000);

    expect(fetchMock).toHaveBeenCalledTimes(1);
    expect(useLiveUpdatesPaused().value).toBe(true);
    expect(notices.get('[role="status"]').text()).toContain('Live updates are paused');
    expect(notices.text()).toContain('too many Cardloop windows are open');

    await vi.advanceTimersByTimeAsync(PAUSED_RETRY_MS);

    expect(fetchMock).toHaveBeenCalledTimes(2);
    expect(useLiveUpdatesPaused().value).toBe(false);
    expect(notices.text()).not.toContain('Live updates are paused');
    listener.unmount();
    notices.unmount();
  });
});
