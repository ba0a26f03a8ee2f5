/** /api/mail — the outbox of the local SMTP service, for the firm's admins (mail:read). */
import { Router } from 'express';
import { and, desc, eq, like, type SQL } from 'drizzle-orm';
import { z } from 'zod';
import type { Db } from '../../db/client.js';
import { outboxMessages } from '../../db/schema.js';
import { allow } from '../../auth/passport.js';
import { ApiError } from '../../middleware/errors.js';
import { idParams, validate } from '../../middleware/validate.js';
import { MAIL_KINDS } from '../../mail/mailer.js';

const listQuery = z.strictObject({
  kind: z.enum(MAIL_KINDS, { error: `kind must be one of ${MAIL_KINDS.join(', ')}` }).optional(),
  to: z.string().trim().max(254, 'to must be at most 254 characters').optional(),
  limit: z.coerce.number().int('limit must be a whole number').min(1, 'limit must be at least 1').max(500, 'limit must be at most 500').default(100),
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
    const rows = db.select().from(outboxMessages).where(and(...where)).orderBy(desc(outboxMessages.id)).limit(q.limit).all();
    res.json({ messages: rows.map((m) => present(m, false)) });
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
