import { createAppContext, getButton, getByLabel, jsonResponse, mountInApp, waitFor } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, type VueWrapper } from '@vue/test-utils';
import type { SequenceBoard, SequenceDay } from '@shared/schemas/sequence';
import type { SessionUser } from '@shared/schemas/user';
import SequenceAddUnitDialog from '@/components/SequenceAddUnitDialog.vue';
import SequenceSettingsDialog from '@/components/SequenceSettingsDialog.vue';
import { useSequenceStore } from '@/stores/sequence';

const FROZEN = '2026-12-01';
const OPEN = '2026-12-07';
const planner: SessionUser = { email: 'planner@example.com', name: 'Pat Planner', role: 'planner', supplierCode: null };

function day(date: string, frozen: boolean): SequenceDay {
  return { date, working: true, frozen, past: false, capacity: 24, load: 0, units: [], version: `v-${date}` };
}

const board: SequenceBoard = {
  from: FROZEN,
  to: OPEN,
  today: FROZEN,
  frozenUntil: FROZEN,
  frozenWindowDays: 1,
  dailyCapacity: 24,
  days: [day(FROZEN, true), day(OPEN, false)],
  models: [{ partNumber: 'M-A', description: 'Model A' }],
};

/** Answers each `METHOD /api/path` with the handler given; records every call. */
function stubApi(answers: Record<string, () => Response>) {
  const fetchMock = vi.fn<typeof fetch>((input, init) => {
    const url = new URL(String(input), 'http://localhost');
    const answer = answers[`${init?.method ?? 'GET'} ${url.pathname}`];
    return Promise.resolve(
      answer ? answer() : jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }),
    );
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

function bodiesOf(fetchMock: ReturnType<typeof stubApi>, method: string, pathname: string): unknown[] {
  return fetchMock.mock.calls
    .filter(
      ([input, init]) => init?.method === method && new URL(String(input), 'http://localhost').pathname === pathname,
    )
    .map(([, init]) => JSON.parse(String(init?.body)));
}

function type(input: HTMLElement, value: string): void {
  (input as HTMLInputElement).value = value;
  input.dispatchEvent(new Event('input'));
}

function errorUnder(dialog: HTMLElement, label: string): string {
  const item = getByLabel(dialog, label).closest('.el-form-item');
  return item?.querySelector('.el-form-item__error')?.textContent?.trim() ?? '';
}

async function openAddDialog() {
  const context = await createAppContext({ user: planner, path: '/sequence' });
  const wrapper = await mountInApp(SequenceAddUnitDialog, context, {
    props: { modelValue: true, days: board.days, models: board.models },
  });
  const dialog = document.body.querySelector<HTMLElement>('[role="dialog"]')!;
  return { wrapper, dialog };
}

// The day and model pickers keep their options in a floating popper; choosing one is its update event.
async function fill(wrapper: VueWrapper, dialog: HTMLElement, date: string): Promise<void> {
  const [dayPicker, modelPicker] = wrapper.findAllComponents({ name: 'ElSelect' });
  dayPicker!.vm.$emit('update:modelValue', date);
  modelPicker!.vm.$emit('update:modelValue', 'M-A');
  type(getByLabel(dialog, 'Serial'), ' SN-NEW-1 ');
  await flushPromises();
}

describe('SequenceAddUnitDialog', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('adds the unit with a trimmed serial and reloads the board', async () => {
    const fetchMock = stubApi({
      'POST /api/sequence/units': () =>
        jsonResponse(201, { id: 9, date: OPEN, sequence: 1, model: 'M-A', serial: 'SN-NEW-1', qty: 1 }),
      'GET /api/sequence': () => jsonResponse(200, board),
    });
    const { wrapper, dialog } = await openAddDialog();
    await fill(wrapper, dialog, OPEN);

    getButton(dialog, 'Add unit').click();
    await waitFor(() => expect(wrapper.emitted('added')).toHaveLength(1));

    expect(bodiesOf(fetchMock, 'POST', '/api/sequence/units')).toEqual([
      { date: OPEN, model: 'M-A', serial: 'SN-NEW-1', qty: 1 },
    ]);
    expect(
      fetchMock.mock.calls.some(([input]) => new URL(String(input), 'http://localhost').pathname === '/api/sequence'),
    ).toBe(true);
  });

  it('keeps a quantity that is not a whole number of units as typed, says so and sends nothing', async () => {
    const fetchMock = stubApi({});
    const { wrapper, dialog } = await openAddDialog();
    await fill(wrapper, dialog, OPEN);
    wrapper.findComponent({ name: 'ElInputNumber' }).vm.$emit('update:modelValue', 1.5);
    await flushPromises();

    getButton(dialog, 'Add unit').click();
    await flushPromises();

    await waitFor(() => expect(errorUnder(dialog, 'Quantity')).toBe('Must be a whole number of pcs'));
    expect(bodiesOf(fetchMock, 'POST', '/api/sequence/units')).toEqual([]);
    expect(wrapper.emitted('added')).toBeUndefined();
  });

  it('shows a serial already in the sequence (409) under the serial input', async () => {
    const message = 'Serial SN-NEW-1 is already in the sequence (Mon 7 Dec, position 3).';
    stubApi({
      'POST /api/sequence/units': () =>
        jsonResponse(409, {
          error: {
            code: 'conflict',
            message,
            details: [{ path: ['serial'], message: 'already used on Mon 7 Dec, position 3' }],
          },
        }),
    });
    const { wrapper, dialog } = await openAddDialog();
    await fill(wrapper, dialog, OPEN);

    getButton(dialog, 'Add unit').click();

    await waitFor(() => expect(errorUnder(dialog, 'Serial')).toBe(message));
    expect(wrapper.emitted('added')).toBeUndefined();
  });

  it('asks before adding to a frozen day and then sends allowFrozen', async () => {
    const fetchMock = stubApi({
      'POST /api/sequence/units': () =>
        jsonResponse(201, { id: 9, date: FROZEN, sequence: 1, model: 'M-A', serial: 'SN-NEW-1', qty: 1 }),
      'GET /api/sequence': () => jsonResponse(200, board),
    });
    const { wrapper, dialog } = await openAddDialog();
    await fill(wrapper, dialog, FROZEN);

    getButton(dialog, 'Add unit').click();
    await waitFor(() =>
      expect(document.body.textContent).toContain(
        'is inside the frozen window: the line may already be kitting its units',
      ),
    );
    getButton(document.body, 'Add it anyway').click();
    await waitFor(() => expect(wrapper.emitted('added')).toHaveLength(1));

    expect(bodiesOf(fetchMock, 'POST', '/api/sequence/units')).toEqual([
      { date: FROZEN, model: 'M-A', serial: 'SN-NEW-1', qty: 1, allowFrozen: true },
    ]);
  });
});

describe('SequenceSettingsDialog', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('starts from the stored settings and saves the new ones on that version', async () => {
    const fetchMock = stubApi({
      'GET /api/sequence/settings': () =>
        jsonResponse(200, { frozenWindowDays: 1, dailyCapacity: 24, version: 'settings-v1' }),
      'PUT /api/sequence/settings': () =>
        jsonResponse(200, { frozenWindowDays: 5, dailyCapacity: 24, version: 'settings-v2' }),
      'GET /api/sequence': () => jsonResponse(200, board),
    });
    const context = await createAppContext({ user: planner, path: '/sequence' });
    useSequenceStore().board = board;
    const wrapper = await mountInApp(SequenceSettingsDialog, context, { props: { modelValue: false } });
    await wrapper.setProps({ modelValue: true });
    await flushPromises();
    const dialog = document.body.querySelector<HTMLElement>('[role="dialog"]')!;
    const frozenInput = getByLabel(dialog, 'Frozen window (working days)') as HTMLInputElement;
    expect(frozenInput.value).toBe('1');

    type(frozenInput, '5');
    frozenInput.dispatchEvent(new Event('change'));
    await flushPromises();
    getButton(dialog, 'Save settings').click();
    await waitFor(() => expect(wrapper.emitted('saved')).toHaveLength(1));

    expect(bodiesOf(fetchMock, 'PUT', '/api/sequence/settings')).toEqual([{ frozenWindowDays: 5, dailyCapacity: 24 }]);
    expect(ifMatchOf(fetchMock, '/api/sequence/settings')).toEqual(['"settings-v1"']);
  });

  it('shows the settings someone else saved first, says so, and saves on their version next', async () => {
    const theirs = { frozenWindowDays: 4, dailyCapacity: 30, version: 'settings-v2' };
    let refused = false;
    const fetchMock = stubApi({
      'GET /api/sequence/settings': () =>
        jsonResponse(200, { frozenWindowDays: 1, dailyCapacity: 24, version: 'settings-v1' }),
      'PUT /api/sequence/settings': () => {
        if (refused) return jsonResponse(200, { frozenWindowDays: 6, dailyCapacity: 30, version: 'settings-v3' });
        refused = true;
        return jsonResponse(409, {
          error: { code: 'stale', message: 'Changed by someone else.', details: [{ current: theirs }] },
        });
      },
      'GET /api/sequence': () => jsonResponse(200, { ...board, frozenWindowDays: 4, dailyCapacity: 30 }),
    });
    const context = await createAppContext({ user: planner, path: '/sequence' });
    useSequenceStore().board = board;
    const wrapper = await mountInApp(SequenceSettingsDialog, context, { props: { modelValue: false } });
    await wrapper.setProps({ modelValue: true });
    await flushPromises();
    const dialog = document.body.querySelector<HTMLElement>('[role="dialog"]')!;
    const frozenInput = getByLabel(dialog, 'Frozen window (working days)') as HTMLInputElement;

    type(frozenInput, '5');
    frozenInput.dispatchEvent(new Event('change'));
    await flushPromises();
    getButton(dialog, 'Save settings').click();
    await waitFor(() => expect(dialog.textContent).toContain('was changed by someone else first'));
    await flushPromises();

    expect(dialog.textContent).toContain('The screen now shows their version');
    expect(frozenInput.value).toBe('4');
    expect((getByLabel(dialog, 'Daily capacity (units)') as HTMLInputElement).value).toBe('30');
    expect(wrapper.emitted('saved')).toBeUndefined();
    expect(useSequenceStore().board?.dailyCapacity).toBe(30);

    type(frozenInput, '6');
    frozenInput.dispatchEvent(new Event('change'));
    await flushPromises();
    getButton(dialog, 'Save settings').click();
    await waitFor(() => expect(wrapper.emitted('saved')).toHaveLength(1));
    expect(ifMatchOf(fetchMock, '/api/sequence/settings')).toEqual(['"settings-v1"', '"settings-v2"']);
  });
});

function ifMatchOf(fetchMock: ReturnType<typeof stubApi>, pathname: string): (string | undefined)[] {
  return fetchMock.mock.calls
    .filter(
      ([input, init]) => init?.method === 'PUT' && new URL(String(input), 'http://localhost').pathname === pathname,
    )
    .map(([, init]) => (init?.headers as Record<string, string>)['If-Match']);
}
