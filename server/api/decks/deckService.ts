/**
 * Decks and their versions. A save always inserts a new version row (numbered 1, 2, …) with
 * the code-method results computed from it; nothing is overwritten (database triggers refuse
 * updates and deletes of versions and results). Firm scoping goes through the project.
 * Results are stored compressed (server/storage/storedResults.ts); a save that would take the
 * firm past its storage quota is refused before anything is written (server/storage/firmQuota.ts).
 */
import { and, count, desc, eq, lt, max } from 'drizzle-orm';
import type { Db } from '../../db/client.js';
import { decks, deckVersions, projects, users, type DeckRow, type DeckVersionRow } from '../../db/schema.js';
import type { Deck } from '../../../shared/deck/schema.js';
import { ApiError } from '../../middleware/errors.js';
import { recordAudit } from '../audit/auditService.js';
import { findProject } from '../projects/projectService.js';
import { computeStoredResults } from './analysis.js';
import { cutPage, decodeCursor, DEFAULT_PAGE, numberCursor, type PageRequest } from '../pagination.js';
import { readStoredPlacements, type SavedPlacements } from './placementsModel.js';
import { encodeResultRow, encodedBytes, insertEncodedResult, MAX_RESULT_JSON_BYTES, ResultTooLargeError, resultHeadingsOfVersion, resultsOfVersion } from '../../storage/storedResults.js';
import { assertWithinQuota } from '../../storage/firmQuota.js';
import { DEFAULT_FIRM_STORAGE_QUOTA_BYTES } from '../../config/env.js';
import { withheldResults, type WithheldResults } from '../training/withheldResults.js';

interface Actor {
  id: number;
  firmId: number;
}

function userRef(db: Db, id: number) {
  return db.select({ id: users.id, name: users.name }).from(users).where(eq(users.id, id)).get() ?? { id, name: '' };
}

function versionSummary(db: Db, v: DeckVersionRow) {
  return {
    id: v.id,
    deckId: v.deckId,
    number: v.number,
    message: v.message,
    createdAt: v.createdAt,
    createdBy: userRef(db, v.createdBy),
    basedOnVersionId: v.basedOnVersionId,
  };
}

function latestVersion(db: Db, deckId: number): DeckVersionRow {
  const v = db.select().from(deckVersions).where(eq(deckVersions.deckId, deckId)).orderBy(desc(deckVersions.number)).limit(1).get();
  if (!v) throw new Error(`deck ${deckId} has no version`);
  return v;
}

function deckSummary(db: Db, d: DeckRow) {
  return {
    id: d.id,
    projectId: d.projectId,
    name: d.name,
    createdAt: d.createdAt,
    createdBy: userRef(db, d.createdBy),
    latestVersion: versionSummary(db, latestVersion(db, d.id)),
  };
}

/**
 * A version as the API answers it: its deck, placements and the headings of its stored
 * results. The results' data (the big part: every factor row with its trace, up to about 8 MB
 * of JSON on the widest decks) comes only with `withResults` (`?include=results`). A reader
 * from whom the results are withheld (a trainee's open exercise on this version) gets the
 * inputs and no result headings; asking for the results' data is refused (403).
 */
function fullVersion(db: Db, v: DeckVersionRow, withheld: WithheldResults | null = null, withResults = false) {
  return {
    ...versionSummary(db, v),
    deck: JSON.parse(v.deckJson) as Deck,
    placements: readStoredPlacements(v.placementsJson),
    results: withheld ? [] : withResults ? resultsOfVersion(db, v.id) : resultHeadingsOfVersion(db, v.id),
    /** Set when the results are hidden from this reader (a trainee's open exercise on this version). */
    resultsWithheld: withheld,
  };
}

/** The deck if its project belongs to the firm; otherwise 404. */
export function findDeck(db: Db, firmId: number, deckId: number): DeckRow {
  const row = db
    .select({ d: decks })
    .from(decks)
    .innerJoin(projects, eq(projects.id, decks.projectId))
    .where(and(eq(decks.id, deckId), eq(projects.firmId, firmId)))
    .get();
  if (!row) throw ApiError.notFound('deck');
  return row.d;
}

/** Version `number` of the deck if its project belongs to the firm; otherwise 404. */
export function findVersionByNumber(db: Db, firmId: number, deckId: number, number: number): DeckVersionRow {
  findDeck(db, firmId, deckId);
  const v = db
    .select()
    .from(deckVersions)
    .where(and(eq(deckVersions.deckId, deckId), eq(deckVersions.number, number)))
    .get();
  if (!v) throw ApiError.notFound(`version ${number} of deck ${deckId}`);
  return v;
}

export function listDecks(db: Db, firmId: number, projectId: number) {
  findProject(db, firmId, projectId);
  return db.select().from(decks).where(eq(decks.projectId, projectId)).orderBy(desc(decks.id)).all().map((d) => deckSummary(db, d));
}

/** A page of a deck's versions, newest first (server/api/pagination.ts). */
export function listVersions(db: Db, firmId: number, deckId: number, req: PageRequest = { limit: DEFAULT_PAGE }) {
  const d = findDeck(db, firmId, deckId);
  const after = decodeCursor(req.cursor, numberCursor);
  const scope = eq(deckVersions.deckId, d.id);
  const total = db.select({ n: count() }).from(deckVersions).where(scope).get()?.n ?? 0;
  const rows = db
    .select()
    .from(deckVersions)
    .where(after ? and(scope, lt(deckVersions.number, after.number)) : scope)
    .orderBy(desc(deckVersions.number))
    .limit(req.limit + 1)
    .all();
  const cut = cutPage(rows, req.limit, total, (v) => ({ number: v.number }));
  return { deck: d, versions: cut.rows.map((v) => versionSummary(db, v)), page: cut.page };
}

/** The deck with the first page of its versions (newest first) and the page's cursor. */
export function getDeck(db: Db, firmId: number, deckId: number, req?: PageRequest) {
  const { deck, versions, page } = listVersions(db, firmId, deckId, req);
  return { deck: deckSummary(db, deck), versions, page };
}

/** A version of the deck; `withResults`: with its stored results' data too. */
export function getVersion(db: Db, reader: Actor, deckId: number, number: number, withResults = false) {
  findDeck(db, reader.firmId, deckId);
  const v = db.select().from(deckVersions).where(and(eq(deckVersions.deckId, deckId), eq(deckVersions.number, number))).get();
  if (!v) throw ApiError.notFound(`version ${number} of deck ${deckId}`);
  const withheld = withheldResults(db, reader, v.id);
  if (withheld && withResults) throw ApiError.forbidden(withheld.message, 'results_withheld');
  return fullVersion(db, v, withheld, withResults);
}

interface SaveInput {
  deck: Deck;
  message: string;
  placements?: SavedPlacements;
  basedOnVersionId?: number;
}

/** Storage rules of a save: the firm's quota in bytes (FIRM_STORAGE_QUOTA_MB). */
export interface StoragePolicy {
  firmQuotaBytes: number;
}

const defaultPolicy: StoragePolicy = { firmQuotaBytes: DEFAULT_FIRM_STORAGE_QUOTA_BYTES };

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/** A result too large to store is refused as bad input: the deck is what makes it large. */
function encodeOrRefuse(r: ReturnType<typeof computeStoredResults>[number]) {
  try {
    return encodeResultRow(r);
  } catch (e) {
    if (!(e instanceof ResultTooLargeError)) throw e;
    const mb = (n: number) => `${(n / 1024 / 1024).toFixed(1)} MB`;
    const message = `the ${r.method} results of this deck would take ${e.bytes === null ? 'more than any string can hold' : mb(e.bytes)}, more than the ${mb(MAX_RESULT_JSON_BYTES)} one version may store: check the girder count, spacing and spans`;
    throw ApiError.badRequest(`body.deck: ${message}`, [{ path: 'body.deck', message }]);
  }
}

/** The columns a save writes, encoded once so the quota check counts what will be stored. */
function encodeSave(input: SaveInput, results: ReturnType<typeof computeStoredResults>) {
  const deckJson = JSON.stringify(input.deck);
  const placementsJson = input.placements === undefined ? null : JSON.stringify(input.placements);
  const encoded = results.map(encodeOrRefuse);
  const bytes = Buffer.byteLength(deckJson) + (placementsJson === null ? 0 : Buffer.byteLength(placementsJson)) + encoded.reduce((n, r) => n + encodedBytes(r), 0);
  return { deckJson, placementsJson, encoded, bytes };
}

function insertVersion(tx: Tx, deckId: number, actor: Actor, input: SaveInput, save: ReturnType<typeof encodeSave>) {
  const top = tx.select({ n: max(deckVersions.number) }).from(deckVersions).where(eq(deckVersions.deckId, deckId)).get();
  const v = tx
    .insert(deckVersions)
    .values({
      deckId,
      number: (top?.n ?? 0) + 1,
      deckJson: save.deckJson,
      placementsJson: save.placementsJson,
      message: input.message,
      basedOnVersionId: input.basedOnVersionId ?? null,
      createdBy: actor.id,
    })
    .returning()
    .get();
  for (const r of save.encoded) insertEncodedResult(tx, v.id, r);
  return v;
}

/**
 * Creates a deck and its first version. A deck that does not name its design values has the
 * schema's default, the converted US customary ones, as every deck stored before the field
 * (shared/loads/designValues.ts); the workspace names the SI edition's for a new deck of an SI
 * project (src/stores/useDeckStore.ts startNew).
 */
export function createDeck(db: Db, actor: Actor, projectId: number, input: SaveInput, policy: StoragePolicy = defaultPolicy) {
  const project = findProject(db, actor.firmId, projectId);
  if (project.archived) throw ApiError.conflict('the project is archived: restore it before adding decks');
  const save = encodeSave(input, computeStoredResults(input.deck));
  const { d, v } = db.transaction((tx) => {
    assertWithinQuota(tx, actor.firmId, policy.firmQuotaBytes, save.bytes);
    const d = tx.insert(decks).values({ projectId, name: input.deck.name, createdBy: actor.id }).returning().get();
    const v = insertVersion(tx, d.id, actor, input, save);
    recordAudit(tx, { firmId: actor.firmId, projectId, actorId: actor.id, action: 'create', entityType: 'deck', entityId: d.id, summary: `created deck “${d.name}” (version 1: ${input.message})` });
    return { d, v };
  });
  return { deck: deckSummary(db, d), version: fullVersion(db, v) };
}

/** The design values a stored version was computed with (a deck stored before the field: the US customary ones). */
function storedDesignValues(v: DeckVersionRow): Deck['designValues'] {
  return (JSON.parse(v.deckJson) as Partial<Deck>).designValues === 'si-edition' ? 'si-edition' : 'us-customary';
}

/**
 * Saves a new version. `designValuesGiven: false` (the request's deck did not name its design
 * values): the version keeps the deck's latest version's, so a save that leaves the field out
 * never switches a deck's values.
 */
export function saveVersion(db: Db, actor: Actor, deckId: number, given: SaveInput, policy: StoragePolicy = defaultPolicy, options: { designValuesGiven?: boolean } = {}) {
  const d = findDeck(db, actor.firmId, deckId);
  const project = findProject(db, actor.firmId, d.projectId);
  if (project.archived) throw ApiError.conflict('the project is archived: restore it before saving');
  const input = options.designValuesGiven === false ? { ...given, deck: { ...given.deck, designValues: storedDesignValues(latestVersion(db, deckId)) } } : given;
  if (input.basedOnVersionId !== undefined) {
    const base = db.select().from(deckVersions).where(and(eq(deckVersions.id, input.basedOnVersionId), eq(deckVersions.deckId, deckId))).get();
    if (!base) throw ApiError.badRequest('basedOnVersionId: no such version of this deck', [{ path: 'body.basedOnVersionId', message: 'no such version of this deck' }]);
  }
  const save = encodeSave(input, computeStoredResults(input.deck));
  const v = db.transaction((tx) => {
    assertWithinQuota(tx, actor.firmId, policy.firmQuotaBytes, save.bytes);
    const v = insertVersion(tx, deckId, actor, input, save);
    recordAudit(tx, { firmId: actor.firmId, projectId: d.projectId, actorId: actor.id, action: 'save-version', entityType: 'deck', entityId: deckId, summary: `saved version ${v.number} of deck “${d.name}”: ${input.message}` });
    return v;
  });
  return fullVersion(db, v);
}
