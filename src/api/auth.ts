import type { LoginRequest, LoginResponse, SessionUser } from '@shared/schemas/user';
import { http } from './http';

/** Exchanges e-mail and password for a bearer token and the signed-in user. */
export function login(credentials: LoginRequest): Promise<LoginResponse> {
  return http.post<LoginResponse>('/auth/login', credentials, { anonymous: true });
}

/** The user behind the stored token; rejects with a 401 ApiError when the token is no longer valid. */
export function fetchCurrentUser(): Promise<SessionUser> {
  return http.get<SessionUser>('/auth/me');
}
