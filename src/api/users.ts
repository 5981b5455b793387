import type { z } from 'zod';
import type { User, createUserRequestSchema, updateUserRequestSchema } from '@shared/schemas/user';
import { http } from './http';

/** What the client sends to create a user (before the server's trimming and lower-casing). */
export type NewUser = z.input<typeof createUserRequestSchema>;
/** A partial change to a user: role, active flag, password or supplier binding. */
export type UserPatch = z.input<typeof updateUserRequestSchema>;

/** Every account, for the admin's user list. */
export function listUsers(signal?: AbortSignal): Promise<User[]> {
  return http.get<User[]>('/users', { signal });
}

/** Creates an account; a taken e-mail rejects with a 409 ApiError, bad fields with a 400 carrying zod issues. */
export function createUser(user: NewUser): Promise<User> {
  return http.post<User>('/users', user);
}

/** Applies a partial change to one account and returns it as stored. */
export function updateUser(id: number, patch: UserPatch): Promise<User> {
  return http.patch<User>(`/users/${id}`, patch);
}
