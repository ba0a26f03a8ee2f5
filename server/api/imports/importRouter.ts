/**
 * /api/imports — CSV imports.
 * - GET  /girder-layout/template?units=US|SI   project:read  the template (text/csv)
 * - POST /girder-layout                        deck:save     multipart: file (CSV ≤ 256 kB),
 *        deckId, message?, dryRun? ("true": check and preview only). Saves a new version of the
 *        deck; any bad row imports nothing (400, one detail per row and column).
 */
import { Router } from 'express';
import { z } from 'zod';
import { personText } from '../../../shared/text.js';
import type { Db } from '../../db/client.js';
import type { Config } from '../../config/env.js';
import { allow } from '../../auth/passport.js';
import { idText, validate } from '../../middleware/validate.js';
import { ApiError } from '../../middleware/errors.js';
import { receiveOneFile } from '../../uploads/receiveFile.js';
import { girderLayoutTemplate } from './girderLayoutCsv.js';
import { importGirderLayout } from './importService.js';

export const MAX_CSV_BYTES = 256 * 1024;

const templateQuery = z.strictObject({ units: z.enum(['US', 'SI'], { error: 'units must be "US" or "SI"' }).default('US') });
const importFields = z.strictObject({
  deckId: idText('deckId'),
  message: personText('message', 500, { multiline: true }).optional(),
  dryRun: z.enum(['true', 'false'], { error: 'dryRun must be "true" or "false"' }).default('false'),
});

export function importRouter(db: Db, config: Pick<Config, 'firmStorageQuotaBytes'>): Router {
  const r = Router();
  r.get('/girder-layout/template', allow('project:read'), validate({ query: templateQuery }), (_req, res) => {
    const units = res.locals.query.units as 'US' | 'SI';
    res.attachment(`girder-layout-template-${units}.csv`);
    res.type('text/csv; charset=utf-8');
    res.send(girderLayoutTemplate(units));
  });
  r.post('/girder-layout', allow('deck:save'), receiveOneFile({ maxBytes: MAX_CSV_BYTES, what: 'the CSV file' }), validate({ body: importFields }), (req, res) => {
    const file = req.file!;
    const text = file.buffer.toString('utf8');
    if (text.includes('\u0000') || text.includes('\uFFFD')) {
      throw ApiError.badRequest('file: the file is not UTF-8 text (save it as CSV UTF-8)', [{ path: 'file', message: 'the file is not UTF-8 text (save it as CSV UTF-8)' }]);
    }
    const body = res.locals.body as z.infer<typeof importFields>;
    const out = importGirderLayout(db, req.user!, { deckId: body.deckId, csv: text, fileName: file.originalname || 'the CSV file', message: body.message, dryRun: body.dryRun === 'true' }, { firmQuotaBytes: config.firmStorageQuotaBytes });
    res.status(out.dryRun ? 200 : 201).json(out);
  });
  return r;
}
