import { asc, eq, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { customerContacts, customers } from '../../db/schema';

export type CustomerSummary = { id: string; organisation: string; address: string; contactCount: number };

export function createCustomersRepository(db: Db) {
  return {
    async list(): Promise<CustomerSummary[]> {
      return db
        .select({
          id: customers.id,
          organisation: customers.organisation,
          address: customers.address,
          contactCount: sql<number>`cast(count(${customerContacts.id}) as int)`,
        })
        .from(customers)
        .leftJoin(customerContacts, eq(customerContacts.customerId, customers.id))
        .groupBy(customers.id)
        .orderBy(asc(customers.organisation));
    },
    async exists(id: string, tx: Db = db): Promise<boolean> {
      const rows = await tx.select({ id: customers.id }).from(customers).where(eq(customers.id, id));
      return rows.length > 0;
    },
  };
}
export type CustomersRepository = ReturnType<typeof createCustomersRepository>;
