/**
 * Messages between the workspace and the solver worker. Every request carries an id; the
 * worker answers with messages carrying the same id: progress while it works, partial
 * results of a long job (the analysis, the influence surfaces, each governing placement as
 * it is found), then 'done' with the result, or 'error'. 'cancel' stops a long job between
 * its steps; the client terminates the worker if a single step runs on.
 */
import type { FactorRow } from '../../shared/lrfd/factors';
import type { LanePlacement } from '../../shared/placement/rules';
import type {
  AnalyseOptions,
  AnalysisSummary,
  GirderEnvelopeSeries,
  GoverningSummary,
  LiveShares,
  RefinedSummary,
  StudyEffect,
  StudySummary,
  SurfaceGrid,
  VehicleKey,
} from './solverCore';

export type SolverRequest =
  | { id: number; type: 'analyse'; deck: unknown; options: AnalyseOptions; span: number; vehicle: VehicleKey }
  | { id: number; type: 'study'; span: number; vehicle: VehicleKey }
  | { id: number; type: 'evaluate'; lanes: LanePlacement[]; effect: StudyEffect }
  | { id: number; type: 'governing'; girder: number; effect: StudyEffect; vehicle?: VehicleKey }
  | { id: number; type: 'surface-grid'; girder: number; effect: StudyEffect; nx: number; ny: number }
  | { id: number; type: 'envelopes'; girder: number }
  | { id: number; type: 'code-factors'; deck: unknown }
  | { id: number; type: 'cancel'; target: number };

export interface SolverErrorInfo {
  name: string;
  message: string;
  issues?: { path: (string | number)[]; message: string }[];
}

export type SolverMessage =
  | { id: number; type: 'progress'; phase: string; fraction: number }
  | { id: number; type: 'analysis'; analysis: AnalysisSummary }
  | { id: number; type: 'study'; study: StudySummary }
  | { id: number; type: 'governing-item'; item: GoverningSummary }
  | { id: number; type: 'refined'; refined: RefinedSummary }
  | { id: number; type: 'done'; result: unknown }
  | { id: number; type: 'error'; error: SolverErrorInfo };

export type SolverResults = {
  analyse: GoverningSummary[];
  study: GoverningSummary[];
  evaluate: LiveShares;
  governing: GoverningSummary;
  'surface-grid': SurfaceGrid;
  envelopes: GirderEnvelopeSeries[];
  'code-factors': FactorRow[];
};
