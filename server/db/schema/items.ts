import { index, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { customers } from './customers';

/** Instruments customers send for calibration (demo data invented). Jobs refer to them. */
export const customerItems = pgTable(
  'customer_items',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    customerId: uuid('customer_id')
      .notNull()
      .references(() => customers.id, { onDelete: 'restrict' }),
    description: text('description').notNull(),
    maker: text('maker').notNull().default(''),
    model: text('model').notNull().default(''),
    serialNumber: text('serial_number').notNull(),
    notes: text('notes').notNull().default(''),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('customer_items_customer_idx').on(t.customerId),
    uniqueIndex('customer_items_identity_unique').on(t.customerId, t.maker, t.model, t.serialNumber),
  ],
);
