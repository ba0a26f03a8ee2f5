/** Accounts and records: creating a user never reveals that another firm has the address; the
 *  local mail service files messages from the application only. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { count } from 'drizzle-orm';
import { demo, signIn, type Agent } from './helpers.js';
import { makeWorkflowApp, otherFirm, send, type WorkflowContext } from './workflowHelpers.js';
import nodemailer from 'nodemailer';
import { outboxMessages, users } from '../../server/db/schema.js';
import { openDatabase } from '../../server/db/client.js';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { FIRM_HEADER, KIND_HEADER } from '../../server/mail/mailer.js';

let ctx: WorkflowContext;
let admin: Agent;
let otherAdmin: Agent;

beforeAll(async () => {
  ctx = await makeWorkflowApp();
  admin = await signIn(ctx.app, demo.admin);
  otherAdmin = await otherFirm(ctx);
});
afterAll(() => ctx.close());

describe('no existence leaks', () => {
  it('an address of another firm is refused without naming the other firm or saying it exists there', async () => {
    const before = ctx.db.select({ n: count() }).from(users).get()!.n;
    const res = await send.post(otherAdmin, '/api/admin/users', { email: demo.designer, name: 'Somebody', roles: ['designer'] });
    expect(res.status).toBe(409);
    // the address typed is echoed; nothing else says where it is used
    const text = JSON.stringify(res.body).replaceAll(demo.designer, '');
    expect(text).not.toMatch(/exist|firm|Larchmont/i);
    expect(res.body.error.details).toEqual([{ path: 'body.email', message: 'cannot be given to a new account' }]);
    expect(ctx.db.select({ n: count() }).from(users).get()!.n).toBe(before);
  });

  it('an address already in the admin’s own firm is named as such (the admin sees that list anyway)', async () => {
    const res = await send.post(admin, '/api/admin/users', { email: demo.designer.toUpperCase(), name: 'Dana again', roles: ['designer'] });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toBe(`${demo.designer} is already a user of your firm: find them in the list`);
  });
});

describe('the local mail service', () => {
  const planted = { from: 'attacker@example.org', to: demo.admin, subject: 'Reset your password here', text: 'http://evil.example', headers: { [FIRM_HEADER]: '1', [KIND_HEADER]: 'invitation' } };

  it('refuses a message from a process that reaches the port without the application’s secret', async () => {
    const before = ctx.db.select({ n: count() }).from(outboxMessages).get()!.n;
    const anonymous = nodemailer.createTransport({ host: ctx.smtp.host, port: ctx.smtp.port, secure: false, ignoreTLS: true });
    await expect(anonymous.sendMail(planted)).rejects.toThrow(/530|authentication/i);
    const guessing = nodemailer.createTransport({ host: ctx.smtp.host, port: ctx.smtp.port, secure: false, ignoreTLS: true, auth: { user: ctx.smtp.auth.user, pass: 'a-guessed-secret' } });
    await expect(guessing.sendMail(planted)).rejects.toThrow(/535|authentication/i);
    anonymous.close();
    guessing.close();
    expect(ctx.db.select({ n: count() }).from(outboxMessages).get()!.n).toBe(before);
  });

  it('files the application’s own messages (it signs in with the per-start secret)', async () => {
    const before = ctx.db.select({ n: count() }).from(outboxMessages).get()!.n;
    await ctx.mailer.send({ to: demo.admin, subject: 'A notice', text: 'hello', html: '<p>hello</p>', firmId: 1, kind: 'review-requested' });
    expect(ctx.db.select({ n: count() }).from(outboxMessages).get()!.n).toBe(before + 1);
  });
});

describe('durable saves', () => {
  it('every connection syncs the write-ahead log at each commit (synchronous = FULL, SQLite "PRAGMA synchronous")', () => {
    // 2 = FULL. The application's connection, and a second one opened on the same file.
    expect(ctx.db.$client.pragma('synchronous', { simple: true })).toBe(2);
    const dir = mkdtempSync(join(tmpdir(), 'deckshare-sync-'));
    const a = openDatabase(join(dir, 'a.db'));
    const b = openDatabase(join(dir, 'a.db'));
    for (const c of [a, b]) {
      expect(c.$client.pragma('synchronous', { simple: true })).toBe(2);
      expect(c.$client.pragma('journal_mode', { simple: true })).toBe('wal');
    }
    a.$client.close();
    b.$client.close();
    rmSync(dir, { recursive: true, force: true });
  });
});
