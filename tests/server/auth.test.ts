/** Sign-in, sessions, CSRF, password change and rate limiting (API, in-process). */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import jwt from 'jsonwebtoken';
import { eq } from 'drizzle-orm';
import { demo, makeTestApp, signIn, type TestContext } from './helpers.js';
import { sessions, users } from '../../server/db/schema.js';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await makeTestApp();
});
afterAll(() => ctx.close());

describe('sign-in', () => {
  it('signs in a demo user, returns the user with roles and firm, sets httpOnly and CSRF cookies', async () => {
    const res = await request(ctx.app).post('/api/auth/login').send({ email: demo.designer, password: 'deckshare-demo-1' });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email: demo.designer, roles: ['designer'], firmName: 'Larchmont Ridge Engineering', mustChangePassword: false });
    const cookies: string[] = ([] as string[]).concat(res.headers['set-cookie']);
    const session = cookies.find((c) => c.startsWith('ds_session='))!;
    expect(session).toMatch(/HttpOnly/i);
    expect(session).toMatch(/SameSite=Strict/i);
    expect(session).toMatch(/Path=\/api/);
    const csrf = cookies.find((c) => c.startsWith('ds_csrf='))!;
    expect(csrf).not.toMatch(/HttpOnly/i);
    expect(JSON.stringify(res.body)).not.toContain('eyJ'); // the token never reaches page script
  });

  it('refuses a wrong password and an unknown e-mail with the same 401', async () => {
    const a = await request(ctx.app).post('/api/auth/login').send({ email: demo.designer, password: 'wrong-password' });
    const b = await request(ctx.app).post('/api/auth/login').send({ email: 'nobody@larchmont-ridge.example', password: 'wrong-password' });
    expect(a.status).toBe(401);
    expect(b.status).toBe(401);
    expect(a.body.error.message).toBe(b.body.error.message);
  });

  it('names the field of a malformed sign-in body', async () => {
    const res = await request(ctx.app).post('/api/auth/login').send({ email: 'not-an-email', password: '' });
    expect(res.status).toBe(400);
    const paths = res.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['body.email', 'body.password']));
  });

  it('answers /me for a signed-in user and 401 without a session', async () => {
    const agent = await signIn(ctx.app, demo.reviewer);
    const me = await agent.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user.roles).toEqual(['reviewer']);
    const anon = await request(ctx.app).get('/api/auth/me');
    expect(anon.status).toBe(401);
    expect(anon.body.error.code).toBe('unauthenticated');
  });

  it('answers /session with the user, or with null and no error when nobody is signed in', async () => {
    const agent = await signIn(ctx.app, demo.reviewer);
    const mine = await agent.get('/api/auth/session');
    expect(mine.status).toBe(200);
    expect(mine.body.user.roles).toEqual(['reviewer']);
    const anon = await request(ctx.app).get('/api/auth/session');
    expect(anon.status).toBe(200);
    expect(anon.body).toEqual({ user: null });
    // a forged or stale cookie is nobody too
    const stale = await request(ctx.app).get('/api/auth/session').set('Cookie', 'ds_session=not-a-token');
    expect(stale.status).toBe(200);
    expect(stale.body).toEqual({ user: null });
  });
});

describe('tokens', () => {
  function tokenFor(secret: string, claims: object, options: jwt.SignOptions) {
    return jwt.sign(claims, secret, { algorithm: 'HS256', ...options });
  }

  it('refuses an expired token', async () => {
    const agent = await signIn(ctx.app, demo.designer);
    const sessionRow = ctx.db.select().from(sessions).all().at(-1)!;
    const expired = tokenFor(ctx.config.jwtSecret, { sub: String(sessionRow.userId), sid: sessionRow.id, csrf: 'x', exp: Math.floor(Date.now() / 1000) - 60 }, {});
    const res = await request(ctx.app).get('/api/projects').set('Cookie', `ds_session=${expired}`);
    expect(res.status).toBe(401);
    expect(agent).toBeDefined();
  });

  it('refuses a forged token (signed with another secret) and an unsigned one', async () => {
    await signIn(ctx.app, demo.designer);
    const sessionRow = ctx.db.select().from(sessions).all().at(-1)!;
    const forged = tokenFor('another-secret-another-secret-another', { sub: String(sessionRow.userId), sid: sessionRow.id, csrf: 'x' }, { expiresIn: 600 });
    expect((await request(ctx.app).get('/api/projects').set('Cookie', `ds_session=${forged}`)).status).toBe(401);
    const none = jwt.sign({ sub: String(sessionRow.userId), sid: sessionRow.id, csrf: 'x' }, '', { algorithm: 'none' });
    expect((await request(ctx.app).get('/api/projects').set('Cookie', `ds_session=${none}`)).status).toBe(401);
  });

  it('sign-out revokes the session on the server, so the old cookie stops working', async () => {
    const agent = await signIn(ctx.app, demo.designer);
    const login = await request(ctx.app).post('/api/auth/login').send({ email: demo.designer, password: 'deckshare-demo-1' });
    const cookie = ([] as string[]).concat(login.headers['set-cookie']).find((c) => c.startsWith('ds_session='))!.split(';')[0];
    const csrf = ([] as string[]).concat(login.headers['set-cookie']).find((c) => c.startsWith('ds_csrf='))!.split(';')[0].split('=')[1];
    expect((await request(ctx.app).get('/api/projects').set('Cookie', cookie)).status).toBe(200);
    const out = await request(ctx.app).post('/api/auth/logout').set('Cookie', cookie).set('X-CSRF-Token', csrf);
    expect(out.status).toBe(204);
    expect((await request(ctx.app).get('/api/projects').set('Cookie', cookie)).status).toBe(401);
    // another session of the same user is unaffected
    expect((await agent.get('/api/projects')).status).toBe(200);
  });
});

describe('CSRF', () => {
  it('refuses a change without the X-CSRF-Token header, or with a wrong one', async () => {
    const agent = await signIn(ctx.app, demo.designer);
    const body = { name: 'Csrf check', units: 'US' };
    const none = await agent.post('/api/projects').send(body);
    expect(none.status).toBe(403);
    expect(none.body.error.code).toBe('csrf_failed');
    const wrong = await agent.post('/api/projects').set('X-CSRF-Token', 'deadbeef').send(body);
    expect(wrong.status).toBe(403);
    const right = await agent.post('/api/projects').set('X-CSRF-Token', agent.csrf).send(body);
    expect(right.status).toBe(201);
  });
});

describe('temporary passwords', () => {
  it('a new user must change the temporary password before anything else, then can work', async () => {
    const admin = await signIn(ctx.app, demo.admin);
    const created = await admin.post('/api/admin/users').set('X-CSRF-Token', admin.csrf).send({ email: 'new.hire@larchmont-ridge.example', name: 'New Hire', roles: ['trainee'] });
    expect(created.status).toBe(201);
    const temp = created.body.temporaryPassword as string;
    expect(temp.length).toBeGreaterThanOrEqual(10);
    const hire = await signIn(ctx.app, 'new.hire@larchmont-ridge.example', temp);
    const blocked = await hire.get('/api/projects');
    expect(blocked.status).toBe(403);
    expect(blocked.body.error.code).toBe('password_change_required');
    const short = await hire.post('/api/auth/password').set('X-CSRF-Token', hire.csrf).send({ currentPassword: temp, newPassword: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.details[0].path).toBe('body.newPassword');
    const wrongCurrent = await hire.post('/api/auth/password').set('X-CSRF-Token', hire.csrf).send({ currentPassword: 'nope', newPassword: 'a-much-longer-password' });
    expect(wrongCurrent.status).toBe(400);
    const ok = await hire.post('/api/auth/password').set('X-CSRF-Token', hire.csrf).send({ currentPassword: temp, newPassword: 'a-much-longer-password' });
    expect(ok.status).toBe(200);
    expect(ok.body.user.mustChangePassword).toBe(false);
    expect((await hire.get('/api/projects')).status).toBe(200);
    // the old password no longer works
    expect((await request(ctx.app).post('/api/auth/login').send({ email: 'new.hire@larchmont-ridge.example', password: temp })).status).toBe(401);
  });

  it('a disabled user cannot sign in and loses open sessions', async () => {
    const admin = await signIn(ctx.app, demo.admin);
    const created = await admin.post('/api/admin/users').set('X-CSRF-Token', admin.csrf).send({ email: 'leaver@larchmont-ridge.example', name: 'Leaver', roles: ['designer'] });
    const id = created.body.user.id as number;
    const leaver = await signIn(ctx.app, 'leaver@larchmont-ridge.example', created.body.temporaryPassword);
    const off = await admin.patch(`/api/admin/users/${id}`).set('X-CSRF-Token', admin.csrf).send({ disabled: true });
    expect(off.status).toBe(200);
    expect((await leaver.get('/api/auth/me')).status).toBe(401);
    const again = await request(ctx.app).post('/api/auth/login').send({ email: 'leaver@larchmont-ridge.example', password: created.body.temporaryPassword });
    expect(again.status).toBe(401);
    expect(ctx.db.select().from(users).where(eq(users.id, id)).get()!.disabled).toBe(true);
  });
});

describe('rate limiting', () => {
  it('answers 429 after too many failed sign-ins for one account', async () => {
    const local = await makeTestApp({ loginAttemptsPer15Min: 3 });
    try {
      const attempt = () => request(local.app).post('/api/auth/login').send({ email: demo.trainee, password: 'wrong-password' });
      expect((await attempt()).status).toBe(401);
      expect((await attempt()).status).toBe(401);
      expect((await attempt()).status).toBe(401);
      const limited = await attempt();
      expect(limited.status).toBe(429);
      expect(limited.body.error.code).toBe('too_many_requests');
    } finally {
      await local.close();
    }
  });
});
