import { getCurrentInstance, onBeforeUnmount, onMounted, readonly, ref, type Ref } from 'vue';
import { ApiError, requestRaw } from '@/api/http';
import { EventStreamParser, type ServerSentEvent } from './usePlanningEvents';

const FIRST_RETRY_MS = 1000;
const MAX_RETRY_MS = 30_000;

export interface DockEvents {
  /** The board version last announced by the server; null before the first event. */
  version: Readonly<Ref<number | null>>;
  /** Whether the stream is open right now. */
  connected: Readonly<Ref<boolean>>;
}

/**
 * Listens to the `dock` events of `GET /api/events` while the calling component is mounted and
 * calls `onChange` whenever the receiving board changed (a card moved, a count, a packing slip),
 * here or on another screen. The first version after (re)connecting is a baseline unless it
 * differs from one seen before, so a change made while the connection was down is not missed.
 * Reconnects with doubling backoff; stops for good when the session is over.
 */
export function useDockEvents(onChange: (version: number) => void): DockEvents {
  const version = ref<number | null>(null);
  const connected = ref(false);
  let controller: AbortController | null = null;
  let retryTimer: ReturnType<typeof setTimeout> | null = null;
  let retryMs = FIRST_RETRY_MS;
  let stopped = false;

  function receive(event: ServerSentEvent): void {
    if (event.event !== 'dock') return;
    let announced: unknown;
    try {
      announced = (JSON.parse(event.data) as { version?: unknown }).version;
    } catch {
      return;
    }
    if (typeof announced !== 'number') return;
    const previous = version.value;
    version.value = announced;
    if (previous !== null && previous !== announced) onChange(announced);
  }

  async function connect(): Promise<void> {
    controller = new AbortController();
    try {
      const response = await requestRaw('/events', { accept: 'text/event-stream', signal: controller.signal });
      if (!response.body) throw new ApiError(0, 'no_stream', 'The browser cannot read the event stream.');
      connected.value = true;
      retryMs = FIRST_RETRY_MS;
      const reader = response.body.pipeThrough(new TextDecoderStream()).getReader();
      const parser = new EventStreamParser();
      for (;;) {
        const { value, done } = await reader.read();
        if (done) break;
        for (const event of parser.feed(value)) receive(event);
      }
    } catch (cause) {
      if (stopped) return;
      // 401/403: the session is over or the role may not listen; retrying cannot help.
      if (cause instanceof ApiError && (cause.status === 401 || cause.status === 403)) stopped = true;
    } finally {
      connected.value = false;
    }
    scheduleReconnect();
  }

  function scheduleReconnect(): void {
    if (stopped) return;
    retryTimer = setTimeout(() => {
      retryTimer = null;
      void connect();
    }, retryMs);
    retryMs = Math.min(retryMs * 2, MAX_RETRY_MS);
  }

  function stop(): void {
    stopped = true;
    if (retryTimer) clearTimeout(retryTimer);
    retryTimer = null;
    controller?.abort();
    controller = null;
  }

  if (getCurrentInstance()) {
    onMounted(() => void connect());
    onBeforeUnmount(stop);
  }

  return { version: readonly(version), connected: readonly(connected) };
}
