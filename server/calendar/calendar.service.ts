import { isDeepStrictEqual } from 'node:util';
import type { EntityManager } from 'typeorm';
import type { Calendar, CalendarUpdate, VersionedCalendar } from '../../shared/schemas/master-data';
import { recordAudit } from '../audit/audit.service';
import { readSetting, writeSetting } from '../settings/settings';
import { bumpPlanningVersion } from '../settings/versions';
import { HolidayEntity } from './holiday.entity';
import type { Database } from '../db/database';
import { assertCurrent, withVersion } from '../http/versions';

const WORKING_WEEKDAYS = 'workingWeekdays';
export const DEFAULT_WORKING_WEEKDAYS = [1, 2, 3, 4, 5];

/** The plant calendar as published by GET /api/calendar. */
export async function readCalendar(manager: EntityManager): Promise<Calendar> {
  const workingWeekdays = await readSetting<number[]>(manager, WORKING_WEEKDAYS, DEFAULT_WORKING_WEEKDAYS);
  const holidays = await manager.find(HolidayEntity, { order: { date: 'ASC' } });
  return { workingWeekdays, holidays: holidays.map((holiday) => holiday.date) };
}

/**
 * Replaces the calendar whole; every lead-time offset moves with it. A holiday that stays keeps its
 * name; `names` names new ones (the demo's shutdown days).
 */
export async function writeCalendar(
  manager: EntityManager,
  calendar: Calendar,
  names: ReadonlyMap<string, string> = new Map(),
): Promise<Calendar> {
  const workingWeekdays = [...calendar.workingWeekdays].sort((a, b) => a - b);
  await writeSetting(manager, WORKING_WEEKDAYS, workingWeekdays);
  const kept = new Map((await manager.find(HolidayEntity)).map((holiday) => [holiday.date, holiday.name]));
  await manager.clear(HolidayEntity);
  if (calendar.holidays.length > 0) {
    await manager.insert(
      HolidayEntity,
      calendar.holidays.map((date) => ({ date, name: names.get(date) ?? kept.get(date) ?? '' })),
    );
  }
  await bumpPlanningVersion(manager, 'calendar');
  return readCalendar(manager);
}

/** The names of the holidays that have one, by date. */
async function readHolidayNames(manager: EntityManager): Promise<Record<string, string>> {
  const holidays = await manager.find(HolidayEntity);
  return Object.fromEntries(holidays.filter((holiday) => holiday.name).map((holiday) => [holiday.date, holiday.name]));
}

/** The calendar as the API gives it: its version and the holidays' names beside it. */
async function versioned(manager: EntityManager, calendar: Calendar): Promise<VersionedCalendar> {
  return { ...withVersion(calendar), holidayNames: await readHolidayNames(manager) };
}

/** "2026-12-11 Stocktake", or the date alone for a holiday without a name. */
function holidayWords(date: string, names: Readonly<Record<string, string>> | undefined): string {
  const name = names?.[date];
  return name ? `${date} ${name}` : date;
}

/**
 * What a calendar change changed, as the audit trail keeps it: the working weekdays when they
 * moved, and the holidays added, removed and renamed (a plant keeps dozens, so the lists whole
 * would hide the one that changed).
 */
function calendarChanges(before: VersionedCalendar, after: VersionedCalendar): Record<string, unknown> {
  const changes: Record<string, unknown> = {};
  if (!isDeepStrictEqual(before.workingWeekdays, after.workingWeekdays)) {
    changes.before = { workingWeekdays: before.workingWeekdays };
    changes.after = { workingWeekdays: after.workingWeekdays };
  }
  const added = after.holidays.filter((date) => !before.holidays.includes(date));
  const removed = before.holidays.filter((date) => !after.holidays.includes(date));
  const renamed = after.holidays.filter(
    (date) =>
      before.holidays.includes(date) && (before.holidayNames?.[date] ?? '') !== (after.holidayNames?.[date] ?? ''),
  );
  if (added.length > 0) changes.holidaysAdded = added.map((date) => holidayWords(date, after.holidayNames));
  if (removed.length > 0) changes.holidaysRemoved = removed.map((date) => holidayWords(date, before.holidayNames));
  if (renamed.length > 0) {
    changes.holidaysRenamed = renamed.map(
      (date) => `${date}: ${before.holidayNames?.[date] || '—'} → ${after.holidayNames?.[date] || '—'}`,
    );
  }
  return changes;
}

export class CalendarService {
  constructor(private readonly db: Database) {}

  async get(): Promise<VersionedCalendar> {
    const manager = this.db.manager;
    return versioned(manager, await readCalendar(manager));
  }

  update(
    { holidayNames, ...calendar }: CalendarUpdate,
    actorEmail: string,
    basedOn?: string,
  ): Promise<VersionedCalendar> {
    return this.db.write(async (manager) => {
      const before = await versioned(manager, await readCalendar(manager));
      // A stale copy is answered with the calendar as GET gives it, names and all.
      assertCurrent(basedOn, before, 'The plant calendar');
      const after = await versioned(
        manager,
        await writeCalendar(manager, calendar, new Map(Object.entries(holidayNames ?? {}))),
      );
      await recordAudit(manager, {
        actorEmail,
        action: 'update',
        entity: 'calendar',
        entityKey: 'plant',
        changes: calendarChanges(before, after),
      });
      return after;
    });
  }
}
