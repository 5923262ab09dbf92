/**
 * Calibration jobs: open from a released template version, edit while draft, check and submit
 * for review; transitions for the certificate workflow (issue 6). Every change writes its audit
 * row in the same transaction.
 */
import { recordAudit } from '../../audit';
import { auditActor } from '../../audit/actor';
import type { Db } from '../../db/client';
import { AppError, ConflictError, ForbiddenError, NotFoundError, ValidationError } from '../../errors/app-error';
import type { EvaluationResult } from '../../../shared/engine';
import type { SessionUser } from '../../../shared/schemas/me.schema';
import type { CreateJob, JobListQuery, JobStatus, PointInput, UpdateJob } from '../../../shared/schemas/jobs.schema';
import { checkJob, cmcForPoint, isCurrent, reportedResult, type CheckPoint } from './checks';
import type { JobRow, JobsRepository, PointRow } from './jobs.repository';
import type { BudgetStandard, JobSources } from './sources';

export type Actor = Pick<SessionUser, 'id' | 'name' | 'role'>;

export class JobNotDraftError extends ConflictError {
  constructor(status: string) {
    super(`The job is ${status === 'submitted' ? 'submitted for review' : status}; only a draft job can be changed.`, 'JOB_NOT_DRAFT');
  }
}

export class SubmitRefusedError extends AppError {
  constructor(reasons: Array<{ message: string; pointId: string | null; symbol: string | null; code: string }>) {
    super(
      422,
      'SUBMIT_REFUSED',
      `The job cannot be submitted yet: ${reasons.length} check${reasons.length === 1 ? '' : 's'} failed.`,
      reasons.map((r) => ({ path: ['points', r.pointId ?? '-', r.symbol ?? '-', r.code], message: r.message })),
    );
  }
}

/** Transitions of the job status. Rejection returns a submitted job to draft with the reviewer's comment. */
const TRANSITIONS: Record<JobStatus, JobStatus[]> = {
  draft: ['submitted'],
  submitted: ['approved', 'draft'],
  approved: ['issued', 'draft'],
  issued: [],
};

export function toPointDto(p: PointRow) {
  const result = (p.result as EvaluationResult | null) ?? null;
  return {
    id: p.id,
    jobId: p.jobId,
    position: p.position,
    nominalValue: p.nominalValue,
    nominalUnit: p.nominalUnit,
    inputs: p.inputs as PointInput[],
    correlations: p.correlations,
    outsideScope: p.outsideScope,
    outsideScopeReason: p.outsideScopeReason,
    result,
    resultEngineVersion: p.resultEngineVersion,
    resultSeed: p.resultSeed,
    computedAt: p.computedAt?.toISOString() ?? null,
    changedAt: p.changedAt.toISOString(),
    current: isCurrent({ result, computedAt: p.computedAt, changedAt: p.changedAt }),
    reported: result ? reportedResult(result) : null,
  };
}

export function toJobDto(j: JobRow & { customer?: string; analyst?: string }) {
  return {
    id: j.id,
    number: j.number,
    status: j.status,
    customerId: j.customerId,
    customer: j.customer ?? null,
    itemId: j.itemId,
    itemLabel: j.itemLabel,
    templateVersionId: j.templateVersionId,
    receivedOn: j.receivedOn,
    calibratedOn: j.calibratedOn,
    location: j.location,
    environment: j.environment,
    reviewComment: j.reviewComment,
    rejectedAt: j.rejectedAt?.toISOString() ?? null,
    submittedAt: j.submittedAt?.toISOString() ?? null,
    analystId: j.analystId,
    analyst: j.analyst ?? null,
    createdAt: j.createdAt.toISOString(),
    updatedAt: j.updatedAt.toISOString(),
  };
}

export function createJobsService(deps: { db: Db; jobsRepo: JobsRepository; sources: JobSources; clock: () => Date }) {
  const { db, jobsRepo, sources, clock } = deps;
  const today = () => clock().toISOString().slice(0, 10);

  async function mustGet(id: string) {
    const job = await jobsRepo.get(id);
    if (!job) throw new NotFoundError('There is no such job.');
    return job;
  }

  /** The job for a change: exists, is a draft, and belongs to the analyst. */
  async function lockDraft(tx: Db, jobId: string, actor: Actor): Promise<JobRow> {
    const job = await jobsRepo.lockJob(tx, jobId);
    if (!job) throw new NotFoundError('There is no such job.');
    if (job.analystId !== actor.id) throw new ForbiddenError('Only the analyst who opened this job can change it.');
    if (job.status !== 'draft') throw new JobNotDraftError(job.status);
    return job;
  }

  async function templateOf(job: Pick<JobRow, 'templateVersionId'>, tx: Db = db) {
    const v = await sources.getTemplateVersion(job.templateVersionId, tx);
    if (!v) throw new NotFoundError('The measurement model of this job is no longer available.');
    return v;
  }

  async function standardsOf(points: PointRow[], tx: Db = db): Promise<Map<string, BudgetStandard | null>> {
    const ids = new Set<string>();
    for (const p of points) for (const i of p.inputs as PointInput[]) if (i.standardId) ids.add(i.standardId);
    const map = new Map<string, BudgetStandard | null>();
    for (const id of ids) map.set(id, await sources.getStandard(id, tx));
    return map;
  }

  function checkPoints(points: PointRow[]): CheckPoint[] {
    return points.map((p) => ({
      id: p.id,
      position: p.position,
      nominalValue: p.nominalValue,
      nominalUnit: p.nominalUnit,
      inputs: p.inputs as PointInput[],
      outsideScope: p.outsideScope,
      outsideScopeReason: p.outsideScopeReason,
      result: (p.result as EvaluationResult | null) ?? null,
      computedAt: p.computedAt,
      changedAt: p.changedAt,
    }));
  }

  async function runChecks(jobId: string, tx: Db = db) {
    const job = await jobsRepo.get(jobId, tx);
    if (!job) throw new NotFoundError('There is no such job.');
    const version = await templateOf(job, tx);
    const points = await jobsRepo.points(jobId, tx);
    const standards = await standardsOf(points, tx);
    const outcome = checkJob({ definition: version.definition, points: checkPoints(points), standards, today: today() });
    const cmc = Object.fromEntries(
      points.map((p) => [p.id, p.result ? (cmcForPoint(version.definition, p.result as unknown as EvaluationResult) ?? null) : null]),
    );
    return { ...outcome, cmc };
  }

  async function transition(tx: Db, jobId: string, from: JobStatus, to: JobStatus, actor: Actor | null, comment?: string) {
    if (!TRANSITIONS[from].includes(to)) throw new ConflictError(`A job cannot go from ${from} to ${to}.`, 'BAD_TRANSITION');
    const now = clock();
    const rejecting = to === 'draft';
    if (rejecting && !(comment ?? '').trim()) throw new ValidationError([{ path: ['comment'], message: 'say why the job is sent back' }], 'A rejection needs the reviewer’s comment.');
    const before = await jobsRepo.lockJob(tx, jobId);
    if (!before) throw new NotFoundError('There is no such job.');
    const row = await jobsRepo.setStatus(tx, jobId, from, {
      status: to,
      updatedAt: now,
      ...(to === 'submitted' ? { submittedAt: now } : {}),
      ...(rejecting ? { reviewComment: comment!.trim(), rejectedAt: now, submittedAt: null } : {}),
    });
    if (!row) throw new ConflictError(`The job is ${before.status}, not ${from}: it was changed meanwhile. Reload it.`, 'STATUS_CHANGED');
    await recordAudit(tx, {
      actor: actor ? auditActor(actor) : null,
      action: rejecting ? 'reject' : to === 'submitted' ? 'submit' : to === 'approved' ? 'approve' : 'issue',
      entity: 'job',
      entityId: jobId,
      before: { status: from },
      after: { status: to, ...(rejecting ? { comment: comment!.trim() } : {}) },
      at: now,
    });
    return row;
  }

  return {
    async list(q: JobListQuery) {
      const { rows, total } = await jobsRepo.list(q);
      return { jobs: rows.map((r) => ({ ...r, updatedAt: r.updatedAt.toISOString() })), total, page: q.page, pageSize: q.pageSize };
    },

    /** What the new-job form offers: released model versions and the customers' items. */
    async options() {
      const versions = await sources.listReleasedTemplateVersions();
      const items = await sources.listItems();
      return {
        templateVersions: versions.map((v) => ({ id: v.id, name: v.name, version: v.version, key: v.key, measurand: v.definition.measurand, cmc: v.definition.cmc ?? null })),
        items,
      };
    },

    async create(input: CreateJob, actor: Actor) {
      const version = await sources.getTemplateVersion(input.templateVersionId);
      if (!version) throw new ValidationError([{ path: ['body', 'templateVersionId'], message: 'there is no such measurement model version' }]);
      if (version.status !== 'released') throw new ValidationError([{ path: ['body', 'templateVersionId'], message: `version ${version.version} of “${version.name}” is ${version.status}: choose a released version` }]);
      const item = await sources.getItem(input.itemId);
      if (!item) throw new ValidationError([{ path: ['body', 'itemId'], message: 'there is no such item' }]);
      if (item.customerId !== input.customerId) throw new ValidationError([{ path: ['body', 'itemId'], message: 'the item belongs to another customer' }]);
      const now = clock();
      const itemLabel = [item.description, item.maker, item.model, item.serial ? `s/n ${item.serial}` : null].filter(Boolean).join(', ');
      return db.transaction(async (tx) => {
        const number = await jobsRepo.nextNumber(tx, now.getUTCFullYear());
        const job = await jobsRepo.insert(tx, {
          number,
          customerId: input.customerId,
          itemId: input.itemId,
          itemLabel,
          templateVersionId: version.id,
          receivedOn: input.receivedOn ?? null,
          calibratedOn: input.calibratedOn ?? null,
          location: input.location ?? '',
          environment: input.environment ?? {},
          analystId: actor.id,
          createdAt: now,
          updatedAt: now,
        });
        await recordAudit(tx, { actor: auditActor(actor), action: 'create', entity: 'job', entityId: job.id, after: toJobDto(job), at: now });
        return toJobDto(job);
      });
    },

    async get(id: string) {
      const job = await mustGet(id);
      const version = await templateOf(job);
      const points = await jobsRepo.points(id);
      const readings = await jobsRepo.readingsOfJob(id);
      const standards = await standardsOf(points);
      const amends = await jobsRepo.amendsOf(id);
      const amendedBy = await jobsRepo.amendedByOf(id);
      return {
        job: { ...toJobDto(job), amends, amendedBy },
        template: { id: version.id, name: version.name, version: version.version, key: version.key, definition: version.definition },
        points: points.map(toPointDto),
        readings: readings.map((r) => ({ pointId: r.pointId, symbol: r.symbol, n: r.values.length, fileName: r.fileName, sha256: r.sha256, column: r.column, uploadedAt: r.uploadedAt.toISOString() })),
        standards: [...standards.values()].filter((s): s is BudgetStandard => Boolean(s)),
      };
    },

    async update(id: string, patch: UpdateJob, actor: Actor) {
      return db.transaction(async (tx) => {
        const before = await lockDraft(tx, id, actor);
        const now = clock();
        let itemLabel: string | undefined;
        if (patch.itemId && patch.itemId !== before.itemId) {
          const item = await sources.getItem(patch.itemId, tx);
          if (!item || item.customerId !== before.customerId) throw new ValidationError([{ path: ['body', 'itemId'], message: 'choose an item of this job’s customer' }]);
          itemLabel = [item.description, item.maker, item.model, item.serial ? `s/n ${item.serial}` : null].filter(Boolean).join(', ');
        }
        const row = await jobsRepo.update(tx, id, { ...patch, ...(itemLabel ? { itemLabel } : {}), updatedAt: now });
        await recordAudit(tx, { actor: auditActor(actor), action: 'update', entity: 'job', entityId: id, before: toJobDto(before), after: toJobDto(row), at: now });
        return toJobDto(row);
      });
    },

    checks: (jobId: string) => runChecks(jobId),

    async submit(jobId: string, actor: Actor) {
      return db.transaction(async (tx) => {
        await lockDraft(tx, jobId, actor);
        const { reasons, notes } = await runChecks(jobId, tx);
        if (reasons.length) throw new SubmitRefusedError(reasons);
        const row = await transition(tx, jobId, 'draft', 'submitted', actor);
        return { job: toJobDto(row), notes };
      });
    },

    /**
     * The amendment a job was opened for, with the job whose certificate it amends (for a link
     * back, as on the job's own page); null for any other job.
     */
    amendsOf: (jobId: string) => jobsRepo.amendsOf(jobId),

    /** For the certificate workflow (issue 6): move the status, audited in `tx`. */
    transitionJob: transition,

    /** Everything a reviewer (and the certificate) needs about a job. */
    async getJobForReview(jobId: string) {
      const job = await mustGet(jobId);
      const version = await templateOf(job);
      const points = await jobsRepo.points(jobId);
      const standards = await standardsOf(points);
      const item = await sources.getItem(job.itemId);
      const outcome = checkJob({ definition: version.definition, points: checkPoints(points), standards, today: today() });
      return {
        job: toJobDto(job),
        customer: { id: job.customerId, organisation: job.customer },
        item,
        templateVersion: version,
        points: points.map((p) => ({ ...toPointDto(p), cmc: p.result ? (cmcForPoint(version.definition, p.result as unknown as EvaluationResult) ?? null) : null })),
        standards: [...standards.values()].filter((s): s is BudgetStandard => Boolean(s)),
        checks: outcome,
      };
    },
  };
}

export type JobsService = ReturnType<typeof createJobsService>;
