/**
 * The jobs of the worker pools as rows of `compute_jobs` (server/db/schema.ts): queued when a
 * pool accepts one, running when a worker starts it, done or failed (with the reason its
 * requester was given) when it ends, or cancelled (with who cancelled it) when a user stops it. At start-up, jobs a stopped server left queued or running
 * are marked failed with the reason, so none stays "running" for ever; asking for the result
 * again starts a new job. A record that cannot be written never fails the job itself.
 */
import { desc, eq, inArray } from 'drizzle-orm';
import type { Db } from '../db/client.js';
import { computeJobs, now } from '../db/schema.js';
import { SOLVER_VERSION } from '../../shared/version.js';

export type JobKind = (typeof computeJobs.$inferSelect)['kind'];

export interface JobMeta {
  kind: JobKind;
  versionId: number;
  /** The user whose request started the job (null when none is known). */
  requestedBy: number | null;
  /** The firm the version belongs to (for the per-firm limit; not stored, the version knows it). */
  firmId?: number;
}

export interface JobRecorder {
  queued(meta: JobMeta): number | null;
  started(id: number): void;
  done(id: number, runMs: number | null): void;
  failed(id: number, error: string, runMs: number | null): void;
  cancelled(id: number, reason: string, runMs: number | null): void;
}

/** Records in the database; a failure to write is logged, never thrown into the job. */
export function databaseJobRecorder(db: Db, log: (line: string) => void = (l) => console.error(l)): JobRecorder {
  const safely = <T>(what: string, f: () => T): T | null => {
    try {
      return f();
    } catch (e) {
      log(`could not record a compute job (${what}): ${e instanceof Error ? e.message : String(e)}`);
      return null;
    }
  };
  return {
    queued: (meta) =>
      safely('queued', () =>
        db.insert(computeJobs).values({ kind: meta.kind, versionId: meta.versionId, requestedBy: meta.requestedBy, solverVersion: SOLVER_VERSION }).returning({ id: computeJobs.id }).get().id,
      ),
    started: (id) => {
      safely('started', () => db.update(computeJobs).set({ state: 'running', startedAt: now }).where(eq(computeJobs.id, id)).run());
    },
    done: (id, runMs) => {
      safely('done', () => db.update(computeJobs).set({ state: 'done', finishedAt: now, runMs }).where(eq(computeJobs.id, id)).run());
    },
    failed: (id, error, runMs) => {
      safely('failed', () => db.update(computeJobs).set({ state: 'failed', finishedAt: now, runMs, error }).where(eq(computeJobs.id, id)).run());
    },
    cancelled: (id, reason, runMs) => {
      safely('cancelled', () => db.update(computeJobs).set({ state: 'cancelled', finishedAt: now, runMs, error: reason }).where(eq(computeJobs.id, id)).run());
    },
  };
}

/** The words a job left unfinished by a stopped server is marked with. */
export const INTERRUPTED =
  'The server stopped before this job finished; nothing of it was stored. Ask for the result again (open the review, the package or the CSV) to run it anew.';

/** Marks every job a previous run of the server left queued or running as failed; returns how many. */
export function failInterruptedJobs(db: Db): number {
  const r = db
    .update(computeJobs)
    .set({ state: 'failed', finishedAt: now, error: INTERRUPTED })
    .where(inArray(computeJobs.state, ['queued', 'running']))
    .run();
  return r.changes;
}

/** The jobs of one version, newest first (at most `limit`). */
export function jobsOfVersion(db: Db, versionId: number, limit = 50) {
  return db.select().from(computeJobs).where(eq(computeJobs.versionId, versionId)).orderBy(desc(computeJobs.id)).limit(limit).all();
}
