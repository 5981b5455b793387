import cron, { type ScheduledTask } from 'node-cron';

/** A job the process runs on a schedule; `run` resolves to a line worth logging, or nothing. */
export interface ScheduledJob {
  name: string;
  /** node-cron expression, with seconds. */
  schedule: string;
  run: () => Promise<string | null | undefined>;
}

/**
 * Starts the in-process jobs. Clock jobs (releases, end of shift) look at their set time every
 * minute rather than being scheduled at it: a changed time needs no rescheduling, and a time
 * missed while the server was down is caught up when it starts again.
 */
export function startJobs(jobs: readonly ScheduledJob[]): ScheduledTask[] {
  return jobs.map((job) =>
    cron.schedule(job.schedule, () => {
      job
        .run()
        .then((line) => {
          if (line) console.log(`${job.name}: ${line}`);
        })
        .catch((error) => console.error(`${job.name} failed:`, error));
    }),
  );
}
