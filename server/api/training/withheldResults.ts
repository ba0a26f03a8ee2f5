/**
 * Results withheld from a trainee while they work an exercise: the stored results of a deck
 * version that is the subject of one of their open (not yet submitted) exercises would give
 * the answer away, so every route that shows them (the version's results, the review summary,
 * the calculation package and CSV tables) withholds them from that trainee until they submit.
 * The deck's inputs stay readable: the trainee needs them to work the exercise. An exercise the
 * instructor has opened to all withholds nothing.
 */
import { and, eq, isNull, notExists } from 'drizzle-orm';
import type { Db } from '../../db/client.js';
import { assignments, assignmentTrainees, deckVersions, submissions } from '../../db/schema.js';
import { ApiError } from '../../middleware/errors.js';

export interface WithheldResults {
  reason: 'open-exercise';
  message: string;
  /** The open exercises on this version, for a link to each. */
  exercises: { id: number; title: string }[];
}

/** The caller's open exercises on a version, oldest first (none for users without any). */
export function openExercisesOn(db: Db, user: { id: number; firmId: number }, versionId: number): { id: number; title: string }[] {
  return db
    .select({ id: assignments.id, title: assignments.title })
    .from(assignments)
    .innerJoin(assignmentTrainees, and(eq(assignmentTrainees.assignmentId, assignments.id), eq(assignmentTrainees.traineeId, user.id)))
    .where(
      and(
        eq(assignments.versionId, versionId),
        eq(assignments.firmId, user.firmId),
        isNull(assignments.resultsOpenedAt),
        notExists(db.select({ id: submissions.id }).from(submissions).where(and(eq(submissions.assignmentId, assignments.id), eq(submissions.traineeId, user.id)))),
      ),
    )
    .orderBy(assignments.id)
    .all();
}

/** Why this version's results are withheld from the caller, or null when they may see them. */
export function withheldResults(db: Db, user: { id: number; firmId: number }, versionId: number): WithheldResults | null {
  const open = openExercisesOn(db, user, versionId);
  if (open.length === 0) return null;
  const names = open.map((e) => `“${e.title}”`).join(', ');
  return { reason: 'open-exercise', message: `The results of this version are hidden until you submit your exercise ${names}.`, exercises: open };
}

/** Refuses (403 `results_withheld`) when the version's results are withheld from the caller. */
export function assertResultsVisible(db: Db, user: { id: number; firmId: number }, versionId: number): void {
  const w = withheldResults(db, user, versionId);
  if (w) throw ApiError.forbidden(w.message, 'results_withheld');
}

/** The same check for a version named by its deck and number (unknown versions pass: the caller answers 404). */
export function assertVersionResultsVisible(db: Db, user: { id: number; firmId: number }, deckId: number, number: number): void {
  const v = db.select({ id: deckVersions.id }).from(deckVersions).where(and(eq(deckVersions.deckId, deckId), eq(deckVersions.number, number))).get();
  if (v) assertResultsVisible(db, user, v.id);
}
