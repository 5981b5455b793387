import { computed, getCurrentInstance, onBeforeUnmount, onMounted, reactive, readonly, ref, type Ref } from 'vue';
import { ApiError, requestRaw } from '@/api/http';

/** One server-sent event: its name (`message` when none is given) and its data lines joined. */
export interface ServerSentEvent {
  event: string;
  data: string;
}

/**
 * Incremental parser for a `text/event-stream` body (WHATWG HTML Living Standard, "Server-sent
 * events", section 9.2.6 "Interpreting an event stream"): feed it decoded chunks as they arrive,
 * it returns the events completed by each chunk. Comments and `retry`/`id` fields are ignored.
 */
export class EventStreamParser {
  private buffer = '';
  private eventName = '';
  private dataLines: string[] = [];
  // A chunk that ended in CR may be followed by the LF of the same CRLF pair.
  private skipLeadingLf = false;

  feed(chunk: string): ServerSentEvent[] {
    this.buffer += chunk;
    if (this.skipLeadingLf && this.buffer.length > 0) {
      if (this.buffer.startsWith('\n')) this.buffer = this.buffer.slice(1);
      this.skipLeadingLf = false;
    }
    const events: ServerSentEvent[] = [];
    let lineEnd = this.buffer.search(/[\r\n]/);
    while (lineEnd !== -1) {
      const line = this.buffer.slice(0, lineEnd);
      let rest = lineEnd + 1;
      if (this.buffer[lineEnd] === '\r') {
        if (rest === this.buffer.length) this.skipLeadingLf = true;
        else if (this.buffer[rest] === '\n') rest += 1;
      }
      this.buffer = this.buffer.slice(rest);
      const event = this.line(line);
      if (event) events.push(event);
      lineEnd = this.buffer.search(/[\r\n]/);
    }
    return events;
  }

  private line(line: string): ServerSentEvent | null {
    if (line === '') return this.dispatch();
    if (line.startsWith(':')) return null;
    const colon = line.indexOf(':');
    const field = colon === -1 ? line : line.slice(0, colon);
    let value = colon === -1 ? '' : line.slice(colon + 1);
    if (value.startsWith(' ')) value = value.slice(1);
    if (field === 'event') this.eventName = value;
    else if (field === 'data') this.dataLines.push(value);
    return null;
  }

  private dispatch(): ServerSentEvent | null {
    const hasData = this.dataLines.length > 0;
    const event = { event: this.eventName || 'message', data: this.dataLines.join('\n') };
    this.eventName = '';
    this.dataLines = [];
    return hasData ? event : null;
  }
}

const FIRST_RETRY_MS = 1000;
const MAX_RETRY_MS = 30_000;
/** After a 429 (too many open streams for this user) the stream waits this long before asking again. */
export const PAUSED_RETRY_MS = 3 * 60_000;

// Streams the server refused for now (429); shared by every screen so the shell can say so once.
let nextStreamId = 0;
const pausedStreams = reactive(new Set<number>());
const liveUpdatesPaused = computed(() => pausedStreams.size > 0);

/** True while a screen's live updates wait because too many Cardloop windows are open. */
export function useLiveUpdatesPaused(): Readonly<Ref<boolean>> {
  return liveUpdatesPaused;
}

/** Names of the version events `GET /api/events` sends. */
export type VersionEventName = 'planning' | 'dock';

export interface VersionEvents {
  /** The version last announced by the server for this event; null before the first event. */
  version: Readonly<Ref<number | null>>;
  /** Whether the stream is open right now. */
  connected: Readonly<Ref<boolean>>;
}

/**
 * Listens to `GET /api/events` while the calling component is mounted and calls `onChange` with
 * the new version whenever the server announces a change of `eventName`. The first version after
 * (re)connecting is only a baseline, unless it differs from one seen before, so a change made
 * while the connection was down is not missed. Reconnects with doubling backoff; stops for good
 * when the session is over.
 */
export function useVersionEvents(eventName: VersionEventName, onChange: (version: number) => void): VersionEvents {
  const version = ref<number | null>(null);
  const connected = ref(false);
  let controller: AbortController | null = null;
  let retryTimer: ReturnType<typeof setTimeout> | null = null;
  let retryMs = FIRST_RETRY_MS;
  let stopped = false;
  const streamId = nextStreamId++;

  function receive(event: ServerSentEvent): void {
    if (event.event !== eventName) return;
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
      pausedStreams.delete(streamId);
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
      if (cause instanceof ApiError && (cause.status === 401 || cause.status === 403)) {
        stopped = true;
        pausedStreams.delete(streamId);
      }
      // 429: too many windows of this user listen already; asking again soon only adds load.
      if (cause instanceof ApiError && cause.status === 429) {
        pausedStreams.add(streamId);
        scheduleReconnect(PAUSED_RETRY_MS);
        return;
      }
    } finally {
      connected.value = false;
    }
    // A stream that ended (the server closes it when the session ends) reconnects soon: if the
    // session is over, that next request answers 401 and signs this browser out.
    scheduleReconnect();
  }

  function scheduleReconnect(delayMs?: number): void {
    if (stopped) return;
    retryTimer = setTimeout(() => {
      retryTimer = null;
      void connect();
    }, delayMs ?? retryMs);
    if (delayMs === undefined) retryMs = Math.min(retryMs * 2, MAX_RETRY_MS);
  }

  function stop(): void {
    stopped = true;
    pausedStreams.delete(streamId);
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
