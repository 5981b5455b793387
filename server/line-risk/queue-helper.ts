import { extname } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Worker } from 'node:worker_threads';
import {
  flatEntries,
  flattenQueueJob,
  ownEntries,
  type Memory,
  type QueueEntries,
  type QueueHelper,
  type QueueJob,
  type QueueStream,
} from '../../shared/domain/line-risk-queue';
import type { QueueTask } from './queue-view.worker';
import { startWorker } from './start-worker';

/**
 * Below this many needs of units (each unit's BOM lines, summed) a walk afresh walks its queue view
 * itself: handing it over costs more than it saves. The benchmark plant has about 120,000 at 1×
 * and 1,260,000 at 16×.
 */
export const QUEUE_HELPER_FROM = 200_000;

/** With no unit written for this long, the walk stops waiting and walks the queue view itself. */
const PATIENCE_MS = 20_000;

const shared: Memory = (bytes) => new SharedArrayBuffer(bytes);

/**
 * A queue helper for the line-risk worker: a thread of its own walks the queue view of a large
 * walk afresh while the walk judges the units, the two sharing memory; the walk waits for a unit's
 * entries only when it gets there first. The thread is started by the first large walk (a small
 * plant never starts it) and again after it failed; until it is up, walks walk their queue view
 * themselves.
 */
export function createQueueHelper(from = QUEUE_HELPER_FROM): QueueHelper {
  let worker: Worker | null = null;
  let started: Int32Array = new Int32Array(0);
  const start = () => {
    started = new Int32Array(new SharedArrayBuffer(4));
    const thread = startWorker(
      new URL(`./queue-view.worker${extname(fileURLToPath(import.meta.url))}`, import.meta.url),
      { workerData: { started } },
    );
    thread.unref();
    const gone = () => {
      if (worker === thread) worker = null;
    };
    thread.on('error', gone);
    thread.on('exit', gone);
    worker = thread;
  };
  return (job) => {
    if (neededParts(job) < from) return null;
    if (!worker) start();
    if (Atomics.load(started, 0) !== 1) return null;
    const flat = flattenQueueJob(job, shared);
    const entries = flatEntries(flat, shared);
    const control = new Int32Array(new SharedArrayBuffer(8));
    const task: QueueTask = { job: flat, entries, control };
    const thread = worker!;
    thread.postMessage(task);
    return new SharedQueueStream(job, entries, control, () => {
      // Stuck: a new thread for the next walk.
      if (worker === thread) worker = null;
      void thread.terminate();
    });
  };
}

function neededParts(job: QueueJob): number {
  let needs = 0;
  for (const unit of job.units) needs += unit.needCount;
  return needs;
}

/** Entries as the helper's thread writes them; walked here instead if it fails or stalls. */
class SharedQueueStream implements QueueStream {
  private written = 0;
  private here: QueueEntries | null = null;

  constructor(
    private readonly job: QueueJob,
    private readonly entries: QueueEntries,
    private readonly control: Int32Array,
    private readonly stalled: () => void,
  ) {}

  ready(position: number): QueueEntries {
    if (this.here) return this.here;
    let waitingSince = -1;
    while (this.written <= position) {
      const written = Atomics.load(this.control, 0);
      if (written > this.written) {
        this.written = written;
        waitingSince = -1;
        continue;
      }
      if (Atomics.load(this.control, 1) === 1) return this.walkHere();
      const now = performance.now();
      if (waitingSince < 0) waitingSince = now;
      else if (now - waitingSince > PATIENCE_MS) {
        this.stalled();
        return this.walkHere();
      }
      Atomics.wait(this.control, 0, written, 100);
    }
    return this.entries;
  }

  keep(): QueueEntries {
    const units = this.job.units.length;
    const entries = units > 0 ? this.ready(units - 1) : this.entries;
    // The shared arrays are sized for the worst case and go with this walk.
    return entries === this.here ? entries : ownEntries(entries);
  }

  private walkHere(): QueueEntries {
    this.here = this.job.walkHere();
    return this.here;
  }
}
