import type { z } from 'zod';
import type {
  User,
  createUserRequestSchema,
  passwordResetSentSchema,
  updateUserRequestSchema,
} from '@shared/schemas/user';
import { http } from './http';

/** What the client sends to create a user (before the server's trimming and lower-casing). */
export type NewUser = z.input<typeof createUserRequestSchema>;
/** A partial change to a user: role, active flag, password or supplier binding. */
export type UserPatch = z.input<typeof updateUserRequestSchema>;
/** Where a password-reset link went and until when it works. */
export type PasswordResetSent = z.infer<typeof passwordResetSentSchema>;

/** Every account, for the admin's user list. */
export function listUsers(signal?: AbortSignal): Promise<User[]> {
  return http.get<User[]>('/users', { signal });
}

/** Creates an account; a taken e-mail rejects with a 409 ApiError, bad fields with a 400 carrying zod issues. */
export function createUser(user: NewUser): Promise<User> {
  return http.post<User>('/users', user);
}

/**
 * Applies a partial change to the account as the admin saw it (`version`) and returns it as
 * stored; a change someone made first rejects with 409 `stale` carrying the account as it is.
 */
export function updateUser(id: number, patch: UserPatch, version: string): Promise<User> {
  return http.patch<User>(`/users/${id}`, patch, { ifMatch: version });
}

/** E-mails the user a single-use link to set a new password (202); a newer link replaces an older one. */
export function sendPasswordReset(id: number): Promise<PasswordResetSent> {
  return http.post<PasswordResetSent>(`/users/${id}/password-reset`);
}
