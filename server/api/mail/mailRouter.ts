/** /api/mail — the outbox of the local SMTP service, for the firm's admins (mail:read); the list is
 *  paged newest first (server/api/pagination.ts). */
import { Router } from 'express';
import { and, count, desc, eq, like, lt, type SQL } from 'drizzle-orm';
import { z } from 'zod';
import type { Db } from '../../db/client.js';
import { outboxMessages } from '../../db/schema.js';
import { allow } from '../../auth/passport.js';
import { ApiError } from '../../middleware/errors.js';
import { idParams, validate } from '../../middleware/validate.js';
import { MAIL_KINDS } from '../../mail/mailer.js';
import { cutPage, decodeCursor, idCursor, pageFields } from '../pagination.js';

const listQuery = z.strictObject({
  kind: z.enum(MAIL_KINDS, { error: `kind must be one of ${MAIL_KINDS.join(', ')}` }).optional(),
  to: z.string().trim().max(254, 'to must be at most 254 characters').optional(),
  ...pageFields,
});

function present(m: typeof outboxMessages.$inferSelect, withBody: boolean) {
  return {
    id: m.id,
    kind: m.kind,
    from: m.fromAddress,
    to: m.toAddresses,
    subject: m.subject,
    receivedAt: m.receivedAt,
    sizeBytes: m.sizeBytes,
    text: m.textBody,
    ...(withBody ? { html: m.htmlBody } : {}),
  };
}

export function mailRouter(db: Db): Router {
  const r = Router();
  r.use(allow('mail:read'));

  r.get('/outbox', validate({ query: listQuery }), (req, res) => {
    const q = res.locals.query as z.infer<typeof listQuery>;
    const where: SQL[] = [eq(outboxMessages.firmId, req.user!.firmId)];
    if (q.kind) where.push(eq(outboxMessages.kind, q.kind));
    if (q.to) where.push(like(outboxMessages.toAddresses, `%${q.to.replace(/[%_]/g, '')}%`));
    const total = db.select({ n: count() }).from(outboxMessages).where(and(...where)).get()?.n ?? 0;
    const after = decodeCursor(q.cursor, idCursor);
    if (after) where.push(lt(outboxMessages.id, after.id));
    const rows = db.select().from(outboxMessages).where(and(...where)).orderBy(desc(outboxMessages.id)).limit(q.limit + 1).all();
    const cut = cutPage(rows, q.limit, total, (m) => ({ id: m.id }));
    res.json({ messages: cut.rows.map((m) => present(m, false)), page: cut.page });
  });

  r.get('/outbox/:messageId', validate({ params: idParams('messageId') }), (req, res) => {
    const m = db
      .select()
      .from(outboxMessages)
      .where(and(eq(outboxMessages.id, res.locals.params.messageId), eq(outboxMessages.firmId, req.user!.firmId)))
      .get();
    if (!m) throw ApiError.notFound('message');
    res.json({ message: present(m, true) });
  });

  return r;
}
