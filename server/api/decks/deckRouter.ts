/** Deck routes: /api/projects/:projectId/decks and /api/decks/:deckId/... */
import { Router } from 'express';
import type { Db } from '../../db/client.js';
import type { Config } from '../../config/env.js';
import { allow } from '../../auth/passport.js';
import { idParams, validate } from '../../middleware/validate.js';
import { deckCreateBody, versionCreateBody, versionParams, versionQuery } from './deckModel.js';
import { createDeck, getDeck, getVersion, listDecks, listVersions, saveVersion, type StoragePolicy } from './deckService.js';
import { pageQuery } from '../pagination.js';

type StorageConfig = Pick<Config, 'firmStorageQuotaBytes'>;
const policyOf = (config: StorageConfig): StoragePolicy => ({ firmQuotaBytes: config.firmStorageQuotaBytes });

/** Whether the request's deck named its design values: the raw body tells (the parsed deck has the schema's default). */
function designValuesGiven(body: unknown): boolean {
  const deck = (body as { deck?: unknown } | undefined)?.deck;
  return typeof deck === 'object' && deck !== null && (deck as { designValues?: unknown }).designValues !== undefined;
}

export function projectDecksRouter(db: Db, config: StorageConfig): Router {
  const r = Router({ mergeParams: true });
  r.get('/', allow('project:read'), validate({ params: idParams('projectId') }), (req, res) => {
    res.json({ decks: listDecks(db, req.user!.firmId, res.locals.params.projectId) });
  });
  r.post('/', allow('deck:save'), validate({ params: idParams('projectId'), body: deckCreateBody }), (req, res) => {
    res.status(201).json(createDeck(db, req.user!, res.locals.params.projectId, res.locals.body, policyOf(config)));
  });
  return r;
}

export function deckRouter(db: Db, config: StorageConfig): Router {
  const r = Router();
  r.get('/:deckId', allow('project:read'), validate({ params: idParams('deckId'), query: pageQuery }), (req, res) => {
    res.json(getDeck(db, req.user!.firmId, res.locals.params.deckId, res.locals.query));
  });
  r.get('/:deckId/versions', allow('project:read'), validate({ params: idParams('deckId'), query: pageQuery }), (req, res) => {
    const { versions, page } = listVersions(db, req.user!.firmId, res.locals.params.deckId, res.locals.query);
    res.json({ versions, page });
  });
  r.post('/:deckId/versions', allow('deck:save'), validate({ params: idParams('deckId'), body: versionCreateBody }), (req, res) => {
    res.status(201).json({ version: saveVersion(db, req.user!, res.locals.params.deckId, res.locals.body, policyOf(config), { designValuesGiven: designValuesGiven(req.body) }) });
  });
  r.get('/:deckId/versions/:number', allow('project:read'), validate({ params: versionParams, query: versionQuery }), (req, res) => {
    res.json({ version: getVersion(db, req.user!, res.locals.params.deckId, res.locals.params.number, res.locals.query.include === 'results') });
  });
  return r;
}
