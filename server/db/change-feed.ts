import { EventEmitter } from 'node:events';

/** A change notice: which kind of data changed (`planning`, `dock`…) and what the screens need to know. */
export interface ChangeNotice {
  channel: string;
  payload: unknown;
}

type Listener = (notice: ChangeNotice) => void;

/**
 * Tells the open event streams of this process what changed, as soon as the change is committed.
 * In-process: one SQLite database is served by one process.
 */
export class ChangeFeed {
  private readonly emitter = new EventEmitter();

  constructor() {
    // One listener per open event stream; the cap on streams lives with the route.
    this.emitter.setMaxListeners(0);
  }

  publish(channel: string, payload: unknown): void {
    this.emitter.emit('change', { channel, payload } satisfies ChangeNotice);
  }

  /** Calls `listener` for every notice until the returned function is called. */
  subscribe(listener: Listener): () => void {
    this.emitter.on('change', listener);
    return () => this.emitter.off('change', listener);
  }

  get listenerCount(): number {
    return this.emitter.listenerCount('change');
  }
}
