/** Sign-in, sign-out, the current user and password change. */
import { Router } from 'express';
import rateLimit, { ipKeyGenerator } from 'express-rate-limit';
import type passport from 'passport';
import { and, eq, ne } from 'drizzle-orm';
import { z } from 'zod';
import type { Config } from '../config/env.js';
import type { Db } from '../db/client.js';
import { sessions, users } from '../db/schema.js';
import { ApiError } from '../middleware/errors.js';
import { validate } from '../middleware/validate.js';
import { recordAudit } from '../api/audit/auditService.js';
import { authenticate, loadUser, publicUser, requireCsrf } from './passport.js';
import { hashPassword, newPasswordSchema, verifyPassword } from './password.js';
import { endSession, startSession } from './session.js';

const loginBody = z.strictObject({
  email: z.string().trim().toLowerCase().email('email must be an e-mail address').max(254),
  password: z.string().min(1, 'password is required').max(200),
});

const passwordBody = z.strictObject({
  currentPassword: z.string().min(1, 'current password is required').max(200),
  newPassword: newPasswordSchema,
});

// A hash to compare against when the e-mail is unknown, so both paths take the same time.
const DUMMY_HASH = '$2b$10$CwTycUXWue0Thq9StjUM0uJ8.Wc0u7mjRjCqQ5o0r2e5f3y6hE4Qy';

export function authRouter(db: Db, config: Config, pp: passport.PassportStatic): Router {
  const r = Router();
  const limiter = rateLimit({
    windowMs: 15 * 60_000,
    limit: config.loginAttemptsPer15Min,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    // Only a text e-mail names the key: String() of a hostile body (a 10,000-deep array) would overflow the stack.
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${typeof req.body?.email === 'string' ? req.body.email.trim().toLowerCase().slice(0, 254) : ''}`,
    handler: (_req, _res, next) =>
      next(new ApiError(429, 'too_many_requests', 'too many sign-in attempts: wait 15 minutes and try again')),
  });

  // who: anyone (not signed in)
  r.post('/login', limiter, validate({ body: loginBody }), async (_req, res) => {
    const { email, password } = res.locals.body as z.infer<typeof loginBody>;
    const row = db.select().from(users).where(eq(users.email, email)).get();
    const ok = await verifyPassword(password, row?.passwordHash ?? DUMMY_HASH);
    if (!row || !ok || row.disabled) throw ApiError.unauthenticated('e-mail or password is wrong, or the account is disabled');
    const user = loadUser(db, row.id);
    if (!user) throw ApiError.unauthenticated('e-mail or password is wrong, or the account is disabled');
    startSession(db, config, res, row.id);
    recordAudit(db, { firmId: row.firmId, actorId: row.id, action: 'sign-in', entityType: 'user', entityId: row.id, summary: `${row.email} signed in` });
    res.json({ user: publicUser(user) });
  });

  // who: anyone; revokes the session when there is one
  r.post('/logout', (req, res, next) => {
    pp.authenticate('jwt', { session: false }, (_err: unknown, user: Express.User | false) => {
      if (user && user.csrfHash) {
        // Sign-out changes state: require the CSRF header when a session exists.
        req.user = user;
        return requireCsrf(req, res, (err?: unknown) => {
          if (err) return next(err);
          endSession(db, res, user.sessionId);
          res.status(204).end();
        });
      }
      endSession(db, res, undefined);
      res.status(204).end();
    })(req, res, next);
  });

  // who: any signed-in user (also with a temporary password)
  r.get('/me', authenticate(pp), (req, res) => {
    res.json({ user: publicUser(req.user!) });
  });

  // who: any signed-in user (also with a temporary password)
  r.post('/password', authenticate(pp), requireCsrf, validate({ body: passwordBody }), async (req, res) => {
    const { currentPassword, newPassword } = res.locals.body as z.infer<typeof passwordBody>;
    const me = req.user!;
    const row = db.select().from(users).where(eq(users.id, me.id)).get();
    if (!row || !(await verifyPassword(currentPassword, row.passwordHash))) {
      throw ApiError.badRequest('currentPassword: the current password is wrong', [{ path: 'body.currentPassword', message: 'the current password is wrong' }]);
    }
    if (currentPassword === newPassword) {
      throw ApiError.badRequest('newPassword: must differ from the current password', [{ path: 'body.newPassword', message: 'must differ from the current password' }]);
    }
    const hash = await hashPassword(newPassword);
    db.transaction((tx) => {
      tx.update(users).set({ passwordHash: hash, mustChangePassword: false, passwordChangedAt: new Date().toISOString() }).where(eq(users.id, me.id)).run();
      // Other sessions of this user end; this one stays.
      tx.update(sessions)
        .set({ revokedAt: new Date().toISOString() })
        .where(and(eq(sessions.userId, me.id), ne(sessions.id, me.sessionId)))
        .run();
      recordAudit(tx, { firmId: me.firmId, actorId: me.id, action: 'change-password', entityType: 'user', entityId: me.id, summary: `${me.email} changed their password` });
    });
    res.json({ user: publicUser(loadUser(db, me.id)!) });
  });

  return r;
}
