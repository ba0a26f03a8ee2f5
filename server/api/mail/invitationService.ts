/**
 * Invitations: an admin sends a new user a link to choose their own password. The link
 * carries a random 256-bit token; only its SHA-256 is stored. A link works once, expires after
 * `INVITATION_HOURS`, and a newer invitation replaces an older one. Setting the password
 * signs the user in and ends their other sessions.
 */
import { formatTimestamp } from '../../../shared/time/timestamps.js';
import { randomBytes } from 'node:crypto';
import { and, desc, eq, isNull } from 'drizzle-orm';
import { alias } from 'drizzle-orm/sqlite-core';
import type { Db } from '../../db/client.js';
import { firms, invitations, sessions, users } from '../../db/schema.js';
import { sha256 } from '../../auth/session.js';
import { hashPassword } from '../../auth/password.js';
import { ApiError } from '../../middleware/errors.js';
import { recordAudit } from '../audit/auditService.js';
import type { Mailer } from '../../mail/mailer.js';
import { invitationMessage } from '../../mail/messages.js';

export const INVITATION_HOURS = 72;

interface Actor {
  id: number;
  firmId: number;
  name: string;
}

export type InvitationStatus = 'pending' | 'used' | 'expired' | 'replaced';

function statusOf(row: typeof invitations.$inferSelect, now = new Date()): InvitationStatus {
  if (row.usedAt) return 'used';
  if (row.replacedAt) return 'replaced';
  if (new Date(row.expiresAt) <= now) return 'expired';
  return 'pending';
}

export function listInvitations(db: Db, firmId: number) {
  const inviter = alias(users, 'inviter');
  return db
    .select({ i: invitations, name: users.name, email: users.email, inviterName: inviter.name })
    .from(invitations)
    .innerJoin(users, eq(users.id, invitations.userId))
    .innerJoin(inviter, eq(inviter.id, invitations.createdBy))
    .where(eq(invitations.firmId, firmId))
    .orderBy(desc(invitations.id))
    .all()
    .map(({ i, name, email, inviterName }) => ({
      id: i.id,
      user: { id: i.userId, name, email },
      invitedBy: { id: i.createdBy, name: inviterName },
      createdAt: i.createdAt,
      expiresAt: i.expiresAt,
      usedAt: i.usedAt,
      status: statusOf(i),
    }));
}

/** Creates an invitation for a user of the actor's firm and e-mails the link. */
export function inviteUser(db: Db, mailer: Mailer, publicUrl: string, actor: Actor, userId: number) {
  const u = db.select().from(users).where(and(eq(users.id, userId), eq(users.firmId, actor.firmId))).get();
  if (!u) throw ApiError.notFound('user');
  if (u.disabled) throw ApiError.conflict(`${u.email} is disabled: enable the account before inviting`);
  if (!u.mustChangePassword) throw ApiError.conflict(`${u.email} has already chosen a password: use “reset password” instead`);
  const firm = db.select().from(firms).where(eq(firms.id, actor.firmId)).get()!;
  const token = randomBytes(32).toString('base64url');
  const expiresAt = new Date(Date.now() + INVITATION_HOURS * 3600_000).toISOString();
  const now = new Date().toISOString();
  const row = db.transaction((tx) => {
    tx.update(invitations)
      .set({ replacedAt: now })
      .where(and(eq(invitations.userId, userId), isNull(invitations.usedAt), isNull(invitations.replacedAt)))
      .run();
    const row = tx.insert(invitations).values({ firmId: actor.firmId, userId, tokenHash: sha256(token), expiresAt, createdBy: actor.id }).returning().get();
    recordAudit(tx, { firmId: actor.firmId, actorId: actor.id, action: 'invite', entityType: 'user', entityId: userId, summary: `sent ${u.email} an invitation to set a password (expires ${formatTimestamp(expiresAt, 'UTC')})` });
    return row;
  });
  const link = `${publicUrl.replace(/\/$/, '')}/set-password/${token}`;
  mailer.queue(invitationMessage({ firmId: actor.firmId, firmName: firm.name, to: { name: u.name, email: u.email }, invitedBy: actor.name, link, expiresAt }));
  return { id: row.id, user: { id: u.id, name: u.name, email: u.email }, invitedBy: { id: actor.id, name: actor.name }, createdAt: row.createdAt, expiresAt, usedAt: null, status: 'pending' as const };
}

function openInvitation(db: Db, token: string) {
  const row = db
    .select({ i: invitations, u: users, firmName: firms.name })
    .from(invitations)
    .innerJoin(users, eq(users.id, invitations.userId))
    .innerJoin(firms, eq(firms.id, invitations.firmId))
    .where(eq(invitations.tokenHash, sha256(token)))
    .get();
  if (!row || statusOf(row.i) !== 'pending' || row.u.disabled) {
    throw new ApiError(404, 'not_found', 'this invitation link is unknown, already used, replaced by a newer one or expired: ask your administrator for a new one');
  }
  return row;
}

/** What the set-password page shows. */
export function describeInvitation(db: Db, token: string) {
  const { i, u, firmName } = openInvitation(db, token);
  return { email: u.email, name: u.name, firmName, expiresAt: i.expiresAt };
}

/** Sets the password from an invitation; returns the user id (the caller starts a session). */
export async function acceptInvitation(db: Db, token: string, password: string): Promise<number> {
  const { i, u } = openInvitation(db, token);
  const hash = await hashPassword(password);
  const now = new Date().toISOString();
  db.transaction((tx) => {
    // Re-check inside the transaction: the same link used twice at once sets the password once.
    const still = tx.select().from(invitations).where(and(eq(invitations.id, i.id), isNull(invitations.usedAt), isNull(invitations.replacedAt))).get();
    if (!still) throw new ApiError(404, 'not_found', 'this invitation link has just been used');
    tx.update(invitations).set({ usedAt: now }).where(eq(invitations.id, i.id)).run();
    tx.update(users).set({ passwordHash: hash, mustChangePassword: false, passwordChangedAt: now }).where(eq(users.id, u.id)).run();
    tx.update(sessions).set({ revokedAt: now }).where(and(eq(sessions.userId, u.id), isNull(sessions.revokedAt))).run();
    recordAudit(tx, { firmId: u.firmId, actorId: u.id, action: 'set-password', entityType: 'user', entityId: u.id, summary: `${u.email} chose a password from an invitation` });
  });
  return u.id;
}
