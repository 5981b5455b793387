import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { CapturedMail, OutboxMessage } from '@shared/schemas/outbox';
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

  /** Loads the newest outgoing notices; a failure is kept in `error`. */
  function fetchOutbox(): Promise<void> {
    return run(outboxApi.listOutbox, (answer) => {
      messages.value = answer;
    });
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

  return {
    messages,
    loading,
    error,
    captured,
    capturedLoading,
    capturedError,
    capturedUnavailable,
    fetchOutbox,
    fetchCaptured,
  };
});
