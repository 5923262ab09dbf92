/**
 * Issued certificates: assembling one from a job, issuing it on approval (number, PDF rendered in
 * the worker pool, signed with the lab's identity, SHA-256 stored, e-mail queued to the
 * customer's contacts, the job marked issued, all records and audit rows in one transaction),
 * reading and downloading, amendments (ISO/IEC 17025:2017 §7.8.8) and withdrawal.
 */
import { and, eq, inArray } from 'drizzle-orm';
import { recordAudit } from '../../audit';
import { auditActor } from '../../audit/actor';
import type { Config } from '../../config/env';
import type { Db } from '../../db/client';
import { calibrationPoints, jobs as jobsTable, readings, referenceStandards } from '../../db/schema';
import { AppError, ConflictError, ForbiddenError, NotFoundError } from '../../errors/app-error';
import type { Logger } from '../../logger';
import type { Outbox } from '../../mail/outbox';
import { sha256Hex, signPdf } from '../../signing';
import type { CertificateData } from '../../../shared/schemas/certificate.schema';
import type { CertificateRow } from '../../../shared/schemas/certificates-api.schema';
import type { PointInput } from '../../../shared/schemas/jobs.schema';
import type { SessionUser } from '../../../shared/schemas/me.schema';
import { ROLE_LABELS } from '../../../shared/schemas/roles';
import type { EvaluationResult } from '../../../shared/engine';
import type { CustomersRepository } from '../customers/customers.repository';
import type { JobsRepository } from '../jobs/jobs.repository';
import type { JobsService } from '../jobs/jobs.service';
import type { LabRepository } from '../lab/lab.repository';
import { assembleCertificate, type AssembleResult } from './certificate-data';
import type { CertificatesRepository } from './certificates.repository';
import { labSigningIdentity } from './lab-identity';

export type Actor = Pick<SessionUser, 'id' | 'name' | 'role'>;
export type JobForReview = Awaited<ReturnType<JobsService['getJobForReview']>>;

export class IssueRefusedError extends AppError {
  constructor(issues: Array<{ code: string; message: string }>) {
    super(
      422,
      'ISSUE_REFUSED',
      `The certificate cannot be issued yet: ${issues.map((i) => i.message).join(' ')}`,
      issues.map((i) => ({ path: [i.code], message: i.message })),
    );
  }
}

/** Placeholder number on the review page's preview; the real one is drawn when the certificate is issued. */
/** Stands for the number in the review page's preview: the heading reads "Calibration certificate (number given at issue)". */
export const PREVIEW_NUMBER = '(number given at issue)';

export type CertificatesDeps = {
  db: Db;
  config: Pick<Config, 'dataDir' | 'signing' | 'baseUrl'>;
  clock: () => Date;
  logger: Logger;
  outbox: Outbox;
  certificatesRepo: CertificatesRepository;
  jobs: Pick<JobsService, 'getJobForReview' | 'transitionJob'>;
  jobsRepo: JobsRepository;
  labRepo: LabRepository;
  customersRepo: CustomersRepository;
  renderPdf: (data: CertificateData) => Promise<Buffer>;
};

export function createCertificatesService(deps: CertificatesDeps) {
  const { db, certificatesRepo: repo, clock } = deps;

  async function standardsUsed(review: JobForReview) {
    const ids = [...new Set(review.points.flatMap((p) => (p.inputs as PointInput[]).map((i) => i.standardId).filter((x): x is string => Boolean(x))))];
    if (ids.length === 0) return [];
    const rows = await db.select().from(referenceStandards).where(inArray(referenceStandards.id, ids.filter((i) => /^[0-9a-f-]{36}$/i.test(i))));
    return rows
      .sort((a, b) => a.name.localeCompare(b.name))
      .map((s) => ({ name: s.name, serialNumber: s.serialNumber || 'not stated', certificateNumber: s.certificateNumber || 'not stated', issuingLaboratory: s.issuingLaboratory || 'not stated', dueDate: s.dueDate }));
  }

  /** The certificate a job would get now: the preview on the review page and the issued PDF alike. */
  async function assemble(review: JobForReview, opts: { number: string; signatory: { name: string; function: string }; now: Date }): Promise<AssembleResult> {
    const lab = await deps.labRepo.get();
    const customer = await deps.customersRepo.find(review.job.customerId);
    const contacts = await deps.customersRepo.contacts(review.job.customerId);
    const contact = contacts.find((c) => c.receivesCertificates) ?? contacts[0] ?? null;
    const amendment = await repo.amendmentOfJob(review.job.id);
    return assembleCertificate({
      number: opts.number,
      job: review.job,
      lab,
      customer: {
        organisation: customer?.organisation ?? review.customer.organisation ?? 'unknown customer',
        address: customer?.address ?? '',
        contact: contact ? { name: contact.name, email: contact.email } : null,
      },
      item: review.item,
      template: { name: review.templateVersion.name, version: review.templateVersion.version, definition: review.templateVersion.definition },
      points: review.points.map((p) => ({
        id: p.id,
        position: p.position,
        nominalValue: p.nominalValue,
        nominalUnit: p.nominalUnit,
        inputs: p.inputs as PointInput[],
        result: (p.result as EvaluationResult | null) ?? null,
        outsideScope: p.outsideScope,
        outsideScopeReason: p.outsideScopeReason,
      })),
      standards: await standardsUsed(review),
      signatory: opts.signatory,
      ...(amendment ? { amends: { certificateNumber: amendment.certificateNumber, reason: amendment.reason } } : {}),
      now: opts.now,
    });
  }

  function signatoryOf(actor: Actor) {
    return { name: actor.name, function: actor.role === 'signatory' ? 'Authorised signatory' : ROLE_LABELS[actor.role ?? 'signatory'] };
  }

  function mailFor(data: CertificateData, contactName: string, sha256: string) {
    const subject = `Calibration certificate ${data.certificateNumber}${data.amends ? ` (replaces ${data.amends.certificateNumber})` : ''}`;
    const lines = [
      `Dear ${contactName},`,
      '',
      `${data.lab.name} has issued calibration certificate ${data.certificateNumber} for your ${data.item.description} (${data.item.maker} ${data.item.model}, serial number ${data.item.serialNumber}). The signed PDF is attached.`,
      ...(data.amends ? ['', `It replaces certificate ${data.amends.certificateNumber}, which is superseded. Reason: ${data.amends.reason}`] : []),
      '',
      `You can check that the file is the one the laboratory issued at ${deps.config.baseUrl}/verify (SHA-256 of the attached PDF: ${sha256}).`,
      '',
      data.lab.name,
      ...(data.lab.contactEmail ? [data.lab.contactEmail] : []),
    ];
    return { subject, text: lines.join('\n') };
  }

  return {
    assemble,
    signatoryOf,

    /**
     * Issues the certificate of a submitted job approved by `actor`: number, PDF (worker pool),
     * signature, hash, then one transaction for the certificate row, the job's status
     * (submitted → approved → issued), the superseded certificate of an amendment, the e-mails and
     * the audit rows. Rendering happens before the transaction; a job changed meanwhile makes the
     * transaction fail and nothing is kept (the number drawn stays unused: numbers are never reused).
     */
    async issue(review: JobForReview, actor: Actor): Promise<CertificateRow> {
      const now = clock();
      const jobId = review.job.id;
      const number = await db.transaction((tx) => repo.nextNumber(tx, now.getUTCFullYear()));
      const assembled = await assemble(review, { number, signatory: signatoryOf(actor), now });
      if (!assembled.data) throw new IssueRefusedError(assembled.missing);
      const data = assembled.data;
      const unsigned = await deps.renderPdf(data);
      const identity = await labSigningIdentity(deps.config, data.lab.name);
      const pdf = await signPdf(unsigned, identity, {
        reason: `Calibration certificate ${number}, approved by ${actor.name}`,
        location: data.lab.name,
        contactInfo: data.lab.contactEmail ?? '',
        name: data.lab.name,
        signingTime: now,
      });
      const pdfSha256 = sha256Hex(pdf);
      const contacts = (await deps.customersRepo.contacts(review.job.customerId)).filter((c) => c.receivesCertificates && c.email);
      const amendment = await repo.amendmentOfJob(jobId);

      const cert = await db.transaction(async (tx) => {
        await deps.jobs.transitionJob(tx, jobId, 'submitted', 'approved', actor);
        await deps.jobs.transitionJob(tx, jobId, 'approved', 'issued', actor);
        // Audit rows carry the time they are written, after the job's transitions (which take the
        // clock themselves); `now`, the signing time printed on the certificate, lies before the
        // rendering and listed them before the job's approval.
        const at = clock();
        const row = await repo.insert(tx, {
          number,
          jobId,
          customerId: review.job.customerId,
          data,
          pdf,
          pdfSha256,
          pdfSize: pdf.length,
          signingFingerprint: identity.fingerprint,
          issuedAt: now,
          signatoryId: actor.id,
          signatoryName: actor.name,
          amendsId: amendment?.status === 'open' ? amendment.certificateId : null,
          amendReason: amendment?.status === 'open' ? amendment.reason : null,
        });
        await recordAudit(tx, {
          actor: auditActor(actor),
          action: 'issue',
          entity: 'certificate',
          entityId: row.id,
          after: { number, jobId, customerId: row.customerId, pdfSha256, pdfSize: pdf.length, signingFingerprint: identity.fingerprint, amends: amendment?.certificateNumber ?? null },
          at,
        });
        if (amendment?.status === 'open') {
          const old = await repo.lock(tx, amendment.certificateId);
          if (!old || !(await repo.markSuperseded(tx, amendment.certificateId, row.id, now))) {
            throw new ConflictError(`Certificate ${amendment.certificateNumber} is no longer current: it cannot be superseded.`, 'NOT_CURRENT');
          }
          await repo.markAmendmentIssued(tx, amendment.id, row.id);
          await recordAudit(tx, {
            actor: auditActor(actor),
            action: 'supersede',
            entity: 'certificate',
            entityId: amendment.certificateId,
            before: { status: 'current' },
            after: { status: 'superseded', supersededBy: number, reason: amendment.reason },
            at,
          });
        }
        for (const c of contacts) {
          const mail = mailFor(data, c.name, pdfSha256);
          const queued = await deps.outbox.enqueue({ to: [c.email], ...mail, attachments: [{ filename: `${number}.pdf`, contentType: 'application/pdf', content: pdf }] }, tx);
          await repo.insertMail(tx, { certificateId: row.id, outboxId: queued.id, recipient: c.email, createdAt: now });
          await recordAudit(tx, { actor: auditActor(actor), action: 'queue_email', entity: 'certificate', entityId: row.id, after: { outboxId: queued.id, to: c.email, subject: mail.subject }, at });
        }
        return row;
      });
      deps.outbox.kick();
      deps.logger.info('certificate issued', { number, jobId, mails: contacts.length });
      const [out] = await repo.list({ ids: [cert.id] });
      return out;
    },

    list: (filter: { customerId?: string } = {}) => repo.list(filter),

    async get(id: string, filter: { customerId?: string } = {}) {
      const row = await repo.get(id);
      if (!row || (filter.customerId && row.customerId !== filter.customerId)) throw new NotFoundError('There is no such certificate.');
      const [out] = await repo.list({ ids: [id] });
      const mails = filter.customerId ? [] : await repo.mailsOf(id);
      return {
        certificate: out,
        data: row.data as CertificateData,
        mails: mails.map((m) => ({ ...m, sentAt: m.sentAt?.toISOString() ?? null })),
      };
    },

    /** The signed PDF exactly as issued; each download is audited. */
    async download(id: string, actor: Actor, filter: { customerId?: string } = {}): Promise<{ number: string; pdf: Buffer }> {
      const row = await repo.get(id);
      if (!row || (filter.customerId && row.customerId !== filter.customerId)) throw new NotFoundError('There is no such certificate.');
      const pdf = await repo.pdf(id);
      if (!pdf) throw new NotFoundError('There is no such certificate.');
      await recordAudit(db, { actor: auditActor(actor), action: 'download', entity: 'certificate', entityId: id, after: { number: row.number, pdfSha256: row.pdfSha256 }, at: clock() });
      return { number: row.number, pdf };
    },

    /**
     * Opens an amendment (§7.8.8): a new draft revision of the certificate's job (a copy of the job,
     * its points, results and readings, for the same analyst), linked to the certificate with the
     * reason. The old certificate stays current until the new one is issued.
     */
    async amend(id: string, reason: string, actor: Actor) {
      const now = clock();
      return db.transaction(async (tx) => {
        const cert = await repo.lock(tx, id);
        if (!cert) throw new NotFoundError('There is no such certificate.');
        if (cert.status !== 'current') throw new ConflictError(`Certificate ${cert.number} is ${cert.status}: only a current certificate can be amended.`, 'NOT_CURRENT');
        if (!cert.jobId) throw new ConflictError(`Certificate ${cert.number} was not issued from a job in this system: it cannot be amended here.`, 'NO_JOB');
        const open = await repo.openAmendmentOfCertificate(id, tx);
        if (open) throw new ConflictError(`An amendment of ${cert.number} is already being prepared.`, 'AMENDMENT_OPEN');
        const [job] = await tx.select().from(jobsTable).where(eq(jobsTable.id, cert.jobId));
        const number = await deps.jobsRepo.nextNumber(tx, now.getUTCFullYear());
        const copy = await deps.jobsRepo.insert(tx, {
          number,
          customerId: job.customerId,
          itemId: job.itemId,
          itemLabel: job.itemLabel,
          templateVersionId: job.templateVersionId,
          receivedOn: job.receivedOn,
          calibratedOn: job.calibratedOn,
          location: job.location,
          environment: job.environment,
          analystId: job.analystId,
          createdAt: now,
          updatedAt: now,
        });
        const points = await tx.select().from(calibrationPoints).where(eq(calibrationPoints.jobId, job.id));
        for (const p of points) {
          const { id: oldPointId, jobId: _j, createdAt: _c, ...rest } = p;
          void _j;
          void _c;
          const [np] = await tx.insert(calibrationPoints).values({ ...rest, jobId: copy.id, createdAt: now }).returning({ id: calibrationPoints.id });
          const rs = await tx.select().from(readings).where(eq(readings.pointId, oldPointId));
          for (const r of rs) {
            const { id: _r, pointId: _p, ...fields } = r;
            void _r;
            void _p;
            await tx.insert(readings).values({ ...fields, pointId: np.id });
          }
        }
        const amendment = await repo.insertAmendment(tx, { certificateId: id, newJobId: copy.id, reason, openedBy: actor.id, openedAt: now });
        await recordAudit(tx, { actor: auditActor(actor), action: 'create', entity: 'job', entityId: copy.id, after: { number, revisionOf: job.number, amends: cert.number }, at: now });
        await recordAudit(tx, { actor: auditActor(actor), action: 'open_amendment', entity: 'certificate', entityId: id, after: { amendmentId: amendment.id, newJob: number, reason }, at: now });
        return { jobId: copy.id, jobNumber: number, certificateNumber: cert.number };
      });
    },

    async withdraw(id: string, reason: string, actor: Actor) {
      const now = clock();
      await db.transaction(async (tx) => {
        const cert = await repo.lock(tx, id);
        if (!cert) throw new NotFoundError('There is no such certificate.');
        if (cert.status !== 'current') throw new ConflictError(`Certificate ${cert.number} is ${cert.status}: only a current certificate can be withdrawn.`, 'NOT_CURRENT');
        if (await repo.openAmendmentOfCertificate(id, tx)) throw new ConflictError(`An amendment of ${cert.number} is being prepared: finish it instead.`, 'AMENDMENT_OPEN');
        await repo.markWithdrawn(tx, id, reason, now);
        await recordAudit(tx, { actor: auditActor(actor), action: 'withdraw', entity: 'certificate', entityId: id, before: { status: 'current' }, after: { status: 'withdrawn', reason }, at: now });
      });
      const [out] = await repo.list({ ids: [id] });
      return out;
    },

    /** For the portal: a job of the customer's own organisation with its certificates, else 404. */
    async jobForCustomer(jobId: string, customerId: string) {
      if (!/^[0-9a-f-]{36}$/i.test(jobId)) throw new NotFoundError('There is no such job.');
      const [job] = await db
        .select({ id: jobsTable.id, number: jobsTable.number, status: jobsTable.status, itemLabel: jobsTable.itemLabel, customerId: jobsTable.customerId })
        .from(jobsTable)
        .where(and(eq(jobsTable.id, jobId), eq(jobsTable.customerId, customerId)));
      if (!job) throw new NotFoundError('There is no such job.');
      return { job: { id: job.id, number: job.number, status: job.status, itemLabel: job.itemLabel }, certificates: await repo.list({ jobId, customerId }) };
    },

    assertNotAnalyst(review: JobForReview, actor: Actor, forbidSelfApproval: boolean) {
      if (forbidSelfApproval && review.job.analystId === actor.id) {
        throw new ForbiddenError('You prepared this job: another authorised signatory must review it (lab setting “signatory may not approve own work”).');
      }
    },
  };
}

export type CertificatesService = ReturnType<typeof createCertificatesService>;
