import { Router } from 'express';
import type { Me } from '../../../shared/schemas/me.schema';
import { currentUser, requireRole } from '../../auth/require-role';
import type { LabService } from '../lab/lab.service';

/** GET /api/me: the signed-in user (any role, or none yet) and the lab's public details. */
export function meRoutes(lab: LabService): Router {
  const r = Router();
  r.get('/', requireRole(), async (_req, res) => {
    const body: Me = { user: currentUser(res), lab: await lab.getPublic() };
    res.json(body);
  });
  return r;
}
