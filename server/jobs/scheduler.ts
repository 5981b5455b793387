import cron, { type ScheduledTask } from 'node-cron';
import type { OutboxDispatcher } from '../mail/outbox.service';

/** In-process jobs: the outbox is drained every ten seconds. */
export function startJobs(dispatcher: OutboxDispatcher): ScheduledTask[] {
  const drainOutbox = cron.schedule('*/10 * * * * *', () => {
    dispatcher.dispatchDue().catch((error) => console.error('Outbox dispatch failed:', error));
  });
  return [drainOutbox];
}
