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
import { flushPromises, type VueWrapper } from '@vue/test-utils';
import UsersAddDialog from '@/components/UsersAddDialog.vue';

function type(input: HTMLElement, value: string): void {
  (input as HTMLInputElement).value = value;
  input.dispatchEvent(new Event('input'));
}

async function openDialog() {
  const context = await createAppContext({ user: demoUsers.admin, path: '/admin/users' });
  const wrapper = await mountInApp(UsersAddDialog, context, { props: { modelValue: true } });
  const dialog = document.body.querySelector<HTMLElement>('[role="dialog"]')!;
  return { wrapper, dialog };
}

async function fillValidUser(wrapper: VueWrapper, dialog: HTMLElement): Promise<void> {
  type(getByLabel(dialog, 'Name'), 'Noor Planner');
  type(getByLabel(dialog, 'E-mail'), 'noor@example.org');
  type(getByLabel(dialog, 'First password'), 'long-enough-secret');
  // The role picker's options live in a floating popper; choosing one is its update event.
  wrapper.findComponent({ name: 'ElSelect' }).vm.$emit('update:modelValue', 'planner');
  await flushPromises();
}

// Element Plus shows a form item's message 100 ms after its state turns to error, so callers wait.
function errorUnder(dialog: HTMLElement, label: string): string {
  const item = getByLabel(dialog, label).closest('.el-form-item');
  return item?.querySelector('.el-form-item__error')?.textContent?.trim() ?? '';
}

describe('UsersAddDialog', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('puts the server’s field messages under the matching inputs', async () => {
    const { wrapper, dialog } = await openDialog();
    await fillValidUser(wrapper, dialog);
    // A zod issue list as the server sends it in `details` (PRODUCT.md, "Published API": 400
    // for invalid input with zod issues in details).
    stubFetch(
      jsonResponse(400, {
        error: {
          code: 'validation_error',
          message: 'Invalid input',
          details: [{ path: ['name'], message: 'Name is reserved' }],
        },
      }),
    );

    getButton(dialog, 'Add user').click();
    await flushPromises();
    await flushPromises();

    await waitFor(() => expect(errorUnder(dialog, 'Name')).toBe('Name is reserved'));
    expect(wrapper.emitted('created')).toBeUndefined();
  });

  it('shows a taken e-mail (409) under the e-mail input', async () => {
    const { wrapper, dialog } = await openDialog();
    await fillValidUser(wrapper, dialog);
    stubFetch(jsonResponse(409, { error: { code: 'conflict', message: 'This e-mail already has an account' } }));

    getButton(dialog, 'Add user').click();
    await flushPromises();
    await flushPromises();

    await waitFor(() => expect(errorUnder(dialog, 'E-mail')).toBe('This e-mail already has an account'));
  });

  it('sends the new user and reports it created', async () => {
    const { wrapper, dialog } = await openDialog();
    await fillValidUser(wrapper, dialog);
    const created = {
      id: 12,
      email: 'noor@example.org',
      name: 'Noor Planner',
      role: 'planner',
      supplierCode: null,
      active: true,
      createdAt: '2025-03-03T08:00:00.000Z',
    };
    const fetchMock = stubFetch(jsonResponse(201, created));

    getButton(dialog, 'Add user').click();
    await flushPromises();
    await flushPromises();

    expect(JSON.parse(String(fetchMock.mock.calls[0]![1]?.body))).toEqual({
      name: 'Noor Planner',
      email: 'noor@example.org',
      role: 'planner',
      password: 'long-enough-secret',
    });
    expect(wrapper.emitted('created')).toEqual([[created]]);
    expect(wrapper.emitted('update:modelValue')).toEqual([[false]]);
  });
});
