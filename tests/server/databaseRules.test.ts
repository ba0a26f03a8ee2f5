/** The database keeps the workflow's rules itself (migration 0007): plain SQL written around
 *  the API is refused with the rule it breaks. Common practice, no source (rules of the house:
 *  README's permission matrix and review states). */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type Database from 'better-sqlite3';
import { demo, signIn, type Agent } from './helpers.js';
import { makeWorkflowApp, send, userId, type WorkflowContext } from './workflowHelpers.js';
import { quarryCreekDeck } from '../fixtures/decks.js';

let ctx: WorkflowContext;
let designer: Agent;
let sql: Database.Database;
let version: { id: number; deck_id: number; project_id: number; firm_id: number; created_by: number };
let otherProject: number;
let reviewer: number;

beforeAll(async () => {
  ctx = await makeWorkflowApp();
  designer = await signIn(ctx.app, demo.designer);
  sql = ctx.db.$client;
  const projects = (await designer.get('/api/projects')).body.projects as { id: number }[];
  otherProject = projects[1].id;
  const d = await send.post(designer, `/api/projects/${projects[0].id}/decks`, { deck: quarryCreekDeck(), message: 'rules' });
  version = sql.prepare('SELECT v.id, v.deck_id, d.project_id, p.firm_id, v.created_by FROM deck_versions v JOIN decks d ON d.id = v.deck_id JOIN projects p ON p.id = d.project_id WHERE v.id = ?').get(d.body.version.id) as typeof version;
  reviewer = userId(ctx, demo.reviewer);
});
afterAll(() => ctx.close());

const newRound = (state = 'awaiting-review', versionId = version.id) =>
  sql
    .prepare('INSERT INTO review_rounds (firm_id, project_id, deck_id, version_id, submitted_by, reviewer_id, state) VALUES (?, ?, ?, ?, ?, ?, ?)')
    .run(version.firm_id, version.project_id, version.deck_id, versionId, version.created_by, reviewer, state).lastInsertRowid as number;
const stateOf = (id: number) => (sql.prepare('SELECT state FROM review_rounds WHERE id = ?').get(id) as { state: string }).state;

describe('rules the database keeps', () => {
  it('a deck never moves to another project', () => {
    expect(() => sql.prepare('UPDATE decks SET project_id = ? WHERE id = ?').run(otherProject, version.deck_id)).toThrow('a deck never moves to another project');
    expect((sql.prepare('SELECT project_id FROM decks WHERE id = ?').get(version.deck_id) as { project_id: number }).project_id).toBe(version.project_id);
    // its name may still change
    sql.prepare("UPDATE decks SET name = 'Renamed' WHERE id = ?").run(version.deck_id);
  });

  it('an exercise’s question and frozen answer never change; its due date and instructions may', () => {
    const id = sql
      .prepare("INSERT INTO assignments (firm_id, project_id, deck_id, version_id, kind, params_json, title, tolerance_percent, due_at, expected_json, created_by) VALUES (?, ?, ?, ?, 'factor', '{}', 't', 1, '2030-01-01T00:00:00Z', '{\"value\":0.7}', ?)")
      .run(version.firm_id, version.project_id, version.deck_id, version.id, version.created_by).lastInsertRowid;
    for (const set of [`expected_json = '{"value":0.9}'`, `params_json = '{"girder":2}'`, 'tolerance_percent = 50', "kind = 'other'"]) {
      expect(() => sql.prepare(`UPDATE assignments SET ${set} WHERE id = ?`).run(id), set).toThrow('an exercise\'s question and frozen answer never change');
    }
    expect(() => sql.prepare('DELETE FROM assignments WHERE id = ?').run(id)).toThrow('exercises are kept for the record');
    sql.prepare("UPDATE assignments SET due_at = '2031-01-01T00:00:00Z', instructions = 'later' WHERE id = ?").run(id);
    expect((sql.prepare('SELECT expected_json FROM assignments WHERE id = ?').get(id) as { expected_json: string }).expected_json).toBe('{"value":0.7}');
  });

  it('a review round starts awaiting review and moves only to approved, sent back or withdrawn', () => {
    expect(() => newRound('approved')).toThrow('a review round starts awaiting review');
    const id = newRound();
    expect(() => sql.prepare("UPDATE review_rounds SET state = 'bogus' WHERE id = ?").run(id)).toThrow(/moves only from awaiting review/);
    sql.prepare("UPDATE review_rounds SET state = 'withdrawn' WHERE id = ?").run(id);
    expect(() => sql.prepare("UPDATE review_rounds SET state = 'awaiting-review' WHERE id = ?").run(id)).toThrow(/locked|moves only from awaiting review/);
    expect(stateOf(id)).toBe('withdrawn');
  });

  it('only the assigned reviewer approves, never on their own submission, with the time recorded', () => {
    const id = newRound();
    const approve = (by: number | null, at: string | null) => sql.prepare("UPDATE review_rounds SET state = 'approved', decided_by = ?, decided_at = ? WHERE id = ?").run(by, at, id);
    const rule = 'only the assigned reviewer decides a review round, never on their own submission, and the time is recorded';
    expect(() => approve(null, null)).toThrow(rule); // "set a waiting review round to approved"
    expect(() => approve(version.created_by, '2026-12-02T10:00:00Z')).toThrow(rule); // not the reviewer
    expect(() => approve(reviewer, null)).toThrow(rule);
    expect(stateOf(id)).toBe('awaiting-review');
    approve(reviewer, '2026-12-02T10:00:00Z');
    expect(stateOf(id)).toBe('approved');
  });

  it('an approved version stays locked: no new round, no move back, no change of parties', () => {
    const approved = sql.prepare("SELECT id FROM review_rounds WHERE version_id = ? AND state = 'approved'").get(version.id) as { id: number };
    expect(() => newRound()).toThrow(/an approved or sent-back version takes no new review round/);
    expect(() => sql.prepare("UPDATE review_rounds SET state = 'awaiting-review' WHERE id = ?").run(approved.id)).toThrow(/locked|moves only/);
    expect(() => sql.prepare('UPDATE review_rounds SET reviewer_id = ? WHERE id = ?').run(version.created_by, approved.id)).toThrow(/locked|keeps its version/);
  });

  it('an open round keeps its version, submitter and reviewer', async () => {
    const d = await send.post(designer, `/api/projects/${version.project_id}/decks`, { deck: { ...quarryCreekDeck(), name: 'Open round' }, message: 'x' });
    const id = newRound('awaiting-review', d.body.version.id);
    for (const set of [`reviewer_id = ${version.created_by}`, `submitted_by = ${reviewer}`, `version_id = ${version.id}`]) {
      expect(() => sql.prepare(`UPDATE review_rounds SET ${set} WHERE id = ?`).run(id), set).toThrow('a review round keeps its version, submitter and reviewer');
    }
  });

  it('refused sign-ins are kept as recorded', () => {
    const id = sql.prepare("INSERT INTO sign_in_refusals (limit_name, email, address) VALUES ('address', NULL, '127.0.0.1')").run().lastInsertRowid;
    expect(() => sql.prepare("UPDATE sign_in_refusals SET address = 'x' WHERE id = ?").run(id)).toThrow('refused sign-ins are kept as recorded');
    expect(() => sql.prepare('DELETE FROM sign_in_refusals WHERE id = ?').run(id)).toThrow('refused sign-ins are kept as recorded');
  });
});
