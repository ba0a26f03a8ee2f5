/**
 * Deck-version saves for the load and crash checks: finds the demo decks, makes a distinct valid
 * body for save number n (the deck as stored, renamed "… · soak n"), keeps a ledger of every
 * acknowledged save (201 with the version's id and number) and reads each one back whole.
 */
import { isDeepStrictEqual } from 'node:util';
import { getJson, type Session } from './client.js';

export interface SaveTarget {
  deckId: number;
  /** The deck JSON of the latest version, as the server stored and returns it. */
  baseDeck: Record<string, unknown>;
  /** That version's number: versions are numbered 1, 2, … and never deleted. */
  latestNumber: number;
}

/** One acknowledged save: what was sent (by its sequence number) and what the server said. */
export interface Ack {
  n: number;
  deckId: number;
  versionId: number;
  number: number;
}

export interface ReadBack {
  acknowledged: number;
  found: number;
  /** Acknowledged saves missing or different when read back, with the reason. */
  problems: string[];
}

interface VersionBody {
  version: { id: number; number: number; message: string; deck: unknown; results: unknown[] };
}

/** The first deck of every project the session sees, by deck id (the demo firm has two). */
export async function findSaveTargets(baseUrl: string, session: Session): Promise<SaveTarget[]> {
  const projects = await getJson<{ projects: { id: number }[] }>(baseUrl, session, '/api/projects');
  const targets: SaveTarget[] = [];
  for (const p of projects.body.projects ?? []) {
    const decks = await getJson<{ decks: { id: number; latestVersion: { number: number } }[] }>(baseUrl, session, `/api/projects/${p.id}/decks`);
    const d = decks.body.decks?.[0];
    if (!d) continue;
    const v = await getJson<VersionBody>(baseUrl, session, `/api/decks/${d.id}/versions/${d.latestVersion.number}`);
    targets.push({ deckId: d.id, baseDeck: v.body.version.deck as Record<string, unknown>, latestNumber: d.latestVersion.number });
  }
  if (targets.length === 0) throw new Error('no demo deck found: is the demo firm seeded?');
  return targets.sort((a, b) => a.deckId - b.deckId);
}

/** The demo deck with the lowest id. */
export async function findSaveTarget(baseUrl: string, session: Session): Promise<SaveTarget> {
  return (await findSaveTargets(baseUrl, session))[0];
}

/** The body of save n: a deck that differs from every other save by its name. */
export function saveBody(target: SaveTarget, n: number, run: string) {
  return { deck: { ...target.baseDeck, name: `${String(target.baseDeck.name).slice(0, 150)} · soak ${run}-${n}` }, message: `soak save ${run}-${n}` };
}

/** Parses a save response; an Ack when the server acknowledged it (201 with id and number). */
export function ackFrom(n: number, deckId: number, status: number, text: string): Ack | null {
  if (status !== 201) return null;
  const body = JSON.parse(text) as Partial<VersionBody>;
  const v = body.version;
  if (!v || typeof v.id !== 'number' || typeof v.number !== 'number') return null;
  return { n, deckId, versionId: v.id, number: v.number };
}

function compare(target: SaveTarget, run: string, ack: Ack, status: number, body: VersionBody | null): string | null {
  if (status !== 200 || !body) return `save ${ack.n} (version ${ack.number}): read back answered ${status}`;
  const sent = saveBody(target, ack.n, run);
  const v = body.version;
  if (v.id !== ack.versionId) return `save ${ack.n}: version ${ack.number} of deck ${ack.deckId} has id ${v.id}, acknowledged ${ack.versionId}`;
  if (v.message !== sent.message) return `save ${ack.n}: version ${ack.number} has message "${v.message}"`;
  if (!isDeepStrictEqual(v.deck, sent.deck)) return `save ${ack.n}: version ${ack.number} deck differs from what was sent`;
  if (!Array.isArray(v.results) || v.results.length === 0) return `save ${ack.n}: version ${ack.number} has no stored results`;
  return null;
}

/** Reads every acknowledged save back through the API (a few requests at a time). */
export async function readBack(baseUrl: string, session: Session, targets: SaveTarget[], run: string, acks: Ack[], parallel = 8): Promise<ReadBack> {
  const problems: string[] = [];
  const numbers = new Set<string>();
  for (const a of acks) {
    const key = `${a.deckId}/${a.number}`;
    if (numbers.has(key)) problems.push(`version ${a.number} of deck ${a.deckId} acknowledged twice`);
    numbers.add(key);
  }
  const byDeck = new Map(targets.map((t) => [t.deckId, t]));
  let next = 0;
  const worker = async () => {
    while (next < acks.length) {
      const ack = acks[next++];
      const target = byDeck.get(ack.deckId)!;
      const res = await getJson<VersionBody>(baseUrl, session, `/api/decks/${target.deckId}/versions/${ack.number}?include=results`);
      const problem = compare(target, run, ack, res.status, res.body);
      if (problem) problems.push(problem);
    }
  };
  await Promise.all(Array.from({ length: parallel }, worker));
  return { acknowledged: acks.length, found: acks.length - problems.filter((p) => !p.includes('acknowledged twice')).length, problems };
}
