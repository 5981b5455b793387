import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { Calendar, VersionedCalendar } from '@shared/schemas/master-data';
import * as calendarApi from '@/api/calendar';
import { ApiError } from '@/api/http';
import { useLatestRequest } from './latest-request';

export const useCalendarStore = defineStore('calendar', () => {
  const calendar = ref<VersionedCalendar | null>(null);
  const { loading, error, run } = useLatestRequest();
  const saving = ref(false);

  /** Loads the plant calendar; a failure is kept in `error` for the view to show. */
  function loadCalendar(): Promise<void> {
    return run(calendarApi.fetchCalendar, (answer) => {
      calendar.value = answer;
    });
  }

  /**
   * Replaces the calendar shown and keeps what the server stored; rethrows the ApiError for the
   * form. When someone changed the calendar first (409 `stale`) the calendar shown becomes theirs.
   */
  async function save(next: Calendar): Promise<Calendar> {
    if (!calendar.value) throw new ApiError(0, 'client_error', 'The calendar is not loaded yet.');
    saving.value = true;
    try {
      calendar.value = await calendarApi.saveCalendar(next, calendar.value.version);
      return calendar.value;
    } catch (cause) {
      if (cause instanceof ApiError && cause.isStale) {
        const current = cause.staleCurrent<VersionedCalendar>();
        if (current) calendar.value = current;
        else await loadCalendar();
      }
      throw cause;
    } finally {
      saving.value = false;
    }
  }

  return { calendar, loading, saving, error, loadCalendar, save };
});
