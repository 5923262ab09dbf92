import { and, asc, eq, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { customerItems, customers } from '../../db/schema';
import { itemLabel, type Item } from '../../../shared/schemas/customers.schema';

export type ItemFields = { description: string; maker: string; model: string; serialNumber: string; notes: string };

const columns = {
  id: customerItems.id,
  customerId: customerItems.customerId,
  customerName: customers.organisation,
  description: customerItems.description,
  maker: customerItems.maker,
  model: customerItems.model,
  serialNumber: customerItems.serialNumber,
  notes: customerItems.notes,
};

const toItem = (r: Omit<Item, 'label'>): Item => ({ ...r, label: itemLabel(r) });

export function createItemsRepository(db: Db) {
  return {
    async list(filter: { customerId?: string; q?: string } = {}, tx: Db = db): Promise<Item[]> {
      const q = filter.q ? `%${filter.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` : null;
      const rows = await tx
        .select(columns)
        .from(customerItems)
        .innerJoin(customers, eq(customers.id, customerItems.customerId))
        .where(
          and(
            filter.customerId ? eq(customerItems.customerId, filter.customerId) : undefined,
            q
              ? sql`(${customerItems.description} ilike ${q} or ${customerItems.maker} ilike ${q} or ${customerItems.model} ilike ${q} or ${customerItems.serialNumber} ilike ${q})`
              : undefined,
          ),
        )
        .orderBy(asc(customers.organisation), asc(customerItems.description), asc(customerItems.serialNumber));
      return rows.map(toItem);
    },
    async find(id: string, tx: Db = db): Promise<Item | null> {
      const [row] = await tx.select(columns).from(customerItems).innerJoin(customers, eq(customers.id, customerItems.customerId)).where(eq(customerItems.id, id));
      return row ? toItem(row) : null;
    },
    async findIdByIdentity(customerId: string, f: Pick<ItemFields, 'maker' | 'model' | 'serialNumber'>, tx: Db = db): Promise<string | null> {
      const [row] = await tx
        .select({ id: customerItems.id })
        .from(customerItems)
        .where(and(eq(customerItems.customerId, customerId), eq(customerItems.maker, f.maker), eq(customerItems.model, f.model), eq(customerItems.serialNumber, f.serialNumber)));
      return row?.id ?? null;
    },
    async insert(customerId: string, fields: ItemFields, now: Date, tx: Db = db): Promise<string> {
      const [row] = await tx.insert(customerItems).values({ ...fields, customerId, createdAt: now, updatedAt: now }).returning({ id: customerItems.id });
      return row.id;
    },
    async update(id: string, fields: ItemFields, now: Date, tx: Db = db): Promise<void> {
      await tx.update(customerItems).set({ ...fields, updatedAt: now }).where(eq(customerItems.id, id));
    },
  };
}
export type ItemsRepository = ReturnType<typeof createItemsRepository>;
