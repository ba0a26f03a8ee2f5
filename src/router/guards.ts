/**
 * Who may open which screen. `decideAccess` is a pure function of the target route's meta
 * and the signed-in user, so it can be tested without a browser; `installGuards` wires it
 * into the router, waiting for the first "who am I" answer before deciding.
 */
import type { RouteLocationNormalized, RouteLocationRaw, Router } from 'vue-router';
import type { Role } from '@/api/types';
import { useAuthStore } from '@/stores/auth';

declare module 'vue-router' {
  interface RouteMeta {
    /** Open without signing in (the sign-in screen). */
    public?: boolean;
    /** When set, only users holding at least one of these roles may open the screen. */
    roles?: readonly Role[];
    /** The window title's first part. */
    title?: string;
  }
}

export interface AccessState {
  signedIn: boolean;
  mustChangePassword: boolean;
  roles: readonly Role[];
}

type Target = Pick<RouteLocationNormalized, 'name' | 'fullPath' | 'meta' | 'query'>;

/** `true` to let the navigation through, or where to send the user instead. */
export function decideAccess(to: Target, state: AccessState): true | RouteLocationRaw {
  if (to.meta.public) {
    if (state.signedIn && to.name === 'sign-in') {
      const redirect = typeof to.query.redirect === 'string' ? to.query.redirect : '';
      return safeRedirect(redirect) ?? { name: 'projects' };
    }
    return true;
  }
  if (!state.signedIn) {
    return to.fullPath && to.fullPath !== '/'
      ? { name: 'sign-in', query: { redirect: to.fullPath } }
      : { name: 'sign-in' };
  }
  if (state.mustChangePassword && to.name !== 'change-password') {
    return { name: 'change-password' };
  }
  const wanted = to.meta.roles;
  if (wanted && !wanted.some((role) => state.roles.includes(role))) {
    return { name: 'not-allowed', query: { from: to.fullPath } };
  }
  return true;
}

/** Only same-site paths are followed after sign-in (never another origin). */
export function safeRedirect(path: string): string | undefined {
  return path.startsWith('/') && !path.startsWith('//') && !path.startsWith('/sign-in') ? path : undefined;
}

export function installGuards(router: Router): void {
  router.beforeEach(async (to) => {
    const auth = useAuthStore();
    await auth.ensureLoaded();
    return decideAccess(to, {
      signedIn: auth.signedIn,
      mustChangePassword: auth.me?.mustChangePassword ?? false,
      roles: auth.roles,
    });
  });
  router.afterEach((to) => {
    document.title = to.meta.title ? `${to.meta.title} · Deckshare` : 'Deckshare';
  });
}
