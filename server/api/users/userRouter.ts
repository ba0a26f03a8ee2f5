/** /api/admin/users — the firm's users; admins only. */
import { Router } from 'express';
import type { Db } from '../../db/client.js';
import type { Config } from '../../config/env.js';
import type { Mailer } from '../../mail/mailer.js';
import { inviteUser } from '../mail/invitationService.js';
import { allow } from '../../auth/passport.js';
import { idParams, validate } from '../../middleware/validate.js';
import { createUser, listUsers, resetPassword, updateUser, userCreateBody, userUpdateBody } from './userService.js';

export function userRouter(db: Db, config: Config, mailer: Mailer): Router {
  const r = Router();
  r.use(allow('users:manage'));
  r.get('/', (req, res) => {
    res.json({ users: listUsers(db, req.user!.firmId) });
  });
  // The new user gets a temporary password to hand over and, by e-mail, a link to set one.
  r.post('/', validate({ body: userCreateBody }), async (req, res) => {
    const created = await createUser(db, req.user!, res.locals.body);
    const invitation = inviteUser(db, mailer, config.publicUrl, req.user!, created.user.id);
    res.status(201).json({ ...created, invitation: { id: invitation.id, expiresAt: invitation.expiresAt } });
  });
  r.patch('/:userId', validate({ params: idParams('userId'), body: userUpdateBody }), (req, res) => {
    res.json({ user: updateUser(db, req.user!, res.locals.params.userId, res.locals.body) });
  });
  r.post('/:userId/reset-password', validate({ params: idParams('userId') }), async (req, res) => {
    res.json(await resetPassword(db, req.user!, res.locals.params.userId));
  });
  return r;
}
