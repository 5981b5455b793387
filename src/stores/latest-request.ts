import { ref } from 'vue';
import { ApiError } from '@/api/http';

/** True for the rejection of a request that a newer one aborted. */
export function isAbort(cause: unknown): boolean {
  return cause instanceof DOMException && cause.name === 'AbortError';
}

/**
 * Loading state for a store action that reads from the server: each `run` aborts the one before
 * it, and only the answer of the latest lands, even when filters change faster than the server
 * answers. An ApiError is kept in `error`; anything else is a bug and is thrown on.
 */
export function useLatestRequest() {
  const loading = ref(false);
  const error = ref<ApiError | null>(null);
  let pending: AbortController | null = null;

  /**
   * Sends `request` and hands its answer to `apply`, unless a newer run started meanwhile.
   * `apply` and the end of `loading` happen in one tick, so a screen never draws the new data
   * under a loading mask.
   */
  async function run<T>(
    request: (signal: AbortSignal) => Promise<T>,
    apply: (answer: T) => void,
    options: { quiet?: boolean } = {},
  ): Promise<void> {
    pending?.abort();
    const controller = new AbortController();
    pending = controller;
    if (!options.quiet) loading.value = true;
    error.value = null;
    try {
      const answer = await request(controller.signal);
      if (pending === controller) apply(answer);
    } catch (cause) {
      if (pending !== controller || isAbort(cause)) return;
      if (!(cause instanceof ApiError)) throw cause;
      error.value = cause;
    } finally {
      if (pending === controller) {
        loading.value = false;
        pending = null;
      }
    }
  }

  /** Drops the request in flight, if any, and its loading and error state. */
  function cancel(): void {
    pending?.abort();
    pending = null;
    loading.value = false;
    error.value = null;
  }

  return { loading, error, run, cancel };
}
