/** Firm isolation and the permission matrix on every API route, listed from the app's router
 *  stack: a second firm with one user per role gets 404 for each of the first firm's ids
 *  (projects, decks, versions, drawings, reviews, exercises, mail, users, reports) and sees
 *  none of its data in lists; every role the matrix (server/auth/permissions.ts) leaves out
 *  gets 403, in either firm. Refusals write nothing. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { firms, ROLES, type Role } from '../../server/db/schema.js';
import { PERMISSIONS } from '../../server/auth/permissions.js';
import { addUser, makeWorkflowApp, send, type WorkflowContext } from './workflowHelpers.js';
import { listRoutes, type RouteInfo } from './routeTable.js';
import { buildWorld, fillPath, sampleRequests, sendRequest, databaseState, type SampleRequest, type WorldIds } from './routeWorld.js';
import type { Agent } from './helpers.js';

/** Routes open to anyone or acting only on the caller's own account: no firm data to leak. */
const OPEN_OR_SELF = new Set([
  'GET /api/health',
  'POST /api/auth/login',
  'POST /api/auth/logout',
  'GET /api/auth/me',
  'GET /api/auth/session',
  'POST /api/auth/password',
  // the invitation token is the secret that grants access; it names no firm id
  'GET /api/invitations/:token',
  'POST /api/invitations/:token/accept',
]);

/** Routes without a path id whose query or body names the first firm's ids. */
const IDS_IN_QUERY_OR_BODY = new Set(['GET /api/reviews', 'POST /api/invitations', 'POST /api/reviews', 'GET /api/reviews/status', 'POST /api/training/assignments', 'POST /api/imports/girder-layout']);

let ctx: WorkflowContext;
let ids: WorldIds;
let routes: RouteInfo[];
let samples: Record<string, SampleRequest>;
const second: Partial<Record<Role, Agent>> = {};
const first: Partial<Record<Role, Agent>> = {};
/** Text that only the first firm's data holds. */
let markers: string[];

beforeAll(async () => {
  ctx = await makeWorkflowApp();
  ids = await buildWorld(ctx);
  const other = ctx.db.insert(firms).values({ name: 'Second Firm of Bridges' }).returning().get();
  for (const role of ROLES) {
    second[role] = (await addUser(ctx, `${role}@second-firm.example`, [role], other.id)).agent;
    first[role] = (await addUser(ctx, `only-${role}@larchmont-ridge.example`, [role])).agent;
  }
  // The second firm has data of its own, so its lists are not empty by accident.
  const own = await send.post(second.designer!, '/api/projects', { name: 'Second firm bridge', units: 'SI' });
  expect(own.status).toBe(201);
  routes = listRoutes(ctx.app);
  samples = sampleRequests(ids);
  const projects = (await first.admin!.get('/api/projects?archived=include')).body.projects as { name: string }[];
  markers = ['larchmont-ridge', 'Larchmont Ridge', 'Quarry Creek', ...projects.map((p) => p.name)];
}, 60_000);
afterAll(() => ctx.close());

function call(agent: Agent, route: RouteInfo, withQuery = true) {
  const s = samples[route.key];
  return sendRequest(agent, route.method, fillPath(route, s.params), { query: withQuery ? s.query : undefined, rawBody: s.body ? JSON.stringify(s.body) : undefined, file: s.file });
}

/** Calls a route and reports whether the database was written to. */
async function callCounting(agent: Agent, route: RouteInfo) {
  await ctx.mailer.idle();
  const before = databaseState(ctx.db);
  const res = await call(agent, route);
  await ctx.mailer.idle();
  return { res, wrote: databaseState(ctx.db) !== before };
}

const allowed = (route: RouteInfo, role: Role) => route.action !== null && (PERMISSIONS[route.action] as readonly Role[]).includes(role);

describe('every route is classified', () => {
  it('each route declares an action with allow(…) or is open or acts on the caller only', () => {
    const undeclared = routes.filter((r) => r.action === null && !OPEN_OR_SELF.has(r.key)).map((r) => r.key);
    expect(undeclared).toEqual([]);
    const missing = routes.filter((r) => !samples[r.key]).map((r) => r.key);
    expect(missing, 'add a sample request to tests/server/routeWorld.ts').toEqual([]);
  });
});

describe('firm isolation', () => {
  it("a user of the second firm gets 404 for each of the first firm's ids, on every route, and nothing is written", async () => {
    const problems: string[] = [];
    let checked = 0;
    for (const route of routes) {
      if (OPEN_OR_SELF.has(route.key)) continue;
      const sample = samples[route.key];
      const namesIds = Object.keys(sample.params ?? {}).length > 0 || IDS_IN_QUERY_OR_BODY.has(route.key);
      if (!namesIds) continue;
      for (const role of ROLES.filter((r) => allowed(route, r))) {
        const { res, wrote } = await callCounting(second[role]!, route);
        checked++;
        if (res.status !== 404) problems.push(`${route.key} as the second firm's ${role}: ${res.status} ${JSON.stringify(res.body).slice(0, 160)}`);
        else if (res.body?.error?.code !== 'not_found') problems.push(`${route.key} as ${role}: 404 without the not_found envelope`);
        if (wrote) problems.push(`${route.key} as the second firm's ${role}: the database changed`);
      }
    }
    expect(problems, problems.join('\n')).toEqual([]);
    expect(checked).toBeGreaterThan(40);
  }, 120_000);

  it("lists answer the second firm with none of the first firm's data", async () => {
    const problems: string[] = [];
    // Lists: GET routes without a path id (the one whose query must name a deck left out); a
    // query naming the first firm's deck is dropped, so the whole list is checked.
    for (const route of routes.filter((r) => r.method === 'GET' && !OPEN_OR_SELF.has(r.key) && !Object.keys(samples[r.key].params ?? {}).length && r.key !== 'GET /api/reviews/status')) {
      for (const role of ROLES.filter((r) => allowed(route, r))) {
        const res = await call(second[role]!, route, !IDS_IN_QUERY_OR_BODY.has(route.key));
        if (res.status !== 200) {
          problems.push(`${route.key} as the second firm's ${role}: ${res.status}`);
          continue;
        }
        const text = res.type === 'application/json' ? JSON.stringify(res.body) : res.text;
        const leaked = markers.filter((m) => text.includes(m));
        if (leaked.length) problems.push(`${route.key} as the second firm's ${role} shows ${leaked.join(', ')}`);
      }
    }
    expect(problems, problems.join('\n')).toEqual([]);
    // The filter is real: the second firm's own project is listed.
    expect(JSON.stringify((await second.designer!.get('/api/projects')).body)).toContain('Second firm bridge');
  }, 120_000);
});

describe('permission matrix on every route', () => {
  it('each role outside the matrix gets 403, in either firm, and nothing is written', async () => {
    const problems: string[] = [];
    let checked = 0;
    for (const route of routes.filter((r) => r.action !== null)) {
      for (const role of ROLES.filter((r) => !allowed(route, r))) {
        for (const [firm, agents] of [['first', first], ['second', second]] as const) {
          const { res, wrote } = await callCounting(agents[role]!, route);
          checked++;
          if (res.status !== 403 || res.body?.error?.code !== 'forbidden') problems.push(`${route.key} (${route.action}) as the ${firm} firm's ${role}: ${res.status} ${JSON.stringify(res.body).slice(0, 120)}`);
          if (wrote) problems.push(`${route.key} as the ${firm} firm's ${role}: the database changed`);
        }
      }
    }
    expect(problems, problems.join('\n')).toEqual([]);
    expect(checked).toBeGreaterThan(100);
  }, 120_000);
});
