import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { CapturedMail, OutboxMessage } from '@shared/schemas/outbox';
import { ApiError } from '@/api/http';
import * as mailApi from '@/api/mail';

export const useOutboxStore = defineStore('outbox', () => {
  const messages = ref<OutboxMessage[]>([]);
  const loading = ref(false);
  const error = ref<ApiError | null>(null);

  const captured = ref<CapturedMail[]>([]);
  const capturedLoading = ref(false);
  const capturedError = ref<ApiError | null>(null);
  /** True when the server runs no demo mail server (SMTP_URL points at a real one). */
  const capturedUnavailable = ref(false);

  /** Loads the newest outgoing notices; a failure is kept in `error`. */
  async function fetchOutbox(): Promise<void> {
    loading.value = true;
    error.value = null;
    try {
      messages.value = await mailApi.listOutbox();
    } catch (cause) {
      if (!(cause instanceof ApiError)) throw cause;
      error.value = cause;
    } finally {
      loading.value = false;
    }
  }

  /** Loads what the demo mail server caught; a 404 means there is none, not a failure. */
  async function fetchCaptured(): Promise<void> {
    capturedLoading.value = true;
    capturedError.value = null;
    try {
      captured.value = await mailApi.listCapturedMail();
      capturedUnavailable.value = false;
    } catch (cause) {
      if (!(cause instanceof ApiError)) throw cause;
      if (cause.status === 404) {
        capturedUnavailable.value = true;
        captured.value = [];
      } else {
        capturedError.value = cause;
      }
    } finally {
      capturedLoading.value = false;
    }
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
