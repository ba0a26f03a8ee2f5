/** Training exercises made from deck versions (see server/api/training). */
import { http } from './http';
import type { PersonRef, UnitSystem } from './types';

export type ExerciseKind = 'factor' | 'truck-position';

export interface FactorParams {
  girder: 'interior' | 'exterior';
  effect: 'moment' | 'negative-moment' | 'shear' | 'reaction' | 'fatigue-moment' | 'fatigue-shear' | 'deflection';
  lanes: 'one' | 'multiple' | 'governing';
  method: 'governing' | 'formula' | 'lever-rule' | 'rigid-section' | 'equal-share';
  location?: string;
  /** On a skewed deck: the value with the skew correction (default) or before it. */
  skew?: 'with' | 'before';
}

export interface TruckPositionParams {
  girder: number;
  line: 'lever-rule' | 'rigid-section';
  laneCounts?: number[];
}

export interface QuestionPreset {
  id: string;
  title: string;
  kind: ExerciseKind;
  params: FactorParams | TruckPositionParams;
}

export interface TraceInput {
  symbol: string;
  description?: string;
  value: number;
  kind: string;
  formulaValue?: number;
  formulaUnit?: string;
}

export interface TraceStep {
  label: string;
  formula: string;
  inputs: TraceInput[];
  value: number;
  kind: string;
  article: string;
  note?: string;
  part?: 'span-length' | 'skew';
}

export interface LanePlacement {
  left: number;
  wheelOffset: number;
}

export interface Roadway {
  curbLeft: number;
  curbRight: number;
  laneWidth: number;
  laneCount: number;
  girderOffsets: number[];
  /** Wheel-line spacing and least wheel-to-lane-edge distance, m (the deck's design values; absent in older answers: 6 ft and 2 ft). */
  gauge?: number;
  wheelToLaneEdge?: number;
}

export interface ExpectedAnswer {
  question: string;
  value: number;
  article: string;
  trace: TraceStep[];
  method?: string;
  lanes?: string;
  loadedLanes?: number;
  location?: string;
  /** Factor questions: whether the value has the skew correction in it ('none': there is none at that place). */
  skew?: 'none' | 'with' | 'before';
  placement?: { lanes: LanePlacement[] };
  wheelLines?: [number, number][];
  roadway?: Roadway;
}

export interface SubmissionStep {
  label: string;
  formula?: string;
  value?: number;
  note?: string;
}

export interface Grading {
  passed: boolean;
  tolerancePercent: number;
  checks: { name: 'value' | 'placement'; label: string; expected: number; submitted: number; differencePercent: number; passed: boolean }[];
  placementViolations: { path: string; message: string }[];
  stepMatches: { traceIndex: number; label: string; productValue: number; traineeStep: number | null }[];
  summary: string;
}

export interface Submission {
  id: number;
  trainee: PersonRef;
  attempt: number;
  value: number;
  placement: { lanes: LanePlacement[] } | null;
  steps: SubmissionStep[];
  late: boolean;
  passed: boolean;
  grading: Grading;
  submittedAt: string;
}

export interface Exercise {
  id: number;
  kind: ExerciseKind;
  params: FactorParams | TruckPositionParams;
  title: string;
  question: string;
  instructions: string;
  tolerancePercent: number;
  dueAt: string;
  overdue: boolean;
  project: { id: number; name: string; units: UnitSystem };
  deck: { id: number; name: string };
  version: { id: number; number: number };
  createdBy: PersonRef;
  createdAt: string;
  /** Set once the instructor opened the exercise to all: the answer and the version's results are shown to every trainee. */
  openedToAll: { at: string; by: PersonRef | null } | null;
  roadway: Roadway | null;
  expected: ExpectedAnswer | null;
  caution: string;
}

export interface ExerciseListItem extends Exercise {
  traineeCount?: number;
  submittedCount?: number;
  passedCount?: number;
  status?: 'to do' | 'passed' | 'not passed';
  submittedAt?: string | null;
}

export interface InstructorExercise extends Exercise {
  trainees: { id: number; name: string; email: string; status: 'passed' | 'not passed' | 'not submitted'; late: boolean; submittedAt: string | null }[];
  submissions: Submission[];
}

export interface TraineeExercise extends Exercise {
  submissions: Submission[];
}

/** What an instructor may change on an exercise (openToAll cannot be undone). */
export interface ExerciseChanges {
  dueAt?: string;
  instructions?: string;
  addTraineeIds?: number[];
  openToAll?: true;
}

export interface NewExercise {
  kind: ExerciseKind;
  versionId: number;
  params: FactorParams | TruckPositionParams;
  title?: string;
  instructions?: string;
  tolerancePercent: number;
  dueAt: string;
  traineeIds: number[];
}

export async function listQuestions(): Promise<QuestionPreset[]> {
  const { questions } = await http.get<{ questions: QuestionPreset[] }>('/api/training/questions');
  return questions;
}

export async function listTrainees(): Promise<{ id: number; name: string; email: string }[]> {
  const { trainees } = await http.get<{ trainees: { id: number; name: string; email: string }[] }>('/api/training/trainees');
  return trainees;
}

export async function listExercises(): Promise<ExerciseListItem[]> {
  const { assignments } = await http.get<{ assignments: ExerciseListItem[] }>('/api/training/assignments');
  return assignments;
}

export async function createExercise(input: NewExercise): Promise<InstructorExercise> {
  const { assignment } = await http.post<{ assignment: InstructorExercise }>('/api/training/assignments', input);
  return assignment;
}

export async function getExercise(id: number): Promise<InstructorExercise> {
  const { assignment } = await http.get<{ assignment: InstructorExercise }>(`/api/training/assignments/${id}`);
  return assignment;
}

export async function updateExercise(id: number, changes: ExerciseChanges): Promise<InstructorExercise> {
  const { assignment } = await http.patch<{ assignment: InstructorExercise }>(`/api/training/assignments/${id}`, changes);
  return assignment;
}

export async function listMyExercises(): Promise<ExerciseListItem[]> {
  const { assignments } = await http.get<{ assignments: ExerciseListItem[] }>('/api/training/mine');
  return assignments;
}

export async function getMyExercise(id: number): Promise<TraineeExercise> {
  const { assignment } = await http.get<{ assignment: TraineeExercise }>(`/api/training/mine/${id}`);
  return assignment;
}

export async function submitAnswer(id: number, input: { value: number; steps: SubmissionStep[]; placement?: { lanes: LanePlacement[] } }): Promise<{ submission: Submission; assignment: TraineeExercise }> {
  return http.post<{ submission: Submission; assignment: TraineeExercise }>(`/api/training/mine/${id}/submissions`, input);
}
