/**
 * Applying an imported girder layout to a deck: the newest version's deck with its girders
 * replaced by the imported offsets and its section properties by the imported ones, checked by
 * the shared deck schema and the code-method engine, then saved as a new version (or only
 * previewed). Errors name the CSV column where the deck field came from it. Nothing is saved
 * when anything is wrong.
 */
import { desc, eq } from 'drizzle-orm';
import type { Db } from '../../db/client.js';
import { deckVersions } from '../../db/schema.js';
import { deckSchema, DeckInputError, type Deck } from '../../../shared/deck/schema.js';
import { computeCodeFactors } from '../../../shared/lrfd/index.js';
import { ApiError, type ErrorDetail } from '../../middleware/errors.js';
import { recordAudit } from '../audit/auditService.js';
import { findDeck, saveVersion, type StoragePolicy } from '../decks/deckService.js';
import { findProject } from '../projects/projectService.js';
import { parseGirderLayoutCsv, SECTION_FIELDS, type CsvProblem, type ParsedLayout } from './girderLayoutCsv.js';

interface Actor {
  id: number;
  firmId: number;
}

function problemDetail(p: CsvProblem): ErrorDetail {
  const path = ['file', p.row !== null ? `row${p.row}` : null, p.column].filter(Boolean).join('.');
  return { path, message: p.message };
}

function refuse(problems: CsvProblem[]): never {
  const n = problems.length;
  throw ApiError.badRequest(`the file has ${n} problem${n === 1 ? '' : 's'}: nothing was imported`, problems.map(problemDetail));
}

/** Maps a deck issue to the CSV column it came from, where it did. */
function deckProblem(layout: ParsedLayout, path: (string | number)[], message: string): CsvProblem {
  const [a, b] = path;
  if (a === 'girders') return { row: null, column: layout.columnOf.spacing ?? 'spacing_ft', message: `column ${layout.columnOf.spacing ?? 'spacing_ft'}: ${message}` };
  if (a === 'section' && typeof b === 'string' && (SECTION_FIELDS as string[]).includes(b)) {
    const col = layout.columnOf[b as (typeof SECTION_FIELDS)[number]];
    return { row: col ? 2 : null, column: col ?? b, message: col ? `row 2, column ${col}: ${message}` : `${message} (add a column for it, or enter it in the deck editor)` };
  }
  return { row: null, column: null, message: `the deck after the import: ${path.join('.')}: ${message}` };
}

export interface ImportInput {
  deckId: number;
  csv: string;
  fileName: string;
  message?: string;
  dryRun: boolean;
}

export function importGirderLayout(db: Db, actor: Actor, input: ImportInput, policy?: StoragePolicy) {
  const d = findDeck(db, actor.firmId, input.deckId);
  const project = findProject(db, actor.firmId, d.projectId);
  if (project.archived) throw ApiError.conflict('the project is archived: restore it before importing');
  const parsed = parseGirderLayoutCsv(input.csv);
  if (!parsed.ok) refuse(parsed.problems);
  const layout = parsed.layout;
  const latest = db.select().from(deckVersions).where(eq(deckVersions.deckId, d.id)).orderBy(desc(deckVersions.number)).limit(1).get()!;
  const base = JSON.parse(latest.deckJson) as Deck;
  const candidate = {
    ...base,
    girders: { kind: 'offsets' as const, offsets: layout.offsets },
    section: { ...base.section, ...layout.section },
  };
  const checked = deckSchema.safeParse(candidate);
  if (!checked.success) refuse(checked.error.issues.map((i) => deckProblem(layout, i.path.map((p) => (typeof p === 'symbol' ? String(p) : p)), i.message)));
  const deck = checked.data;
  try {
    computeCodeFactors(deck);
  } catch (e) {
    if (e instanceof DeckInputError) refuse(e.issues.map((i) => deckProblem(layout, i.path, i.message)));
    throw e;
  }
  const summary = {
    girderCount: layout.offsets.length,
    offsets: layout.offsets,
    spacings: layout.spacings,
    section: layout.section,
    basedOnVersion: latest.number,
  };
  if (input.dryRun) return { dryRun: true as const, imported: summary, deck, version: null };
  const message = input.message?.trim() || `Imported the girder layout and section from ${input.fileName}`;
  // saveVersion's own transaction nests (a savepoint) inside this one, with the audit entry.
  const version = db.transaction(() => {
    const v = saveVersion(db, actor, d.id, { deck, message, basedOnVersionId: latest.id }, policy);
    recordAudit(db, {
      firmId: actor.firmId,
      projectId: d.projectId,
      actorId: actor.id,
      action: 'import',
      entityType: 'deck',
      entityId: d.id,
      summary: `imported ${layout.offsets.length} girders${Object.keys(layout.section).length ? ' and the section properties' : ''} from ${input.fileName} into deck “${d.name}” (version ${v.number})`,
    });
    return v;
  });
  return { dryRun: false as const, imported: summary, deck, version };
}
