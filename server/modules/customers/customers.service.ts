import type { Db } from '../../db/client';
import { recordAudit, type AuditActor } from '../../audit';
import { ConflictError, NotFoundError } from '../../errors/app-error';
import type { Contact, CustomerDetail, Item } from '../../../shared/schemas/customers.schema';
import type { ItemsRepository, ItemFields } from '../items/items.repository';
import type { CustomerSummary, CustomersRepository } from './customers.repository';

type CustomerFields = { organisation: string; address: string };
type ContactFields = { name: string; email: string; receivesCertificates: boolean };

/**
 * Customers, their contacts (who receives certificates) and their items. Every change is
 * audited in its own transaction (ISO/IEC 17025:2017 §7.5, §8.4).
 */
export function createCustomersService(deps: { db: Db; customersRepo: CustomersRepository; itemsRepo: ItemsRepository; clock: () => Date }) {
  const { customersRepo: customers, itemsRepo: items } = deps;

  async function detail(id: string, tx: Db = deps.db): Promise<CustomerDetail | null> {
    const row = await customers.find(id, tx);
    if (!row) return null;
    return { id: row.id, organisation: row.organisation, address: row.address, contacts: await customers.contacts(id, tx), items: await items.list({ customerId: id }, tx) };
  }

  async function mustExist(id: string, tx: Db) {
    const row = await customers.find(id, tx);
    if (!row) throw new NotFoundError('No customer has this id.');
    return row;
  }

  async function organisationFree(organisation: string, exceptId: string | null, tx: Db) {
    const other = await customers.findIdByOrganisation(organisation, tx);
    if (other && other !== exceptId) throw new ConflictError(`A customer named "${organisation}" already exists.`, 'ORGANISATION_TAKEN');
  }

  async function contactOf(customerId: string, contactId: string, tx: Db): Promise<Contact> {
    const c = await customers.findContact(contactId, tx);
    if (!c || c.customerId !== customerId) throw new NotFoundError('This customer has no contact with this id.');
    return c;
  }

  async function contactEmailFree(customerId: string, email: string, exceptId: string | null, tx: Db) {
    const clash = (await customers.contacts(customerId, tx)).find((c) => c.email === email && c.id !== exceptId);
    if (clash) throw new ConflictError(`${email} is already a contact of this customer.`, 'CONTACT_EXISTS');
  }

  async function itemOf(customerId: string, itemId: string, tx: Db): Promise<Item> {
    const i = await items.find(itemId, tx);
    if (!i || i.customerId !== customerId) throw new NotFoundError('This customer has no item with this id.');
    return i;
  }

  async function itemIdentityFree(customerId: string, f: ItemFields, exceptId: string | null, tx: Db) {
    const other = await items.findIdByIdentity(customerId, f, tx);
    if (other && other !== exceptId) {
      throw new ConflictError(`This customer already has an item ${[f.maker, f.model].filter(Boolean).join(' ')} with serial number ${f.serialNumber}.`, 'ITEM_EXISTS');
    }
  }

  return {
    list(): Promise<CustomerSummary[]> {
      return customers.list();
    },
    async get(id: string): Promise<CustomerDetail> {
      const d = await detail(id);
      if (!d) throw new NotFoundError('No customer has this id.');
      return d;
    },
    create(input: CustomerFields, actor: AuditActor | null): Promise<CustomerDetail> {
      return deps.db.transaction(async (tx) => {
        await organisationFree(input.organisation, null, tx);
        const now = deps.clock();
        const id = await customers.insert(input, now, tx);
        await recordAudit(tx, { actor, action: 'create', entity: 'customer', entityId: id, after: input, at: now });
        return (await detail(id, tx))!;
      });
    },
    update(id: string, input: CustomerFields, actor: AuditActor | null): Promise<CustomerDetail> {
      return deps.db.transaction(async (tx) => {
        const before = await mustExist(id, tx);
        await organisationFree(input.organisation, id, tx);
        const now = deps.clock();
        await customers.update(id, input, now, tx);
        await recordAudit(tx, { actor, action: 'update', entity: 'customer', entityId: id, before: { organisation: before.organisation, address: before.address }, after: input, at: now });
        return (await detail(id, tx))!;
      });
    },

    addContact(customerId: string, input: ContactFields, actor: AuditActor | null): Promise<Contact> {
      return deps.db.transaction(async (tx) => {
        await mustExist(customerId, tx);
        await contactEmailFree(customerId, input.email, null, tx);
        const now = deps.clock();
        const id = await customers.insertContact(customerId, input, now, tx);
        const after = (await customers.findContact(id, tx))!;
        await recordAudit(tx, { actor, action: 'create', entity: 'customer_contact', entityId: id, after, at: now });
        return after;
      });
    },
    updateContact(customerId: string, contactId: string, input: ContactFields, actor: AuditActor | null): Promise<Contact> {
      return deps.db.transaction(async (tx) => {
        const before = await contactOf(customerId, contactId, tx);
        await contactEmailFree(customerId, input.email, contactId, tx);
        await customers.updateContact(contactId, input, tx);
        const after = (await customers.findContact(contactId, tx))!;
        await recordAudit(tx, { actor, action: 'update', entity: 'customer_contact', entityId: contactId, before, after, at: deps.clock() });
        return after;
      });
    },
    removeContact(customerId: string, contactId: string, actor: AuditActor | null): Promise<void> {
      return deps.db.transaction(async (tx) => {
        const before = await contactOf(customerId, contactId, tx);
        await customers.deleteContact(contactId, tx);
        await recordAudit(tx, { actor, action: 'delete', entity: 'customer_contact', entityId: contactId, before, at: deps.clock() });
      });
    },

    listItems(filter: { customerId?: string; q?: string }): Promise<Item[]> {
      return items.list(filter);
    },
    async getItem(id: string): Promise<Item> {
      const i = await items.find(id);
      if (!i) throw new NotFoundError('No item has this id.');
      return i;
    },
    addItem(customerId: string, input: ItemFields, actor: AuditActor | null): Promise<Item> {
      return deps.db.transaction(async (tx) => {
        await mustExist(customerId, tx);
        await itemIdentityFree(customerId, input, null, tx);
        const now = deps.clock();
        const id = await items.insert(customerId, input, now, tx);
        const after = (await items.find(id, tx))!;
        await recordAudit(tx, { actor, action: 'create', entity: 'customer_item', entityId: id, after, at: now });
        return after;
      });
    },
    updateItem(customerId: string, itemId: string, input: ItemFields, actor: AuditActor | null): Promise<Item> {
      return deps.db.transaction(async (tx) => {
        const before = await itemOf(customerId, itemId, tx);
        await itemIdentityFree(customerId, input, itemId, tx);
        const now = deps.clock();
        await items.update(itemId, input, now, tx);
        const after = (await items.find(itemId, tx))!;
        await recordAudit(tx, { actor, action: 'update', entity: 'customer_item', entityId: itemId, before, after, at: now });
        return after;
      });
    },
  };
}
export type CustomersService = ReturnType<typeof createCustomersService>;
