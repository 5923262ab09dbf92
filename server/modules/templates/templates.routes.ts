import { Router } from 'express';
import { z } from 'zod';
import { createTemplateInputSchema, updateDraftInputSchema, type CreateTemplateInput, type UpdateDraftInput } from '../../../shared/schemas/template.schema';
import { currentUser, requireRole } from '../../auth/require-role';
import { validate } from '../../middleware/validate';
import type { TemplatesService } from './templates.service';

const idParams = z.object({ id: z.uuid({ message: 'id must be a uuid' }) });

/**
 * /api/templates. Quality managers write (create, edit drafts, validate, release, new version,
 * retire) and read everything; analysts and signatories read released and retired versions.
 */
export function templatesRoutes(templates: TemplatesService): Router {
  const r = Router();
  const readers = requireRole('quality_manager', 'analyst', 'signatory');
  const writers = requireRole('quality_manager');

  r.get('/', readers, async (_req, res) => {
    res.json({ templates: await templates.list(currentUser(res)) });
  });
  r.post('/', writers, validate({ body: createTemplateInputSchema }), async (req, res) => {
    res.status(201).json({ version: await templates.create(req.body as CreateTemplateInput, currentUser(res)) });
  });
  r.get('/versions/:id', readers, validate({ params: idParams }), async (req, res) => {
    res.json({ version: await templates.getVersion(req.params.id as string, currentUser(res)) });
  });
  r.put('/versions/:id', writers, validate({ params: idParams, body: updateDraftInputSchema }), async (req, res) => {
    res.json({ version: await templates.updateDraft(req.params.id as string, (req.body as UpdateDraftInput).definition, currentUser(res)) });
  });
  r.post('/versions/:id/validate', writers, validate({ params: idParams }), async (req, res) => {
    res.json({ validation: await templates.validate(req.params.id as string, currentUser(res)) });
  });
  r.post('/versions/:id/release', writers, validate({ params: idParams }), async (req, res) => {
    res.json({ version: await templates.release(req.params.id as string, currentUser(res)) });
  });
  r.post('/versions/:id/new-version', writers, validate({ params: idParams }), async (req, res) => {
    res.status(201).json({ version: await templates.newVersionFrom(req.params.id as string, currentUser(res)) });
  });
  r.post('/versions/:id/retire', writers, validate({ params: idParams }), async (req, res) => {
    res.json({ version: await templates.retire(req.params.id as string, currentUser(res)) });
  });
  return r;
}
