import { Router, type Response } from 'express';
import { z } from 'zod';
import { currentUser, requireRole } from '../../auth/require-role';
import { validate } from '../../middleware/validate';
import { amendBodySchema, withdrawBodySchema } from '../../../shared/schemas/certificates-api.schema';
import type { CertificatesService } from './certificates.service';

const idParams = z.object({ id: z.string().min(1).max(100) });

export function sendPdf(res: Response, file: { number: string; pdf: Buffer }) {
  res.setHeader('Content-Type', 'application/pdf');
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Cache-Control', 'private, no-store');
  res.attachment(`${file.number}.pdf`);
  res.send(file.pdf);
}

/** /api/certificates: the lab's issued certificates (signatories, quality managers, admins); amend and withdraw. */
export function certificatesRoutes(certificates: CertificatesService): Router {
  const r = Router();
  const staff = requireRole('signatory', 'quality_manager', 'admin');
  r.get('/', staff, async (_req, res) => {
    res.json({ certificates: await certificates.list() });
  });
  r.get('/:id', staff, validate({ params: idParams }), async (req, res) => {
    res.json(await certificates.get(String(req.params.id)));
  });
  r.get('/:id/pdf', staff, validate({ params: idParams }), async (req, res) => {
    sendPdf(res, await certificates.download(String(req.params.id), currentUser(res)));
  });
  r.post('/:id/amend', requireRole('signatory', 'quality_manager'), validate({ params: idParams, body: amendBodySchema }), async (req, res) => {
    res.status(201).json(await certificates.amend(String(req.params.id), req.body.reason, currentUser(res)));
  });
  r.post('/:id/withdraw', requireRole('signatory', 'quality_manager'), validate({ params: idParams, body: withdrawBodySchema }), async (req, res) => {
    res.json({ certificate: await certificates.withdraw(String(req.params.id), req.body.reason, currentUser(res)) });
  });
  return r;
}
