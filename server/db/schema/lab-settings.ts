import { sql } from 'drizzle-orm';
import { check, integer, pgTable, text, timestamp } from 'drizzle-orm/pg-core';

/** The laboratory's own details: exactly one row, id 1. */
export const labSettings = pgTable(
  'lab_settings',
  {
    id: integer('id').primaryKey().default(1),
    name: text('name').notNull(),
    address: text('address').notNull().default(''),
    accreditationNumber: text('accreditation_number').notNull().default(''),
    contactEmail: text('contact_email').notNull().default(''),
    contactPhone: text('contact_phone').notNull().default(''),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [check('lab_settings_single_row', sql`${t.id} = 1`)],
);
