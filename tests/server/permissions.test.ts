/** Every route family refuses the roles the permission matrix does not allow (403), and
 *  README's permission table matches the matrix in server/auth/permissions.ts. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { demo, makeTestApp, signIn, type Agent, type TestContext } from './helpers.js';
import { PERMISSIONS } from '../../server/auth/permissions.js';
import { ROLES } from '../../server/db/schema.js';
import { quarryCreekDeck } from '../fixtures/decks.js';

let ctx: TestContext;
const agents: Record<string, Agent> = {};
let projectId: number;
let deckId: number;

beforeAll(async () => {
  ctx = await makeTestApp();
  for (const [role, email] of Object.entries(demo)) agents[role] = await signIn(ctx.app, email);
  const d = agents.designer;
  projectId = (await d.get('/api/projects')).body.projects[0].id;
  deckId = (await d.post(`/api/projects/${projectId}/decks`).set('X-CSRF-Token', d.csrf).send({ deck: quarryCreekDeck(), message: 'x' })).body.deck.id;
});
afterAll(() => ctx.close());

type Call = (a: Agent) => Promise<{ status: number }>;
const calls: Record<string, { action: keyof typeof PERMISSIONS; call: Call }[]> = {};
function route(family: string, action: keyof typeof PERMISSIONS, call: Call) {
  (calls[family] ??= []).push({ action, call });
}
route('projects', 'project:read', (a) => a.get('/api/projects'));
route('projects', 'project:create', (a) => a.post('/api/projects').set('X-CSRF-Token', a.csrf).send({ name: 'perm', units: 'US' }));
route('projects', 'project:update', (a) => a.patch(`/api/projects/${projectId}`).set('X-CSRF-Token', a.csrf).send({ notes: 'perm' }));
route('decks', 'project:read', (a) => a.get(`/api/decks/${deckId}`));
route('decks', 'deck:save', (a) => a.post(`/api/decks/${deckId}/versions`).set('X-CSRF-Token', a.csrf).send({ deck: quarryCreekDeck(), message: 'perm' }));
route('decks', 'deck:save', (a) => a.post(`/api/projects/${projectId}/decks`).set('X-CSRF-Token', a.csrf).send({ deck: quarryCreekDeck(), message: 'perm' }));
route('audit', 'audit:read', (a) => a.get(`/api/projects/${projectId}/audit`));
route('admin users', 'users:manage', (a) => a.get('/api/admin/users'));
route('admin users', 'users:manage', (a) => a.post('/api/admin/users').set('X-CSRF-Token', a.csrf).send({ email: `p${Math.random()}@x.example`, name: 'P', roles: ['trainee'] }));
route('studies', 'study:read', (a) => a.get(`/api/projects/${projectId}/studies`));
route('studies', 'study:create', (a) =>
  a.post(`/api/projects/${projectId}/studies`).set('X-CSRF-Token', a.csrf).send({ name: 'perm', deckId, versionNumber: 1, sweep: { axes: [{ parameter: 'skew', values: { kind: 'list', values: [0] } }] } }),
);

const userRoles: Record<string, string[]> = {
  admin: ['admin'],
  designer: ['designer'],
  reviewer: ['reviewer'],
  instructor: ['instructor', 'reviewer'],
  trainee: ['trainee'],
};

describe('permission matrix', () => {
  for (const [family, list] of Object.entries(calls)) {
    it(`${family}: each demo role gets exactly what the matrix allows`, async () => {
      for (const { action, call } of list) {
        for (const role of Object.keys(demo)) {
          const allowed = userRoles[role].some((r) => (PERMISSIONS[action] as readonly string[]).includes(r));
          const res = await call(agents[role]);
          if (allowed) expect([200, 201], `${role} → ${action}`).toContain(res.status);
          else expect(res.status, `${role} → ${action}`).toBe(403);
        }
      }
    });
  }

  it('README states the same matrix as the code', () => {
    const readme = readFileSync(new URL('../../README.md', import.meta.url), 'utf8');
    for (const [action, roles] of Object.entries(PERMISSIONS)) {
      const line = readme.split('\n').find((l) => l.startsWith(`| \`${action}\``));
      expect(line, `README row for ${action}`).toBeDefined();
      const cells = line!.split('|').slice(2, 2 + ROLES.length).map((c) => c.trim());
      ROLES.forEach((role, i) => expect(cells[i], `${action} × ${role}`).toBe((roles as readonly string[]).includes(role) ? 'yes' : '—'));
    }
  });
});
