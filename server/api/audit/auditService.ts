/** The audit trail: append-only (database triggers refuse UPDATE and DELETE). */
import { and, count, desc, eq, lt } from 'drizzle-orm';
import type { Db } from '../../db/client.js';
import { auditLog, users } from '../../db/schema.js';
import { cutPage, decodeCursor, DEFAULT_PAGE, idCursor, type PageRequest } from '../pagination.js';

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

/** A page of a project's audit trail, newest first (server/api/pagination.ts). */
export function projectAudit(db: Db, firmId: number, projectId: number, req: PageRequest = { limit: DEFAULT_PAGE }) {
  const after = decodeCursor(req.cursor, idCursor);
  const scope = and(eq(auditLog.firmId, firmId), eq(auditLog.projectId, projectId));
  const total = db.select({ n: count() }).from(auditLog).where(scope).get()?.n ?? 0;
  const rows = db
    .select({ a: auditLog, actorName: users.name })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.actorId))
    .where(after ? and(scope, lt(auditLog.id, after.id)) : scope)
    .orderBy(desc(auditLog.id))
    .limit(req.limit + 1)
    .all();
  const cut = cutPage(rows, req.limit, total, ({ a }) => ({ id: a.id }));
  return {
    entries: cut.rows.map(({ a, actorName }) => ({
      id: a.id,
      at: a.at,
      actor: a.actorId ? { id: a.actorId, name: actorName ?? '' } : null,
      action: a.action,
      entityType: a.entityType,
      entityId: a.entityId,
      summary: a.summary,
    })),
    page: cut.page,
  };
}
