/** Accounts and records: creating a user never reveals that another firm has the address. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { count } from 'drizzle-orm';
import { demo, signIn, type Agent } from './helpers.js';
import { makeWorkflowApp, otherFirm, send, type WorkflowContext } from './workflowHelpers.js';
import { users } from '../../server/db/schema.js';

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
