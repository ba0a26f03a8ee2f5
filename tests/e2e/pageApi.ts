/**
 * The browser tests' call of the product's API from inside the signed-in page (its cookies and
 * CSRF token), for setting up records a test then looks at through the screens. Kept apart
 * from harness.ts, which is also type-checked without the DOM library (tests/bench).
 */
import type { Page } from 'playwright-core';

export async function api<T>(page: Page, method: string, path: string, body?: unknown): Promise<{ status: number; body: T }> {
  return page.evaluate(
    async ({ method, path, body }) => {
      const csrf = document.cookie.split('; ').find((c) => c.startsWith('ds_csrf='))?.slice(8) ?? '';
      const res = await fetch(path, { method, headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': decodeURIComponent(csrf) }, body: body === undefined ? undefined : JSON.stringify(body), credentials: 'same-origin' });
      return { status: res.status, body: (await res.json().catch(() => null)) as T };
    },
    { method, path, body },
  );
}
