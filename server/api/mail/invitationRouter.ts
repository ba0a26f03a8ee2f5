/**
 * /api/invitations — mounted before the global sign-in check, because the invited user has no
 * session yet:
 * - GET  /:token          anyone holding the link: who the invitation is for
 * - POST /:token/accept   anyone holding the link: choose the password (signs in)
 * - GET  /                admins (users:manage): the firm's invitations
 * - POST /                admins (users:manage): invite a user `{ userId }` by e-mail
 * The token routes are rate-limited per client address.
 */
import { Router } from 'express';
import rateLimit from 'express-rate-limit';
import type passport from 'passport';
import { z } from 'zod';
import type { Config } from '../../config/env.js';
import type { Db } from '../../db/client.js';
import { allow, authenticate, loadUser, publicUser, requireCsrf, requirePasswordChanged } from '../../auth/passport.js';
import { newPasswordSchema } from '../../auth/password.js';
import { startSession } from '../../auth/session.js';
import { ApiError } from '../../middleware/errors.js';
import { validate } from '../../middleware/validate.js';
import type { Mailer } from '../../mail/mailer.js';
import { acceptInvitation, describeInvitation, inviteUser, listInvitations } from './invitationService.js';

const tokenParams = z.object({
  token: z.string().regex(/^[A-Za-z0-9_-]{20,100}$/, 'the invitation link is malformed: copy the whole link from the e-mail'),
});
const acceptBody = z.strictObject({ password: newPasswordSchema });
const inviteBody = z.strictObject({
  userId: z.number({ error: 'userId must be a number' }).int('userId must be a whole number').positive('userId must be a positive id'),
});

export function invitationRouter(db: Db, config: Config, pp: passport.PassportStatic, mailer: Mailer): Router {
  const r = Router();
  const signedInAdmin = [authenticate(pp), requireCsrf, requirePasswordChanged, allow('users:manage')];
  const limiter = rateLimit({
    windowMs: 15 * 60_000,
    limit: 30,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) => next(new ApiError(429, 'too_many_requests', 'too many attempts with invitation links: wait 15 minutes and try again')),
  });

  // who: admins of the firm
  r.get('/', ...signedInAdmin, (req, res) => {
    res.json({ invitations: listInvitations(db, req.user!.firmId) });
  });

  // who: admins of the firm
  r.post('/', ...signedInAdmin, validate({ body: inviteBody }), (req, res) => {
    const me = req.user!;
    res.status(201).json({ invitation: inviteUser(db, mailer, config.publicUrl, me, res.locals.body.userId) });
  });

  // who: anyone holding the link
  r.get('/:token', limiter, validate({ params: tokenParams }), (_req, res) => {
    res.json({ invitation: describeInvitation(db, res.locals.params.token) });
  });

  // who: anyone holding the link
  r.post('/:token/accept', limiter, validate({ params: tokenParams, body: acceptBody }), async (_req, res) => {
    const userId = await acceptInvitation(db, res.locals.params.token, res.locals.body.password);
    startSession(db, config, res, userId);
    res.json({ user: publicUser(loadUser(db, userId)!) });
  });

  return r;
}
