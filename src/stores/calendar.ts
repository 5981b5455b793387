import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { Calendar } from '@shared/schemas/master-data';
import * as calendarApi from '@/api/calendar';
import { ApiError } from '@/api/http';

export const useCalendarStore = defineStore('calendar', () => {
  const calendar = ref<Calendar | null>(null);
  const loading = ref(false);
  const saving = ref(false);
  const error = ref<ApiError | null>(null);

  /** Loads the plant calendar; a failure is kept in `error` for the view to show. */
  async function fetch(): Promise<void> {
    loading.value = true;
    error.value = null;
    try {
      calendar.value = await calendarApi.fetchCalendar();
    } catch (cause) {
      if (!(cause instanceof ApiError)) throw cause;
      error.value = cause;
    } finally {
      loading.value = false;
    }
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

  return { calendar, loading, saving, error, fetch, save };
});
