import cron, { type ScheduledTask } from 'node-cron';
import type { OutboxDispatcher } from '../outbox/outbox.service';
import type { ReleaseJob } from '../releases/release-job';

/** A check that returns what it reported, run every few minutes. */
type PeriodicCheck = () => Promise<string[]>;

/**
 * In-process jobs: the outbox is drained every ten seconds; the release job looks at its clock
 * every minute; the frozen window is checked for new shortages every five minutes.
 */
export function startJobs(
  dispatcher: OutboxDispatcher,
  releaseJob: ReleaseJob,
  frozenWindowCheck: PeriodicCheck,
): ScheduledTask[] {
  const drainOutbox = cron.schedule('*/10 * * * * *', () => {
    dispatcher.dispatchDue().catch((error) => console.error('Outbox dispatch failed:', error));
  });
  // Every minute rather than a cron at the set time: the admin's time change needs no rescheduling,
  // and a missed time is caught up after a restart.
  const releases = cron.schedule('0 * * * * *', () => {
    releaseJob
      .tick()
      .then((result) => {
        if (result) console.log(`Release job ${result.date}: ${result.releases.length} releases sent.`);
      })
      .catch((error) => console.error('Release job failed:', error));
  });
  const shortages = cron.schedule('30 */5 * * * *', () => {
    frozenWindowCheck()
      .then((parts) => {
        if (parts.length > 0) console.log(`Frozen-window shortage alert sent for ${parts.join(', ')}.`);
      })
      .catch((error) => console.error('Frozen-window shortage check failed:', error));
  });
  return [drainOutbox, releases, shortages];
}
