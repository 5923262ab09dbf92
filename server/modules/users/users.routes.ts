import { Router } from 'express';
import { createUserInputSchema, type CreateUserInput } from '../../../shared/schemas/users.schema';
import { auditActor } from '../../audit';
import { currentUser, requireRole } from '../../auth/require-role';
import { validate } from '../../middleware/validate';
import type { UsersService } from './users.service';

/** /api/users (admin). Invitations, role changes and deactivation come with issue 7. */
export function usersRoutes(users: UsersService): Router {
  const r = Router();
  r.use(requireRole('admin'));
  r.get('/', async (_req, res) => {
    res.json({ users: await users.list() });
  });
  r.post('/', validate({ body: createUserInputSchema }), async (req, res) => {
    res.status(201).json({ user: await users.create(req.body as CreateUserInput, undefined, auditActor(currentUser(res))) });
  });
  return r;
}
