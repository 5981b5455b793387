import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { CapturedMail, OutboxHealth, OutboxMessage } from '@shared/schemas/outbox';
import { ApiError } from '@/api/http';
import * as outboxApi from '@/api/outbox';
import { useLatestRequest } from './latest-request';

export const useOutboxStore = defineStore('outbox', () => {
  const messages = ref<OutboxMessage[]>([]);
  const { loading, error, run } = useLatestRequest();

  const captured = ref<CapturedMail[]>([]);
  const { loading: capturedLoading, error: capturedError, run: runCaptured } = useLatestRequest();
  /** True when the server runs no demo mail server (SMTP_URL points at a real one). */
  const capturedUnavailable = ref(false);

  const health = ref<OutboxHealth | null>(null);
  const { run: runHealth } = useLatestRequest();
  /** Notices with a "send again" in flight, so their buttons spin and refuse a second click. */
  const sendingIds = ref(new Set<number>());

  /** Loads the newest outgoing notices; a failure is kept in `error`. */
  function fetchOutbox(): Promise<void> {
    return run(outboxApi.listOutbox, (answer) => {
      messages.value = answer;
    });
  }

  /**
   * Asks how many notices fail to reach the mail server (admin). Quiet: the banner it feeds is a
   * side note, so a failed check keeps the last answer rather than raising an error of its own.
   */
  function checkHealth(): Promise<void> {
    return runHealth(
      outboxApi.getOutboxHealth,
      (answer) => {
        health.value = answer;
      },
      { quiet: true },
    );
  }

  /** Tries one notice again now and swaps in its new state; rethrows the ApiError for the view. */
  async function sendAgain(id: number): Promise<OutboxMessage> {
    sendingIds.value.add(id);
    try {
      const updated = await outboxApi.sendOutboxMessageAgain(id);
      messages.value = messages.value.map((message) => (message.id === id ? updated : message));
      void checkHealth();
      return updated;
    } finally {
      sendingIds.value.delete(id);
    }
  }

  function isSending(id: number): boolean {
    return sendingIds.value.has(id);
  }

  /** Loads what the demo mail server caught; a 404 means there is none, not a failure. */
  function fetchCaptured(): Promise<void> {
    return runCaptured(
      async (signal) => {
        try {
          return await outboxApi.listCapturedMail(signal);
        } catch (cause) {
          if (cause instanceof ApiError && cause.status === 404) return null;
          throw cause;
        }
      },
      (answer) => {
        capturedUnavailable.value = answer === null;
        captured.value = answer ?? [];
      },
    );
  }

  /** The notice being read from the outbox, as written. */
  const reading = ref<CapturedMail | null>(null);
  const { loading: readingLoading, error: readingError, run: runReading, cancel: cancelReading } = useLatestRequest();

  /** Loads one notice as written, to read; a failure is kept in `readingError`. */
  function read(id: number): Promise<void> {
    reading.value = null;
    return runReading(
      (signal) => outboxApi.getOutboxMail(id, signal),
      (answer) => {
        reading.value = answer;
      },
    );
  }

  function stopReading(): void {
    cancelReading();
    reading.value = null;
  }

  return {
    messages,
    loading,
    error,
    captured,
    capturedLoading,
    capturedError,
    capturedUnavailable,
    health,
    fetchOutbox,
    fetchCaptured,
    checkHealth,
    sendAgain,
    isSending,
    downloadAttachment: outboxApi.downloadCapturedAttachment,
    downloadOutboxAttachment: outboxApi.downloadOutboxAttachment,
    reading,
    readingLoading,
    readingError,
    read,
    stopReading,
  };
});
