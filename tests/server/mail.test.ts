/** E-mail: invitations with a set-password link, the local SMTP service and the admins' outbox. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { eq } from 'drizzle-orm';
import { auditLog, invitations, outboxMessages } from '../../server/db/schema.js';
import { demo, signIn, type Agent } from './helpers.js';
import { makeWorkflowApp, otherFirm, outbox, send, userId, type WorkflowContext } from './workflowHelpers.js';

let ctx: WorkflowContext;
let admin: Agent;
let designer: Agent;
let outsider: Agent;

beforeAll(async () => {
  ctx = await makeWorkflowApp();
  admin = await signIn(ctx.app, demo.admin);
  designer = await signIn(ctx.app, demo.designer);
  outsider = await otherFirm(ctx);
});
afterAll(() => ctx.close());

const tokenOf = (text: string) => /\/set-password\/([A-Za-z0-9_-]+)/.exec(text)?.[1];

async function newUser(email: string) {
  const res = await send.post(admin, '/api/admin/users', { email, name: 'Noor Halvorsen', roles: ['designer'] });
  expect(res.status).toBe(201);
  return res.body.user.id as number;
}

describe('invitations', () => {
  it('sends a set-password link that works once and signs the user in', async () => {
    const id = await newUser('noor@larchmont-ridge.example');
    const inv = await send.post(admin, '/api/invitations', { userId: id });
    expect(inv.status).toBe(201);
    expect(inv.body.invitation).toMatchObject({ user: { id, email: 'noor@larchmont-ridge.example' }, status: 'pending' });

    // Creating the user sent the first invitation; the admin's second one replaces it.
    const mail = (await outbox(ctx)).filter((m) => m.kind === 'invitation' && m.toAddresses === 'noor@larchmont-ridge.example');
    expect(mail).toHaveLength(2);
    const latest = mail[mail.length - 1];
    expect(latest.subject).toBe('You are invited to Deckshare (Larchmont Ridge Engineering)');
    expect(latest.textBody).toContain('http://deckshare.test/set-password/');
    const token = tokenOf(latest.textBody)!;
    expect((await request(ctx.app).get(`/api/invitations/${tokenOf(mail[0].textBody)}`)).status).toBe(404);
    expect(token.length).toBeGreaterThanOrEqual(40);
    // Only the hash is stored, never the token itself.
    expect(JSON.stringify(ctx.db.select().from(invitations).all())).not.toContain(token);

    const info = await request(ctx.app).get(`/api/invitations/${token}`);
    expect(info.status).toBe(200);
    expect(info.body.invitation).toMatchObject({ email: 'noor@larchmont-ridge.example', name: 'Noor Halvorsen', firmName: 'Larchmont Ridge Engineering' });

    const short = await request(ctx.app).post(`/api/invitations/${token}/accept`).send({ password: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.details).toEqual([{ path: 'body.password', message: 'the new password must have at least 10 characters' }]);
    const unknown = await request(ctx.app).post(`/api/invitations/${token}/accept`).send({ password: 'a-long-password-1', role: 'admin' });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.details[0].message).toContain('role');

    const agent = request.agent(ctx.app);
    const ok = await agent.post(`/api/invitations/${token}/accept`).send({ password: 'noor-chose-this-1' });
    expect(ok.status).toBe(200);
    expect(ok.body.user).toMatchObject({ email: 'noor@larchmont-ridge.example', mustChangePassword: false, roles: ['designer'] });
    expect((await agent.get('/api/auth/me')).body.user.email).toBe('noor@larchmont-ridge.example');
    expect((await agent.get('/api/projects')).status).toBe(200);

    const again = await request(ctx.app).post(`/api/invitations/${token}/accept`).send({ password: 'another-password-2' });
    expect(again.status).toBe(404);
    expect((await request(ctx.app).get(`/api/invitations/${token}`)).status).toBe(404);
    await signIn(ctx.app, 'noor@larchmont-ridge.example', 'noor-chose-this-1');

    const audit = ctx.db.select().from(auditLog).where(eq(auditLog.entityId, id)).all().map((a) => a.action);
    expect(audit).toEqual(expect.arrayContaining(['create', 'invite', 'set-password']));
  });

  it('a newer invitation replaces the older one; an expired one no longer works', async () => {
    const id = await newUser('oskar@larchmont-ridge.example');
    await send.post(admin, '/api/invitations', { userId: id });
    await send.post(admin, '/api/invitations', { userId: id });
    const mails = (await outbox(ctx)).filter((m) => m.toAddresses === 'oskar@larchmont-ridge.example');
    expect(mails).toHaveLength(3); // one sent when the user was created, then two more
    const [first, second] = mails.slice(1).map((m) => tokenOf(m.textBody)!);
    expect((await request(ctx.app).get(`/api/invitations/${first}`)).status).toBe(404);
    expect((await request(ctx.app).get(`/api/invitations/${second}`)).status).toBe(200);
    ctx.db.update(invitations).set({ expiresAt: new Date(Date.now() - 1000).toISOString() }).where(eq(invitations.userId, id)).run();
    const expired = await request(ctx.app).post(`/api/invitations/${second}/accept`).send({ password: 'oskar-password-1' });
    expect(expired.status).toBe(404);
    expect(expired.body.error.message).toContain('expired');
    const list = await admin.get('/api/invitations');
    expect(list.body.invitations.filter((i: { user: { id: number } }) => i.user.id === id).map((i: { status: string }) => i.status)).toEqual(['expired', 'replaced', 'replaced']);
  });

  it('refuses: a user who chose a password (409), another firm’s user (404), a non-admin (403), a malformed link (400)', async () => {
    expect((await send.post(admin, '/api/invitations', { userId: userId(ctx, demo.designer) })).status).toBe(409);
    const theirs = userId(ctx, 'everyone@other-firm.example');
    expect((await send.post(admin, '/api/invitations', { userId: theirs })).status).toBe(404);
    expect((await send.post(designer, '/api/invitations', { userId: userId(ctx, demo.trainee) })).status).toBe(403);
    expect((await admin.post('/api/invitations').send({ userId: 1 })).status).toBe(403); // no CSRF header
    const bad = await request(ctx.app).get('/api/invitations/not*a*token');
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('params.token');
    expect((await send.post(admin, '/api/invitations', { userId: 'x' })).body.error.details[0]).toEqual({ path: 'body.userId', message: 'userId must be a number' });
  });
});

describe('outbox', () => {
  it('shows admins their own firm’s messages only', async () => {
    const mine = await admin.get('/api/mail/outbox');
    expect(mine.status).toBe(200);
    expect(mine.body.messages.length).toBeGreaterThanOrEqual(3);
    expect(mine.body.messages.every((m: { to: string }) => m.to.endsWith('@larchmont-ridge.example'))).toBe(true);
    const one = await admin.get(`/api/mail/outbox/${mine.body.messages[0].id}`);
    expect(one.body.message.html).toContain('<a href="http://deckshare.test/set-password/');
    expect((await admin.get('/api/mail/outbox?kind=invitation&to=oskar')).body.messages).toHaveLength(3);
    expect((await admin.get('/api/mail/outbox?kind=nonsense')).status).toBe(400);

    expect((await designer.get('/api/mail/outbox')).status).toBe(403);
    expect((await outsider.get('/api/mail/outbox')).body.messages).toEqual([]);
    expect((await outsider.get(`/api/mail/outbox/${mine.body.messages[0].id}`)).status).toBe(404);
  });

  it('keeps messages as received (no update)', () => {
    expect(() => ctx.db.update(outboxMessages).set({ subject: 'changed' }).run()).toThrow(/cannot be changed/);
  });
});
