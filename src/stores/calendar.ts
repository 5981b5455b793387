import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { CalendarUpdate, VersionedCalendar } from '@shared/schemas/master-data';
import * as calendarApi from '@/api/calendar';
import * as sequenceApi from '@/api/sequence';
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
  async function save(next: CalendarUpdate): Promise<VersionedCalendar> {
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

  /** Units still to build on each day asked about (checkUnitsOn), for the warning on a new holiday. */
  const unitsPlanned = ref<Record<string, number>>({});

  /**
   * Counts the units still to build on a day about to become a holiday. Only a warning rests on
   * it: when the sequence cannot be read, the day shows none rather than an error.
   */
  async function checkUnitsOn(date: string): Promise<void> {
    try {
      const board = await sequenceApi.fetchBoard({ from: date, days: 1 });
      const day = board.days.find((candidate) => candidate.date === date);
      const count = (day?.units ?? [])
        .filter((unit) => unit.status !== 'built')
        .reduce((sum, unit) => sum + unit.qty, 0);
      unitsPlanned.value = { ...unitsPlanned.value, [date]: count };
    } catch {
      // The warning is left out; saving the calendar does not depend on it.
    }
  }

  return { calendar, loading, saving, error, unitsPlanned, loadCalendar, save, checkUnitsOn };
});
