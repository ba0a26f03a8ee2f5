/** Sign-in, sign-out, the current user and password change. */
import { Router, type Request, type Response } from 'express';
import rateLimit, { ipKeyGenerator, type RateLimitRequestHandler } from 'express-rate-limit';
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

const SIGN_IN_WINDOW_MS = 15 * 60_000;

/**
 * A limit on failed sign-ins in the window (successful ones are given back). Over the limit:
 * 429 in the error envelope, with Retry-After and the RateLimit headers.
 */
function signInLimiter(name: string, limit: number, key: (req: Request, res: Response) => string, message: string): RateLimitRequestHandler {
  return rateLimit({
    windowMs: SIGN_IN_WINDOW_MS,
    limit,
    identifier: name,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    skipSuccessfulRequests: true,
    keyGenerator: key,
    handler: (_req, _res, next) => next(new ApiError(429, 'too_many_requests', `${message}: wait 15 minutes and try again`)),
  });
}

/**
 * Per client address, whatever the e-mail: stops one client trying many accounts. Mounted by
 * createApp ahead of body parsing (server/app.ts), so a flood from one address stays cheap.
 */
export function addressLimiter(config: Config) {
  return signInLimiter('sign-in-address', config.loginAttemptsPerAddressPer15Min, (req) => ipKeyGenerator(req.ip ?? ''), 'too many failed sign-ins from this address');
}

/** Per account, whatever the client address: stops many clients guessing one password. */
function accountLimiter(config: Config) {
  return signInLimiter('sign-in-account', config.loginAttemptsPer15Min, (_req, res) => (res.locals.body as z.infer<typeof loginBody>).email, 'too many failed sign-ins for this account');
}

export function authRouter(db: Db, config: Config, pp: passport.PassportStatic): Router {
  const r = Router();

  // who: anyone (not signed in). The per-address limit has already run (server/app.ts); the
  // per-account one needs the validated e-mail.
  r.post('/login', validate({ body: loginBody }), accountLimiter(config), async (_req, res) => {
    const { email, password } = res.locals.body as z.infer<typeof loginBody>;
    const row = db.select().from(users).where(eq(users.email, email)).get();
    // Unknown e-mail: compared against a dummy hash, so it takes as long as a wrong password.
    const ok = await verifyPassword(password, row?.passwordHash);
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
