import { Router, type Response } from 'express';
import { z } from 'zod';
import { currentUser, requireRole } from '../../auth/require-role';
import { NotFoundError } from '../../errors/app-error';
import { validate } from '../../middleware/validate';
import type { CertificatesService } from '../certificates/certificates.service';
import { sendPdf } from '../certificates/certificates.routes';

const idParams = z.object({ id: z.string().min(1).max(100) });

/** The signed-in customer's organisation; a customer account without one sees nothing. */
function organisationOf(res: Response): string {
  const customerId = currentUser(res).customerId;
  if (!customerId) throw new NotFoundError('Your account is not linked to a customer organisation: ask the laboratory.');
  return customerId;
}

/**
 * /api/portal: a customer's own organisation's certificates. Another organisation's certificate,
 * PDF or job answers 404, as if it did not exist.
 */
export function portalRoutes(certificates: CertificatesService): Router {
  const r = Router();
  r.use(requireRole('customer'));
  r.get('/certificates', async (_req, res) => {
    res.json({ certificates: await certificates.list({ customerId: organisationOf(res) }) });
  });
  r.get('/certificates/:id', validate({ params: idParams }), async (req, res) => {
    res.json(await certificates.get(String(req.params.id), { customerId: organisationOf(res) }));
  });
  r.get('/certificates/:id/pdf', validate({ params: idParams }), async (req, res) => {
    sendPdf(res, await certificates.download(String(req.params.id), currentUser(res), { customerId: organisationOf(res) }));
  });
  r.get('/jobs/:id', validate({ params: idParams }), async (req, res) => {
    res.json(await certificates.jobForCustomer(String(req.params.id), organisationOf(res)));
  });
  return r;
}
