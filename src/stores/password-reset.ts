import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { PasswordResetInfo } from '@shared/schemas/user';
import * as authApi from '@/api/auth';
import { ApiError } from '@/api/http';

/**
 * Where the public reset page stands: reading the link, choosing the password, done, or one of
 * the ways a link stops working (used 409, expired or replaced 410, unknown 404).
 */
export type PasswordResetPhase = 'loading' | 'ready' | 'done' | 'used' | 'gone' | 'unknown' | 'failed';

function phaseOf(error: ApiError): PasswordResetPhase {
  if (error.status === 409) return 'used';
  if (error.status === 410) return 'gone';
  // The server also answers 400 for a token that cannot be one: as unknown as a 404.
  if (error.status === 404 || (error.status === 400 && error.fieldErrors().token !== undefined)) return 'unknown';
  return 'failed';
}

/** The public "set a new password" page: one reset link, used once. */
export const usePasswordResetStore = defineStore('password-reset', () => {
  const info = ref<PasswordResetInfo | null>(null);
  const phase = ref<PasswordResetPhase>('loading');
  /** Why the link cannot be used, or why the last attempt failed. */
  const problem = ref<ApiError | null>(null);
  const saving = ref(false);

  async function open(token: string): Promise<void> {
    phase.value = 'loading';
    problem.value = null;
    info.value = null;
    try {
      info.value = await authApi.fetchPasswordReset(token);
      phase.value = 'ready';
    } catch (cause) {
      if (!(cause instanceof ApiError)) throw cause;
      problem.value = cause;
      phase.value = phaseOf(cause);
    }
  }

  /**
   * Sets the password. A refused password (400) and a failure that leaves the link usable
   * (network, 429, 5xx) are rethrown for the form; a spent, expired or unknown link ends it.
   */
  async function setPassword(token: string, password: string): Promise<void> {
    saving.value = true;
    problem.value = null;
    try {
      await authApi.resetPassword({ token, password });
      phase.value = 'done';
    } catch (cause) {
      if (!(cause instanceof ApiError)) throw cause;
      problem.value = cause;
      const next = phaseOf(cause);
      if (next !== 'failed') phase.value = next;
      throw cause;
    } finally {
      saving.value = false;
    }
  }

  return { info, phase, problem, saving, open, setPassword };
});
