/**
 * The signed-in user and what their roles allow. The session itself lives in an httpOnly
 * cookie the client never reads; this store only knows who the server says we are.
 */
import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import * as authApi from '@/api/auth';
import { ApiError, onSessionProblem } from '@/api/http';
import type { Role, SessionUser } from '@/api/types';

export const useAuthStore = defineStore('auth', () => {
  const me = ref<SessionUser | null>(null);
  /** True once the first "who am I" answer (or failure) has arrived. */
  const loaded = ref(false);
  /** Set when the first load failed for a reason other than "not signed in". */
  const loadError = ref<string | null>(null);
  /** How the last session ended: signed out on purpose, or refused by the server (expired). */
  const sessionEnd = ref<'signed-out' | 'expired' | null>(null);
  let pending: Promise<void> | null = null;

  const signedIn = computed(() => me.value !== null);
  const roles = computed<Role[]>(() => me.value?.roles ?? []);

  function hasRole(role: Role): boolean {
    return roles.value.includes(role);
  }
  function hasAnyRole(wanted: readonly Role[]): boolean {
    return wanted.some((r) => roles.value.includes(r));
  }

  const isAdmin = computed(() => hasRole('admin'));
  /** Create and edit projects (API: admin, designer). */
  const canEditProjects = computed(() => hasAnyRole(['admin', 'designer']));
  /** Save decks and versions (API: admin, designer, instructor). */
  const canSaveDecks = computed(() => hasAnyRole(['admin', 'designer', 'instructor']));
  /** See a project's parameter studies (API: admin, designer, reviewer, instructor). */
  const canReadStudies = computed(() => hasAnyRole(['admin', 'designer', 'reviewer', 'instructor']));
  /** Start, cancel and resume studies (API: designer, instructor). */
  const canRunStudies = computed(() => hasAnyRole(['designer', 'instructor']));
  /** Read a project's audit trail (API: admin, reviewer, designer, instructor). */
  const canSeeAudit = computed(() => hasAnyRole(['admin', 'reviewer', 'designer', 'instructor']));

  /** Asks the server who is signed in (null: nobody; a 401 from an older server means the same). */
  async function refresh(): Promise<void> {
    try {
      me.value = await authApi.fetchSession();
      loadError.value = null;
    } catch (error) {
      me.value = null;
      if (error instanceof ApiError && error.status === 401) {
        loadError.value = null;
      } else {
        loadError.value = error instanceof Error ? error.message : 'Could not check your session.';
      }
    } finally {
      loaded.value = true;
    }
  }

  /** Resolves once `me` is known; the first call fetches, later calls reuse the answer. */
  function ensureLoaded(): Promise<void> {
    if (loaded.value) return Promise.resolve();
    if (!pending) pending = refresh().finally(() => (pending = null));
    return pending;
  }

  async function login(email: string, password: string): Promise<SessionUser> {
    const user = await authApi.login(email, password);
    sessionEnd.value = null;
    me.value = user;
    loaded.value = true;
    loadError.value = null;
    return user;
  }

  async function logout(): Promise<void> {
    sessionEnd.value = 'signed-out';
    try {
      await authApi.logout();
    } finally {
      me.value = null;
    }
  }

  async function changePassword(currentPassword: string, newPassword: string): Promise<SessionUser> {
    const user = await authApi.changePassword(currentPassword, newPassword);
    me.value = user;
    return user;
  }

  /** Forgets the user locally (the server already said the session is gone). */
  function clear(): void {
    me.value = null;
  }

  // Any API answer saying the session ended, or that a password change is due, updates us.
  onSessionProblem((error) => {
    if (error.status === 401) {
      if (me.value) sessionEnd.value = sessionEnd.value ?? 'expired';
      me.value = null;
    } else if (error.code === 'password_change_required' && me.value) {
      me.value = { ...me.value, mustChangePassword: true };
    }
  });

  return {
    me,
    loaded,
    loadError,
    sessionEnd,
    signedIn,
    roles,
    isAdmin,
    canEditProjects,
    canSaveDecks,
    canSeeAudit,
    canReadStudies,
    canRunStudies,
    hasRole,
    hasAnyRole,
    refresh,
    ensureLoaded,
    login,
    logout,
    changePassword,
    clear,
  };
});
