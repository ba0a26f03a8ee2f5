/**
 * Sessions. A signed-in browser holds two cookies:
 * - `ds_session`: the JSON Web Token (HS256), httpOnly, SameSite=Strict, Path=/api — a script
 *   injected into the page cannot read it;
 * - `ds_csrf`: a random token the page can read and must echo in the `X-CSRF-Token` header of
 *   every request that changes something (double-submit). The token's SHA-256 is a claim of
 *   the signed JWT, so a cookie planted by another site cannot be used.
 * The JWT names a row of `sessions`, so sign-out revokes it server-side before it expires.
 */
import { createHash, randomBytes, randomUUID } from 'node:crypto';
import type { Response } from 'express';
import jwt from 'jsonwebtoken';
import { eq } from 'drizzle-orm';
import type { Config } from '../config/env.js';
import type { Db } from '../db/client.js';
import { sessions } from '../db/schema.js';

export const SESSION_COOKIE = 'ds_session';
export const CSRF_COOKIE = 'ds_csrf';
export const CSRF_HEADER = 'x-csrf-token';

export interface TokenClaims {
  sub: string;
  sid: string;
  csrf: string;
}

export function sha256(s: string): string {
  return createHash('sha256').update(s).digest('hex');
}

export function startSession(db: Db, config: Config, res: Response, userId: number): void {
  const sid = randomUUID();
  const csrf = randomBytes(24).toString('hex');
  const expires = new Date(Date.now() + config.sessionMinutes * 60_000);
  db.insert(sessions).values({ id: sid, userId, expiresAt: expires.toISOString() }).run();
  const claims: TokenClaims = { sub: String(userId), sid, csrf: sha256(csrf) };
  const token = jwt.sign(claims, config.jwtSecret, { algorithm: 'HS256', expiresIn: config.sessionMinutes * 60 });
  const common = { sameSite: 'strict' as const, secure: config.secureCookies, expires };
  res.cookie(SESSION_COOKIE, token, { ...common, httpOnly: true, path: '/api' });
  res.cookie(CSRF_COOKIE, csrf, { ...common, httpOnly: false, path: '/' });
}

export function endSession(db: Db, res: Response, sid: string | undefined): void {
  if (sid) db.update(sessions).set({ revokedAt: new Date().toISOString() }).where(eq(sessions.id, sid)).run();
  res.clearCookie(SESSION_COOKIE, { path: '/api' });
  res.clearCookie(CSRF_COOKIE, { path: '/' });
}
