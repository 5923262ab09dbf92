import { Router } from 'express';
import { z } from 'zod';
import { standardInputSchema, standardListQuerySchema, type StandardInputParsed, type StandardListQuery } from '../../../shared/schemas/standards.schema';
import { auditActor } from '../../audit';
import { currentUser, requireRole } from '../../auth/require-role';
import { singleUpload } from '../../files/upload';
import { validate } from '../../middleware/validate';
import { CERTIFICATE_MAX_BYTES, type StandardsService } from './standards.service';

const idParams = z.object({ id: z.uuid('The standard id is not valid.') });

/**
 * /api/standards: the reference-standard register (ISO/IEC 17025:2017 §6.4, §6.5). Lab staff read
 * it (analysts pick standards for budgets, signatories check them); quality managers keep it.
 */
export function standardsRoutes(standards: StandardsService): Router {
  const r = Router();
  const read = requireRole('admin', 'quality_manager', 'analyst', 'signatory');
  const write = requireRole('quality_manager');

  r.get('/', read, validate({ query: standardListQuerySchema }), async (_req, res) => {
    res.json(await standards.list(res.locals.query as StandardListQuery));
  });
  r.get('/:id', read, validate({ params: idParams }), async (req, res) => {
    res.json({ standard: await standards.get(req.params.id as string) });
  });
  r.post('/', write, validate({ body: standardInputSchema }), async (req, res) => {
    res.status(201).json({ standard: await standards.create(req.body as StandardInputParsed, auditActor(currentUser(res))) });
  });
  r.put('/:id', write, validate({ params: idParams, body: standardInputSchema }), async (req, res) => {
    res.json({ standard: await standards.update(req.params.id as string, req.body as StandardInputParsed, auditActor(currentUser(res))) });
  });
  r.post('/:id/certificate', write, validate({ params: idParams }), singleUpload('file', CERTIFICATE_MAX_BYTES), async (req, res) => {
    res.status(201).json({ standard: await standards.uploadCertificate(req.params.id as string, req.file!, auditActor(currentUser(res))) });
  });
  r.get('/:id/certificate', read, validate({ params: idParams }), async (req, res) => {
    const file = await standards.certificateFile(req.params.id as string);
    res.setHeader('Content-Type', 'application/pdf');
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.attachment(file.name);
    res.send(file.bytes);
  });
  return r;
}
