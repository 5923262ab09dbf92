/**
 * /api/templates: drafts, release validation (ISO/IEC 17025:2017 §7.2.2 validation of methods),
 * the frozen released version (API 409 and the database trigger), new versions, retirement,
 * roles, and the five shipped templates seeded released with their validation records.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../setup/test-app';
import { createTemplatesService } from '../../server/modules/templates/templates.service';
import type { TemplateDefinition, TemplateSummary, TemplateVersion, ValidationRecord } from '../../shared/schemas/template.schema';

type Agent = Awaited<ReturnType<TestApp['signIn']>>;

/** A small valid model: E = T_ind − T_ref with normal inputs; y and u by hand (GUM 5.1.2, c = ±1). */
function simpleDefinition(over: Partial<TemplateDefinition> = {}): TemplateDefinition {
  return {
    name: 'Comparison with a reference thermometer (test)',
    measurand: { symbol: 'E', unit: 'K', description: 'error of indication' },
    equations: ['E = T_ind - T_ref'],
    inputs: [
      { symbol: 'T_ind', unit: 'K', description: 'indication', source: 'readings', distribution: { type: 'normal', mean: 300.3, sd: 0.03 } },
      { symbol: 'T_ref', unit: 'K', description: 'reference temperature', source: 'reference', distribution: { type: 'normal', mean: 300, sd: 0.04 } },
    ],
    certificate: { resultLabel: 'Error of indication', methodStatement: 'Comparison with a reference thermometer.' },
    // y = 300.3 − 300 = 0.3 K; u = √(0.03² + 0.04²) = 0.05 K (worked by hand).
    referenceCase: { source: 'worked by hand: y = 0.3 K, u = √(0.03² + 0.04²) = 0.05 K', expected: { y: 0.3, u: 0.05 }, tolerance: { yAbs: 1e-9, uRel: 1e-9 } },
    ...over,
  } as TemplateDefinition;
}

let t: TestApp;
let qm: Agent;
let analyst: Agent;

beforeAll(async () => {
  t = await createTestApp();
  qm = await t.signIn('quality_manager');
  analyst = await t.signIn('analyst');
});
afterAll(async () => {
  await t?.close();
});

async function createDraft(def: TemplateDefinition = simpleDefinition()): Promise<TemplateVersion> {
  const res = await qm.post('/api/templates').send({ definition: def }).expect(201);
  return res.body.version as TemplateVersion;
}

describe('shipped templates seeded at first start', () => {
  it('when the demo is seeded, then the five shipped templates are released as version 1 by the demo quality manager, each with a passed validation record', async () => {
    const res = await qm.get('/api/templates').expect(200);
    const list = res.body.templates as TemplateSummary[];
    const keys = readdirSync(join(import.meta.dirname, '../../templates')).filter((f) => f.endsWith('.json')).map((f) => f.replace(/\.json$/, ''));
    expect(keys.length).toBeGreaterThanOrEqual(5);
    for (const key of keys) {
      const row = list.find((r) => r.key === key);
      expect(row, key).toBeTruthy();
      expect(row!.latest).toMatchObject({ version: 1, status: 'released' });
      const v = (await qm.get(`/api/templates/versions/${row!.latest.id}`).expect(200)).body.version as TemplateVersion;
      expect(v.releasedBy?.name).toBe('Quinn Quality (demo)');
      expect(v.validation?.passed).toBe(true);
      expect(v.validation?.purpose).toBe('release');
      expect(v.validation?.engineVersion).toMatch(/emberline-engine/);
      expect(v.validation?.checks.map((c) => c.passed)).toEqual([true, true, true, true, true, true]);
      expect(v.validation?.referenceCase?.obtained).not.toBeNull();
    }
  });
});

describe('roles', () => {
  it('when signed out, then the list answers 401', async () => {
    await request(t.app).get('/api/templates').expect(401);
  });

  it('when an analyst creates or edits a template, then 403 and nothing changes', async () => {
    await analyst.post('/api/templates').send({ name: 'Analyst template' }).expect(403);
    const draft = await createDraft();
    await analyst.put(`/api/templates/versions/${draft.id}`).send({ definition: simpleDefinition({ name: 'Changed by analyst' }) }).expect(403);
    await analyst.post(`/api/templates/versions/${draft.id}/release`).expect(403);
    const still = (await qm.get(`/api/templates/versions/${draft.id}`).expect(200)).body.version as TemplateVersion;
    expect(still.definition.name).toBe(simpleDefinition().name);
  });

  it('when an analyst reads, then only released and retired versions are visible; a draft is 404', async () => {
    const draft = await createDraft(simpleDefinition({ name: 'Invisible draft (test)' }));
    const list = (await analyst.get('/api/templates').expect(200)).body.templates as TemplateSummary[];
    expect(list.some((r) => r.name === 'Invisible draft (test)')).toBe(false);
    expect(list.flatMap((r) => r.versions).every((v) => v.status !== 'draft')).toBe(true);
    await analyst.get(`/api/templates/versions/${draft.id}`).expect(404);
    const signatory = await t.signIn('signatory');
    await signatory.get('/api/templates').expect(200);
    const customer = await t.signIn('customer');
    await customer.get('/api/templates').expect(403);
  });
});

describe('drafts', () => {
  it('when a quality manager creates a template from a name, then a draft version 1 with a starter model is made', async () => {
    const res = await qm.post('/api/templates').send({ name: 'Spectral irradiance of a lamp (test)' }).expect(201);
    expect(res.body.version).toMatchObject({ version: 1, status: 'draft', releasedAt: null });
    expect(res.body.version.definition.name).toBe('Spectral irradiance of a lamp (test)');
  });

  it('when a draft made from a name still holds the starter wording, then release is refused naming those fields', async () => {
    const res = await qm.post('/api/templates').send({ name: 'Starter only (test)' }).expect(201);
    const refused = await qm.post(`/api/templates/versions/${res.body.version.id}/release`).expect(422);
    const text = JSON.stringify(refused.body.error.issues);
    expect(text).toMatch(/method statement is still the starter text/);
    expect(text).toMatch(/meaning of input \\"x\\" is still the starter text/);
  });

  it('when the body is not a template, then 400 names what is wrong', async () => {
    const bad = { ...simpleDefinition(), inputs: [{ symbol: '1x', description: '', source: 'somewhere', distribution: { type: 'normal', mean: 0 } }] };
    const res = await qm.post('/api/templates').send({ definition: bad }).expect(400);
    const text = JSON.stringify(res.body.error.issues);
    expect(text).toMatch(/symbol must start with a letter/);
    expect(text).toMatch(/source must be one of/);
  });

  it('when a draft has a model error, then it can still be saved; validation lists the error with its position', async () => {
    const draft = await createDraft();
    const def = simpleDefinition({ equations: ['E = T_ind - * T_ref'] });
    const saved = (await qm.put(`/api/templates/versions/${draft.id}`).send({ definition: def }).expect(200)).body.version as TemplateVersion;
    expect(saved.definition.equations).toEqual(['E = T_ind - * T_ref']);
    const record = (await qm.post(`/api/templates/versions/${draft.id}/validate`).expect(200)).body.validation as ValidationRecord;
    expect(record.passed).toBe(false);
    const eq = record.checks.find((c) => c.id === 'equations')!;
    expect(eq.passed).toBe(false);
    expect(eq.messages[0]).toMatchObject({ equation: 0 });
    expect(eq.messages[0].position).toBeGreaterThanOrEqual(10);
    expect(record.checks.find((c) => c.id === 'units')!.passed).toBeNull();
  });

  it('when an unknown version id is asked for, then 404; a malformed id is 400', async () => {
    await qm.get('/api/templates/versions/00000000-0000-4000-8000-000000000000').expect(404);
    await qm.get('/api/templates/versions/not-a-uuid').expect(400);
  });
});

describe('release validation', () => {
  it('when the model uses an undefined symbol, then release is refused with 422 naming the symbol, and the record is kept with the draft', async () => {
    const draft = await createDraft(simpleDefinition({ equations: ['E = T_ind - T_ref + dT_drift'] }));
    const res = await qm.post(`/api/templates/versions/${draft.id}/release`).expect(422);
    expect(res.body.error.code).toBe('TEMPLATE_VALIDATION_FAILED');
    expect(res.body.error.message).toMatch(/every symbol is defined/i);
    expect(res.body.error.issues.some((i: { path: unknown[]; message: string }) => i.path[0] === 'symbols' && /dT_drift/.test(i.message))).toBe(true);
    const v = (await qm.get(`/api/templates/versions/${draft.id}`).expect(200)).body.version as TemplateVersion;
    expect(v.status).toBe('draft');
    expect(v.validation?.purpose).toBe('release');
    expect(v.validation?.passed).toBe(false);
  });

  it('when the units are inconsistent, then release is refused and the message names the units', async () => {
    const def = simpleDefinition();
    def.inputs[1] = { ...def.inputs[1], unit: 'm' };
    const draft = await createDraft(def);
    const res = await qm.post(`/api/templates/versions/${draft.id}/release`).expect(422);
    const units = res.body.error.issues.filter((i: { path: unknown[] }) => i.path[0] === 'units');
    expect(units.length).toBeGreaterThan(0);
    expect(units.map((i: { message: string }) => i.message).join(' ')).toMatch(/\bK\b|\bm\b/);
  });

  it('when an input has no unit, then release is refused naming the input', async () => {
    const def = simpleDefinition();
    def.inputs[0] = { ...def.inputs[0], unit: undefined };
    const draft = await createDraft(def);
    const res = await qm.post(`/api/templates/versions/${draft.id}/release`).expect(422);
    expect(JSON.stringify(res.body.error.issues)).toMatch(/input \\"T_ind\\" has no unit/);
  });

  it('when the reference case does not reproduce, then release is refused with both values', async () => {
    const draft = await createDraft(simpleDefinition({ referenceCase: { source: 'deliberately wrong', expected: { y: 0.31, u: 0.05 }, tolerance: { yAbs: 0.001, uRel: 0.01 } } }));
    const res = await qm.post(`/api/templates/versions/${draft.id}/release`).expect(422);
    const rc = res.body.error.issues.filter((i: { path: unknown[] }) => i.path[0] === 'reference-case');
    expect(rc[0].message).toMatch(/expected 0\.31/);
  });

  it('when a template has no reference case, then release is refused and says to add one', async () => {
    const draft = await createDraft(simpleDefinition({ referenceCase: undefined }));
    const res = await qm.post(`/api/templates/versions/${draft.id}/release`).expect(422);
    expect(JSON.stringify(res.body.error.issues)).toMatch(/no reference case/);
  });
});

describe('released versions are frozen', () => {
  let released: TemplateVersion;

  beforeAll(async () => {
    const draft = await createDraft(simpleDefinition({ name: 'Frozen one (test)' }));
    released = (await qm.post(`/api/templates/versions/${draft.id}/release`).expect(200)).body.version;
  });

  it('when a valid draft is released, then it is released by the quality manager with a passed record', () => {
    expect(released.status).toBe('released');
    expect(released.releasedBy?.name).toBe('Quinn Quality (demo)');
    expect(released.validation?.passed).toBe(true);
    expect(released.validation?.result?.y).toBeCloseTo(0.3, 12);
    expect(released.validation?.result?.u).toBeCloseTo(0.05, 12);
  });

  it('when the API is asked to change it, then 409 and the definition is unchanged', async () => {
    const res = await qm.put(`/api/templates/versions/${released.id}`).send({ definition: simpleDefinition({ name: 'Changed (test)' }) }).expect(409);
    expect(res.body.error.message).toMatch(/cannot be changed.*new version/);
    await qm.post(`/api/templates/versions/${released.id}/release`).expect(409);
    await qm.post(`/api/templates/versions/${released.id}/validate`).expect(409);
    const v = (await qm.get(`/api/templates/versions/${released.id}`).expect(200)).body.version as TemplateVersion;
    expect(v.definition.name).toBe('Frozen one (test)');
  });

  it('when SQL updates its definition, number or release columns, or deletes it, then the trigger refuses', async () => {
    const db = t.database;
    await expect(db.query(`UPDATE template_versions SET definition = jsonb_set(definition, '{name}', '"tampered"') WHERE id = $1`, [released.id])).rejects.toThrow(/frozen/);
    await expect(db.query(`UPDATE template_versions SET version = 7 WHERE id = $1`, [released.id])).rejects.toThrow(/frozen/);
    await expect(db.query(`UPDATE template_versions SET released_at = now() - interval '1 day' WHERE id = $1`, [released.id])).rejects.toThrow(/frozen/);
    await expect(db.query(`UPDATE template_versions SET validation = '{}'::jsonb WHERE id = $1`, [released.id])).rejects.toThrow(/frozen/);
    await expect(db.query(`UPDATE template_versions SET status = 'draft' WHERE id = $1`, [released.id])).rejects.toThrow(/released to retired/);
    await expect(db.query(`DELETE FROM template_versions WHERE id = $1`, [released.id])).rejects.toThrow(/cannot be deleted/);
    const [row] = await db.query<{ name: string; status: string }>(`SELECT definition->>'name' AS name, status FROM template_versions WHERE id = $1`, [released.id]);
    expect(row).toEqual({ name: 'Frozen one (test)', status: 'released' });
  });

  it('when SQL edits or deletes a draft, then the trigger lets it through (drafts are not frozen)', async () => {
    const draft = await createDraft(simpleDefinition({ name: 'Scratch (test)' }));
    await t.database.query(`UPDATE template_versions SET definition = jsonb_set(definition, '{name}', '"Scratch 2 (test)"') WHERE id = $1`, [draft.id]);
    await t.database.query(`DELETE FROM template_versions WHERE id = $1`, [draft.id]);
  });

  it('when a new version is made from it, then a draft numbered one higher holds a copy; a second one is refused while that draft is open', async () => {
    const res = await qm.post(`/api/templates/versions/${released.id}/new-version`).expect(201);
    const v2 = res.body.version as TemplateVersion;
    expect(v2).toMatchObject({ templateId: released.templateId, version: 2, status: 'draft', validation: null });
    expect(v2.definition).toEqual(released.definition);
    const again = await qm.post(`/api/templates/versions/${released.id}/new-version`).expect(409);
    expect(again.body.error.message).toMatch(/already has a draft \(version 2\)/);
    await qm.post(`/api/templates/versions/${v2.id}/new-version`).expect(409);
    const list = (await qm.get('/api/templates').expect(200)).body.templates as TemplateSummary[];
    const row = list.find((r) => r.id === released.templateId)!;
    expect(row.latest).toMatchObject({ version: 2, status: 'draft' });
    expect(row.versions.map((x) => `${x.version}:${x.status}`)).toEqual(['2:draft', '1:released']);
  });

  it('when it is retired, then new jobs no longer see it but existing jobs can still read it', async () => {
    const svc = createTemplatesService({ db: t.database.db, clock: () => new Date() });
    expect((await svc.listReleasedForNewJobs()).some((r) => r.id === released.id)).toBe(true);
    const res = await qm.post(`/api/templates/versions/${released.id}/retire`).expect(200);
    expect(res.body.version).toMatchObject({ status: 'retired' });
    expect(res.body.version.retiredAt).not.toBeNull();
    expect((await svc.listReleasedForNewJobs()).some((r) => r.id === released.id)).toBe(false);
    const forJob = await svc.getVersionForJob(released.id);
    expect(forJob).toMatchObject({ status: 'retired', version: 1, name: 'Frozen one (test)' });
    expect(forJob.definition.equations).toEqual(['E = T_ind - T_ref']);
    await qm.post(`/api/templates/versions/${released.id}/retire`).expect(409);
    await expect(t.database.query(`UPDATE template_versions SET status = 'released', retired_at = null WHERE id = $1`, [released.id])).rejects.toThrow(/released to retired/);
  });

  it('when a job asks for a draft, then it is refused', async () => {
    const svc = createTemplatesService({ db: t.database.db, clock: () => new Date() });
    const draft = await createDraft(simpleDefinition({ name: 'Not for jobs (test)' }));
    await expect(svc.getVersionForJob(draft.id)).rejects.toMatchObject({ status: 409 });
  });

  it('writes audit rows for create, update, release, new version and retire', async () => {
    const rows = await t.database.query<{ action: string }>(`SELECT action FROM audit_log WHERE entity = 'template_version'`);
    const actions = new Set(rows.map((r) => r.action));
    for (const a of ['create', 'update', 'release', 'release_refused', 'create_version', 'retire']) expect(actions.has(a), a).toBe(true);
  });
});

describe('the five shipped templates through the API', () => {
  const dir = join(import.meta.dirname, '../../templates');
  for (const file of readdirSync(dir).filter((f) => f.endsWith('.json')).sort()) {
    it(`when ${file} is created as a new template and released, then it passes and reproduces its reference case`, async () => {
      const raw = JSON.parse(readFileSync(join(dir, file), 'utf8'));
      delete raw.key;
      const draft = await createDraft({ ...raw, name: `${raw.name} (copy)` });
      const res = await qm.post(`/api/templates/versions/${draft.id}/release`);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      const rc = (res.body.version as TemplateVersion).validation!.referenceCase!;
      expect(Math.abs(rc.obtained!.y - rc.expected.y)).toBeLessThanOrEqual(rc.tolerance.y);
      expect(Math.abs(rc.obtained!.u - rc.expected.u) / rc.expected.u).toBeLessThanOrEqual(rc.tolerance.uRel);
    });
  }
});
