/** Decks (saved configurations) of a project and their immutable versions. */
import type { DeckInput } from '@shared/deck/schema';
import type { VersionFactors } from '@shared/versionDiff/versionFactors';
import { http, requestWithStatus } from './http';
import type { ComputeJob, RefinedRefusal } from './reviews';
import type { DeckSummary, DeckVersion, Page, VersionSummary } from './types';

export async function listDecks(projectId: number): Promise<DeckSummary[]> {
  const { decks } = await http.get<{ decks: DeckSummary[] }>(`/api/projects/${projectId}/decks`);
  return decks;
}

export async function createDeck(
  projectId: number,
  input: { deck: DeckInput; message: string; placements?: unknown },
): Promise<{ deck: DeckSummary; version: DeckVersion }> {
  return http.post<{ deck: DeckSummary; version: DeckVersion }>(`/api/projects/${projectId}/decks`, input);
}

/** The deck with the first page of its versions, newest first. */
export async function getDeck(deckId: number): Promise<{ deck: DeckSummary; versions: VersionSummary[]; page: Page }> {
  return http.get<{ deck: DeckSummary; versions: VersionSummary[]; page: Page }>(`/api/decks/${deckId}`);
}

/** The next page of a deck's versions (older ones), from the previous page's `nextCursor`. */
export async function listVersions(deckId: number, cursor: string): Promise<{ versions: VersionSummary[]; page: Page }> {
  return http.get<{ versions: VersionSummary[]; page: Page }>(`/api/decks/${deckId}/versions`, { cursor });
}

export async function saveVersion(
  deckId: number,
  input: { deck: DeckInput; message: string; basedOnVersionId?: number; placements?: unknown },
): Promise<DeckVersion> {
  const { version } = await http.post<{ version: DeckVersion }>(`/api/decks/${deckId}/versions`, input);
  return version;
}

/** A saved version; `withResults` adds its stored results' data (otherwise only their headings). */
export async function getVersion(deckId: number, number: number, withResults = false): Promise<DeckVersion> {
  const { version } = await http.get<{ version: DeckVersion }>(`/api/decks/${deckId}/versions/${number}`, withResults ? { include: 'results' } : undefined);
  return version;
}

/**
 * A version's factors for the comparison of two versions, without waiting for its grillage:
 * with the job to follow (GET its `url`) while the grillage is computed (the server answers 202
 * with the code part), or with the refusal when the server could not start it now.
 */
export async function getVersionFactors(deckId: number, number: number): Promise<{ factors: VersionFactors; job: ComputeJob | null; refusal: RefinedRefusal | null }> {
  const { status, body } = await requestWithStatus<{ factors: VersionFactors; job?: ComputeJob | null; refusal?: RefinedRefusal | null }>(`/api/decks/${deckId}/versions/${number}/factors`, {
    headers: { Prefer: 'respond-async' },
  });
  return { factors: body.factors, job: status === 202 ? (body.job ?? null) : null, refusal: body.refusal ?? null };
}
