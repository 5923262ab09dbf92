/**
 * Review and approval (ISO/IEC 17025:2017 §7.8.1.1: reports are reviewed and authorised before
 * release). The signatory sees the job, its budgets and checks and the certificate it would
 * produce; rejects with a comment (the job returns to draft, the comment kept for the analyst);
 * or approves by entering the password again, which issues the certificate.
 */
import { asc, eq } from 'drizzle-orm';
import { recordAudit } from '../../audit';
import { auditActor } from '../../audit/actor';
import type { Auth } from '../../auth/auth';
import type { Db } from '../../db/client';
import { calibrationPoints, customers, jobs, user } from '../../db/schema';
import { AppError, ConflictError, NotFoundError } from '../../errors/app-error';
import type { ReviewDetail, ReviewSettings } from '../../../shared/schemas/certificates-api.schema';
import type { JobsService } from '../jobs/jobs.service';
import type { CertificatesRepository } from '../certificates/certificates.repository';
import { PREVIEW_NUMBER, type Actor, type CertificatesService } from '../certificates/certificates.service';
import { formatQuantity } from '../../../shared/format';
import { verifyUserPassword } from './password';

export class SignatureRefusedError extends AppError {
  constructor() {
    super(403, 'PASSWORD_REJECTED', 'The password is not correct: the approval was not signed. Enter your own sign-in password.');
  }
}

export function createReviewService(deps: {
  db: Db;
  auth: Auth;
  clock: () => Date;
  jobs: Pick<JobsService, 'getJobForReview' | 'transitionJob' | 'amendsOf'>;
  certificates: CertificatesService;
  certificatesRepo: CertificatesRepository;
}) {
  const { db, certificatesRepo: repo } = deps;

  async function load(jobId: string) {
    if (!/^[0-9a-f-]{36}$/i.test(jobId)) throw new NotFoundError('There is no such job.');
    return deps.jobs.getJobForReview(jobId);
  }

  return {
    /** Jobs submitted for review, oldest first. */
    async queue() {
      const pointsCount = db.$count(calibrationPoints, eq(calibrationPoints.jobId, jobs.id));
      const rows = await db
        .select({ jobId: jobs.id, jobNumber: jobs.number, customer: customers.organisation, itemLabel: jobs.itemLabel, analyst: user.name, analystId: jobs.analystId, submittedAt: jobs.submittedAt, points: pointsCount })
        .from(jobs)
        .innerJoin(customers, eq(customers.id, jobs.customerId))
        .innerJoin(user, eq(user.id, jobs.analystId))
        .where(eq(jobs.status, 'submitted'))
        .orderBy(asc(jobs.submittedAt), asc(jobs.number));
      const amends = await repo.amendmentsOfJobs(rows.map((r) => r.jobId));
      return rows.map((r) => ({ ...r, points: Number(r.points), submittedAt: r.submittedAt?.toISOString() ?? null, amends: amends.get(r.jobId) ?? null }));
    },

    async detail(jobId: string, actor: Actor): Promise<ReviewDetail> {
      const review = await load(jobId);
      const settings = await repo.settings();
      const assembled = await deps.certificates.assemble(review, { number: PREVIEW_NUMBER, signatory: deps.certificates.signatoryOf(actor), now: deps.clock() });
      const amendment = await deps.jobs.amendsOf(jobId);
      const blocking: Array<{ code: string; message: string }> = [];
      if (review.job.status !== 'submitted') blocking.push({ code: 'NOT_SUBMITTED', message: `The job is ${review.job.status === 'draft' ? 'a draft' : review.job.status}: only a job submitted for review can be approved.` });
      for (const r of review.checks.reasons) blocking.push({ code: r.code, message: r.message });
      for (const m of assembled.missing) blocking.push(m);
      if (settings.forbidSelfApproval && review.job.analystId === actor.id) blocking.push({ code: 'OWN_JOB', message: 'You prepared this job: another authorised signatory must approve it.' });
      return {
        job: {
          id: review.job.id,
          number: review.job.number,
          status: review.job.status,
          customer: review.job.customer,
          itemLabel: review.job.itemLabel,
          analyst: review.job.analyst,
          analystId: review.job.analystId,
          submittedAt: review.job.submittedAt,
          reviewComment: review.job.reviewComment,
          rejectedAt: review.job.rejectedAt,
        },
        template: { name: review.templateVersion.name, version: review.templateVersion.version },
        points: review.points.map((p) => ({
          id: p.id,
          position: p.position,
          nominal: formatQuantity(p.nominalValue, p.nominalUnit),
          current: p.current,
          result: p.result,
          reported: p.reported,
          inputs: p.inputs,
          cmc: p.cmc ?? null,
          outsideScope: p.outsideScope,
          outsideScopeReason: p.outsideScopeReason,
        })),
        checks: review.checks,
        preview: assembled.data,
        blocking,
        // While the amendment is prepared: the certificate it amends, why, and the job that
        // certificate was issued from (ISO/IEC 17025:2017 §7.8.8), for a link back to it.
        amends: amendment && amendment.status === 'open' ? { certificateNumber: amendment.certificateNumber, reason: amendment.reason, jobId: amendment.jobId, jobNumber: amendment.jobNumber } : null,
        settings,
      };
    },

    async reject(jobId: string, comment: string, actor: Actor) {
      await load(jobId);
      await db.transaction((tx) => deps.jobs.transitionJob(tx, jobId, 'submitted', 'draft', actor, comment));
      return { jobId, status: 'draft' as const, comment };
    },

    /** Approval as an electronic signature: the password again, then the certificate is issued. */
    async approve(jobId: string, password: string, actor: Actor) {
      if (!(await verifyUserPassword(deps.auth, db, actor.id, password))) {
        await recordAudit(db, { actor: auditActor(actor), action: 'approve_refused', entity: 'job', entityId: jobId, after: { reason: 'wrong password' }, at: deps.clock() });
        throw new SignatureRefusedError();
      }
      const review = await load(jobId);
      if (review.job.status !== 'submitted') throw new ConflictError(`The job is ${review.job.status}: only a job submitted for review can be approved.`, 'NOT_SUBMITTED');
      const settings = await repo.settings();
      deps.certificates.assertNotAnalyst(review, actor, settings.forbidSelfApproval);
      if (review.checks.reasons.length) {
        throw new AppError(422, 'CHECKS_FAILED', `The job does not pass its checks: ${review.checks.reasons.map((r) => r.message).join(' ')}`);
      }
      return deps.certificates.issue(review, actor);
    },

    settings: () => repo.settings(),

    async saveSettings(s: ReviewSettings, actor: Actor) {
      const now = deps.clock();
      await db.transaction(async (tx) => {
        const before = await repo.settings(tx);
        await repo.saveSettings(tx, s, now);
        await recordAudit(tx, { actor: auditActor(actor), action: 'update', entity: 'review_settings', entityId: '1', before, after: s, at: now });
      });
      return repo.settings();
    },
  };
}

export type ReviewService = ReturnType<typeof createReviewService>;
