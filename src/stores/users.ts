import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import type { User } from '@shared/schemas/user';
import * as usersApi from '@/api/users';
import type { NewUser, UserPatch } from '@/api/users';
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

  /** Changes one account and swaps the stored row; rethrows the ApiError for the view to report. */
  async function update(id: number, patch: UserPatch): Promise<User> {
    updatingIds.value.add(id);
    try {
      const updated = await usersApi.updateUser(id, patch);
      users.value = users.value.map((user) => (user.id === id ? updated : user));
      return updated;
    } finally {
      updatingIds.value.delete(id);
    }
  }

  function isUpdating(id: number): boolean {
    return updatingIds.value.has(id);
  }

  return { users, byNewest, loading, saving, error, fetchAll, create, update, isUpdating };
});
