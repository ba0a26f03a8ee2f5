/**
 * Studies of a project: created from a saved deck version with a sweep (shared/studies/),
 * computed by the study runner (server/compute/studyRunner.ts), read with their stored points,
 * cancelled or resumed, and written out as CSV in the project's units.
 */
import { asc, desc, eq } from 'drizzle-orm';
import type { Db } from '../../db/client.js';
import { decks, deckVersions, studies, studyPoints, users } from '../../db/schema.js';
import { ApiError } from '../../middleware/errors.js';
import { findProject } from '../projects/projectService.js';
import { findVersionByNumber } from '../decks/deckService.js';
import { deckAtPoint, parseSweep, studyPoints as pointsOfSweep, SweepError, STUDY_PARAMETER_INFO, type Sweep } from '../../../shared/studies/sweep.js';
import { STUDY_GIRDERS, STUDY_EFFECTS, STUDY_METHODS, studyKey, type PointSummary } from '../../../shared/studies/pointResult.js';
import type { DeckInput } from '../../../shared/deck/schema.js';
import { SOLVER_VERSION } from '../../../shared/version.js';
import { toDisplay, unitSymbol, type UnitSystem } from '../../../shared/units.js';
import { showLengths } from '../../../shared/quantities/inText.js';
import { toCsv, type CsvCell } from '../../reports/csvText.js';
import { CSV_CAUTION } from '../../reports/csvExport.js';
import type { StudyProgress } from '../../compute/studyRunner.js';

type StudyRow = typeof studies.$inferSelect;

export interface CreateStudyInput {
  name: string;
  deckId: number;
  versionNumber: number;
  sweep: unknown;
}

/** A sweep's points, or 400 naming the field and saying what to change. */
function checkedSweep(input: unknown, deckJson: string): { sweep: Sweep; total: number } {
  const parsed = parseSweep(input);
  if (!parsed.ok) throw ApiError.badRequest(parsed.issues.map((i) => `sweep.${i.path.join('.')}: ${i.message}`).join('; '), parsed.issues.map((i) => ({ path: ['body', 'sweep', ...i.path].join('.'), message: i.message })));
  try {
    const points = pointsOfSweep(parsed.sweep);
    deckAtPoint(JSON.parse(deckJson) as DeckInput, parsed.sweep, points[0].values);
    return { sweep: parsed.sweep, total: points.length };
  } catch (e) {
    if (!(e instanceof SweepError)) throw e;
    const path = `sweep.${e.path.join('.')}`;
    throw ApiError.badRequest(`${path}: ${e.message}`, [{ path: `body.${path}`, message: e.message }]);
  }
}

export function createStudy(db: Db, actor: { id: number; firmId: number }, projectId: number, input: CreateStudyInput): StudyRow {
  findProject(db, actor.firmId, projectId);
  const version = findVersionByNumber(db, actor.firmId, input.deckId, input.versionNumber);
  const deck = db.select({ projectId: decks.projectId }).from(decks).where(eq(decks.id, input.deckId)).get();
  if (deck?.projectId !== projectId) throw ApiError.notFound(`deck ${input.deckId} in this project`);
  const { sweep, total } = checkedSweep(input.sweep, version.deckJson);
  return db
    .insert(studies)
    .values({ projectId, versionId: version.id, name: input.name, sweepJson: JSON.stringify(sweep), pointsTotal: total, solverVersion: SOLVER_VERSION, createdBy: actor.id })
    .returning()
    .get();
}

/** The study if its project belongs to the firm; otherwise 404. */
export function findStudy(db: Db, firmId: number, studyId: number): StudyRow {
  const s = db.select().from(studies).where(eq(studies.id, studyId)).get();
  if (!s) throw ApiError.notFound('study');
  findProject(db, firmId, s.projectId);
  return s;
}

export function studyView(db: Db, s: StudyRow, progress: StudyProgress | null) {
  const v = db.select({ deckId: deckVersions.deckId, number: deckVersions.number }).from(deckVersions).where(eq(deckVersions.id, s.versionId)).get()!;
  const deck = db.select({ name: decks.name }).from(decks).where(eq(decks.id, v.deckId)).get();
  const by = db.select({ name: users.name }).from(users).where(eq(users.id, s.createdBy)).get();
  return {
    id: s.id,
    projectId: s.projectId,
    name: s.name,
    state: s.state,
    sweep: JSON.parse(s.sweepJson) as Sweep,
    version: { deckId: v.deckId, number: v.number, deckName: deck?.name ?? '' },
    pointsTotal: s.pointsTotal,
    pointsDone: progress?.done ?? s.pointsDone,
    secondsLeft: progress?.secondsLeft ?? null,
    solverVersion: s.solverVersion,
    createdBy: { id: s.createdBy, name: by?.name ?? '' },
    createdAt: s.createdAt,
    finishedAt: s.finishedAt,
    cancelledBy: s.cancelledBy,
  };
}

export function listStudies(db: Db, firmId: number, projectId: number) {
  findProject(db, firmId, projectId);
  return db.select().from(studies).where(eq(studies.projectId, projectId)).orderBy(desc(studies.id)).all();
}

export interface StoredPoint {
  index: number;
  values: number[];
  summary: PointSummary | null;
  error: string | null;
  solverVersion: string;
}

export function pointsOf(db: Db, studyId: number): StoredPoint[] {
  return db
    .select()
    .from(studyPoints)
    .where(eq(studyPoints.studyId, studyId))
    .orderBy(asc(studyPoints.index))
    .all()
    .map((p) => ({ index: p.index, values: JSON.parse(p.valuesJson) as number[], summary: p.summaryJson ? (JSON.parse(p.summaryJson) as PointSummary) : null, error: p.error, solverVersion: p.solverVersion }));
}

/** The deck of one point (internal units), for opening it in the workspace. */
/** The deck of the point at `index` (0-based; the API numbers points from 1). */
export function pointDeck(db: Db, s: StudyRow, index: number): DeckInput {
  const sweep = JSON.parse(s.sweepJson) as Sweep;
  const point = pointsOfSweep(sweep).find((p) => p.index === index);
  if (!point) throw ApiError.notFound(`point ${index + 1} of this study`);
  const version = db.select({ deckJson: deckVersions.deckJson }).from(deckVersions).where(eq(deckVersions.id, s.versionId)).get()!;
  const base = JSON.parse(version.deckJson) as DeckInput;
  const deck = deckAtPoint(base, sweep, point.values);
  return { ...deck, name: `${base.name} — study point ${index + 1}`.slice(0, 200) };
}

/** Every stored point: its inputs in the project's units, each factor and where the formulas left their range. */
export function studyCsv(s: StudyRow, points: StoredPoint[], units: UnitSystem): string {
  const sweep = JSON.parse(s.sweepJson) as Sweep;
  const header: string[] = ['point'];
  for (const a of sweep.axes) {
    const kind = STUDY_PARAMETER_INFO[a.parameter].kind;
    const sym = unitSymbol(kind, units);
    header.push(sym ? `${a.parameter}_${sym}` : a.parameter);
  }
  const keys = STUDY_GIRDERS.flatMap((g) => STUDY_EFFECTS.map((e) => studyKey(g, e)));
  for (const k of keys) header.push(`${k}/governing`, `${k}/governing_method`, ...STUDY_METHODS.map((m) => `${k}/${m}`), `${k}/out_of_range_or_fallback`);
  header.push('findings', 'error', 'solver_version');
  const rows: CsvCell[][] = [header];
  for (const p of points) {
    const row: CsvCell[] = [p.index + 1];
    sweep.axes.forEach((a, i) => row.push(Number(toDisplay(p.values[i], STUDY_PARAMETER_INFO[a.parameter].kind, units).toPrecision(12))));
    const messages = new Set<string>();
    for (const k of keys) {
      const v = p.summary?.values[k];
      row.push(v?.governing ?? null, v?.governingMethod ?? null, ...STUDY_METHODS.map((m) => v?.byMethod[m] ?? null), v ? v.outOfRange || v.fallback : null);
      v?.rangeMessages.forEach((m) => messages.add(showLengths(m, units)));
    }
    if (p.summary?.refinedError) messages.add(`grillage: ${showLengths(p.summary.refinedError, units)}`);
    row.push([...messages].join(' | '), p.error, p.solverVersion);
    rows.push(row);
  }
  return toCsv(rows) + `\r\n${JSON.stringify(CSV_CAUTION)}\r\n`;
}
