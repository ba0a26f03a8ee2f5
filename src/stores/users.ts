/** The firm's users, for administrators. */
import { defineStore } from 'pinia';
import { ref } from 'vue';
import * as usersApi from '@/api/users';
import type { AdminUser, NewUser, UserChanges } from '@/api/types';

export const useUsersStore = defineStore('users', () => {
  const users = ref<AdminUser[]>([]);
  const loading = ref(false);
  const listError = ref<string | null>(null);

  function replace(user: AdminUser): void {
    const index = users.value.findIndex((u) => u.id === user.id);
    if (index >= 0) users.value.splice(index, 1, user);
    else users.value.push(user);
  }

  async function fetchUsers(): Promise<void> {
    loading.value = true;
    try {
      users.value = await usersApi.listUsers();
      listError.value = null;
    } catch (error) {
      listError.value = error instanceof Error ? error.message : 'Could not load the users.';
      throw error;
    } finally {
      loading.value = false;
    }
  }

  /** Creates a user and returns the temporary password to hand over (shown once). */
  async function createUser(input: NewUser): Promise<{ user: AdminUser; temporaryPassword: string }> {
    const result = await usersApi.createUser(input);
    replace(result.user);
    return result;
  }

  async function updateUser(userId: number, changes: UserChanges): Promise<AdminUser> {
    const user = await usersApi.updateUser(userId, changes);
    replace(user);
    return user;
  }

  /** Issues a new temporary password; the user must change it at next sign-in. */
  async function resetPassword(userId: number): Promise<string> {
    const temporaryPassword = await usersApi.resetPassword(userId);
    const user = users.value.find((u) => u.id === userId);
    if (user) replace({ ...user, mustChangePassword: true });
    return temporaryPassword;
  }

  return { users, loading, listError, fetchUsers, createUser, updateUser, resetPassword };
});
