/**
 * passport-jwt strategy: reads the token from the `ds_session` cookie, verifies it (HS256,
 * expiry), then checks that its session is neither revoked nor expired and its user is not
 * disabled. The authenticated user (`req.user`) carries the firm and roles.
 */
import type { Request, RequestHandler } from 'express';
import passport from 'passport';
import { Strategy as JwtStrategy } from 'passport-jwt';
import { and, eq, isNull } from 'drizzle-orm';
import type { Config } from '../config/env.js';
import type { Db } from '../db/client.js';
import { firms, sessions, userRoles, users, type Role } from '../db/schema.js';
import { ApiError } from '../middleware/errors.js';
import { CSRF_HEADER, SESSION_COOKIE, sha256, type TokenClaims } from './session.js';
import { mayPerform, type Action } from './permissions.js';

export interface AuthUser {
  id: number;
  email: string;
  name: string;
  firmId: number;
  firmName: string;
  roles: Role[];
  mustChangePassword: boolean;
  sessionId: string;
  csrfHash: string;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends AuthUser {}
  }
}

export function loadUser(db: Db, userId: number): Omit<AuthUser, 'sessionId' | 'csrfHash'> | undefined {
  const row = db
    .select({ u: users, firmName: firms.name })
    .from(users)
    .innerJoin(firms, eq(firms.id, users.firmId))
    .where(eq(users.id, userId))
    .get();
  if (!row || row.u.disabled) return undefined;
  const roles = db.select({ role: userRoles.role }).from(userRoles).where(eq(userRoles.userId, userId)).all();
  return {
    id: row.u.id,
    email: row.u.email,
    name: row.u.name,
    firmId: row.u.firmId,
    firmName: row.firmName,
    roles: roles.map((r) => r.role).sort(),
    mustChangePassword: row.u.mustChangePassword,
  };
}

/** The user as the API returns it. */
export function publicUser(u: Omit<AuthUser, 'sessionId' | 'csrfHash'>) {
  return { id: u.id, email: u.email, name: u.name, firmId: u.firmId, firmName: u.firmName, roles: u.roles, mustChangePassword: u.mustChangePassword };
}

export function configurePassport(db: Db, config: Config): passport.PassportStatic {
  const instance = new passport.Passport() as unknown as passport.PassportStatic;
  instance.use(
    'jwt',
    new JwtStrategy(
      {
        jwtFromRequest: (req: Request) => (req.cookies?.[SESSION_COOKIE] as string | undefined) ?? null,
        secretOrKey: config.jwtSecret,
        algorithms: ['HS256'],
      },
      (claims: TokenClaims, done: (err: unknown, user?: AuthUser | false) => void) => {
        try {
          const session = db
            .select()
            .from(sessions)
            .where(and(eq(sessions.id, claims.sid), isNull(sessions.revokedAt)))
            .get();
          if (!session || session.userId !== Number(claims.sub) || new Date(session.expiresAt) <= new Date()) return done(null, false);
          const user = loadUser(db, session.userId);
          if (!user) return done(null, false);
          done(null, { ...user, sessionId: session.id, csrfHash: claims.csrf });
        } catch (e) {
          done(e);
        }
      },
    ),
  );
  return instance;
}

/** Requires a valid session; refuses with 401. */
export function authenticate(pp: passport.PassportStatic): RequestHandler {
  return (req, res, next) => {
    pp.authenticate('jwt', { session: false }, (err: unknown, user: AuthUser | false) => {
      if (err) return next(err);
      if (!user) return next(ApiError.unauthenticated('your session is missing, expired or signed out: sign in again'));
      req.user = user;
      next();
    })(req, res, next);
  };
}

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/** Double-submit CSRF check for requests that change something. */
export const requireCsrf: RequestHandler = (req, _res, next) => {
  if (SAFE.has(req.method)) return next();
  const header = req.get(CSRF_HEADER);
  if (!header || !req.user || sha256(header) !== req.user.csrfHash) {
    return next(ApiError.forbidden('missing or wrong X-CSRF-Token header: reload the page and try again', 'csrf_failed'));
  }
  next();
};

/** Refuses every route but /api/auth/* while the user still has a temporary password. */
export const requirePasswordChanged: RequestHandler = (req, _res, next) => {
  if (req.user?.mustChangePassword) {
    return next(ApiError.forbidden('change your temporary password first', 'password_change_required'));
  }
  next();
};

/** Declares who may call a route: the user's roles must allow `action` (kept on the handler as `.action`). */
export function allow(action: Action): RequestHandler & { action: Action } {
  const handler: RequestHandler = (req, _res, next) => {
    if (!req.user) return next(ApiError.unauthenticated());
    if (!mayPerform(req.user.roles, action)) {
      return next(ApiError.forbidden(`your roles (${req.user.roles.join(', ') || 'none'}) do not allow ${action}`));
    }
    next();
  };
  // The action stays readable on the handler, so tests can list every route with its action.
  return Object.assign(handler, { action });
}
