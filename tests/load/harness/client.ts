/**
 * A signed-in HTTP session against a running server: the two session cookies and the CSRF
 * header (see server/auth/session.ts), and small JSON helpers over fetch.
 */
export const DEMO_PASSWORD = 'deckshare-demo-1';
export const DEMO = {
  admin: 'admin@larchmont-ridge.example',
  designer: 'designer@larchmont-ridge.example',
  instructor: 'instructor@larchmont-ridge.example',
};

export interface Session {
  email: string;
  /** Headers every signed-in request carries (cookie, CSRF token, JSON type). */
  headers: Record<string, string>;
}

function cookieValue(setCookies: string[], name: string): string {
  const v = setCookies.map((c) => new RegExp(`^${name}=([^;]+)`).exec(c)?.[1]).find(Boolean);
  if (!v) throw new Error(`sign-in set no ${name} cookie`);
  return v;
}

export async function signIn(baseUrl: string, email: string, password = DEMO_PASSWORD): Promise<Session> {
  const res = await fetch(`${baseUrl}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password }) });
  if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status} ${await res.text()}`);
  const setCookies = res.headers.getSetCookie();
  const token = cookieValue(setCookies, 'ds_session');
  const csrf = cookieValue(setCookies, 'ds_csrf');
  return { email, headers: { cookie: `ds_session=${token}; ds_csrf=${csrf}`, 'x-csrf-token': csrf, 'content-type': 'application/json' } };
}

export async function getJson<T>(baseUrl: string, session: Session, path: string): Promise<{ status: number; body: T }> {
  const res = await fetch(`${baseUrl}${path}`, { headers: session.headers });
  const text = await res.text();
  return { status: res.status, body: (text ? JSON.parse(text) : null) as T };
}

export async function postJson<T>(baseUrl: string, session: Session, path: string, body: unknown): Promise<{ status: number; body: T }> {
  const res = await fetch(`${baseUrl}${path}`, { method: 'POST', headers: session.headers, body: JSON.stringify(body) });
  const text = await res.text();
  return { status: res.status, body: (text ? JSON.parse(text) : null) as T };
}
