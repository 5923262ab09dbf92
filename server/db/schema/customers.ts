import { boolean, index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

/** The lab's customer organisations (invented in the demo). */
export const customers = pgTable('customers', {
  id: uuid('id').primaryKey().defaultRandom(),
  organisation: text('organisation').notNull(),
  address: text('address').notNull().default(''),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/** People at a customer organisation; those flagged receive issued certificates by e-mail. */
export const customerContacts = pgTable(
  'customer_contacts',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    customerId: uuid('customer_id')
      .notNull()
      .references(() => customers.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    email: text('email').notNull(),
    receivesCertificates: boolean('receives_certificates').notNull().default(true),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('customer_contacts_customer_idx').on(t.customerId)],
);
