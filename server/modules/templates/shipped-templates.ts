/**
 * The shipped templates (templates/*.json): read and parsed with the template schema, and seeded
 * released as version 1 by the demo quality manager, each with the validation record of its
 * release (the same checks the API runs; a shipped template that fails them stops the seed).
 */
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { eq } from 'drizzle-orm';
import { recordAudit } from '../../audit';
import type { Db } from '../../db/client';
import { user } from '../../db/schema';
import { templateDefinitionSchema, type TemplateDefinition } from '../../../shared/schemas/template.schema';
import { createTemplatesRepository } from './templates.repository';
import { validateTemplate } from './template-validation';

/** Finds `templates/` by walking up from this file (works from server/modules and dist/server). */
export function shippedTemplatesFolder(): string {
  let dir = path.dirname(fileURLToPath(import.meta.url));
  for (;;) {
    const candidate = path.join(dir, 'templates');
    if (fs.existsSync(path.join(candidate, 'ir-thermometer-blackbody.json'))) return candidate;
    const parent = path.dirname(dir);
    if (parent === dir) throw new Error('The shipped templates folder templates/ was not found above ' + fileURLToPath(import.meta.url));
    dir = parent;
  }
}

/** Every templates/*.json, parsed; a file that does not parse stops with its name and the issues. */
export function loadShippedTemplates(folder = shippedTemplatesFolder()): Array<{ file: string; definition: TemplateDefinition }> {
  return fs
    .readdirSync(folder)
    .filter((f) => f.endsWith('.json'))
    .sort()
    .map((file) => {
      const r = templateDefinitionSchema.safeParse(JSON.parse(fs.readFileSync(path.join(folder, file), 'utf8')));
      if (!r.success) throw new Error(`templates/${file} is not a valid template: ${r.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`);
      return { file, definition: { ...r.data, key: r.data.key ?? path.basename(file, '.json') } };
    });
}

/** Seeds each shipped template not yet present (by key), released as version 1 by `releasedByEmail`. */
export async function seedShippedTemplates(tx: Db, opts: { releasedByEmail: string; clock: () => Date }): Promise<string[]> {
  const repo = createTemplatesRepository(tx);
  const [qm] = await tx.select({ id: user.id, name: user.name, role: user.role }).from(user).where(eq(user.email, opts.releasedByEmail));
  if (!qm) throw new Error(`the demo quality manager ${opts.releasedByEmail} must be seeded before the templates`);
  const seeded: string[] = [];
  for (const { file, definition } of loadShippedTemplates()) {
    const key = definition.key!;
    if (await repo.findTemplateByKey(key, tx)) continue;
    const now = opts.clock();
    const record = validateTemplate(definition, { purpose: 'release', by: { id: qm.id, name: qm.name }, at: now });
    if (!record.passed) {
      const failed = record.checks.filter((c) => c.passed === false).flatMap((c) => c.messages.map((m) => `${c.id}: ${m.message}`));
      throw new Error(`shipped template templates/${file} fails release validation: ${failed.join('; ')}`);
    }
    const templateId = await repo.insertTemplate({ key, name: definition.name, createdBy: qm.id, now }, tx);
    const id = await repo.insertVersion({ templateId, version: 1, definition, by: qm.id, now }, tx);
    await repo.markReleased(id, record, qm.id, now, tx);
    await recordAudit(tx, {
      actor: { id: qm.id, name: qm.name, role: qm.role },
      action: 'release',
      entity: 'template_version',
      entityId: id,
      after: { templateId, version: 1, status: 'released', name: definition.name, shippedFile: `templates/${file}`, validation: record },
      at: now,
    });
    seeded.push(key);
  }
  return seeded;
}

/** Seed step (server/db/seed SEED_STEPS): after the demo users, before anything that uses a template. */
export const shippedTemplatesSeedStep = {
  name: 'shipped-templates',
  async run({ db, clock }: { db: Db; clock: () => Date }): Promise<void> {
    await seedShippedTemplates(db, { releasedByEmail: 'quality@emberline-demo.test', clock });
  },
};
