/** Parameter studies of a project (server/api/studies). Values are internal SI units. */
import { http } from './http';
import type { DeckInput } from '@shared/deck/schema';
import type { SweepInput, Sweep } from '@shared/studies/sweep';
import type { PointSummary } from '@shared/studies/pointResult';

export type StudyState = 'running' | 'done' | 'cancelled' | 'interrupted';

export interface Study {
  id: number;
  projectId: number;
  name: string;
  state: StudyState;
  sweep: Sweep;
  version: { deckId: number; number: number; deckName: string };
  pointsTotal: number;
  pointsDone: number;
  secondsLeft: number | null;
  solverVersion: string;
  createdBy: { id: number; name: string };
  createdAt: string;
  finishedAt: string | null;
  cancelledBy: string | null;
}

export interface StudyPointRow {
  index: number;
  values: number[];
  summary: PointSummary | null;
  error: string | null;
  solverVersion: string;
}

export interface NewStudy {
  name: string;
  deckId: number;
  versionNumber: number;
  sweep: SweepInput;
}

export async function listStudies(projectId: number): Promise<Study[]> {
  return (await http.get<{ studies: Study[] }>(`/api/projects/${projectId}/studies`)).studies;
}

export async function createStudy(projectId: number, input: NewStudy): Promise<Study> {
  return (await http.post<{ study: Study }>(`/api/projects/${projectId}/studies`, input)).study;
}

export async function getStudy(studyId: number): Promise<{ study: Study; points: StudyPointRow[] }> {
  return http.get<{ study: Study; points: StudyPointRow[] }>(`/api/studies/${studyId}`);
}

export async function cancelStudy(studyId: number): Promise<Study> {
  return (await http.post<{ study: Study }>(`/api/studies/${studyId}/cancel`)).study;
}

export async function resumeStudy(studyId: number): Promise<Study> {
  return (await http.post<{ study: Study }>(`/api/studies/${studyId}/resume`)).study;
}

export async function pointDeck(studyId: number, index: number): Promise<DeckInput> {
  // the API numbers points from 1
  return (await http.get<{ deck: DeckInput }>(`/api/studies/${studyId}/points/${index + 1}/deck`)).deck;
}

export const studyCsvUrl = (studyId: number) => `/api/studies/${studyId}/study.csv`;
