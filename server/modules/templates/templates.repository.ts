import { aliasedTable, and, asc, desc, eq, inArray, max } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { templates, templateVersions, user } from '../../db/schema';
import {
  templateDefinitionSchema,
  validationRecordSchema,
  type TemplateDefinition,
  type TemplateStatus,
  type TemplateVersion,
  type TemplateVersionRef,
  type ValidationRecord,
} from '../../../shared/schemas/template.schema';

/*
 * Drizzle only. JSON columns are parsed with the shared schemas on every read and write: a
 * stored definition that no longer parses is an error here, never a half-read document.
 */

const createdByUser = aliasedTable(user, 'created_by_user');
const updatedByUser = aliasedTable(user, 'updated_by_user');
const releasedByUser = aliasedTable(user, 'released_by_user');

const versionColumns = {
  id: templateVersions.id,
  templateId: templateVersions.templateId,
  key: templates.key,
  version: templateVersions.version,
  status: templateVersions.status,
  definition: templateVersions.definition,
  createdById: templateVersions.createdBy,
  createdByName: createdByUser.name,
  createdAt: templateVersions.createdAt,
  updatedById: templateVersions.updatedBy,
  updatedByName: updatedByUser.name,
  updatedAt: templateVersions.updatedAt,
  releasedById: templateVersions.releasedBy,
  releasedByName: releasedByUser.name,
  releasedAt: templateVersions.releasedAt,
  retiredAt: templateVersions.retiredAt,
  validation: templateVersions.validation,
};

type VersionRow = {
  id: string;
  templateId: string;
  key: string | null;
  version: number;
  status: TemplateStatus;
  definition: unknown;
  createdById: string | null;
  createdByName: string | null;
  createdAt: Date;
  updatedById: string | null;
  updatedByName: string | null;
  updatedAt: Date;
  releasedById: string | null;
  releasedByName: string | null;
  releasedAt: Date | null;
  retiredAt: Date | null;
  validation: unknown;
};

const person = (id: string | null, name: string | null) => (id ? { id, name: name ?? 'unknown user' } : null);

/** Parses a stored definition; a stored document that no longer parses is a server fault. */
export function parseStoredDefinition(raw: unknown, where: string): TemplateDefinition {
  const r = templateDefinitionSchema.safeParse(raw);
  if (!r.success) throw new Error(`stored template definition of ${where} does not match the template schema: ${r.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`);
  return r.data;
}

function toVersion(r: VersionRow): TemplateVersion {
  return {
    id: r.id,
    templateId: r.templateId,
    key: r.key,
    version: r.version,
    status: r.status,
    definition: parseStoredDefinition(r.definition, `version ${r.id}`),
    createdBy: person(r.createdById, r.createdByName),
    createdAt: r.createdAt.toISOString(),
    updatedBy: person(r.updatedById, r.updatedByName),
    updatedAt: r.updatedAt.toISOString(),
    releasedBy: person(r.releasedById, r.releasedByName),
    releasedAt: r.releasedAt?.toISOString() ?? null,
    retiredAt: r.retiredAt?.toISOString() ?? null,
    validation: r.validation == null ? null : validationRecordSchema.parse(r.validation),
  };
}

const writeDefinition = (d: TemplateDefinition) => templateDefinitionSchema.parse(d);
const writeValidation = (v: ValidationRecord) => validationRecordSchema.parse(v);

export type TemplateRow = { id: string; key: string | null; name: string; createdAt: Date };
export type VersionListRow = TemplateVersionRef & { templateId: string; definition: TemplateDefinition };

export function createTemplatesRepository(db: Db) {
  const selectVersions = (tx: Db) =>
    tx
      .select(versionColumns)
      .from(templateVersions)
      .innerJoin(templates, eq(templates.id, templateVersions.templateId))
      .leftJoin(createdByUser, eq(createdByUser.id, templateVersions.createdBy))
      .leftJoin(updatedByUser, eq(updatedByUser.id, templateVersions.updatedBy))
      .leftJoin(releasedByUser, eq(releasedByUser.id, templateVersions.releasedBy));

  return {
    async listTemplates(tx: Db = db): Promise<TemplateRow[]> {
      return tx.select({ id: templates.id, key: templates.key, name: templates.name, createdAt: templates.createdAt }).from(templates).orderBy(asc(templates.name));
    },

    /** Every version of the given statuses (all when omitted), newest first within a template. */
    async listVersions(statuses?: readonly TemplateStatus[], tx: Db = db): Promise<VersionListRow[]> {
      const q = tx
        .select({
          id: templateVersions.id,
          templateId: templateVersions.templateId,
          version: templateVersions.version,
          status: templateVersions.status,
          updatedAt: templateVersions.updatedAt,
          releasedAt: templateVersions.releasedAt,
          retiredAt: templateVersions.retiredAt,
          definition: templateVersions.definition,
        })
        .from(templateVersions)
        .where(statuses ? inArray(templateVersions.status, [...statuses]) : undefined)
        .orderBy(asc(templateVersions.templateId), desc(templateVersions.version));
      const rows = await q;
      return rows.map((r) => ({
        id: r.id,
        templateId: r.templateId,
        version: r.version,
        status: r.status,
        updatedAt: r.updatedAt.toISOString(),
        releasedAt: r.releasedAt?.toISOString() ?? null,
        retiredAt: r.retiredAt?.toISOString() ?? null,
        definition: parseStoredDefinition(r.definition, `version ${r.id}`),
      }));
    },

    async findVersion(id: string, tx: Db = db): Promise<TemplateVersion | null> {
      const [row] = await selectVersions(tx).where(eq(templateVersions.id, id));
      return row ? toVersion(row as VersionRow) : null;
    },

    async findTemplate(id: string, tx: Db = db): Promise<TemplateRow | null> {
      const [row] = await tx.select({ id: templates.id, key: templates.key, name: templates.name, createdAt: templates.createdAt }).from(templates).where(eq(templates.id, id));
      return row ?? null;
    },

    async findTemplateByKey(key: string, tx: Db = db): Promise<TemplateRow | null> {
      const [row] = await tx.select({ id: templates.id, key: templates.key, name: templates.name, createdAt: templates.createdAt }).from(templates).where(eq(templates.key, key));
      return row ?? null;
    },

    async insertTemplate(row: { key: string | null; name: string; createdBy: string | null; now: Date }, tx: Db = db): Promise<string> {
      const [created] = await tx.insert(templates).values({ key: row.key, name: row.name, createdBy: row.createdBy, createdAt: row.now }).returning({ id: templates.id });
      return created.id;
    },

    async renameTemplate(id: string, name: string, tx: Db = db): Promise<void> {
      await tx.update(templates).set({ name }).where(eq(templates.id, id));
    },

    async insertVersion(
      row: { templateId: string; version: number; definition: TemplateDefinition; by: string | null; now: Date },
      tx: Db = db,
    ): Promise<string> {
      const [created] = await tx
        .insert(templateVersions)
        .values({
          templateId: row.templateId,
          version: row.version,
          status: 'draft',
          definition: writeDefinition(row.definition),
          createdBy: row.by,
          createdAt: row.now,
          updatedBy: row.by,
          updatedAt: row.now,
        })
        .returning({ id: templateVersions.id });
      return created.id;
    },

    /** Row lock on one version until the transaction ends (release reads, checks, then writes). */
    async lockVersion(id: string, tx: Db = db): Promise<void> {
      await tx.select({ id: templateVersions.id }).from(templateVersions).where(eq(templateVersions.id, id)).for('update');
    },

    async maxVersion(templateId: string, tx: Db = db): Promise<number> {
      const [row] = await tx.select({ v: max(templateVersions.version) }).from(templateVersions).where(eq(templateVersions.templateId, templateId));
      return row?.v ?? 0;
    },

    async findDraft(templateId: string, tx: Db = db): Promise<string | null> {
      const [row] = await tx
        .select({ id: templateVersions.id })
        .from(templateVersions)
        .where(and(eq(templateVersions.templateId, templateId), eq(templateVersions.status, 'draft')));
      return row?.id ?? null;
    },

    /** Updates a draft's definition; returns false when the row is no longer a draft. */
    async updateDraft(id: string, definition: TemplateDefinition, by: string | null, now: Date, tx: Db = db): Promise<boolean> {
      const rows = await tx
        .update(templateVersions)
        .set({ definition: writeDefinition(definition), updatedBy: by, updatedAt: now, validation: null })
        .where(and(eq(templateVersions.id, id), eq(templateVersions.status, 'draft')))
        .returning({ id: templateVersions.id });
      return rows.length === 1;
    },

    async storeValidation(id: string, record: ValidationRecord, tx: Db = db): Promise<boolean> {
      const rows = await tx
        .update(templateVersions)
        .set({ validation: writeValidation(record) })
        .where(and(eq(templateVersions.id, id), eq(templateVersions.status, 'draft')))
        .returning({ id: templateVersions.id });
      return rows.length === 1;
    },

    async markReleased(id: string, record: ValidationRecord, by: string, now: Date, tx: Db = db): Promise<boolean> {
      const rows = await tx
        .update(templateVersions)
        .set({ status: 'released', validation: writeValidation(record), releasedBy: by, releasedAt: now, updatedBy: by, updatedAt: now })
        .where(and(eq(templateVersions.id, id), eq(templateVersions.status, 'draft')))
        .returning({ id: templateVersions.id });
      return rows.length === 1;
    },

    async markRetired(id: string, by: string | null, now: Date, tx: Db = db): Promise<boolean> {
      const rows = await tx
        .update(templateVersions)
        .set({ status: 'retired', retiredAt: now, updatedBy: by, updatedAt: now })
        .where(and(eq(templateVersions.id, id), eq(templateVersions.status, 'released')))
        .returning({ id: templateVersions.id });
      return rows.length === 1;
    },
  };
}
export type TemplatesRepository = ReturnType<typeof createTemplatesRepository>;
