import { isWorkingDay } from '../../shared/domain/calendar';
import type { CloseDayResponse } from '../../shared/schemas/builds';
import { readCalendar } from '../calendar/calendar.service';
import type { Database } from '../db/database';
import { plantToday } from '../planning/plan-dates';
import { plantClock } from '../releases/release-job';
import { readSetting, writeSetting } from '../settings/settings';
import { CLOSE_DAY_LAST, CLOSE_DAY_TIME, type BuildsService } from './builds.service';

/**
 * The end-of-shift job: when the admin has set a time (off by default), every unit of a working
 * day not reported built by then is reported built, once per day. A plant that reports each unit
 * at the line leaves it off; one that only knows the day was built switches it on.
 */
export class CloseDayJob {
  private busy = false;

  constructor(
    private readonly db: Database,
    private readonly builds: BuildsService,
  ) {}

  async tick(now = new Date()): Promise<CloseDayResponse | null> {
    if (this.busy) return null;
    this.busy = true;
    try {
      return await this.db.runAlone('end-of-shift', () => this.closeIfDue(now));
    } finally {
      this.busy = false;
    }
  }

  private async closeIfDue(now: Date): Promise<CloseDayResponse | null> {
    const manager = this.db.manager;
    const time = await readSetting<string | null>(manager, CLOSE_DAY_TIME, null);
    const today = plantToday(now);
    const last = await readSetting<string | null>(manager, CLOSE_DAY_LAST, null);
    if (!time || plantClock(now) < time || (last !== null && last >= today)) return null;
    if (!isWorkingDay(today, await readCalendar(manager))) return null;
    const result = await this.builds.closeDay(today, null);
    await this.db.write((work) => writeSetting(work, CLOSE_DAY_LAST, today));
    return result;
  }
}
