import { isWorkingDay } from '../../shared/domain/calendar';
import type { RunReleasesResponse } from '../../shared/schemas/releases';
import { readCalendar } from '../calendar/calendar.service';
import { plantToday } from '../planning/plan-dates';
import {
  DEFAULT_RELEASE_JOB_TIME,
  RELEASE_JOB_LAST_RUN,
  RELEASE_JOB_TIME,
  type ReleasesService,
} from './releases.service';
import { readSetting, writeSetting } from '../settings/settings';
import type { Database } from '../db/database';

/** After a failed run the job waits this long before trying again, rather than every minute. */
const RETRY_AFTER_MS = 15 * 60 * 1000;

/** `HH:MM` of the server clock, which is plant time. */
export function plantClock(now: Date): string {
  return `${String(now.getHours()).padStart(2, '0')}:${String(now.getMinutes()).padStart(2, '0')}`;
}

/**
 * The daily release run. A cron calls `tick` every minute; it runs the day's releases once the set
 * time has come and the day has not been run yet, so a changed time takes effect at once and a
 * server that was down at the set time catches up when it starts again. Days the plant does not
 * work are skipped: cards emptied then are ordered on the next working day. A brand-new database
 * (no run recorded) first started after the set time begins its schedule the next day, so a fresh
 * install never e-mails suppliers before anyone has looked at it; "Run now" is always there.
 */
export class ReleaseJob {
  private busy = false;
  private failedAt = 0;

  constructor(
    private readonly db: Database,
    private readonly releases: ReleasesService,
  ) {}

  /** Runs today's releases when they are due; returns what the run made, or null when nothing was due. */
  async tick(now = new Date()): Promise<RunReleasesResponse | null> {
    if (this.busy || now.getTime() - this.failedAt < RETRY_AFTER_MS) return null;
    this.busy = true;
    try {
      return await this.db.runAlone('release-job', () => this.runIfDue(now));
    } catch (error) {
      this.failedAt = now.getTime();
      throw error;
    } finally {
      this.busy = false;
    }
  }

  private async runIfDue(now: Date): Promise<RunReleasesResponse | null> {
    const manager = this.db.manager;
    const today = plantToday(now);
    const markRun = () => this.db.write((work) => writeSetting(work, RELEASE_JOB_LAST_RUN, today));
    const jobTime = await readSetting<string>(manager, RELEASE_JOB_TIME, DEFAULT_RELEASE_JOB_TIME);
    const lastRun = await readSetting<string | null>(manager, RELEASE_JOB_LAST_RUN, null);
    if (plantClock(now) < jobTime || (lastRun !== null && lastRun >= today)) return null;
    if (lastRun === null) {
      await markRun();
      return null;
    }
    if (!isWorkingDay(today, await readCalendar(manager))) return null;
    const result = await this.releases.run(today, null);
    await markRun();
    return result;
  }
}
