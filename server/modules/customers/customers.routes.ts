import { Router } from 'express';
import { z } from 'zod';
import { STAFF_ROLES } from '../../../shared/schemas/roles';
import { contactInputSchema, customerInputSchema, itemInputSchema } from '../../../shared/schemas/customers.schema';
import { auditActor } from '../../audit';
import { currentUser, requireRole } from '../../auth/require-role';
import { validate } from '../../middleware/validate';
import type { CustomersService } from './customers.service';

type Out<T extends z.ZodType> = z.output<T>;
const customerParams = z.object({ id: z.uuid('The customer id is not valid.') });
const contactParams = customerParams.extend({ contactId: z.uuid('The contact id is not valid.') });
const itemParams = customerParams.extend({ itemId: z.uuid('The item id is not valid.') });

/**
 * /api/customers: customer organisations with their contacts and items. Lab staff read (analysts
 * pick the customer and item of a job); quality managers and admins manage.
 */
export function customersRoutes(customers: CustomersService): Router {
  const r = Router();
  const read = requireRole(...STAFF_ROLES);
  const manage = requireRole('quality_manager', 'admin');
  const actor = (res: Parameters<typeof currentUser>[0]) => auditActor(currentUser(res));
  const p = (req: { params: unknown }) => req.params as Record<string, string>;

  r.get('/', read, async (_req, res) => {
    res.json({ customers: await customers.list() });
  });
  r.post('/', manage, validate({ body: customerInputSchema }), async (req, res) => {
    res.status(201).json({ customer: await customers.create(req.body as Out<typeof customerInputSchema>, actor(res)) });
  });
  r.get('/:id', read, validate({ params: customerParams }), async (req, res) => {
    res.json({ customer: await customers.get(p(req).id) });
  });
  r.put('/:id', manage, validate({ params: customerParams, body: customerInputSchema }), async (req, res) => {
    res.json({ customer: await customers.update(p(req).id, req.body as Out<typeof customerInputSchema>, actor(res)) });
  });

  r.post('/:id/contacts', manage, validate({ params: customerParams, body: contactInputSchema }), async (req, res) => {
    res.status(201).json({ contact: await customers.addContact(p(req).id, req.body as Out<typeof contactInputSchema>, actor(res)) });
  });
  r.put('/:id/contacts/:contactId', manage, validate({ params: contactParams, body: contactInputSchema }), async (req, res) => {
    res.json({ contact: await customers.updateContact(p(req).id, p(req).contactId, req.body as Out<typeof contactInputSchema>, actor(res)) });
  });
  r.delete('/:id/contacts/:contactId', manage, validate({ params: contactParams }), async (req, res) => {
    await customers.removeContact(p(req).id, p(req).contactId, actor(res));
    res.status(204).end();
  });

  r.get('/:id/items', read, validate({ params: customerParams }), async (req, res) => {
    await customers.get(p(req).id);
    res.json({ items: await customers.listItems({ customerId: p(req).id }) });
  });
  r.post('/:id/items', manage, validate({ params: customerParams, body: itemInputSchema }), async (req, res) => {
    res.status(201).json({ item: await customers.addItem(p(req).id, req.body as Out<typeof itemInputSchema>, actor(res)) });
  });
  r.put('/:id/items/:itemId', manage, validate({ params: itemParams, body: itemInputSchema }), async (req, res) => {
    res.json({ item: await customers.updateItem(p(req).id, p(req).itemId, req.body as Out<typeof itemInputSchema>, actor(res)) });
  });
  return r;
}
