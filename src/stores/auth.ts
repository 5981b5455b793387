import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import type { ChangePasswordRequest, LoginRequest, Role, SessionUser } from '@shared/schemas/user';
import * as authApi from '@/api/auth';
import { ApiError, onUnauthorized } from '@/api/http';
import { readToken, writeToken } from '@/api/session-token';

/**
 * Why the last session ended: the login page words its greeting from this. `expired`: the
 * server stopped taking the token (signed out elsewhere, password changed, account changed by
 * an administrator, or its time ran out).
 */
export type SessionEnd = 'signed-out' | 'expired';

/** Sign-out waits this long for the server before forgetting the token anyway. */
const LOGOUT_WAIT_MS = 5000;

export const useAuthStore = defineStore('auth', () => {
  const token = ref<string | null>(readToken());
  const user = ref<SessionUser | null>(null);
  const loading = ref(false);
  const error = ref<ApiError | null>(null);
  const sessionEnd = ref<SessionEnd | null>(null);
  const signingOut = ref(false);

  const isAuthenticated = computed(() => token.value !== null && user.value !== null);
  const role = computed<Role | null>(() => user.value?.role ?? null);

  function hasRole(...roles: Role[]): boolean {
    return user.value !== null && roles.includes(user.value.role);
  }

  function startSession(newToken: string, sessionUser: SessionUser): void {
    token.value = newToken;
    user.value = sessionUser;
    sessionEnd.value = null;
    writeToken(newToken);
  }

  function endSession(reason: SessionEnd): void {
    token.value = null;
    user.value = null;
    sessionEnd.value = reason;
    writeToken(null);
  }

  /** Signs in; resolves false with `error` set when the server refuses (bad credentials, rate limit). */
  async function login(credentials: LoginRequest): Promise<boolean> {
    loading.value = true;
    error.value = null;
    try {
      const session = await authApi.login(credentials);
      startSession(session.token, session.user);
      return true;
    } catch (cause) {
      error.value = toApiError(cause);
      return false;
    } finally {
      loading.value = false;
    }
  }

  // Guards on parallel navigations all ask for the user at start-up; one request serves them.
  let pendingMe: Promise<boolean> | null = null;

  /** Loads the user behind a stored token; resolves false when there is no usable session. */
  function fetchMe(): Promise<boolean> {
    if (!token.value) return Promise.resolve(false);
    pendingMe ??= (async () => {
      loading.value = true;
      error.value = null;
      try {
        user.value = await authApi.fetchCurrentUser();
        return true;
      } catch (cause) {
        error.value = toApiError(cause);
        return false;
      } finally {
        loading.value = false;
        pendingMe = null;
      }
    })();
    return pendingMe;
  }

  /**
   * Ends this session on the server, then forgets the token here. Offline, or when the server
   * does not answer in time, the token is forgotten all the same: signing out never fails.
   */
  async function logout(): Promise<void> {
    if (signingOut.value) return;
    signingOut.value = true;
    try {
      await authApi.logout(AbortSignal.timeout(LOGOUT_WAIT_MS));
    } catch {
      // The server may be unreachable or the session already over; this browser signs out anyway.
    } finally {
      signingOut.value = false;
      endSession('signed-out');
    }
  }

  /** Changes the password; other sessions end, this one stays. Rethrows the ApiError for the form. */
  function changePassword(request: ChangePasswordRequest): Promise<void> {
    return authApi.changePassword(request);
  }

  // A 401 on any call after sign-in means the server ended the session; a sign-out under way
  // already says why it ended.
  onUnauthorized(() => {
    if (signingOut.value || token.value === null) return;
    endSession('expired');
  });

  return {
    token,
    user,
    loading,
    error,
    sessionEnd,
    signingOut,
    isAuthenticated,
    role,
    hasRole,
    login,
    fetchMe,
    logout,
    changePassword,
  };
});

function toApiError(cause: unknown): ApiError {
  if (cause instanceof ApiError) return cause;
  return new ApiError(0, 'client_error', cause instanceof Error ? cause.message : 'Something went wrong.');
}
