import { recordAudit, auditActor } from '../../audit';
import type { Db } from '../../db/client';
import { AppError, ConflictError, NotFoundError } from '../../errors/app-error';
import type { SessionUser } from '../../../shared/schemas/me.schema';
import {
  starterDefinition,
  TEMPLATE_STATUS_LABELS,
  type CreateTemplateInput,
  type TemplateDefinition,
  type TemplateSummary,
  type TemplateVersion,
  type ValidationRecord,
} from '../../../shared/schemas/template.schema';
import { createTemplatesRepository, type TemplatesRepository } from './templates.repository';
import { validateTemplate } from './template-validation';

/** Quality managers see drafts; every other reader sees released and retired versions only. */
const canSeeDrafts = (u: Pick<SessionUser, 'role'>) => u.role === 'quality_manager';

const frozenMessage = (v: TemplateVersion) =>
  `Version ${v.version} of “${v.definition.name}” is ${TEMPLATE_STATUS_LABELS[v.status].toLowerCase()} and cannot be changed. Make a new version from it to change the model.`;

/** What a job needs of a template version (issue 5). */
export type VersionForJob = TemplateVersion & { status: 'released' | 'retired'; name: string };

/** A released version offered to new jobs. */
export type ReleasedVersionForJobs = { id: string; templateId: string; key: string | null; name: string; version: number; releasedAt: string; measurand: TemplateDefinition['measurand'] };

const auditView = (v: TemplateVersion) => ({ templateId: v.templateId, version: v.version, status: v.status, name: v.definition.name });

export function createTemplatesService(deps: { db: Db; templatesRepo?: TemplatesRepository; clock: () => Date }) {
  const { db, clock } = deps;
  const repo = deps.templatesRepo ?? createTemplatesRepository(db);

  async function versionOrThrow(id: string, tx: Db, viewer?: Pick<SessionUser, 'role'>): Promise<TemplateVersion> {
    const v = await repo.findVersion(id, tx);
    if (!v || (viewer && v.status === 'draft' && !canSeeDrafts(viewer))) throw new NotFoundError('No template version has this id.');
    return v;
  }

  async function reload(id: string, tx: Db): Promise<TemplateVersion> {
    const v = await repo.findVersion(id, tx);
    if (!v) throw new Error(`template version ${id} vanished inside its transaction`);
    return v;
  }

  const service = {
    /** The list: each template with its latest visible version and the state of every version. */
    async list(viewer: Pick<SessionUser, 'role'>): Promise<TemplateSummary[]> {
      const [rows, versions] = await Promise.all([repo.listTemplates(), repo.listVersions(canSeeDrafts(viewer) ? undefined : ['released', 'retired'])]);
      const out: TemplateSummary[] = [];
      for (const t of rows) {
        const own = versions.filter((v) => v.templateId === t.id);
        if (!own.length) continue;
        const latest = own[0];
        out.push({
          id: t.id,
          key: t.key,
          name: latest.definition.name,
          summary: latest.definition.summary ?? null,
          measurand: { symbol: latest.definition.measurand.symbol, unit: latest.definition.measurand.unit ?? null },
          createdAt: t.createdAt.toISOString(),
          latest: strip(latest),
          versions: own.map(strip),
        });
      }
      return out.sort((a, b) => a.name.localeCompare(b.name));
    },

    getVersion(id: string, viewer: Pick<SessionUser, 'role'>): Promise<TemplateVersion> {
      return versionOrThrow(id, db, viewer);
    },

    /** A new template with its draft version 1 (from a whole definition, or a starter draft). */
    async create(input: CreateTemplateInput, by: SessionUser): Promise<TemplateVersion> {
      const definition = input.definition ?? starterDefinition(input.name ?? 'New measurement model');
      return db.transaction(async (tx) => {
        const key = definition.key ?? null;
        if (key && (await repo.findTemplateByKey(key, tx))) throw new ConflictError(`A template with the key “${key}” already exists: make a new version of it instead.`, 'TEMPLATE_KEY_TAKEN');
        const now = clock();
        const templateId = await repo.insertTemplate({ key, name: definition.name, createdBy: by.id, now }, tx);
        const id = await repo.insertVersion({ templateId, version: 1, definition, by: by.id, now }, tx);
        const v = await reload(id, tx);
        await recordAudit(tx, { actor: auditActor(by), action: 'create', entity: 'template_version', entityId: id, after: { ...auditView(v), definition }, at: now });
        return v;
      });
    },

    /** Replaces a draft's definition. A released or retired version answers 409. */
    async updateDraft(id: string, definition: TemplateDefinition, by: SessionUser): Promise<TemplateVersion> {
      return db.transaction(async (tx) => {
        const before = await versionOrThrow(id, tx, by);
        if (before.status !== 'draft') throw new ConflictError(frozenMessage(before), 'TEMPLATE_VERSION_FROZEN');
        const now = clock();
        if (!(await repo.updateDraft(id, definition, by.id, now, tx))) throw new ConflictError(frozenMessage(await reload(id, tx)), 'TEMPLATE_VERSION_FROZEN');
        await repo.renameTemplate(before.templateId, definition.name, tx);
        const after = await reload(id, tx);
        await recordAudit(tx, { actor: auditActor(by), action: 'update', entity: 'template_version', entityId: id, before: { ...auditView(before), definition: before.definition }, after: { ...auditView(after), definition }, at: now });
        return after;
      });
    },

    /** Dry run of the release checks on a draft; the record is kept with the draft. */
    async validate(id: string, by: SessionUser): Promise<ValidationRecord> {
      return db.transaction(async (tx) => {
        const v = await versionOrThrow(id, tx, by);
        if (v.status !== 'draft') throw new ConflictError(`${frozenMessage(v)} Its release validation record is shown with the version.`, 'TEMPLATE_VERSION_FROZEN');
        const record = validateTemplate(v.definition, { purpose: 'dry-run', by: { id: by.id, name: by.name }, at: clock() });
        await repo.storeValidation(id, record, tx);
        return record;
      });
    },

    /**
     * Runs every release check and stores the record either way. Passed: the version becomes
     * released (frozen). Failed: 422 listing the failed checks; the draft keeps the record.
     */
    async release(id: string, by: SessionUser): Promise<TemplateVersion> {
      const outcome = await db.transaction(async (tx) => {
        await repo.lockVersion(id, tx);
        const v = await versionOrThrow(id, tx, by);
        if (v.status !== 'draft') throw new ConflictError(frozenMessage(v), 'TEMPLATE_VERSION_FROZEN');
        const now = clock();
        const record = validateTemplate(v.definition, { purpose: 'release', by: { id: by.id, name: by.name }, at: now });
        if (!record.passed) {
          await repo.storeValidation(id, record, tx);
          await recordAudit(tx, { actor: auditActor(by), action: 'release_refused', entity: 'template_version', entityId: id, after: { ...auditView(v), validation: record }, at: now });
          return { released: false as const, record, v };
        }
        if (!(await repo.markReleased(id, record, by.id, now, tx))) throw new ConflictError(frozenMessage(await reload(id, tx)), 'TEMPLATE_VERSION_FROZEN');
        const after = await reload(id, tx);
        await recordAudit(tx, { actor: auditActor(by), action: 'release', entity: 'template_version', entityId: id, before: auditView(v), after: { ...auditView(after), validation: record }, at: now });
        return { released: true as const, version: after };
      });
      if (outcome.released) return outcome.version;
      const failed = outcome.record.checks.filter((c) => c.passed === false);
      throw new AppError(
        422,
        'TEMPLATE_VALIDATION_FAILED',
        `Version ${outcome.v.version} of “${outcome.v.definition.name}” was not released: ${failed.map((c) => c.label.toLowerCase()).join('; ')} — failed. The draft is unchanged; the validation record is kept with it.`,
        failed.flatMap((c) => c.messages.map((m) => ({ path: [c.id, ...(m.path ?? [])], message: m.message }))),
      );
    },

    /** Copies a released or retired version into a new draft numbered one above the highest. */
    async newVersionFrom(id: string, by: SessionUser): Promise<TemplateVersion> {
      return db.transaction(async (tx) => {
        const source = await versionOrThrow(id, tx, by);
        if (source.status === 'draft') throw new ConflictError(`Version ${source.version} is still a draft: edit it directly.`, 'TEMPLATE_VERSION_IS_DRAFT');
        const open = await repo.findDraft(source.templateId, tx);
        if (open) {
          const d = await reload(open, tx);
          throw new ConflictError(`“${source.definition.name}” already has a draft (version ${d.version}): finish or release it first.`, 'TEMPLATE_DRAFT_EXISTS');
        }
        const now = clock();
        const number = (await repo.maxVersion(source.templateId, tx)) + 1;
        const newId = await repo.insertVersion({ templateId: source.templateId, version: number, definition: source.definition, by: by.id, now }, tx);
        const v = await reload(newId, tx);
        await recordAudit(tx, { actor: auditActor(by), action: 'create_version', entity: 'template_version', entityId: newId, after: { ...auditView(v), copiedFrom: { id: source.id, version: source.version } }, at: now });
        return v;
      });
    },

    /** Hides a released version from new jobs; jobs that use it keep it. */
    async retire(id: string, by: SessionUser): Promise<TemplateVersion> {
      return db.transaction(async (tx) => {
        const v = await versionOrThrow(id, tx, by);
        if (v.status !== 'released') {
          throw new ConflictError(v.status === 'draft' ? `Version ${v.version} is a draft: only released versions can be retired.` : `Version ${v.version} is already retired.`, 'TEMPLATE_VERSION_NOT_RELEASED');
        }
        const now = clock();
        if (!(await repo.markRetired(id, by.id, now, tx))) throw new ConflictError(`Version ${v.version} is no longer released.`, 'TEMPLATE_VERSION_NOT_RELEASED');
        const after = await reload(id, tx);
        await recordAudit(tx, { actor: auditActor(by), action: 'retire', entity: 'template_version', entityId: id, before: auditView(v), after: auditView(after), at: now });
        return after;
      });
    },

    /**
     * For the jobs module: a released or retired version with its parsed definition. Retired
     * versions stay readable for the jobs that use them; drafts are refused (409).
     */
    async getVersionForJob(versionId: string, tx: Db = db): Promise<VersionForJob> {
      const v = await repo.findVersion(versionId, tx);
      if (!v) throw new NotFoundError('No template version has this id.');
      if (v.status === 'draft') throw new ConflictError(`Version ${v.version} of “${v.definition.name}” is a draft: a job needs a released version.`, 'TEMPLATE_VERSION_NOT_RELEASED');
      return { ...v, status: v.status, name: v.definition.name };
    },

    /** For the jobs module: the versions a new job may use (released, not retired). */
    async listReleasedForNewJobs(tx: Db = db): Promise<ReleasedVersionForJobs[]> {
      const [rows, versions] = await Promise.all([repo.listTemplates(tx), repo.listVersions(['released'], tx)]);
      const keyOf = new Map(rows.map((t) => [t.id, t.key]));
      return versions
        .map((v) => ({ id: v.id, templateId: v.templateId, key: keyOf.get(v.templateId) ?? null, name: v.definition.name, version: v.version, releasedAt: v.releasedAt!, measurand: v.definition.measurand }))
        .sort((a, b) => a.name.localeCompare(b.name) || b.version - a.version);
    },
  };
  return service;
}
export type TemplatesService = ReturnType<typeof createTemplatesService>;

function strip<T extends { definition: unknown; templateId: string }>(v: T) {
  const { definition: _d, templateId: _t, ...ref } = v;
  return ref as Omit<T, 'definition' | 'templateId'>;
}

/** Standalone forms for other modules (jobs, certificates) that hold only a Db. */
export const getVersionForJob = (db: Db, versionId: string, clock: () => Date = () => new Date()) => createTemplatesService({ db, clock }).getVersionForJob(versionId);
export const listReleasedForNewJobs = (db: Db, clock: () => Date = () => new Date()) => createTemplatesService({ db, clock }).listReleasedForNewJobs();
