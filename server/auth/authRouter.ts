/**
 * Sign-in, sign-out, the current user and password change.
 *
 * Sign-in policy (README, Sessions and security): failed sign-ins are limited per client
 * address whatever the e-mail (spraying: 429), per account and address (guessing from one
 * client: 429), and slowed per account whatever the address (guessing from many clients:
 * growing waits, never a refusal, so the owner still signs in). Successful sign-ins never
 * count; the first refusal of each key in each window is recorded (sign_in_refusals).
 */
import { Router, type Request, type Response } from 'express';
import rateLimit, { ipKeyGenerator, type RateLimitRequestHandler } from 'express-rate-limit';
import { slowDown } from 'express-slow-down';
import type passport from 'passport';
import { and, eq, ne } from 'drizzle-orm';
import { z } from 'zod';
import type { Config } from '../config/env.js';
import type { Db } from '../db/client.js';
import { sessions, signInRefusals, users } from '../db/schema.js';
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
/** Longest wait an account under attack adds to each sign-in: growing, never a refusal. */
export const MAX_ACCOUNT_DELAY_MS = 8_000;

type RefusalRecorder = (req: Request, res: Response, limit: 'address' | 'account-address') => void;

/**
 * Records the first refusal of a key in its window (sign_in_refusals): who was tried, from
 * where, and the account's firm when the e-mail is known. Later refusals of the same key in the
 * window add no row, so a flood cannot fill the database.
 */
function refusalRecorder(db: Db): RefusalRecorder {
  return (req, res, limit) => {
    const info = (req as Request & { rateLimit?: { used: number; limit: number } }).rateLimit;
    if (info && info.used !== info.limit + 1) return;
    const email = (res.locals.body as { email?: string } | undefined)?.email ?? null;
    const firmId = email ? (db.select({ firmId: users.firmId }).from(users).where(eq(users.email, email)).get()?.firmId ?? null) : null;
    db.insert(signInRefusals).values({ limit, email, address: req.ip ?? '', firmId }).run();
  };
}

/**
 * A limit on failed sign-ins in the window (successful ones are given back). Over the limit:
 * 429 in the error envelope, with Retry-After and the RateLimit headers; the first refusal of
 * each key in the window is recorded.
 */
function signInLimiter(
  name: 'address' | 'account-address',
  limit: number,
  key: (req: Request, res: Response) => string,
  message: string,
  record: RefusalRecorder,
): RateLimitRequestHandler {
  return rateLimit({
    windowMs: SIGN_IN_WINDOW_MS,
    limit,
    identifier: `sign-in-${name}`,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    skipSuccessfulRequests: true,
    keyGenerator: key,
    handler: (req, res, next) => {
      try {
        record(req, res, name);
      } catch {
        // a refusal is answered even if its record cannot be written
      }
      next(new ApiError(429, 'too_many_requests', `${message}: wait 15 minutes and try again`));
    },
  });
}

/**
 * Per client address, whatever the e-mail: stops one client spraying many accounts. Mounted by
 * createApp ahead of body parsing (server/app.ts), so a flood from one address stays cheap.
 */
export function addressLimiter(db: Db, config: Config) {
  return signInLimiter('address', config.loginAttemptsPerAddressPer15Min, (req) => ipKeyGenerator(req.ip ?? ''), 'too many failed sign-ins from this address', refusalRecorder(db));
}

const emailOf = (res: Response) => (res.locals.body as z.infer<typeof loginBody>).email;

/** Per account and address: one client guessing one account is refused after the limit. */
function accountAddressLimiter(db: Db, config: Config) {
  return signInLimiter(
    'account-address',
    config.loginAttemptsPer15Min,
    (req, res) => `${emailOf(res)} ${ipKeyGenerator(req.ip ?? '')}`,
    'too many failed sign-ins for this account from this address',
    refusalRecorder(db),
  );
}

/**
 * Per account, whatever the address: past the limit of failures every further sign-in of the
 * account waits longer (0.5 s, doubling, at most MAX_ACCOUNT_DELAY_MS) — guessing from many
 * addresses is slowed, but never refused, so the owner with the right password still signs in
 * while the account is under attack. Successful sign-ins are given back.
 */
function accountSlowdown(config: Config) {
  const after = config.loginAttemptsPer15Min;
  return slowDown({
    windowMs: SIGN_IN_WINDOW_MS,
    delayAfter: after,
    delayMs: (used) => Math.min(MAX_ACCOUNT_DELAY_MS, 500 * 2 ** Math.min(10, used - after - 1)),
    maxDelayMs: MAX_ACCOUNT_DELAY_MS,
    skipSuccessfulRequests: true,
    identifier: 'sign-in-account',
    keyGenerator: (_req, res) => emailOf(res),
  });
}

export function authRouter(db: Db, config: Config, pp: passport.PassportStatic): Router {
  const r = Router();

  // who: anyone (not signed in). The per-address limit has already run (server/app.ts); the
  // per-account ones need the validated e-mail.
  r.post('/login', validate({ body: loginBody }), accountAddressLimiter(db, config), accountSlowdown(config), async (_req, res) => {
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

  // who: anyone. The page's question "is anybody signed in here?": 200 with the user, or with
  // null when there is no valid session (no error, so the sign-in page logs none); /me stays
  // the 401 answer for API clients that need a session.
  r.get('/session', (req, res, next) => {
    pp.authenticate('jwt', { session: false }, (err: unknown, user: Express.User | false) => {
      if (err) return next(err);
      res.json({ user: user ? publicUser(user) : null });
    })(req, res, next);
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
