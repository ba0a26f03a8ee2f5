/**
 * The load phases, driven by autocannon against a running server:
 * - reads: signed-in clients listing the firm's projects (GET /api/projects);
 * - saves: signed-in clients saving new versions of the demo decks (in turn: a one-span and a
 *   three-span continuous deck), every acknowledged save recorded (201 + version id and
 *   number) for the read-back.
 * Requests are spread over the given sessions (a session may be used concurrently: a JWT
 * naming one server-side session row, nothing per request is stored in it).
 */
import autocannon from 'autocannon';
import type { Session } from './harness/client.js';
import { ackFrom, saveBody, type Ack, type SaveTarget } from './harness/saves.js';

export interface PhaseFigures {
  phase: string;
  requests: number;
  non2xx: number;
  errors: number;
  timeouts: number;
  p50: number;
  p99: number;
  max: number;
  perSecond: number;
}

export interface LoadSettings {
  url: string;
  sessions: Session[];
  seconds: number;
  connections: number;
}

function figures(phase: string, r: autocannon.Result): PhaseFigures {
  return { phase, requests: r.requests.total, non2xx: r.non2xx, errors: r.errors, timeouts: r.timeouts, p50: r.latency.p50, p99: r.latency.p99, max: r.latency.max, perSecond: r.requests.average };
}

/** Headers of the session whose turn request n is. */
function sessionFor(sessions: Session[], n: number): Record<string, string> {
  return sessions[n % sessions.length].headers;
}

export async function readPhase(s: LoadSettings): Promise<PhaseFigures> {
  let n = 0;
  const result = await autocannon({
    url: s.url,
    connections: s.connections,
    duration: s.seconds,
    requests: [{ method: 'GET', path: '/api/projects', setupRequest: (req) => ({ ...req, headers: sessionFor(s.sessions, n++) }) }],
  });
  return figures('reads: GET /api/projects', result);
}

export interface SavePhaseResult {
  figures: PhaseFigures;
  acks: Ack[];
}

export async function savePhase(s: LoadSettings, targets: SaveTarget[], run: string): Promise<SavePhaseResult> {
  let next = 0;
  const acks: Ack[] = [];
  const result = await autocannon({
    url: s.url,
    connections: s.connections,
    duration: s.seconds,
    requests: [
      {
        method: 'POST',
        setupRequest: (req, context) => {
          const n = next++;
          const target = targets[n % targets.length];
          Object.assign(context, { n, deckId: target.deckId });
          return { ...req, path: `/api/decks/${target.deckId}/versions`, headers: sessionFor(s.sessions, n), body: JSON.stringify(saveBody(target, n, run)) };
        },
        onResponse: (status, body, context) => {
          const { n, deckId } = context as { n: number; deckId: number };
          const ack = ackFrom(n, deckId, status, body);
          if (ack) acks.push(ack);
        },
      },
    ],
  });
  return { figures: figures(`saves: POST /api/decks/{${targets.map((t) => t.deckId).join(',')}}/versions`, result), acks };
}
