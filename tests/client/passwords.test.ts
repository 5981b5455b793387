import { createAppContext, demoUsers, getButton, getByLabel, jsonResponse, mountInApp, waitFor } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import type { PasswordResetInfo } from '@shared/schemas/user';
import AppShellUserMenu from '@/components/AppShellUserMenu.vue';
import { newPasswordProblem, repeatProblem } from '@/components/password-rules';
import PasswordResetView from '@/views/PasswordResetView.vue';

type Answer = (init?: RequestInit) => Response;

function stubApi(answers: Record<string, Answer>) {
  const fetchMock = vi.fn<typeof fetch>((input, init) => {
    const url = new URL(String(input), 'http://localhost');
    const answer = answers[`${init?.method ?? 'GET'} ${url.pathname}`];
    return Promise.resolve(
      answer ? answer(init) : jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }),
    );
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

function posted(fetchMock: ReturnType<typeof stubApi>, pathname: string): unknown[] {
  return fetchMock.mock.calls
    .filter(
      ([input, init]) => init?.method === 'POST' && new URL(String(input), 'http://localhost').pathname === pathname,
    )
    .map(([, init]) => JSON.parse(String(init?.body)));
}

function type(input: HTMLElement, value: string): void {
  (input as HTMLInputElement).value = value;
  input.dispatchEvent(new Event('input'));
}

function errorUnder(root: HTMLElement, label: string): string {
  const item = getByLabel(root, label).closest('.el-form-item');
  return item?.querySelector('.el-form-item__error')?.textContent?.trim() ?? '';
}

async function openPasswordDialog(): Promise<HTMLElement> {
  const context = await createAppContext({ user: demoUsers.buyer, path: '/' });
  await mountInApp(AppShellUserMenu, context);
  (document.querySelector('[aria-label="Account of Bo Buyer"]') as HTMLElement).click();
  await flushPromises();
  const item = [...document.querySelectorAll('[role="menuitem"]')].find(
    (candidate) => candidate.textContent?.trim() === 'Change password',
  );
  (item as HTMLElement).click();
  await flushPromises();
  return document.querySelector<HTMLElement>('[role="dialog"][aria-label="Change password"]')!;
}

async function fill(dialog: HTMLElement, current: string, next: string, repeat: string): Promise<void> {
  type(getByLabel(dialog, 'Current password'), current);
  type(getByLabel(dialog, 'New password'), next);
  type(getByLabel(dialog, 'Repeat new password'), repeat);
  await flushPromises();
}

// The forms check with these before sending. (Element Plus form validation stays inert under
// happy-dom here, so the rules are checked as functions; the e2e journey sees them in a browser.)
describe('password rules', () => {
  it('asks for at least 10 characters, as the shared schema does', () => {
    expect(newPasswordProblem('nine-char')).toBe('At least 10 characters');
    expect(newPasswordProblem('ten-chars!')).toBe('');
    expect(newPasswordProblem('')).toBe('Choose a new password');
  });

  it('refuses a new password equal to the current one, and only then', () => {
    expect(newPasswordProblem('old-password-1', 'old-password-1')).toBe('Must differ from the current password');
    expect(newPasswordProblem('new-password-2', 'old-password-1')).toBe('');
    expect(newPasswordProblem('short', 'old-password-1')).toBe('At least 10 characters');
  });

  it('wants the repeat to match the new password exactly', () => {
    expect(repeatProblem('brand-new-secret', 'brand-new-secreT')).toBe('The two new passwords are not the same');
    expect(repeatProblem('brand-new-secret', 'brand-new-secret')).toBe('');
    expect(repeatProblem('brand-new-secret', '')).toBe('Type the new password again');
  });
});

describe('Change password (user menu)', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('puts the server’s “wrong current password” under that field', async () => {
    stubApi({
      'POST /api/auth/password': () =>
        jsonResponse(400, {
          error: {
            code: 'invalid_input',
            message: 'The current password is not right.',
            details: [{ path: ['currentPassword'], message: 'is not your current password' }],
          },
        }),
    });
    const dialog = await openPasswordDialog();

    await fill(dialog, 'not-my-password', 'a-new-password-42', 'a-new-password-42');
    getButton(dialog, 'Change password').click();
    await waitFor(() => expect(errorUnder(dialog, 'Current password')).toBe('Is not your current password'));

    expect(errorUnder(dialog, 'New password')).toBe('');
    expect(dialog.querySelector('.el-alert')).toBeNull();
  });

  it('sends current and new password, closes, and says the other devices were signed out', async () => {
    const fetchMock = stubApi({ 'POST /api/auth/password': () => new Response(null, { status: 204 }) });
    const dialog = await openPasswordDialog();

    await fill(dialog, 'old-password-1', 'a-new-password-42', 'a-new-password-42');
    getButton(dialog, 'Change password').click();
    await waitFor(() => expect(document.body.textContent).toContain('Password changed.'));

    expect(posted(fetchMock, '/api/auth/password')).toEqual([
      { currentPassword: 'old-password-1', newPassword: 'a-new-password-42' },
    ]);
    expect(document.body.textContent).toContain('Every other device where you were signed in is now signed out.');
  });
});

const TOKEN = 'Zr8sQk2Lw9mN4pT7vX1yB3cD5fG6hJ0aE2iO4uY8';
const info: PasswordResetInfo = {
  email: 'planner@example.com',
  name: 'Pat Planner',
  expiresAt: '2026-12-03T09:00:00.000Z',
};

async function openReset() {
  const context = await createAppContext({ path: `/reset-password/${TOKEN}` });
  const wrapper = await mountInApp(PasswordResetView, context);
  await flushPromises();
  return wrapper;
}

describe('PasswordResetView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('names whose password the link sets, sets it once, and offers sign-in', async () => {
    const fetchMock = stubApi({
      [`GET /api/auth/password-reset/${TOKEN}`]: () => jsonResponse(200, info),
      'POST /api/auth/password-reset': () => new Response(null, { status: 204 }),
    });
    const wrapper = await openReset();
    const page = wrapper.element as HTMLElement;

    expect(wrapper.get('h1').text()).toBe('Set a new password');
    expect(wrapper.text()).toContain('Pat Planner');
    expect(wrapper.text()).toContain('planner@example.com');
    expect(wrapper.text()).toContain('This link works once, until Thu 3 Dec 2026');
    type(getByLabel(page, 'New password'), 'brand-new-secret');
    type(getByLabel(page, 'Repeat new password'), 'brand-new-secret');
    await flushPromises();
    getButton(page, 'Set password').closest('form')!.dispatchEvent(new Event('submit'));
    await waitFor(() => expect(wrapper.text()).toContain('Password set — sign in'));

    expect(posted(fetchMock, '/api/auth/password-reset')).toEqual([{ token: TOKEN, password: 'brand-new-secret' }]);
    const signIn = wrapper.get('a');
    expect(signIn.text()).toBe('Go to sign-in');
    expect(signIn.attributes('href')).toBe('/login');
    // A person who is not signed in is not sent the token of anybody.
    const sentHeaders = fetchMock.mock.calls.map(([, init]) => init?.headers as Record<string, string>);
    expect(sentHeaders.every((headers) => headers.Authorization === undefined)).toBe(true);
  });

  it.each([
    [404, 'not_found', 'This link is not known', 'Check that the whole link was copied'],
    [409, 'conflict', 'This link was already used', 'Ask your Cardloop administrator to e-mail you a new link'],
    [410, 'gone', 'This link no longer works', 'Ask your Cardloop administrator to e-mail you a new link'],
  ])('explains a link answered %i and what to do next', async (status, code, title, advice) => {
    stubApi({
      [`GET /api/auth/password-reset/${TOKEN}`]: () =>
        jsonResponse(status, { error: { code, message: 'From the server.' } }),
    });

    const wrapper = await openReset();

    expect(wrapper.get('h1').text()).toBe(title);
    expect(wrapper.text()).toContain(advice);
    expect(wrapper.find('input[type="password"]').exists()).toBe(false);
  });

  it('ends the form when the link expires between opening and sending', async () => {
    stubApi({
      [`GET /api/auth/password-reset/${TOKEN}`]: () => jsonResponse(200, info),
      'POST /api/auth/password-reset': () =>
        jsonResponse(410, {
          error: { code: 'gone', message: 'This link has expired or was replaced by a newer one.' },
        }),
    });
    const wrapper = await openReset();
    const page = wrapper.element as HTMLElement;

    type(getByLabel(page, 'New password'), 'brand-new-secret');
    type(getByLabel(page, 'Repeat new password'), 'brand-new-secret');
    await flushPromises();
    getButton(page, 'Set password').closest('form')!.dispatchEvent(new Event('submit'));
    await waitFor(() => expect(wrapper.get('h1').text()).toBe('This link no longer works'));

    expect(wrapper.text()).toContain('a newer link replaced it');
  });
});
