/** The audit trail: append-only (database triggers refuse UPDATE and DELETE). */
import { and, desc, eq } from 'drizzle-orm';
import type { Db } from '../../db/client.js';
import { auditLog, users } from '../../db/schema.js';

/** A Drizzle handle or a transaction on it. */
export type DbOrTx = Pick<Db, 'insert' | 'select' | 'update'>;

export interface AuditEntry {
  firmId: number;
  projectId?: number | null;
  actorId: number | null;
  action: string;
  entityType: string;
  entityId?: number | null;
  summary: string;
}

export function recordAudit(db: DbOrTx, e: AuditEntry): void {
  db.insert(auditLog)
    .values({ firmId: e.firmId, projectId: e.projectId ?? null, actorId: e.actorId, action: e.action, entityType: e.entityType, entityId: e.entityId ?? null, summary: e.summary })
    .run();
}

export function projectAudit(db: Db, firmId: number, projectId: number) {
  return db
    .select({ a: auditLog, actorName: users.name })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.actorId))
    .where(and(eq(auditLog.firmId, firmId), eq(auditLog.projectId, projectId)))
    .orderBy(desc(auditLog.id))
    .all()
    .map(({ a, actorName }) => ({
      id: a.id,
      at: a.at,
      actor: a.actorId ? { id: a.actorId, name: actorName ?? '' } : null,
      action: a.action,
      entityType: a.entityType,
      entityId: a.entityId,
      summary: a.summary,
    }));
}
