/** Projects (bridges) of a firm. Every read and write is scoped to the caller's firm. */
import { and, count, desc, eq } from 'drizzle-orm';
import type { Db } from '../../db/client.js';
import { decks, projects, users, type ProjectRow } from '../../db/schema.js';
import { ApiError } from '../../middleware/errors.js';
import { recordAudit } from '../audit/auditService.js';
import type { ProjectCreate, ProjectUpdate } from './projectModel.js';

function present(db: Db, p: ProjectRow) {
  const creator = db.select({ id: users.id, name: users.name }).from(users).where(eq(users.id, p.createdBy)).get();
  const n = db.select({ n: count() }).from(decks).where(eq(decks.projectId, p.id)).get();
  return {
    id: p.id,
    name: p.name,
    ownerAgency: p.ownerAgency,
    location: p.location,
    units: p.units,
    notes: p.notes,
    archived: p.archived,
    createdAt: p.createdAt,
    updatedAt: p.updatedAt,
    createdBy: creator ?? { id: p.createdBy, name: '' },
    deckCount: n?.n ?? 0,
  };
}

export type ProjectView = ReturnType<typeof present>;

/** The project row if it belongs to the firm; otherwise 404 (never reveal another firm's ids). */
export function findProject(db: Db, firmId: number, projectId: number): ProjectRow {
  const p = db.select().from(projects).where(and(eq(projects.id, projectId), eq(projects.firmId, firmId))).get();
  if (!p) throw ApiError.notFound('project');
  return p;
}

export function listProjects(db: Db, firmId: number, archived: 'include' | 'only' | 'exclude'): ProjectView[] {
  const where =
    archived === 'include'
      ? eq(projects.firmId, firmId)
      : and(eq(projects.firmId, firmId), eq(projects.archived, archived === 'only'));
  return db.select().from(projects).where(where).orderBy(desc(projects.updatedAt)).all().map((p) => present(db, p));
}

export function getProject(db: Db, firmId: number, projectId: number): ProjectView {
  return present(db, findProject(db, firmId, projectId));
}

export function createProject(db: Db, actor: { id: number; firmId: number }, body: ProjectCreate): ProjectView {
  const row = db.transaction((tx) => {
    const p = tx.insert(projects).values({ ...body, firmId: actor.firmId, createdBy: actor.id }).returning().get();
    recordAudit(tx, { firmId: actor.firmId, projectId: p.id, actorId: actor.id, action: 'create', entityType: 'project', entityId: p.id, summary: `created project “${p.name}”` });
    return p;
  });
  return present(db, row);
}

export function updateProject(db: Db, actor: { id: number; firmId: number }, projectId: number, body: ProjectUpdate): ProjectView {
  const before = findProject(db, actor.firmId, projectId);
  const changed = Object.entries(body)
    .filter(([k, v]) => before[k as keyof ProjectRow] !== v)
    .map(([k]) => k);
  const row = db.transaction((tx) => {
    const p = tx
      .update(projects)
      .set({ ...body, updatedAt: new Date().toISOString() })
      .where(and(eq(projects.id, projectId), eq(projects.firmId, actor.firmId)))
      .returning()
      .get();
    const action = body.archived === true && !before.archived ? 'archive' : body.archived === false && before.archived ? 'restore' : 'change';
    recordAudit(tx, {
      firmId: actor.firmId,
      projectId,
      actorId: actor.id,
      action,
      entityType: 'project',
      entityId: projectId,
      summary:
        action === 'archive'
          ? `archived project “${p.name}”`
          : action === 'restore'
            ? `restored project “${p.name}”`
            : changed.length
              ? `changed project “${p.name}” (${changed.join(', ')})`
              : `saved project “${p.name}” without changes`,
    });
    return p;
  });
  return present(db, row);
}
