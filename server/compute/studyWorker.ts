/**
 * The worker-thread side of the study runner (server/compute/studyRunner.ts): one task is a
 * batch of a study's points. Each point's deck is the version's deck with the swept
 * parameters set (shared/studies/sweep.ts deckAtPoint); its code factors come from
 * computeCodeFactors, its grillage (when the study asks for it at this point) from
 * computeRefinedFactors (AASHTO LRFD Art. 4.6.3.3), the same calls a single deck makes.
 * A deck that is invalid at a point is an answer for that point (its own messages), not a
 * failure of the batch. Units: factors are dimensionless lane fractions.
 */
import { assertDeck, DeckInputError, type DeckInput } from '../../shared/deck/schema.js';
import { GrillageMechanismError } from '../../shared/grillage/errors.js';
import { computeRefinedFactors } from '../../shared/grillage/refinedFactors.js';
import { deckAtPoint, type StudyPoint, type Sweep } from '../../shared/studies/sweep.js';
import { computeCodePoint, leavesRange, summarizeRows, type PointSummary } from '../../shared/studies/pointResult.js';
import { modelSizeRefusal, refinedModelSize } from './modelSize.js';

export interface StudyTask {
  deckJson: string;
  sweep: Sweep;
  points: StudyPoint[];
  /** Largest grillage accepted, nodes × girder lines (the refined pool's limit). */
  maxNodeGirders: number;
}

export interface StudyPointAnswer {
  index: number;
  values: number[];
  summary: PointSummary | null;
  error: string | null;
}

function refinedAt(deck: DeckInput, maxNodeGirders: number): { rows: ReturnType<typeof computeRefinedFactors>['rows'] | null; error?: string } {
  try {
    const valid = assertDeck(deck);
    const refusal = modelSizeRefusal(refinedModelSize(valid), maxNodeGirders);
    if (refusal) return { rows: null, error: `the grillage was not run: ${refusal}` };
    return { rows: computeRefinedFactors(valid).rows };
  } catch (e) {
    if (e instanceof DeckInputError || e instanceof GrillageMechanismError) return { rows: null, error: e.message };
    throw e;
  }
}

export function computePoint(base: DeckInput, sweep: Sweep, point: StudyPoint, maxNodeGirders: number): StudyPointAnswer {
  const deck = deckAtPoint(base, sweep, point.values);
  const code = computeCodePoint(deck);
  if (!code.ok) return { index: point.index, values: point.values, summary: null, error: code.error };
  const wantsGrillage = sweep.grillage === 'all' || (sweep.grillage === 'outside-range' && leavesRange(code.summary));
  if (!wantsGrillage) return { index: point.index, values: point.values, summary: code.summary, error: null };
  const refined = refinedAt(deck, maxNodeGirders);
  return { index: point.index, values: point.values, summary: summarizeRows(code.code, refined.rows, refined.error), error: null };
}

export default function studyTask(task: StudyTask): StudyPointAnswer[] {
  const base = JSON.parse(task.deckJson) as DeckInput;
  return task.points.map((p) => computePoint(base, task.sweep, p, task.maxNodeGirders));
}
