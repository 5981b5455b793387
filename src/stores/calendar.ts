import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { Calendar } from '@shared/schemas/master-data';
import * as calendarApi from '@/api/calendar';
import { useLatestRequest } from './latest-request';

export const useCalendarStore = defineStore('calendar', () => {
  const calendar = ref<Calendar | null>(null);
  const { loading, error, run } = useLatestRequest();
  const saving = ref(false);

  /** Loads the plant calendar; a failure is kept in `error` for the view to show. */
  function loadCalendar(): Promise<void> {
    return run(calendarApi.fetchCalendar, (answer) => {
      calendar.value = answer;
    });
  }

  /** Replaces the calendar and keeps what the server stored; rethrows the ApiError for the form. */
  async function save(next: Calendar): Promise<Calendar> {
    saving.value = true;
    try {
      calendar.value = await calendarApi.saveCalendar(next);
      return calendar.value;
    } finally {
      saving.value = false;
    }
  }

  return { calendar, loading, saving, error, loadCalendar, save };
});
