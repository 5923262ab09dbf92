import { Router } from 'express';
import { labSettingsInputSchema, type LabSettingsInput } from '../../../shared/schemas/lab.schema';
import { auditActor } from '../../audit';
import { currentUser, requireRole } from '../../auth/require-role';
import { validate } from '../../middleware/validate';
import type { LabService } from './lab.service';

/** /api/lab: the public subset for anyone; the full settings for the admin. */
export function labRoutes(lab: LabService): Router {
  const r = Router();
  r.get('/', async (_req, res) => {
    res.json({ lab: await lab.getPublic() });
  });
  r.get('/settings', requireRole('admin'), async (_req, res) => {
    res.json({ lab: await lab.getSettings() });
  });
  r.put('/', requireRole('admin'), validate({ body: labSettingsInputSchema }), async (req, res) => {
    res.json({ lab: await lab.updateSettings(req.body as LabSettingsInput, auditActor(currentUser(res))) });
  });
  return r;
}
