import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import type { SessionUser } from '@shared/schemas/auth';
import { ROLES, roleAtLeast, type Role } from '@shared/roles';
import * as authApi from '@/api/auth';
import { ApiError } from '@/api/http';
import { forgetRememberedSession, rememberedSession, rememberSession } from '@/offline/remembered-session';

const LAST_CELLAR_KEY = 'cellarwright.lastCellar';

/** The signed-in user, their cellars and which cellar is open. */
export const useSessionStore = defineStore('session', () => {
  const user = ref<SessionUser | null>(null);
  const loaded = ref(false);
  const currentCellarId = ref<string | null>(null);

  const cellars = computed(() => user.value?.cellars ?? []);
  const currentCellar = computed(() => cellars.value.find((c) => c.cellarId === currentCellarId.value) ?? null);
  const role = computed<Role | null>(() => currentCellar.value?.role ?? null);
  /** True when the open cellar lets this user do at least `needed`. */
  const can = (needed: Role) => (role.value ? roleAtLeast(role.value, needed) : false);

  /** Loads the session once (and again after sign-in or sign-out). */
  async function load(): Promise<void> {
    try {
      user.value = await authApi.fetchMe();
      rememberSession(user.value);
    } catch (err) {
      // Without signal, the person last signed in on this phone (src/offline/remembered-session.ts).
      if (err instanceof ApiError && err.code === 'offline' && rememberedSession()) {
        user.value = rememberedSession();
        return;
      }
      if (!(err instanceof ApiError) || err.status !== 401) throw err;
      user.value = null;
    } finally {
      loaded.value = true;
    }
  }

  async function signIn(email: string, password: string): Promise<void> {
    user.value = await authApi.signIn({ email, password });
    rememberSession(user.value);
    loaded.value = true;
  }

  async function signOut(): Promise<void> {
    await authApi.signOut().catch(() => undefined);
    forget();
  }

  /** Drops the local session (after sign-out or when the server says it ended). */
  function forget(): void {
    user.value = null;
    currentCellarId.value = null;
    forgetRememberedSession();
  }

  function openCellar(cellarId: string): void {
    currentCellarId.value = cellarId;
    localStorage.setItem(LAST_CELLAR_KEY, cellarId);
  }

  /** The cellar to open after sign-in: the last one used, else the one with the strongest role. */
  function defaultCellarId(): string | null {
    const last = localStorage.getItem(LAST_CELLAR_KEY);
    if (last && cellars.value.some((c) => c.cellarId === last)) return last;
    const strongest = [...cellars.value].sort((a, b) => ROLES.indexOf(b.role) - ROLES.indexOf(a.role));
    return strongest[0]?.cellarId ?? null;
  }

  return { user, loaded, currentCellarId, cellars, currentCellar, role, can, load, signIn, signOut, forget, openCellar, defaultCellarId };
});
