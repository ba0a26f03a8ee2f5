/**
 * Refined (grillage) distribution factors of a version, per girder, for comparison with the
 * code's factors. They come from the result stored with the version under method 'grillage'
 * (the shared solver's `RefinedResult`, whose `rows` are factor rows of method 'grillage' with
 * the girder number; a bare list of rows or `{ factors: FactorRow[] }` is read too). When none
 * is stored yet they are computed once with the shared solver (computeRefinedFactors, AASHTO
 * LRFD Art. 4.6.3.3) on the refined-analysis pool's worker threads (server/compute), never on
 * the request thread, and stored with the version under method 'grillage' and the solver
 * version (an append-only row, like the code result written at save time). A deck the
 * grillage cannot model is stored as `{ error }`, so the reason is kept too; a deck above the
 * server's model-size limit is not run (and nothing is stored: the limit is the server's).
 * A full pool, a job over its time limit or out of memory throw the pool's 503 ApiError.
 * Units: dimensionless factors (lanes per girder).
 */
import type { Db } from '../../db/client.js';
import type { DeckVersionRow } from '../../db/schema.js';
import type { FactorRow } from '../../../shared/lrfd/index.js';
import { deckOf, storedResult } from './versionResults.js';
import { RefinedModelTooLargeError, type RefinedPool } from '../../compute/refinedPool.js';
import { SOLVER_VERSION } from '../../../shared/version.js';
import { insertEncodedResultOnce } from '../../storage/storedResults.js';
import { governingPerGirder, type PanelAspectFact, type RefinedFactor } from '../../../shared/review/reductions.js';
import type { GrillageMissing } from '../../../shared/versionDiff/versionFactors.js';

export type { RefinedFactor };

export interface RefinedResults {
  /** The solver version of the result (absent when there is none). */
  solverVersion?: string;
  /** The mesh's over-elongated panel (its 'panel-aspect-ratio' finding), or null when every panel is within the limit or the result predates findings. */
  panelAspect?: PanelAspectFact | null;
  /** The governing refined factor per girder, effect and location. */
  factors: RefinedFactor[] | null;
  /** Every refined row (each lane case), method 'grillage'. */
  rows: FactorRow[] | null;
  source: string;
  note: string;
  /** Why there are no factors (absent when there are). */
  missing?: Extract<GrillageMissing, 'not-built' | 'no-rows' | 'too-large'>;
}

function rowsOf(data: unknown): FactorRow[] | null {
  const o = typeof data === 'object' && data !== null ? (data as { rows?: unknown; factors?: unknown }) : {};
  const list = Array.isArray(data) ? data : Array.isArray(o.rows) ? o.rows : Array.isArray(o.factors) ? o.factors : null;
  if (!list) return null;
  const rows = list.filter(
    (r): r is FactorRow =>
      typeof r === 'object' && r !== null && typeof (r as FactorRow).value === 'number' && Number.isFinite((r as FactorRow).value) && typeof (r as FactorRow).effect === 'string' && typeof (r as FactorRow).location?.key === 'string',
  );
  return rows;
}

const jobKey = (v: DeckVersionRow) => `${v.id}|${SOLVER_VERSION}`;

/** The user a request is for: recorded with the job it starts, and counted in the pool's per-user and per-firm limits. */
export interface Requester {
  id: number;
  firmId: number;
}

/** Computes the version's grillage result and stores it (once per version and solver version). */
async function computeAndStore(db: Db, pool: RefinedPool, v: DeckVersionRow, requester: Requester | null): Promise<unknown> {
  const answer = await pool.run(jobKey(v), deckOf(v), v.deckJson, { versionId: v.id, requestedBy: requester?.id ?? null, ...(requester ? { firmId: requester.firmId } : {}) });
  const data = answer.error !== undefined ? { error: answer.error } : { rows: answer.rows, findings: answer.findings };
  // When another request stored it first (same version, method and solver version), theirs
  // is kept; a result too large to store (encoded null) serves this request only.
  if (answer.encoded) insertEncodedResultOnce(db, v.id, answer.encoded);
  return data;
}

/** The rows and the governing factor of each girder from a grillage result (stored or just computed). */
function resultsOf(data: unknown, solverVersion: string): RefinedResults {
  const source = `grillage stored with the version, solver ${solverVersion}`;
  const error = typeof data === 'object' && data !== null && typeof (data as { error?: unknown }).error === 'string' ? (data as { error: string }).error : undefined;
  if (error !== undefined) return { factors: null, rows: null, source, note: `The grillage could not be built for this version: ${error}`, missing: 'not-built' };
  const rows = rowsOf(data);
  if (!rows || rows.length === 0) return { factors: null, rows: null, source, note: 'The stored grillage result holds no factor rows that can be compared.', missing: 'no-rows' };
  return { factors: governingPerGirder(rows), rows, source, note: '', panelAspect: panelAspectOf(data), solverVersion };
}

/** The 'panel-aspect-ratio' finding of a stored grillage result (shared/grillage/quality.ts), as a fact for the claim. */
function panelAspectOf(data: unknown): PanelAspectFact | null {
  const findings = typeof data === 'object' && data !== null ? (data as { findings?: unknown }).findings : undefined;
  if (!Array.isArray(findings)) return null;
  for (const f of findings) {
    const values = (f as { code?: unknown; values?: { ratio?: unknown; limit?: unknown } }).values;
    if ((f as { code?: unknown }).code === 'panel-aspect-ratio' && typeof values?.ratio === 'number' && typeof values.limit === 'number') return { ratio: values.ratio, limit: values.limit };
  }
  return null;
}

/** The version's refined results when they are stored (never starts a run), else null. */
export function storedRefinedResults(db: Db, v: DeckVersionRow): RefinedResults | null {
  const stored = storedResult(db, v.id, 'grillage');
  return stored ? resultsOf(stored.data, stored.solverVersion) : null;
}

/**
 * The version's refined results, started once: `results` settles with them (at once when they
 * are stored), and `jobId` is the compute_jobs row of the pool's job they wait for (null when
 * stored, or when the pool refused the job, whose reason `results` then rejects with). A
 * client that would rather poll than wait answers with the job while it runs.
 */
export function startRefinedResults(db: Db, pool: RefinedPool, v: DeckVersionRow, requester: Requester | null = null): { jobId: number | null; results: Promise<RefinedResults> } {
  const stored = storedRefinedResults(db, v);
  if (stored) return { jobId: null, results: Promise.resolve(stored) };
  const results = computeAndStore(db, pool, v, requester).then(
    (data) => resultsOf(data, SOLVER_VERSION),
    (e: unknown): RefinedResults => {
      if (!(e instanceof RefinedModelTooLargeError)) throw e;
      return { factors: null, rows: null, source: 'grillage not run (model-size limit of this server)', note: e.message, missing: 'too-large' };
    },
  );
  return { jobId: pool.recordOf(jobKey(v)), results };
}

/**
 * The governing refined factor of each girder, effect and location (the largest over the
 * lane cases), or null with the reason when there is none.
 */
export async function refinedResultsOf(db: Db, pool: RefinedPool, v: DeckVersionRow, requester: Requester | null = null): Promise<RefinedResults> {
  return startRefinedResults(db, pool, v, requester).results;
}
