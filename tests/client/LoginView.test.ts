import {
  createAppContext,
  demoUsers,
  getButton,
  getByLabel,
  jsonResponse,
  mountInApp,
  stubFetch,
  waitFor,
} from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import LoginView from '@/views/LoginView.vue';

async function fillAndSubmit(root: HTMLElement, email: string, password: string): Promise<void> {
  const emailInput = getByLabel(root, 'E-mail') as HTMLInputElement;
  const passwordInput = getByLabel(root, 'Password') as HTMLInputElement;
  emailInput.value = email;
  emailInput.dispatchEvent(new Event('input'));
  passwordInput.value = password;
  passwordInput.dispatchEvent(new Event('input'));
  getButton(root, 'Sign in').closest('form')!.dispatchEvent(new Event('submit'));
  await flushPromises();
  await flushPromises();
}

describe('LoginView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('labels its inputs so they can be found by their label', async () => {
    const context = await createAppContext({ path: '/login' });

    const wrapper = await mountInApp(LoginView, context);

    expect(getByLabel(wrapper.element, 'E-mail').tagName).toBe('INPUT');
    expect(getByLabel(wrapper.element, 'Password').getAttribute('type')).toBe('password');
    expect(getButton(wrapper.element, 'Sign in').type).toBe('submit');
  });

  it('shows the server’s message in an alert when sign-in is rate-limited', async () => {
    const context = await createAppContext({ path: '/login' });
    stubFetch(
      jsonResponse(429, {
        error: { code: 'rate_limited', message: 'Too many failed sign-ins. Try again in 15 minutes.' },
      }),
    );
    const wrapper = await mountInApp(LoginView, context);

    await fillAndSubmit(wrapper.element as HTMLElement, 'buyer@example.com', 'not-the-password');

    const alert = wrapper.get('[role="alert"]');
    expect(alert.text()).toContain('Too many sign-in attempts');
    expect(alert.text()).toContain('Too many failed sign-ins. Try again in 15 minutes.');
    expect(context.router.currentRoute.value.name).toBe('login');
  });

  it('goes to the page in the redirect query after signing in', async () => {
    const context = await createAppContext({ path: '/login?redirect=/admin/users' });
    const fetchMock = stubFetch(jsonResponse(200, { token: 'jwt', user: demoUsers.admin }));
    const wrapper = await mountInApp(LoginView, context);

    await fillAndSubmit(wrapper.element as HTMLElement, 'Admin@Example.com', 'correct-password');

    const [url, init] = fetchMock.mock.calls[0]!;
    expect(url).toBe('/api/auth/login');
    expect(JSON.parse(String(init?.body))).toEqual({
      email: 'Admin@Example.com',
      password: 'correct-password',
    });
    // The target view is lazy-loaded, so the navigation settles a little later.
    await waitFor(() => expect(context.router.currentRoute.value.fullPath).toBe('/admin/users'));
  });
});
