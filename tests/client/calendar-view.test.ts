import { createAppContext, demoUsers, getButton, jsonResponse, mountInApp, stubFetch, waitFor } from './helpers';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, type VueWrapper } from '@vue/test-utils';
import { addDays, addMonths, format, getISODay } from 'date-fns';
import { RouterView } from 'vue-router';
import type { SessionUser } from '@shared/schemas/user';
import CalendarHolidayList from '@/components/CalendarHolidayList.vue';
import CalendarMonth from '@/components/CalendarMonth.vue';

const planner: SessionUser = { email: 'planner@example.com', name: 'Pat Planner', role: 'planner', supplierCode: null };
const viewer: SessionUser = { email: 'viewer@example.com', name: 'Vi Viewer', role: 'viewer', supplierCode: null };

const STORED = { workingWeekdays: [1, 2, 3, 4, 5], holidays: ['2030-12-25'], version: 'cal-v1' };

// ISO 8601 numbers the days of the week Monday = 1 … Sunday = 7 (from memory); the numbers here
// come from date-fns (getISODay), a general-purpose date library, for seven days in a row.
const ISO_DAY_OF = Object.fromEntries(
  Array.from({ length: 7 }, (_, offset) => {
    const date = addDays(new Date(2030, 0, 1), offset);
    return [format(date, 'EEEE'), getISODay(date)];
  }),
) as Record<string, number>;

async function openCalendar(user: SessionUser) {
  const fetchMock = stubFetch(jsonResponse(200, STORED));
  const context = await createAppContext({ user, path: '/calendar' });
  // Through the real route, so the view's leave guard has its route record.
  const wrapper = await mountInApp(RouterView, context);
  await waitFor(() => expect(wrapper.find('.calendar-view__grid').exists()).toBe(true));
  return { wrapper, fetchMock };
}

function weekdayBox(wrapper: VueWrapper, label: string) {
  const box = wrapper.findAll('label.el-checkbox').find((candidate) => candidate.text() === label);
  if (!box) throw new Error(`no weekday "${label}"`);
  return box.get('input[type="checkbox"]');
}

function lastPutBody(fetchMock: ReturnType<typeof stubFetch>): unknown {
  const put = fetchMock.mock.calls.find(([, init]) => init?.method === 'PUT');
  return put ? JSON.parse(String(put[1]!.body)) : undefined;
}

describe('CalendarView', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
    vi.unstubAllGlobals();
  });

  it('sends the ticked weekdays as ISO numbers, Monday = 1 … Sunday = 7, with the holidays kept', async () => {
    const { wrapper, fetchMock } = await openCalendar(planner);
    const expected = ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Saturday'].map((name) => ISO_DAY_OF[name]);
    fetchMock.mockResolvedValueOnce(jsonResponse(200, { workingWeekdays: expected, holidays: STORED.holidays }));

    await weekdayBox(wrapper, 'Friday').setValue(false);
    await weekdayBox(wrapper, 'Saturday').setValue(true);
    getButton(wrapper.element, 'Save calendar').click();
    await flushPromises();

    // PRODUCT.md's `GET|PUT /api/calendar` takes ISO weekday numbers.
    expect(lastPutBody(fetchMock)).toEqual({ workingWeekdays: expected, holidays: ['2030-12-25'] });
    expect(fetchMock.mock.calls.at(-1)![0]).toBe('/api/calendar');
  });

  it('saves on the version shown; when someone saved first, shows their calendar and says so', async () => {
    const { wrapper, fetchMock } = await openCalendar(planner);
    const theirs = { workingWeekdays: [1, 2, 3, 4, 5, 6], holidays: ['2030-12-25', '2030-12-26'], version: 'cal-v2' };
    fetchMock.mockResolvedValueOnce(
      jsonResponse(409, {
        error: { code: 'stale', message: 'Changed by someone else.', details: [{ current: theirs }] },
      }),
    );

    await weekdayBox(wrapper, 'Friday').setValue(false);
    getButton(wrapper.element, 'Save calendar').click();
    await flushPromises();

    const put = fetchMock.mock.calls.find(([, init]) => init?.method === 'PUT')!;
    expect((put[1]!.headers as Record<string, string>)['If-Match']).toBe('"cal-v1"');
    expect(wrapper.text()).toContain(
      'The plant calendar was changed by someone else first. The screen now shows their version',
    );
    expect((weekdayBox(wrapper, 'Friday').element as HTMLInputElement).checked).toBe(true);
    expect((weekdayBox(wrapper, 'Saturday').element as HTMLInputElement).checked).toBe(true);
    expect(
      wrapper
        .findAll('button')
        .find((button) => button.text() === 'Save calendar')!
        .attributes('disabled'),
    ).toBeDefined();
  });

  it('adds a holiday from the list to the saved body in date order', async () => {
    const { wrapper, fetchMock } = await openCalendar(demoUsers.admin);
    // The units planned on the new day (none), then the save.
    fetchMock.mockResolvedValueOnce(jsonResponse(200, { days: [] }));
    fetchMock.mockResolvedValueOnce(jsonResponse(200, { ...STORED, holidays: ['2030-12-24', '2030-12-25'] }));

    wrapper.findComponent(CalendarHolidayList).vm.$emit('add', '2030-12-24', '');
    await flushPromises();
    getButton(wrapper.element, 'Save calendar').click();
    await flushPromises();

    expect(lastPutBody(fetchMock)).toEqual({
      workingWeekdays: [1, 2, 3, 4, 5],
      holidays: ['2030-12-24', '2030-12-25'],
    });
  });

  it('names a new holiday, and warns of the units still planned on it before closing the day', async () => {
    const { wrapper, fetchMock } = await openCalendar(planner);
    const unit = (serial: string, status: string) => ({
      id: serial.length,
      date: '2030-12-24',
      sequence: 1,
      model: 'M',
      serial,
      qty: 1,
      status,
      builtAt: null,
    });
    fetchMock.mockImplementation(async (input, init) => {
      const url = String(input);
      if (url.startsWith('/api/sequence')) {
        return jsonResponse(200, {
          days: [{ date: '2030-12-24', units: [unit('S1', 'planned'), unit('S2', 'started'), unit('S3', 'built')] }],
        });
      }
      if (init?.method === 'PUT') return jsonResponse(200, { ...STORED, holidays: ['2030-12-24', '2030-12-25'] });
      return jsonResponse(200, STORED);
    });

    wrapper.findComponent({ name: 'ElDatePicker' }).vm.$emit('update:modelValue', '2030-12-24');
    await wrapper.get('input[aria-label="Holiday name"]').setValue('  Stocktake ');
    await wrapper.get('form').trigger('submit');
    await flushPromises();
    // The built unit is done; the planned and the started one would sit on a closed day.
    await waitFor(() =>
      expect(wrapper.get('[data-test="units-planned"]').text()).toBe(
        '2 units planned that day: move them on the Build sequence board',
      ),
    );
    expect(wrapper.text()).toContain('Stocktake');
    getButton(wrapper.element, 'Save calendar').click();
    await flushPromises();

    expect(lastPutBody(fetchMock)).toBeUndefined();
    await waitFor(() =>
      expect(document.body.textContent).toContain('Units are still planned on Tue 24 Dec (2 units).'),
    );
    getButton(document.body, 'Save the calendar').click();
    await flushPromises();
    await waitFor(() =>
      expect(lastPutBody(fetchMock)).toEqual({
        workingWeekdays: [1, 2, 3, 4, 5],
        holidays: ['2030-12-24', '2030-12-25'],
        holidayNames: { '2030-12-24': 'Stocktake' },
      }),
    );
  });

  it('refuses to save a week without a working day and says why', async () => {
    const { wrapper, fetchMock } = await openCalendar(planner);
    for (const day of ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday'])
      await weekdayBox(wrapper, day).setValue(false);

    getButton(wrapper.element, 'Save calendar').click();
    await flushPromises();

    await waitFor(() => expect(wrapper.get('.el-form-item__error').text()).toBe('At least one working weekday'));
    expect(lastPutBody(fetchMock)).toBeUndefined();
  });

  it('puts a server validation message beside the holidays', async () => {
    const { wrapper, fetchMock } = await openCalendar(planner);
    await weekdayBox(wrapper, 'Saturday').setValue(true);
    // A zod issue list as the server sends it for invalid input (PRODUCT.md, 400 with zod issues in details).
    fetchMock.mockResolvedValueOnce(
      jsonResponse(400, {
        error: {
          code: 'validation_error',
          message: 'Invalid input',
          details: [{ path: ['holidays', 0], message: 'a date as YYYY-MM-DD' }],
        },
      }),
    );

    getButton(wrapper.element, 'Save calendar').click();
    await flushPromises();

    expect(wrapper.text()).toContain('A date as YYYY-MM-DD');
    expect(wrapper.text()).toContain('The calendar was not saved: Invalid input');
  });

  it('shows a viewer the calendar read-only: no save, weekdays locked', async () => {
    const { wrapper } = await openCalendar(viewer);

    expect(wrapper.text()).toContain('Read only');
    expect(wrapper.findAll('button').map((button) => button.text())).not.toContain('Save calendar');
    expect((weekdayBox(wrapper, 'Monday').element as HTMLInputElement).disabled).toBe(true);
    expect((weekdayBox(wrapper, 'Monday').element as HTMLInputElement).checked).toBe(true);
  });
});

describe('CalendarHolidayList', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
  });

  it('marks the next holiday, hides past ones, and notes one that falls on a closed weekday', async () => {
    const context = await createAppContext({ user: planner, path: '/' });
    // The weekday of each date comes from date-fns (getISODay), a general-purpose date library.
    const closedWeekday = getISODay(new Date(2031, 0, 4));

    const wrapper = await mountInApp(CalendarHolidayList, context, {
      props: {
        holidays: ['2030-11-01', '2030-12-25', '2031-01-04'],
        workingWeekdays: [1, 2, 3, 4, 5, 6, 7].filter((day) => day !== closedWeekday),
        today: '2030-12-01',
        editable: true,
      },
    });

    const items = wrapper.findAll('.calendar-holiday-list__item');
    expect(items.map((item) => item.find('time').attributes('datetime'))).toEqual(['2030-12-25', '2031-01-04']);
    expect(items[0]!.classes()).toContain('is-next');
    expect(items[0]!.text()).toContain('in 24 days');
    expect(items[0]!.text()).toContain('Next');
    expect(items[0]!.text()).not.toContain('already a non-working weekday');
    expect(items[1]!.text()).toContain('already a non-working weekday');
    expect(wrapper.text()).toContain('Show past holidays (1)');
  });

  it('shows a holiday’s name beside its date, and nothing for one without', async () => {
    const context = await createAppContext({ user: planner, path: '/' });
    const wrapper = await mountInApp(CalendarHolidayList, context, {
      props: {
        holidays: ['2030-12-25', '2030-12-27'],
        names: { '2030-12-25': 'Plant shutdown: year end' },
        workingWeekdays: [1, 2, 3, 4, 5],
        today: '2030-12-01',
        editable: false,
      },
    });

    const items = wrapper.findAll('.calendar-holiday-list__item');
    expect(items[0]!.get('.calendar-holiday-list__name').text()).toBe('Plant shutdown: year end');
    expect(items[1]!.find('.calendar-holiday-list__name').exists()).toBe(false);
  });

  it('refuses a date that is already a holiday', async () => {
    const context = await createAppContext({ user: planner, path: '/' });
    const wrapper = await mountInApp(CalendarHolidayList, context, {
      props: { holidays: ['2030-12-25'], workingWeekdays: [1, 2, 3, 4, 5], today: '2030-12-01', editable: true },
    });
    wrapper.findComponent({ name: 'ElDatePicker' }).vm.$emit('update:modelValue', '2030-12-25');
    await flushPromises();

    await wrapper.get('form').trigger('submit');
    await flushPromises();

    expect(wrapper.emitted('add')).toBeUndefined();
    await waitFor(() =>
      expect(wrapper.get('.el-form-item__error').text()).toBe('Wed 25 Dec 2030 is already a holiday.'),
    );
  });
});

describe('CalendarMonth', () => {
  afterEach(() => {
    document.body.innerHTML = '';
    localStorage.clear();
  });

  it('names the month shown in the screen style and pages from month to month', async () => {
    const context = await createAppContext({ user: planner, path: '/' });
    const wrapper = await mountInApp(CalendarMonth, context, {
      props: { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] },
    });
    const today = new Date();

    // date-fns writes the expected month names ("Dec 2030"), independently of the component.
    expect(wrapper.get('.calendar-month__title').text()).toBe(format(today, 'MMM yyyy'));
    getButton(wrapper.element, 'Next month').click();
    await flushPromises();

    expect(wrapper.get('.calendar-month__title').text()).toBe(format(addMonths(today, 1), 'MMM yyyy'));
  });
});
