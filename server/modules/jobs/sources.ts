/**
 * What jobs read from other parts of the lab's records: released template versions (issue 4),
 * customers' items and the reference-standard register (issue 7). The jobs service depends on
 * this interface only; modules/index.ts wires it to those modules.
 */
import { asc, eq, inArray } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { customerItems, referenceStandards, referenceStandardValues } from '../../db/schema';
import { NotFoundError } from '../../errors/app-error';
import { createTemplatesService } from '../templates/templates.service';
import { templateDefinitionSchema, type TemplateDefinition } from '../../../shared/schemas/template.schema';

export type JobTemplateVersion = {
  id: string;
  templateId: string;
  key: string | null;
  name: string;
  version: number;
  status: 'draft' | 'released' | 'retired';
  definition: TemplateDefinition;
};

export type JobItem = {
  id: string;
  customerId: string;
  description: string;
  maker: string | null;
  model: string | null;
  serial: string | null;
};

/** One certified value of a reference standard: value with U and k, in SI. */
export type CertifiedValue = { label: string; value: number; U: number; k: number; unit: string; at?: { value: number; unit: string } | null };

export type BudgetStandard = {
  id: string;
  name: string;
  identifier: string | null;
  kind: string | null;
  certificateNumber: string | null;
  /** YYYY-MM-DD: the standard may not be used in a calibration after this day. */
  dueDate: string | null;
  status: string;
  values: CertifiedValue[];
};

export interface JobSources {
  /** Each method takes the transaction it runs in, if any (PGlite has one connection: a query outside an open transaction would wait for it). */
  getTemplateVersion(id: string, tx?: Db): Promise<JobTemplateVersion | null>;
  listReleasedTemplateVersions(): Promise<JobTemplateVersion[]>;
  getItem(id: string, tx?: Db): Promise<JobItem | null>;
  listItems(customerId?: string): Promise<JobItem[]>;
  getStandard(id: string, tx?: Db): Promise<BudgetStandard | null>;
  listStandards(): Promise<BudgetStandard[]>;
}

/**
 * The sources from the other modules' records: template versions through the templates
 * service (issue 4); items and reference standards read from the register's tables (issue 7).
 */
export function createJobSources(db: Db, clock: () => Date): JobSources {
  const templatesService = createTemplatesService({ db, clock });
  const toStandard = (s: typeof referenceStandards.$inferSelect, values: Array<typeof referenceStandardValues.$inferSelect>): BudgetStandard => ({
    id: s.id,
    name: s.name,
    identifier: s.serialNumber || null,
    kind: s.kind,
    certificateNumber: s.certificateNumber || null,
    dueDate: s.dueDate,
    status: s.status,
    values: values
      .sort((a, b) => a.position - b.position)
      .map((v) => ({
        label: `${v.quantity}${v.atValue !== null ? ` at ${v.atValue} ${v.atUnit ?? ''}`.trimEnd() : ''}`,
        at: v.atValue === null ? null : { value: v.atValue, unit: v.atUnit ?? '' },
        value: v.value,
        U: v.expandedUncertainty,
        k: v.coverageFactor,
        unit: v.unit,
      })),
  });
  const toItem = (i: typeof customerItems.$inferSelect): JobItem => ({ id: i.id, customerId: i.customerId, description: i.description, maker: i.maker || null, model: i.model || null, serial: i.serialNumber || null });
  return {
    async getTemplateVersion(id, tx = db) {
      try {
        const v = await templatesService.getVersionForJob(id, tx);
        return { id: v.id, templateId: v.templateId, key: (v as { key?: string | null }).key ?? v.definition.key ?? null, name: v.name, version: v.version, status: v.status as JobTemplateVersion['status'], definition: templateDefinitionSchema.parse(v.definition) };
      } catch (err) {
        if (err instanceof NotFoundError) return null;
        throw err;
      }
    },
    async listReleasedTemplateVersions() {
      const list = await templatesService.listReleasedForNewJobs();
      const out: JobTemplateVersion[] = [];
      for (const r of list) {
        const v = await this.getTemplateVersion(r.id);
        if (v) out.push(v);
      }
      return out;
    },
    async getItem(id, tx = db) {
      const [row] = await tx.select().from(customerItems).where(eq(customerItems.id, id));
      return row ? toItem(row) : null;
    },
    async listItems(customerId) {
      const rows = await db.select().from(customerItems).where(customerId ? eq(customerItems.customerId, customerId) : undefined).orderBy(asc(customerItems.description));
      return rows.map(toItem);
    },
    async getStandard(id, tx = db) {
      if (!/^[0-9a-f-]{36}$/i.test(id)) return null;
      const [row] = await tx.select().from(referenceStandards).where(eq(referenceStandards.id, id));
      if (!row) return null;
      const values = await tx.select().from(referenceStandardValues).where(eq(referenceStandardValues.standardId, id));
      return toStandard(row, values);
    },
    async listStandards() {
      const rows = await db.select().from(referenceStandards).orderBy(asc(referenceStandards.name));
      const values = rows.length ? await db.select().from(referenceStandardValues).where(inArray(referenceStandardValues.standardId, rows.map((r) => r.id))) : [];
      return rows.map((r) => toStandard(r, values.filter((v) => v.standardId === r.id)));
    },
  };
}
