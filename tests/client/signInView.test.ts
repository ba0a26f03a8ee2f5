// @vitest-environment happy-dom
/**
 * The sign-in screen checks its fields before anything is sent, shows the server's refusal
 * as readable text (429 explained in words), and moves a signed-in user on.
 */
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory, createRouter, type Router } from 'vue-router';
import SignInView from '@/views/SignInView.vue';

const fetchMock = vi.fn<(input: string, init: RequestInit) => Promise<Response>>();

function jsonResponse(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
}

const designer = {
  id: 2,
  email: 'designer@larchmont-ridge.example',
  name: 'Dana Designer',
  firmId: 1,
  firmName: 'Larchmont Ridge Engineering',
  roles: ['designer'],
  mustChangePassword: false,
};

async function setup(query: Record<string, string> = {}): Promise<{ wrapper: ReturnType<typeof mount>; router: Router }> {
  const pinia = createPinia();
  setActivePinia(pinia);
  const router = createRouter({
    history: createMemoryHistory(),
    routes: [
      { path: '/sign-in', name: 'sign-in', component: SignInView },
      { path: '/projects', name: 'projects', component: { template: '<p>projects</p>' } },
      { path: '/projects/:id', name: 'project', component: { template: '<p>project</p>' } },
      { path: '/change-password', name: 'change-password', component: { template: '<p>change</p>' } },
    ],
  });
  await router.push({ name: 'sign-in', query });
  await router.isReady();
  const wrapper = mount(SignInView, { global: { plugins: [pinia, router] }, attachTo: document.body });
  return { wrapper, router };
}

async function fill(wrapper: ReturnType<typeof mount>, email: string, password: string): Promise<void> {
  await wrapper.find('input[data-test="email"]').setValue(email);
  await wrapper.find('[data-test="password"] input, input[data-test="password"]').setValue(password);
}

async function submit(wrapper: ReturnType<typeof mount>): Promise<void> {
  await wrapper.find('form').trigger('submit');
  await flushPromises();
}

beforeEach(() => {
  fetchMock.mockReset();
  vi.stubGlobal('fetch', fetchMock);
});
afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

describe('SignInView validation', () => {
  it('asks for both fields and sends nothing when they are empty', async () => {
    const { wrapper } = await setup();
    await submit(wrapper);
    const text = wrapper.text();
    expect(text).toContain('Enter your e-mail address.');
    expect(text).toContain('Enter your password.');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('refuses an address without an @ and a domain', async () => {
    const { wrapper } = await setup();
    await fill(wrapper, 'designer-at-larchmont', 'whatever-123');
    await submit(wrapper);
    expect(wrapper.text()).toContain('This does not look like an e-mail address');
    expect(wrapper.text()).not.toContain('Enter your password.');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('shows the server refusal for wrong credentials as text', async () => {
    fetchMock.mockResolvedValue(
      jsonResponse(401, { error: { code: 'unauthenticated', message: 'E-mail or password is not right <b>.</b>' } }),
    );
    const { wrapper } = await setup();
    await fill(wrapper, 'designer@larchmont-ridge.example', 'wrong-password');
    await submit(wrapper);
    expect(fetchMock).toHaveBeenCalledTimes(1);
    const alert = wrapper.find('[data-test="signin-error"]');
    expect(alert.exists()).toBe(true);
    expect(alert.text()).toContain('E-mail or password is not right <b>.</b>');
    expect(alert.find('b').exists()).toBe(false);
  });

  it('explains rate limiting (429) in words', async () => {
    fetchMock.mockResolvedValue(jsonResponse(429, { error: { code: 'too_many_requests', message: 'Too many requests' } }));
    const { wrapper } = await setup();
    await fill(wrapper, 'designer@larchmont-ridge.example', 'guess-number-six');
    await submit(wrapper);
    const alert = wrapper.find('[data-test="signin-error"]');
    expect(alert.text()).toContain('Too many sign-in attempts');
    expect(alert.text()).toContain('Wait a few minutes');
  });

  it('signs in with the trimmed address and follows a same-site redirect', async () => {
    fetchMock.mockResolvedValue(jsonResponse(200, { user: designer }));
    const { wrapper, router } = await setup({ redirect: '/projects/7' });
    await fill(wrapper, '  designer@larchmont-ridge.example ', 'deckshare-demo-1');
    await submit(wrapper);
    const [url, init] = fetchMock.mock.calls[0]!;
    expect(url).toBe('/api/auth/login');
    expect(JSON.parse(String(init.body))).toEqual({ email: 'designer@larchmont-ridge.example', password: 'deckshare-demo-1' });
    expect(router.currentRoute.value.fullPath).toBe('/projects/7');
  });

  it('ignores a redirect to another origin', async () => {
    fetchMock.mockResolvedValue(jsonResponse(200, { user: designer }));
    const { wrapper, router } = await setup({ redirect: '//evil.example/steal' });
    await fill(wrapper, 'designer@larchmont-ridge.example', 'deckshare-demo-1');
    await submit(wrapper);
    expect(router.currentRoute.value.name).toBe('projects');
  });

  it('sends a user with a temporary password to the change-password screen', async () => {
    fetchMock.mockResolvedValue(jsonResponse(200, { user: { ...designer, mustChangePassword: true } }));
    const { wrapper, router } = await setup();
    await fill(wrapper, 'designer@larchmont-ridge.example', 'temporary-pass-1');
    await submit(wrapper);
    expect(router.currentRoute.value.name).toBe('change-password');
  });
});
