/**
 * The worker-thread side of the refined-analysis pool (server/compute/refinedPool.ts): one
 * task is one version's grillage run with the shared solver (computeRefinedFactors, AASHTO
 * LRFD Art. 4.6.3.3), done here so that the request thread never waits for it.
 *
 * The task says it has started (a message to the pool, which then starts the job's clock),
 * runs the solver and encodes the stored row here too (JSON and brotli,
 * server/storage/resultEncoding.ts), so the request thread receives the row to insert and only
 * the factor rows it needs. A deck the grillage cannot model
 * (DeckInputError, GrillageMechanismError) is an answer, not a failure: `{ error }`, stored
 * like a result so the reason is kept. Anything else is thrown to the pool.
 * Units: dimensionless factors (lanes per girder); the result as the solver returns it.
 */
import { parentPort } from 'node:worker_threads';
import { assertDeck, DeckInputError } from '../../shared/deck/schema.js';
import { GrillageMechanismError } from '../../shared/grillage/errors.js';
import { computeRefinedFactors, type RefinedProgress, type RefinedResult } from '../../shared/grillage/refinedFactors.js';
import type { FactorRow } from '../../shared/lrfd/index.js';
import { SOLVER_VERSION } from '../../shared/version.js';
import { encodeResultRow, ResultTooLargeError, type EncodedResult } from '../storage/resultEncoding.js';

export interface RefinedTask {
  jobId: number;
  /** The version's deck, as stored (JSON text). */
  deckJson: string;
  /** Run the moment rows again at twice the mesh density (false when that model would exceed the server's size limit). */
  checkConvergence: boolean;
}

export interface RefinedAnswer {
  /** The row to store under method 'grillage' (the solver's result or `{ error }`, encoded), or null when it is too large to store. */
  encoded: EncodedResult | null;
  /** The result's factor rows (method 'grillage'), or null with `error`. */
  rows: FactorRow[] | null;
  /** The result's findings (the mesh's quality among them); empty with `error`. */
  findings: RefinedResult['findings'];
  error?: string;
}

export interface StartedMessage {
  kind: 'refined-started';
  jobId: number;
}

/** Where the job is (at most every PROGRESS_MS, and at each change of phase). */
export interface ProgressMessage {
  kind: 'refined-progress';
  jobId: number;
  progress: RefinedProgress;
}
const PROGRESS_MS = 250;

function solve(deckJson: string, checkConvergence: boolean, onProgress: (p: RefinedProgress) => void): { data: unknown; rows: FactorRow[] | null; findings: RefinedResult['findings']; error?: string } {
  try {
    // The moment rows' convergence at twice the mesh density goes with the result: a reduction claim needs it.
    const result = computeRefinedFactors(assertDeck(JSON.parse(deckJson)), { checkConvergence, onProgress });
    return { data: result, rows: result.rows, findings: result.findings };
  } catch (e) {
    if (!(e instanceof DeckInputError) && !(e instanceof GrillageMechanismError)) throw e;
    return { data: { error: e.message }, rows: null, findings: [], error: e.message };
  }
}

function encode(data: unknown): EncodedResult | null {
  try {
    return encodeResultRow({ method: 'grillage', solverVersion: SOLVER_VERSION, data });
  } catch (e) {
    if (e instanceof ResultTooLargeError) return null;
    throw e;
  }
}

export default function refinedTask(task: RefinedTask): RefinedAnswer {
  parentPort?.postMessage({ kind: 'refined-started', jobId: task.jobId } satisfies StartedMessage);
  let last = 0;
  let phase = '';
  const onProgress = (progress: RefinedProgress) => {
    const now = performance.now();
    if (progress.phase === phase && now - last < PROGRESS_MS) return;
    last = now;
    phase = progress.phase;
    parentPort?.postMessage({ kind: 'refined-progress', jobId: task.jobId, progress } satisfies ProgressMessage);
  };
  const { data, rows, findings, error } = solve(task.deckJson, task.checkConvergence === true, onProgress);
  return { encoded: encode(data), rows, findings, ...(error !== undefined ? { error } : {}) };
}
