import { Router } from 'express';
import { z } from 'zod';
import { STAFF_ROLES } from '../../../shared/schemas/roles';
import { requireRole } from '../../auth/require-role';
import { validate } from '../../middleware/validate';
import type { CustomersService } from '../customers/customers.service';

const listQuery = z.object({
  customerId: z.preprocess((v) => (v === '' ? undefined : v), z.uuid('customerId is not a valid id.').optional()),
  q: z.preprocess((v) => (v === '' ? undefined : v), z.string().trim().max(200).optional()),
});

/** /api/items: every customer's items, for pickers (filter by customer, search text). Staff read. */
export function itemsRoutes(customers: CustomersService): Router {
  const r = Router();
  r.use(requireRole(...STAFF_ROLES));
  r.get('/', validate({ query: listQuery }), async (_req, res) => {
    res.json({ items: await customers.listItems(res.locals.query as z.output<typeof listQuery>) });
  });
  r.get('/:id', validate({ params: z.object({ id: z.uuid('The item id is not valid.') }) }), async (req, res) => {
    res.json({ item: await customers.getItem(req.params.id as string) });
  });
  return r;
}
