/** The firm's users, managed by its admins. */
import { and, asc, eq } from 'drizzle-orm';
import { z } from 'zod';
import { personText } from '../../../shared/text.js';
import type { Db } from '../../db/client.js';
import { ROLES, sessions, userRoles, users, type Role } from '../../db/schema.js';
import { hashPassword, temporaryPassword } from '../../auth/password.js';
import { ApiError } from '../../middleware/errors.js';
import { recordAudit } from '../audit/auditService.js';

const roles = z
  .array(z.enum(ROLES, { error: `each role must be one of ${ROLES.join(', ')}` }))
  .min(1, 'a user needs at least one role')
  .transform((r) => [...new Set(r)].sort() as Role[]);

export const userCreateBody = z.strictObject({
  email: z.string().trim().toLowerCase().email('email must be an e-mail address').max(254),
  name: personText('name', 200, { min: 1, minMessage: 'name is required' }),
  roles,
});

export const userUpdateBody = z
  .strictObject({
    name: personText('name', 200, { min: 1, minMessage: 'name is required' }).optional(),
    roles: roles.optional(),
    disabled: z.boolean({ error: 'disabled must be true or false' }).optional(),
  })
  .refine((b) => Object.keys(b).length > 0, { message: 'nothing to change: send at least one field' });

interface Actor {
  id: number;
  firmId: number;
}

function present(db: Db, u: typeof users.$inferSelect) {
  const r = db.select({ role: userRoles.role }).from(userRoles).where(eq(userRoles.userId, u.id)).all();
  return { id: u.id, email: u.email, name: u.name, roles: r.map((x) => x.role).sort(), mustChangePassword: u.mustChangePassword, disabled: u.disabled, createdAt: u.createdAt };
}

function findUser(db: Db, firmId: number, userId: number) {
  const u = db.select().from(users).where(and(eq(users.id, userId), eq(users.firmId, firmId))).get();
  if (!u) throw ApiError.notFound('user');
  return u;
}

export function listUsers(db: Db, firmId: number) {
  return db.select().from(users).where(eq(users.firmId, firmId)).orderBy(asc(users.name)).all().map((u) => present(db, u));
}

export async function createUser(db: Db, actor: Actor, body: z.infer<typeof userCreateBody>) {
  // E-mail addresses are unique across firms because sign-in asks for the address alone. A
  // clash inside the admin's own firm is named (the admin sees that list anyway); a clash with
  // another firm is answered without saying that another firm has the address.
  const taken = db.select({ firmId: users.firmId }).from(users).where(eq(users.email, body.email)).get();
  if (taken) {
    throw taken.firmId === actor.firmId
      ? ApiError.conflict(`${body.email} is already a user of your firm: find them in the list`, [{ path: 'body.email', message: 'already a user of your firm' }])
      : ApiError.conflict(`${body.email} cannot be given to a new account: use another address for this person`, [{ path: 'body.email', message: 'cannot be given to a new account' }]);
  }
  const password = temporaryPassword();
  const hash = await hashPassword(password);
  const u = db.transaction((tx) => {
    const u = tx.insert(users).values({ firmId: actor.firmId, email: body.email, name: body.name, passwordHash: hash, mustChangePassword: true }).returning().get();
    for (const role of body.roles) tx.insert(userRoles).values({ userId: u.id, role }).run();
    recordAudit(tx, { firmId: actor.firmId, actorId: actor.id, action: 'create', entityType: 'user', entityId: u.id, summary: `created user ${u.email} (${body.roles.join(', ')})` });
    return u;
  });
  return { user: present(db, u), temporaryPassword: password };
}

export function updateUser(db: Db, actor: Actor, userId: number, body: z.infer<typeof userUpdateBody>) {
  const u = findUser(db, actor.firmId, userId);
  if (userId === actor.id && body.disabled === true) throw ApiError.conflict('you cannot disable your own account');
  if (userId === actor.id && body.roles && !body.roles.includes('admin')) throw ApiError.conflict('you cannot remove your own admin role');
  db.transaction((tx) => {
    if (body.name !== undefined || body.disabled !== undefined) {
      tx.update(users).set({ name: body.name ?? u.name, disabled: body.disabled ?? u.disabled }).where(eq(users.id, userId)).run();
    }
    if (body.roles) {
      tx.delete(userRoles).where(eq(userRoles.userId, userId)).run();
      for (const role of body.roles) tx.insert(userRoles).values({ userId, role }).run();
    }
    if (body.disabled === true) tx.update(sessions).set({ revokedAt: new Date().toISOString() }).where(eq(sessions.userId, userId)).run();
    const what = [body.name !== undefined && 'name', body.roles && `roles → ${body.roles.join(', ')}`, body.disabled !== undefined && (body.disabled ? 'disabled' : 'enabled')].filter(Boolean).join('; ');
    recordAudit(tx, { firmId: actor.firmId, actorId: actor.id, action: 'change', entityType: 'user', entityId: userId, summary: `changed user ${u.email}: ${what}` });
  });
  return present(db, findUser(db, actor.firmId, userId));
}

export async function resetPassword(db: Db, actor: Actor, userId: number) {
  const u = findUser(db, actor.firmId, userId);
  const password = temporaryPassword();
  const hash = await hashPassword(password);
  db.transaction((tx) => {
    tx.update(users).set({ passwordHash: hash, mustChangePassword: true }).where(eq(users.id, userId)).run();
    tx.update(sessions).set({ revokedAt: new Date().toISOString() }).where(eq(sessions.userId, userId)).run();
    recordAudit(tx, { firmId: actor.firmId, actorId: actor.id, action: 'reset-password', entityType: 'user', entityId: userId, summary: `reset the password of ${u.email}` });
  });
  return { temporaryPassword: password };
}
