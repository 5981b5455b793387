import type {
  ChangePasswordRequest,
  LoginRequest,
  LoginResponse,
  PasswordResetInfo,
  PasswordResetRequest,
  SessionUser,
} from '@shared/schemas/user';
import { http } from './http';

/** Exchanges e-mail and password for a bearer token and the signed-in user. */
export function login(credentials: LoginRequest): Promise<LoginResponse> {
  return http.post<LoginResponse>('/auth/login', credentials, { anonymous: true });
}

/** The user behind the stored token; rejects with a 401 ApiError when the token is no longer valid. */
export function fetchCurrentUser(): Promise<SessionUser> {
  return http.get<SessionUser>('/auth/me');
}

/** Ends this session on the server (204): the token stops working at once; other devices stay signed in. */
export function logout(signal?: AbortSignal): Promise<void> {
  return http.post<void>('/auth/logout', undefined, { signal });
}

/**
 * Changes the signed-in user's password (204) and ends their other sessions. A wrong current
 * password rejects with a 400 ApiError whose details name `currentPassword`.
 */
export function changePassword(request: ChangePasswordRequest): Promise<void> {
  return http.post<void>('/auth/password', request);
}

/** Whose password a reset link sets; rejects 404 (unknown), 409 (used) or 410 (expired or replaced). */
export function fetchPasswordReset(token: string, signal?: AbortSignal): Promise<PasswordResetInfo> {
  return http.get<PasswordResetInfo>(`/auth/password-reset/${encodeURIComponent(token)}`, { signal, anonymous: true });
}

/** Sets a new password through a reset link (204); the link is spent and the user's sessions end. */
export function resetPassword(request: PasswordResetRequest): Promise<void> {
  return http.post<void>('/auth/password-reset', request, { anonymous: true });
}
