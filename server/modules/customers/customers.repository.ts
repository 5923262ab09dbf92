import { asc, eq, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { customerContacts, customers } from '../../db/schema';
import type { Contact } from '../../../shared/schemas/customers.schema';

export type CustomerSummary = { id: string; organisation: string; address: string; contactCount: number; itemCount: number };
export type CustomerRow = typeof customers.$inferSelect;

const toContact = (r: typeof customerContacts.$inferSelect): Contact => ({
  id: r.id,
  customerId: r.customerId,
  name: r.name,
  email: r.email,
  receivesCertificates: r.receivesCertificates,
});

export function createCustomersRepository(db: Db) {
  return {
    async list(): Promise<CustomerSummary[]> {
      return db
        .select({
          id: customers.id,
          organisation: customers.organisation,
          address: customers.address,
          contactCount: sql<number>`(select cast(count(*) as int) from customer_contacts cc where cc.customer_id = "customers"."id")`,
          itemCount: sql<number>`(select cast(count(*) as int) from customer_items ci where ci.customer_id = "customers"."id")`,
        })
        .from(customers)
        .orderBy(asc(customers.organisation));
    },
    async exists(id: string, tx: Db = db): Promise<boolean> {
      const rows = await tx.select({ id: customers.id }).from(customers).where(eq(customers.id, id));
      return rows.length > 0;
    },
    async find(id: string, tx: Db = db): Promise<CustomerRow | null> {
      const [row] = await tx.select().from(customers).where(eq(customers.id, id));
      return row ?? null;
    },
    async findIdByOrganisation(organisation: string, tx: Db = db): Promise<string | null> {
      const [row] = await tx.select({ id: customers.id }).from(customers).where(sql`lower(${customers.organisation}) = lower(${organisation})`);
      return row?.id ?? null;
    },
    async insert(fields: { organisation: string; address: string }, now: Date, tx: Db = db): Promise<string> {
      const [row] = await tx.insert(customers).values({ ...fields, createdAt: now, updatedAt: now }).returning({ id: customers.id });
      return row.id;
    },
    async update(id: string, fields: { organisation: string; address: string }, now: Date, tx: Db = db): Promise<void> {
      await tx.update(customers).set({ ...fields, updatedAt: now }).where(eq(customers.id, id));
    },
    async contacts(customerId: string, tx: Db = db): Promise<Contact[]> {
      const rows = await tx.select().from(customerContacts).where(eq(customerContacts.customerId, customerId)).orderBy(asc(customerContacts.name));
      return rows.map(toContact);
    },
    async findContact(id: string, tx: Db = db): Promise<Contact | null> {
      const [row] = await tx.select().from(customerContacts).where(eq(customerContacts.id, id));
      return row ? toContact(row) : null;
    },
    async insertContact(customerId: string, fields: { name: string; email: string; receivesCertificates: boolean }, now: Date, tx: Db = db): Promise<string> {
      const [row] = await tx.insert(customerContacts).values({ ...fields, customerId, createdAt: now }).returning({ id: customerContacts.id });
      return row.id;
    },
    async updateContact(id: string, fields: { name: string; email: string; receivesCertificates: boolean }, tx: Db = db): Promise<void> {
      await tx.update(customerContacts).set(fields).where(eq(customerContacts.id, id));
    },
    async deleteContact(id: string, tx: Db = db): Promise<void> {
      await tx.delete(customerContacts).where(eq(customerContacts.id, id));
    },
    /** E-mail addresses that receive this customer's issued certificates. */
    async certificateRecipients(customerId: string, tx: Db = db): Promise<string[]> {
      const rows = await this.contacts(customerId, tx);
      return rows.filter((c) => c.receivesCertificates).map((c) => c.email);
    },
  };
}
export type CustomersRepository = ReturnType<typeof createCustomersRepository>;
