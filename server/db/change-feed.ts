import { EventEmitter } from 'node:events';
import pg from 'pg';

/** A change notice: which kind of data changed (`planning`, `dock`…) and what the screens need to know. */
export interface ChangeNotice {
  channel: string;
  payload: unknown;
}

type Listener = (notice: ChangeNotice) => void;

/**
 * Tells the open event streams of this process what changed, as soon as the change is committed.
 * On SQLite the process that commits publishes (one SQLite database is served by one process); on
 * PostgreSQL every node's `PostgresChangeListener` publishes what the server tells it.
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

/** How long to wait before listening again after the connection to PostgreSQL dropped. */
const RECONNECT_MS = 1_000;

/**
 * A connection of its own that LISTENs on the change channel and hands every notice (sent with
 * NOTIFY by whichever node committed the change) to this node's feed. A dropped connection is
 * opened again; notices sent meanwhile are lost, and the screens catch up with the next one.
 */
export class PostgresChangeListener {
  readonly feed = new ChangeFeed();
  private client: pg.Client | null = null;
  private stopped = false;
  private retry: NodeJS.Timeout | undefined;

  private constructor(
    private readonly url: string,
    private readonly channel: string,
  ) {}

  static async start(url: string, channel: string): Promise<PostgresChangeListener> {
    const listener = new PostgresChangeListener(url, channel);
    await listener.connect();
    return listener;
  }

  private async connect(): Promise<void> {
    const client = new pg.Client({ connectionString: this.url, application_name: 'cardloop-listen' });
    client.on('notification', (message) => {
      if (message.channel !== this.channel || !message.payload) return;
      const notice = JSON.parse(message.payload) as ChangeNotice;
      this.feed.publish(notice.channel, notice.payload);
    });
    client.on('error', () => this.reconnect(client));
    client.on('end', () => this.reconnect(client));
    await client.connect();
    await client.query(`LISTEN ${this.channel}`);
    this.client = client;
  }

  /** Listens again after `failed` (null: after a failed attempt to reconnect) went away. */
  private reconnect(failed: pg.Client | null): void {
    if (this.stopped || (failed !== null && this.client !== failed)) return;
    this.client = null;
    this.retry = setTimeout(() => {
      this.connect().catch(() => this.reconnect(null));
    }, RECONNECT_MS);
  }

  async stop(): Promise<void> {
    this.stopped = true;
    clearTimeout(this.retry);
    const client = this.client;
    this.client = null;
    await client?.end().catch(() => undefined);
  }
}
