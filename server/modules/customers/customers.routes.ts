import { Router } from 'express';
import { STAFF_ROLES } from '../../../shared/schemas/roles';
import { requireRole } from '../../auth/require-role';
import type { CustomersRepository } from './customers.repository';

/** /api/customers: read-only list for lab staff (the admin's user form needs it). */
export function customersRoutes(customersRepo: CustomersRepository): Router {
  const r = Router();
  r.get('/', requireRole(...STAFF_ROLES), async (_req, res) => {
    res.json({ customers: await customersRepo.list() });
  });
  return r;
}
