/** Drawings attached to projects: firm-scoped through the project; uploads and deletions audited. */
import { createHash } from 'node:crypto';
import { and, desc, eq } from 'drizzle-orm';
import type { Db } from '../../db/client.js';
import { attachments, projects, users, type AttachmentRow } from '../../db/schema.js';
import { withoutForbiddenCharacters } from '../../../shared/text.js';
import { ApiError } from '../../middleware/errors.js';
import { recordAudit } from '../audit/auditService.js';
import { findProject } from '../projects/projectService.js';
import { MAX_ATTACHMENT_BYTES, detectDrawingType, newStoredName, removeStored, writeStored } from './attachmentStore.js';

interface Actor {
  id: number;
  firmId: number;
}

function present(a: AttachmentRow, uploaderName: string) {
  return {
    id: a.id,
    projectId: a.projectId,
    title: a.title,
    originalName: a.originalName,
    contentType: a.contentType,
    sizeBytes: a.sizeBytes,
    sha256: a.sha256,
    uploadedBy: { id: a.uploadedBy, name: uploaderName },
    createdAt: a.createdAt,
    downloadUrl: `/api/attachments/${a.id}/download`,
  };
}

export type AttachmentView = ReturnType<typeof present>;

export function listAttachments(db: Db, firmId: number, projectId: number): AttachmentView[] {
  findProject(db, firmId, projectId);
  return db
    .select({ a: attachments, name: users.name })
    .from(attachments)
    .innerJoin(users, eq(users.id, attachments.uploadedBy))
    .where(and(eq(attachments.projectId, projectId), eq(attachments.firmId, firmId)))
    .orderBy(desc(attachments.id))
    .all()
    .map(({ a, name }) => present(a, name));
}

/** The attachment if its project belongs to the firm; otherwise 404. */
export function findAttachment(db: Db, firmId: number, attachmentId: number): AttachmentRow {
  const row = db
    .select({ a: attachments })
    .from(attachments)
    .innerJoin(projects, eq(projects.id, attachments.projectId))
    .where(and(eq(attachments.id, attachmentId), eq(projects.firmId, firmId)))
    .get();
  if (!row) throw ApiError.notFound('attachment');
  return row.a;
}

/**
 * A file name safe to show and to send back in Content-Disposition: the last path part, in
 * Unicode NFC, without the characters typed names may not hold (shared/text.ts: controls and
 * the bidirectional overrides that make "plan\u202Efdp.exe" show as "planexe.pdf") and quotes;
 * removed here rather than refused, because nobody typed them.
 */
function cleanName(name: string): string {
  const base = name.split(/[\\/]/).pop() ?? '';
  const cleaned = withoutForbiddenCharacters(base).replace(/"/g, '').trim().slice(0, 200);
  return cleaned || 'drawing';
}

export function addAttachment(db: Db, dir: string, actor: Actor, projectId: number, file: { originalname: string; buffer: Buffer; size: number }, title: string | undefined): AttachmentView {
  const project = findProject(db, actor.firmId, projectId);
  if (project.archived) throw ApiError.conflict('the project is archived: restore it before attaching drawings');
  if (file.size === 0) throw ApiError.badRequest('file: the file is empty', [{ path: 'file', message: 'the file is empty' }]);
  if (file.size > MAX_ATTACHMENT_BYTES) throw new ApiError(413, 'payload_too_large', `file: a drawing may be at most ${MAX_ATTACHMENT_BYTES / 1024 / 1024} MB`);
  const type = detectDrawingType(file.buffer);
  if (!type) {
    throw ApiError.badRequest('file: the content is not a PDF, PNG or JPEG file (checked from its first bytes, not its name)', [
      { path: 'file', message: 'the content is not a PDF, PNG or JPEG file (checked from its first bytes, not its name)' },
    ]);
  }
  const originalName = cleanName(file.originalname);
  const storedName = newStoredName();
  const sha256 = createHash('sha256').update(file.buffer).digest('hex');
  writeStored(dir, storedName, file.buffer);
  try {
    const row = db.transaction((tx) => {
      const a = tx
        .insert(attachments)
        .values({ firmId: actor.firmId, projectId, title: title?.trim() || originalName, originalName, storedName, contentType: type, sizeBytes: file.size, sha256, uploadedBy: actor.id })
        .returning()
        .get();
      recordAudit(tx, { firmId: actor.firmId, projectId, actorId: actor.id, action: 'upload', entityType: 'attachment', entityId: a.id, summary: `attached drawing “${a.title}” (${originalName}, ${type}, ${(file.size / 1024).toFixed(0)} kB)` });
      return a;
    });
    const name = db.select({ name: users.name }).from(users).where(eq(users.id, actor.id)).get()?.name ?? '';
    return present(row, name);
  } catch (e) {
    removeStored(dir, storedName);
    throw e;
  }
}

export function deleteAttachment(db: Db, dir: string, actor: Actor, attachmentId: number): void {
  const a = findAttachment(db, actor.firmId, attachmentId);
  db.transaction((tx) => {
    tx.delete(attachments).where(eq(attachments.id, a.id)).run();
    recordAudit(tx, { firmId: actor.firmId, projectId: a.projectId, actorId: actor.id, action: 'delete', entityType: 'attachment', entityId: a.id, summary: `deleted drawing “${a.title}” (${a.originalName})` });
  });
  removeStored(dir, a.storedName);
}
