import { Router } from 'express';
import { z } from 'zod';
import {
  acceptInvitationInputSchema,
  createUserInputSchema,
  updateUserInputSchema,
  type AcceptInvitationInput,
  type CreateUserInput,
  type UpdateUserInput,
} from '../../../shared/schemas/users.schema';
import { auditActor } from '../../audit';
import { currentUser, requireRole } from '../../auth/require-role';
import { validate } from '../../middleware/validate';
import type { UsersService } from './users.service';

const idParams = z.object({ id: z.uuid('The user id is not valid.') });

/** /api/users (admin): create (with an invitation e-mail), change role, deactivate, reset password. */
export function usersRoutes(users: UsersService): Router {
  const r = Router();
  r.use(requireRole('admin'));
  const actor = (res: Parameters<typeof currentUser>[0]) => auditActor(currentUser(res));
  const id = (req: { params: unknown }) => (req.params as { id: string }).id;
  r.get('/', async (_req, res) => {
    res.json({ users: await users.list() });
  });
  r.post('/', validate({ body: createUserInputSchema }), async (req, res) => {
    res.status(201).json({ user: await users.create(req.body as CreateUserInput, undefined, actor(res)) });
  });
  r.get('/:id', validate({ params: idParams }), async (req, res) => {
    res.json({ user: await users.get(id(req)) });
  });
  r.patch('/:id', validate({ params: idParams, body: updateUserInputSchema }), async (req, res) => {
    res.json({ user: await users.update(id(req), req.body as UpdateUserInput, actor(res)) });
  });
  r.post('/:id/deactivate', validate({ params: idParams }), async (req, res) => {
    res.json({ user: await users.deactivate(id(req), actor(res)) });
  });
  r.post('/:id/reactivate', validate({ params: idParams }), async (req, res) => {
    res.json({ user: await users.reactivate(id(req), actor(res)) });
  });
  r.post('/:id/reset-password', validate({ params: idParams }), async (req, res) => {
    res.json({ user: await users.resetPassword(id(req), actor(res)) });
  });
  return r;
}

/** /api/invitations (public): the one-time link from an invitation or reset e-mail. */
export function invitationsRoutes(users: UsersService): Router {
  const r = Router();
  r.get('/:token', validate({ params: z.object({ token: z.string().min(20).max(200) }) }), async (req, res) => {
    res.json({ invitation: await users.invitation((req.params as { token: string }).token) });
  });
  r.post('/accept', validate({ body: acceptInvitationInputSchema }), async (req, res) => {
    res.json(await users.acceptInvitation(req.body as AcceptInvitationInput));
  });
  return r;
}
