import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import type { User } from '@shared/schemas/user';
import * as usersApi from '@/api/users';
import type { NewUser, PasswordResetSent, UserPatch } from '@/api/users';
import { ApiError } from '@/api/http';
import { useLatestRequest } from './latest-request';

export const useUsersStore = defineStore('users', () => {
  const users = ref<User[]>([]);
  const { loading, error, run } = useLatestRequest();
  const saving = ref(false);
  // Rows with a change in flight, so their controls can show a spinner and refuse a second click.
  const updatingIds = ref(new Set<number>());

  const byNewest = computed(() => [...users.value].sort((a, b) => b.createdAt.localeCompare(a.createdAt)));

  /** Loads all accounts; a failure is kept in `error` for the view to show. */
  function fetchAll(): Promise<void> {
    return run(usersApi.listUsers, (answer) => {
      users.value = answer;
    });
  }

  /** Creates an account; rethrows the ApiError so the form can place field messages. */
  async function create(newUser: NewUser): Promise<User> {
    saving.value = true;
    try {
      const created = await usersApi.createUser(newUser);
      users.value = [...users.value, created];
      return created;
    } finally {
      saving.value = false;
    }
  }

  function replaceUser(updated: User): void {
    users.value = users.value.map((user) => (user.id === updated.id ? updated : user));
  }

  /**
   * Changes one account as the list shows it and swaps the stored row. Rethrows the ApiError for
   * the view to report; when someone changed the account first (409 `stale`) the row shows the
   * account as it is now before the error reaches the view.
   */
  async function update(id: number, patch: UserPatch): Promise<User> {
    const shown = users.value.find((user) => user.id === id);
    if (!shown) throw new ApiError(404, 'not_found', 'This account is no longer in the list; refresh it.');
    updatingIds.value.add(id);
    try {
      const updated = await usersApi.updateUser(id, patch, shown.version);
      replaceUser(updated);
      return updated;
    } catch (cause) {
      if (cause instanceof ApiError && cause.isStale) {
        const current = cause.staleCurrent<User>();
        if (current) replaceUser(current);
        else void fetchAll();
      }
      throw cause;
    } finally {
      updatingIds.value.delete(id);
    }
  }

  /** E-mails one account a single-use link to set a new password; rethrows the ApiError for the view. */
  async function sendPasswordReset(id: number): Promise<PasswordResetSent> {
    updatingIds.value.add(id);
    try {
      return await usersApi.sendPasswordReset(id);
    } finally {
      updatingIds.value.delete(id);
    }
  }

  function isUpdating(id: number): boolean {
    return updatingIds.value.has(id);
  }

  return { users, byNewest, loading, saving, error, fetchAll, create, update, sendPasswordReset, isUpdating };
});
