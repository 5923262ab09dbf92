import { sql } from 'drizzle-orm';
import { check, index, integer, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { user } from './auth';

/*
 * Measurement-model templates and their versions (issue 4). A version is drafted, released
 * (then frozen: the database refuses changes to its definition, number, validation record and
 * release columns, and its deletion; migration 0001's trigger) and finally retired, which hides
 * it from new jobs while jobs that already use it keep it.
 *
 * The JSON columns hold documents of shared/schemas/template.schema.ts; the repository parses
 * them with those schemas on every read and write (the database does not check their shape).
 */

export const TEMPLATE_STATUSES = ['draft', 'released', 'retired'] as const;
export type TemplateStatus = (typeof TEMPLATE_STATUSES)[number];

export const templates = pgTable('templates', {
  id: uuid('id').primaryKey().defaultRandom(),
  /** Stable key of a shipped template (its file name without .json); null for lab-written ones. */
  key: text('key').unique(),
  name: text('name').notNull(),
  createdBy: uuid('created_by').references(() => user.id, { onDelete: 'restrict' }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

export const templateVersions = pgTable(
  'template_versions',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    templateId: uuid('template_id')
      .notNull()
      .references(() => templates.id, { onDelete: 'restrict' }),
    version: integer('version').notNull(),
    status: text('status').$type<TemplateStatus>().notNull().default('draft'),
    /** The template document (templateDefinitionSchema). */
    definition: jsonb('definition').notNull(),
    createdBy: uuid('created_by').references(() => user.id, { onDelete: 'restrict' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedBy: uuid('updated_by').references(() => user.id, { onDelete: 'restrict' }),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
    releasedBy: uuid('released_by').references(() => user.id, { onDelete: 'restrict' }),
    releasedAt: timestamp('released_at', { withTimezone: true }),
    retiredAt: timestamp('retired_at', { withTimezone: true }),
    /** The last validation record (validationRecordSchema); for a released version, the one that released it. */
    validation: jsonb('validation'),
  },
  (t) => [
    uniqueIndex('template_versions_number_idx').on(t.templateId, t.version),
    // At most one open draft per template: "new version from" refuses while one exists.
    uniqueIndex('template_versions_one_draft_idx').on(t.templateId).where(sql`${t.status} = 'draft'`),
    index('template_versions_status_idx').on(t.status),
    check('template_versions_status_check', sql`${t.status} IN ('draft', 'released', 'retired')`),
    check('template_versions_version_check', sql`${t.version} >= 1`),
    check('template_versions_released_check', sql`${t.status} = 'draft' OR (${t.releasedAt} IS NOT NULL AND ${t.releasedBy} IS NOT NULL AND ${t.validation} IS NOT NULL)`),
    check('template_versions_retired_check', sql`(${t.status} = 'retired') = (${t.retiredAt} IS NOT NULL)`),
  ],
);
