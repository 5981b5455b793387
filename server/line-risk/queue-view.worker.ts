import { parentPort, workerData } from 'node:worker_threads';
import { walkFlatQueueJob, type FlatQueueJob, type QueueEntries } from '../../shared/domain/line-risk-queue';

/*
 * Walks the queue view of a line-risk walk beside the walk, which judges the units meanwhile (see
 * queue-helper.ts). Everything lives in memory shared with the walk's thread: the job, the
 * entries written, and the control words the walk waits on.
 */

/** One walk's queue view to walk; `control` is [units written, 1 when the walk failed here]. */
export interface QueueTask {
  job: FlatQueueJob;
  entries: QueueEntries;
  control: Int32Array;
}

const { started } = workerData as { started: Int32Array };

parentPort!.on('message', ({ job, entries, control }: QueueTask) => {
  try {
    walkFlatQueueJob(job, entries, (units) => {
      Atomics.store(control, 0, units);
      Atomics.notify(control, 0);
    });
  } catch {
    // The walk then walks the queue view itself.
    Atomics.store(control, 1, 1);
    Atomics.notify(control, 0);
  }
});

Atomics.store(started, 0, 1);
