import { createAppContext, demoUsers, jsonResponse, mountInApp } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import type { User } from '@shared/schemas/user';
import UsersView from '@/views/UsersView.vue';

const confirmBox = vi.hoisted(() => vi.fn(() => Promise.resolve('confirm')));
vi.mock('element-plus', async (importOriginal) => {
  const original = await importOriginal<typeof import('element-plus')>();
  return { ...original, ElMessageBox: { confirm: confirmBox } };
});

const admin: User = {
  ...demoUsers.admin,
  id: 1,
  active: true,
  createdAt: '2026-11-01T08:00:00.000Z',
  version: 'admin-v1',
};
const planner: User = {
  id: 2,
  email: 'planner@example.com',
  name: 'Pat Planner',
  role: 'planner',
  supplierCode: null,
  active: true,
  createdAt: '2026-11-02T08:00:00.000Z',
  version: 'planner-v1',
};

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

function callsTo(fetchMock: ReturnType<typeof stubApi>, method: string, pathname: string) {
  return fetchMock.mock.calls.filter(
    ([input, init]) => init?.method === method && new URL(String(input), 'http://localhost').pathname === pathname,
  );
}

async function openUsers() {
  const context = await createAppContext({ user: demoUsers.admin, path: '/admin/users' });
  const wrapper = await mountInApp(UsersView, context);
  await flushPromises();
  return wrapper;
}

function plannerRow(wrapper: Awaited<ReturnType<typeof openUsers>>) {
  return wrapper.findAll('tr.el-table__row').find((row) => row.text().includes('planner@example.com'))!;
}

function roleSelectOf(wrapper: Awaited<ReturnType<typeof openUsers>>, name: string) {
  return wrapper
    .findAllComponents({ name: 'ElSelect' })
    .find((candidate) => candidate.props('ariaLabel') === `Role of ${name}`)!;
}

async function chooseRole(wrapper: Awaited<ReturnType<typeof openUsers>>, role: string): Promise<void> {
  roleSelectOf(wrapper, 'Pat Planner').vm.$emit('change', role);
  await flushPromises();
}

describe('UsersView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
    confirmBox.mockReset();
    confirmBox.mockImplementation(() => Promise.resolve('confirm'));
  });

  it('asks before changing a role, and changes nothing when the admin keeps it', async () => {
    const fetchMock = stubApi({ 'GET /api/users': () => jsonResponse(200, [admin, planner]) });
    confirmBox.mockImplementationOnce(() => Promise.reject(new Error('cancel')));
    const wrapper = await openUsers();

    await chooseRole(wrapper, 'buyer');

    expect(confirmBox).toHaveBeenCalledTimes(1);
    expect(confirmBox.mock.calls[0]).toEqual(
      expect.arrayContaining([expect.stringContaining('Pat Planner becomes Buyer instead of Planner')]),
    );
    expect(callsTo(fetchMock, 'PATCH', '/api/users/2')).toHaveLength(0);
    expect(plannerRow(wrapper).text()).toContain('Planner');
  });

  it('changes the role once confirmed, on the version the list showed', async () => {
    const fetchMock = stubApi({
      'GET /api/users': () => jsonResponse(200, [admin, planner]),
      'PATCH /api/users/2': () => jsonResponse(200, { ...planner, role: 'buyer', version: 'planner-v2' }),
    });
    const wrapper = await openUsers();

    await chooseRole(wrapper, 'buyer');

    const [[, init]] = callsTo(fetchMock, 'PATCH', '/api/users/2') as [[unknown, RequestInit]];
    expect(JSON.parse(String(init.body))).toEqual({ role: 'buyer' });
    expect((init.headers as Record<string, string>)['If-Match']).toBe('"planner-v1"');
    expect(document.body.textContent).toContain('Pat Planner is now Buyer.');
  });

  it('shows the account as someone else left it when they changed it first', async () => {
    const theirs = { ...planner, role: 'viewer', version: 'planner-v2' };
    stubApi({
      'GET /api/users': () => jsonResponse(200, [admin, planner]),
      'PATCH /api/users/2': () =>
        jsonResponse(409, {
          error: { code: 'stale', message: 'Changed by someone else.', details: [{ current: theirs }] },
        }),
    });
    const wrapper = await openUsers();

    await chooseRole(wrapper, 'buyer');

    expect(document.body.textContent).toContain(
      'The account of Pat Planner was changed by someone else first. The screen now shows their version',
    );
    expect(roleSelectOf(wrapper, 'Pat Planner').props('modelValue')).toBe('viewer');
  });

  it('asks before disabling an account and leaves it active when the admin keeps it', async () => {
    const fetchMock = stubApi({ 'GET /api/users': () => jsonResponse(200, [admin, planner]) });
    confirmBox.mockImplementationOnce(() => Promise.reject(new Error('cancel')));
    const wrapper = await openUsers();

    await plannerRow(wrapper).get('.el-switch').trigger('click');
    await flushPromises();

    expect(confirmBox).toHaveBeenCalledWith(
      expect.stringContaining('Pat Planner will no longer be able to sign in'),
      'Disable this account?',
      expect.anything(),
    );
    expect(callsTo(fetchMock, 'PATCH', '/api/users/2')).toHaveLength(0);
    expect(plannerRow(wrapper).text()).toContain('Active');
  });

  it('e-mails a reset link after asking, and says where it went and until when', async () => {
    const expiresAt = new Date(2026, 11, 3, 14, 5).toISOString();
    const fetchMock = stubApi({
      'GET /api/users': () => jsonResponse(200, [admin, planner]),
      'POST /api/users/2/password-reset': () => jsonResponse(202, { to: 'planner@example.com', expiresAt }),
    });
    const wrapper = await openUsers();

    await plannerRow(wrapper).get('button[aria-label="E-mail a password-reset link to Pat Planner"]').trigger('click');
    await flushPromises();

    expect(confirmBox).toHaveBeenCalledWith(
      expect.stringContaining('The link works once, for 24 hours'),
      'E-mail a password-reset link?',
      expect.anything(),
    );
    expect(callsTo(fetchMock, 'POST', '/api/users/2/password-reset')).toHaveLength(1);
    const alert = wrapper.get('.users-view__alert');
    expect(alert.text()).toContain('Password-reset link sent to planner@example.com');
    expect(alert.text()).toContain('until Thu 3 Dec 2026 14:05 (24 hours)');
  });

  it('sends no reset link when the admin says not now', async () => {
    const fetchMock = stubApi({ 'GET /api/users': () => jsonResponse(200, [admin, planner]) });
    confirmBox.mockImplementationOnce(() => Promise.reject(new Error('cancel')));
    const wrapper = await openUsers();

    await plannerRow(wrapper).get('button[aria-label="E-mail a password-reset link to Pat Planner"]').trigger('click');
    await flushPromises();

    expect(callsTo(fetchMock, 'POST', '/api/users/2/password-reset')).toHaveLength(0);
    expect(wrapper.find('.users-view__alert').exists()).toBe(false);
  });
});
