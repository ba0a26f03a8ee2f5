/**
 * Demo data for an empty database: the invented firm "Larchmont Ridge Engineering", one user
 * per role, and two invented bridge projects. Seeding never touches a database that already
 * has a firm, and is only done when asked for (`--demo` or SEED_DEMO=true), never in
 * production (server/config/env.ts refuses it). The demo users share one password chosen by
 * the caller: a random one printed at start unless DEMO_PASSWORD sets it.
 */
import { count } from 'drizzle-orm';
import type { Db } from './client.js';
import { firms, projects, userRoles, users, type Role } from './schema.js';
import { hashPassword } from '../auth/password.js';
import { recordAudit } from '../api/audit/auditService.js';
import { createDeck } from '../api/decks/deckService.js';
import { demoDecks } from './demoDecks.js';

export const DEMO_FIRM = 'Larchmont Ridge Engineering';

export const DEMO_USERS: { email: string; name: string; roles: Role[] }[] = [
  { email: 'admin@larchmont-ridge.example', name: 'Avery Lindqvist', roles: ['admin'] },
  { email: 'designer@larchmont-ridge.example', name: 'Dana Okonkwo', roles: ['designer'] },
  { email: 'reviewer@larchmont-ridge.example', name: 'Ruth Castellanos', roles: ['reviewer'] },
  { email: 'instructor@larchmont-ridge.example', name: 'Ingrid Marsh', roles: ['instructor', 'reviewer'] },
  { email: 'trainee@larchmont-ridge.example', name: 'Theo Brandt', roles: ['trainee'] },
];

export const DEMO_PROJECTS = [
  {
    name: 'Quarry Creek Overpass',
    ownerAgency: 'Harlow County Highway Department',
    location: 'County Road 14 over Quarry Creek, Harlow County',
    units: 'US' as const,
    notes: 'Replacement of a two-span timber structure; single 110 ft span on precast bulb-tee girders, 20° skew.',
  },
  {
    name: 'Ashgrove Street Viaduct',
    ownerAgency: 'City of Fenmore Public Works',
    location: 'Ashgrove Street over the Fenmore rail yard',
    units: 'SI' as const,
    notes: 'Three-span continuous steel plate girders; widening study for a fourth lane.',
  },
];

/** Seeds when the database has no firm, every demo user with `password`; returns true when it seeded. */
export async function seedDemo(db: Db, password: string): Promise<boolean> {
  const n = db.select({ n: count() }).from(firms).get();
  if ((n?.n ?? 0) > 0) return false;
  // Build and validate the demo decks before writing anything, so a failure leaves the
  // database empty rather than half-seeded.
  const decksToSeed = demoDecks();
  const hash = await hashPassword(password);
  const { firmId, designerId, projectIds } = db.transaction((tx) => {
    const firm = tx.insert(firms).values({ name: DEMO_FIRM }).returning().get();
    const ids: number[] = [];
    for (const u of DEMO_USERS) {
      const row = tx.insert(users).values({ firmId: firm.id, email: u.email, name: u.name, passwordHash: hash, mustChangePassword: false }).returning().get();
      ids.push(row.id);
      for (const role of u.roles) tx.insert(userRoles).values({ userId: row.id, role }).run();
    }
    const designerId = ids[1];
    const projectIds = new Map<string, number>();
    for (const p of DEMO_PROJECTS) {
      const row = tx.insert(projects).values({ ...p, firmId: firm.id, createdBy: designerId }).returning().get();
      projectIds.set(row.name, row.id);
      recordAudit(tx, { firmId: firm.id, projectId: row.id, actorId: designerId, action: 'create', entityType: 'project', entityId: row.id, summary: `created project “${row.name}” (demo data)` });
    }
    return { firmId: firm.id, designerId, projectIds };
  });
  for (const d of decksToSeed) {
    createDeck(db, { id: designerId, firmId }, projectIds.get(d.project)!, { deck: d.deck, message: d.message });
  }
  return true;
}

export function demoCredentialsText(password: string): string {
  return [
    `Demo firm "${DEMO_FIRM}" — every demo user's password is ${password}`,
    ...DEMO_USERS.map((u) => `  ${u.roles.join(' + ').padEnd(22)} ${u.email}`),
  ].join('\n');
}
