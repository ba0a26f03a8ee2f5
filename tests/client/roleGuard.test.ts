// @vitest-environment happy-dom
/**
 * Route guards by role: the rule (a pure function) and the real router, which must wait for
 * the first "who am I" answer before deciding. The roles that may open the firm-users screen
 * follow the API: /api/admin/users is admin only. The not-allowed page names the roles that
 * open the page and who can give one: the firm's administrator, or an administrator
 * themselves on the Users page.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory } from 'vue-router';
import { decideAccess, safeRedirect, type AccessState } from '@/router/guards';
import { createAppRouter } from '@/router';
import type { Role } from '@/api/types';
import NotAllowedView from '@/views/NotAllowedView.vue';

const adminRoute = { name: 'admin-users', fullPath: '/admin/users', meta: { roles: ['admin'] as const }, query: {} };
const projectsRoute = { name: 'projects', fullPath: '/projects', meta: {}, query: {} };
const signInRoute = { name: 'sign-in', fullPath: '/sign-in', meta: { public: true }, query: {} };

function state(roles: Role[], extra: Partial<AccessState> = {}): AccessState {
  return { signedIn: true, mustChangePassword: false, roles, ...extra };
}

describe('decideAccess', () => {
  it('refuses the admin screen to every role but admin', () => {
    for (const role of ['designer', 'reviewer', 'instructor', 'trainee'] as const) {
      expect(decideAccess(adminRoute, state([role]))).toEqual({ name: 'not-allowed', query: { from: '/admin/users' } });
    }
    expect(decideAccess(adminRoute, state(['admin']))).toBe(true);
    expect(decideAccess(adminRoute, state(['trainee', 'admin']))).toBe(true);
  });

  it('lets any signed-in role open the projects list', () => {
    for (const role of ['admin', 'designer', 'reviewer', 'instructor', 'trainee'] as const) {
      expect(decideAccess(projectsRoute, state([role]))).toBe(true);
    }
  });

  it('sends a signed-out visitor to sign in, remembering where they were going', () => {
    const out = { signedIn: false, mustChangePassword: false, roles: [] };
    expect(decideAccess(adminRoute, out)).toEqual({ name: 'sign-in', query: { redirect: '/admin/users' } });
    expect(decideAccess(signInRoute, out)).toBe(true);
  });

  it('holds a user with a temporary password on the change-password screen', () => {
    const temp = state(['admin'], { mustChangePassword: true });
    expect(decideAccess(adminRoute, temp)).toEqual({ name: 'change-password' });
    expect(decideAccess({ name: 'change-password', fullPath: '/change-password', meta: {}, query: {} }, temp)).toBe(true);
  });

  it('moves a signed-in user away from the sign-in screen, to a same-site address only', () => {
    expect(decideAccess(signInRoute, state(['designer']))).toEqual({ name: 'projects' });
    expect(decideAccess({ ...signInRoute, query: { redirect: '/projects/4' } }, state(['designer']))).toBe('/projects/4');
    expect(decideAccess({ ...signInRoute, query: { redirect: 'https://evil.example' } }, state(['designer']))).toEqual({
      name: 'projects',
    });
    expect(safeRedirect('//evil.example')).toBeUndefined();
    expect(safeRedirect('/sign-in?redirect=/x')).toBeUndefined();
  });
});

describe('the router with its guards', () => {
  const fetchMock = vi.fn<(input: string, init: RequestInit) => Promise<Response>>();

  beforeEach(() => {
    setActivePinia(createPinia());
    fetchMock.mockReset();
    vi.stubGlobal('fetch', fetchMock);
  });
  afterEach(() => vi.unstubAllGlobals());

  function me(roles: Role[]): Response {
    return new Response(
      JSON.stringify({
        user: {
          id: 5,
          email: 'trainee@larchmont-ridge.example',
          name: 'Tess Trainee',
          firmId: 1,
          firmName: 'Larchmont Ridge Engineering',
          roles,
          mustChangePassword: false,
        },
      }),
      { status: 200, headers: { 'Content-Type': 'application/json' } },
    );
  }

  it('waits for "who am I", then shows a trainee the not-allowed page for /admin/users', async () => {
    let answer!: (r: Response) => void;
    fetchMock.mockReturnValue(new Promise<Response>((resolve) => (answer = resolve)));
    const router = createAppRouter(createMemoryHistory());
    const navigation = router.push('/admin/users');
    await Promise.resolve();
    // Nothing is decided before the server has answered.
    expect(router.currentRoute.value.name).not.toBe('admin-users');
    expect(router.currentRoute.value.name).not.toBe('not-allowed');
    answer(me(['trainee']));
    await navigation;
    expect(fetchMock).toHaveBeenCalledTimes(1);
    expect(fetchMock.mock.calls[0]![0]).toBe('/api/auth/session');
    expect(router.currentRoute.value.name).toBe('not-allowed');
    expect(router.currentRoute.value.query.from).toBe('/admin/users');
  });

  it('lets an admin through to /admin/users and asks the server only once', async () => {
    fetchMock.mockResolvedValue(me(['admin']));
    const router = createAppRouter(createMemoryHistory());
    await router.push('/admin/users');
    expect(router.currentRoute.value.name).toBe('admin-users');
    await router.push('/projects');
    await router.push('/admin/users');
    expect(fetchMock).toHaveBeenCalledTimes(1);
  });

  it('sends a visitor without a session to sign in', async () => {
    fetchMock.mockResolvedValue(
      new Response(JSON.stringify({ error: { code: 'unauthenticated', message: 'Sign in first' } }), { status: 401 }),
    );
    const router = createAppRouter(createMemoryHistory());
    await router.push('/projects/12');
    expect(router.currentRoute.value.name).toBe('sign-in');
    expect(router.currentRoute.value.query.redirect).toBe('/projects/12');
  });
});

describe('the not-allowed page', () => {
  const fetchMock = vi.fn<(input: string, init: RequestInit) => Promise<Response>>();
  beforeEach(() => {
    setActivePinia(createPinia());
    fetchMock.mockReset();
    vi.stubGlobal('fetch', fetchMock);
  });
  afterEach(() => vi.unstubAllGlobals());

  async function refusedPage(roles: Role[], path: string) {
    fetchMock.mockResolvedValue(
      new Response(JSON.stringify({ user: { id: 1, email: 'a@larchmont-ridge.example', name: 'Avery Admin', firmId: 1, firmName: 'Larchmont Ridge Engineering', roles, mustChangePassword: false } }), {
        status: 200,
        headers: { 'Content-Type': 'application/json' },
      }),
    );
    const router = createAppRouter(createMemoryHistory());
    await router.push(path);
    expect(router.currentRoute.value.name).toBe('not-allowed');
    const wrapper = mount(NotAllowedView, { global: { plugins: [router] } });
    await flushPromises();
    return wrapper;
  }

  it('tells an administrator to add the role to their own account, with the way to the Users page', async () => {
    const w = await refusedPage(['admin'], '/training');
    expect(w.text()).toContain('Your roles (Admin) do not give access to /training.');
    expect(w.text()).toContain('It is open to the Instructor or Trainee role.');
    expect(w.get('[data-test="not-allowed-admin"]').text()).toContain('you can give yourself the role');
    expect(w.find('[data-test="not-allowed-ask"]').exists()).toBe(false);
    expect(w.get('[data-test="open-users"]').element.closest('a')!.getAttribute('href')).toBe('/admin/users');
    w.unmount();
  });

  it('tells anyone else to ask the firm’s administrator', async () => {
    const w = await refusedPage(['designer'], '/admin/users');
    expect(w.text()).toContain('It is open to the Admin role.');
    expect(w.get('[data-test="not-allowed-ask"]').text()).toContain("ask your firm's administrator");
    expect(w.find('[data-test="not-allowed-admin"]').exists()).toBe(false);
    expect(w.find('[data-test="open-users"]').exists()).toBe(false);
    w.unmount();
  });
});
