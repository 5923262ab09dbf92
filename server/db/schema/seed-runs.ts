import { pgTable, text, timestamp } from 'drizzle-orm/pg-core';

/** One row per demo-seed step that has run (server/db/seed): each step runs once per database. */
export const seedRuns = pgTable('seed_runs', {
  step: text('step').primaryKey(),
  ranAt: timestamp('ran_at', { withTimezone: true }).notNull().defaultNow(),
});
