import { and, asc, count, desc, eq, exists, ilike, inArray, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import type { Db } from '../../db/client';
import { calibrationPoints, certificateAmendments, certificates, customers, jobs, readings, user } from '../../db/schema';
import type { JobAmendedBy, JobAmends, JobListQuery, JobStatus } from '../../../shared/schemas/jobs.schema';

export type JobRow = typeof jobs.$inferSelect;
export type PointRow = typeof calibrationPoints.$inferSelect;
export type ReadingRow = typeof readings.$inferSelect;

export type JobListRow = Pick<JobRow, 'id' | 'number' | 'status' | 'itemLabel' | 'calibratedOn' | 'receivedOn' | 'updatedAt' | 'customerId' | 'templateVersionId'> & {
  customer: string;
  analyst: string;
  points: number;
  amends: JobAmends | null;
  amendedBy: JobAmendedBy | null;
};

/** The certificate an amendment amends, and the one its approval issued (ISO/IEC 17025:2017 §7.8.8). */
const amendedCertificate = alias(certificates, 'amended_certificate');
const replacingCertificate = alias(certificates, 'replacing_certificate');
/** The job opened to prepare an amendment, and the job the amended certificate was issued from. */
const amendingJob = alias(jobs, 'amending_job');
const amendedJob = alias(jobs, 'amended_job');
/** The same three tables again, for the search's subquery: a job whose certificate is amended by a job whose number matches. */
const searchedAmendment = alias(certificateAmendments, 'searched_amendment');
const searchedCertificate = alias(certificates, 'searched_certificate');
const searchedAmendingJob = alias(jobs, 'searched_amending_job');

/** Columns of an amendment; every one is null for a job without one (left joins). */
const amendmentColumns = {
  certificateNumber: amendedCertificate.number,
  reason: certificateAmendments.reason,
  status: certificateAmendments.status,
  newCertificateNumber: replacingCertificate.number,
};
/** …of the amendment a job was opened for, with the job whose certificate it amends. */
const amendsColumns = { ...amendmentColumns, jobId: amendedJob.id, jobNumber: amendedJob.number };
type AmendmentColumns = { certificateNumber: string | null; reason: string | null; status: 'open' | 'issued' | null; newCertificateNumber: string | null };
type AmendsColumns = AmendmentColumns & { jobId: string | null; jobNumber: string | null };

function toAmendment(a: AmendmentColumns | null) {
  // Drizzle may give a nested selection over left-joined tables as null when every column is null.
  if (!a || a.certificateNumber === null || a.reason === null || a.status === null) return null;
  return { certificateNumber: a.certificateNumber, reason: a.reason, status: a.status, newCertificateNumber: a.status === 'issued' ? a.newCertificateNumber : null };
}

/** An amended certificate always comes from a job here: POST /api/certificates/:id/amend refuses any other. */
function toAmends(a: AmendsColumns | null): JobAmends | null {
  const amendment = toAmendment(a);
  return amendment && a?.jobId && a.jobNumber ? { ...amendment, jobId: a.jobId, jobNumber: a.jobNumber } : null;
}

/** Drizzle queries of jobs, their points and readings. No HTTP, no rules. */
export function createJobsRepository(db: Db) {
  return {
    async nextNumber(tx: Db, year: number): Promise<string> {
      const res = await tx.execute(sql`select nextval('job_number_seq') as n`);
      const n = Number((res as unknown as { rows: Array<{ n: string | number }> }).rows[0].n);
      return `EMB-${year}-${String(n).padStart(4, '0')}`;
    },

    async list(q: JobListQuery, analystId?: string): Promise<{ rows: JobListRow[]; total: number }> {
      const where: SQL[] = [];
      if (q.status) where.push(eq(jobs.status, q.status));
      if (q.customerId) where.push(eq(jobs.customerId, q.customerId));
      if (analystId) where.push(eq(jobs.analystId, analystId));
      if (q.q && q.q.trim()) {
        const like = `%${q.q.trim().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
        // A job is found by its number, item or customer; an amendment also by the number of the
        // certificate it amends; and a job whose certificate is amended also by the number of the
        // job opened for the amendment, as the list names it ('Being amended in …', 'Amended by …').
        const amendedInMatchingJob = db
          .select({ one: sql`1` })
          .from(searchedAmendment)
          .innerJoin(searchedCertificate, eq(searchedCertificate.id, searchedAmendment.certificateId))
          .innerJoin(searchedAmendingJob, eq(searchedAmendingJob.id, searchedAmendment.newJobId))
          .where(and(eq(searchedCertificate.jobId, jobs.id), ilike(searchedAmendingJob.number, like)));
        where.push(or(ilike(jobs.number, like), ilike(jobs.itemLabel, like), ilike(customers.organisation, like), ilike(amendedCertificate.number, like), exists(amendedInMatchingJob))!);
      }
      const cond = where.length ? and(...where) : undefined;
      const pointsCount = db.$count(calibrationPoints, eq(calibrationPoints.jobId, jobs.id));
      const rows = await db
        .select({
          id: jobs.id, number: jobs.number, status: jobs.status, itemLabel: jobs.itemLabel, calibratedOn: jobs.calibratedOn,
          receivedOn: jobs.receivedOn, updatedAt: jobs.updatedAt, customerId: jobs.customerId, templateVersionId: jobs.templateVersionId,
          customer: customers.organisation, analyst: user.name, points: pointsCount, amends: amendsColumns,
        })
        .from(jobs)
        .innerJoin(customers, eq(customers.id, jobs.customerId))
        .innerJoin(user, eq(user.id, jobs.analystId))
        .leftJoin(certificateAmendments, eq(certificateAmendments.newJobId, jobs.id))
        .leftJoin(amendedCertificate, eq(amendedCertificate.id, certificateAmendments.certificateId))
        .leftJoin(amendedJob, eq(amendedJob.id, amendedCertificate.jobId))
        .leftJoin(replacingCertificate, eq(replacingCertificate.id, certificateAmendments.newCertificateId))
        .where(cond)
        .orderBy(desc(jobs.updatedAt), desc(jobs.number))
        .limit(q.pageSize)
        .offset((q.page - 1) * q.pageSize);
      const [{ total }] = await db
        .select({ total: count() })
        .from(jobs)
        .innerJoin(customers, eq(customers.id, jobs.customerId))
        .leftJoin(certificateAmendments, eq(certificateAmendments.newJobId, jobs.id))
        .leftJoin(amendedCertificate, eq(amendedCertificate.id, certificateAmendments.certificateId))
        .where(cond);
      const amendedBy = await this.amendedByOfJobs(rows.map((r) => r.id));
      return {
        rows: rows.map((r) => ({ ...r, points: Number(r.points), amends: toAmends(r.amends), amendedBy: amendedBy.get(r.id) ?? null })),
        total: Number(total),
      };
    },

    async get(id: string, tx: Db = db): Promise<(JobRow & { customer: string; analyst: string }) | null> {
      const [row] = await tx
        .select({ job: jobs, customer: customers.organisation, analyst: user.name })
        .from(jobs)
        .innerJoin(customers, eq(customers.id, jobs.customerId))
        .innerJoin(user, eq(user.id, jobs.analystId))
        .where(eq(jobs.id, id));
      return row ? { ...row.job, customer: row.customer, analyst: row.analyst } : null;
    },

    /**
     * The amendment a job was opened for (at most one: `new_job_id` is unique), with the number
     * of the certificate it amends and the job it was issued from and, once approved, the number
     * of the certificate that replaced it.
     */
    async amendsOf(jobId: string, tx: Db = db): Promise<JobAmends | null> {
      const [row] = await tx
        .select(amendsColumns)
        .from(certificateAmendments)
        .innerJoin(amendedCertificate, eq(amendedCertificate.id, certificateAmendments.certificateId))
        .leftJoin(amendedJob, eq(amendedJob.id, amendedCertificate.jobId))
        .leftJoin(replacingCertificate, eq(replacingCertificate.id, certificateAmendments.newCertificateId))
        .where(eq(certificateAmendments.newJobId, jobId));
      return row ? toAmends(row) : null;
    },

    /**
     * The amendment of the certificate issued from this job, with the job opened to prepare it;
     * null when the job's certificate has never been amended. Only a current certificate can be
     * amended and the issued amendment supersedes it, so there is at most one; the latest is taken.
     */
    async amendedByOf(jobId: string, tx: Db = db): Promise<JobAmendedBy | null> {
      return (await this.amendedByOfJobs([jobId], tx)).get(jobId) ?? null;
    },

    /** {@link amendedByOf} for several jobs at once (a page of the jobs list), by job id. */
    async amendedByOfJobs(jobIds: string[], tx: Db = db): Promise<Map<string, JobAmendedBy>> {
      const found = new Map<string, JobAmendedBy>();
      if (jobIds.length === 0) return found;
      const rows = await tx
        .select({ of: amendedCertificate.jobId, amendment: amendmentColumns, jobId: amendingJob.id, jobNumber: amendingJob.number, jobStatus: amendingJob.status })
        .from(certificateAmendments)
        .innerJoin(amendedCertificate, eq(amendedCertificate.id, certificateAmendments.certificateId))
        .innerJoin(amendingJob, eq(amendingJob.id, certificateAmendments.newJobId))
        .leftJoin(replacingCertificate, eq(replacingCertificate.id, certificateAmendments.newCertificateId))
        .where(inArray(amendedCertificate.jobId, jobIds))
        .orderBy(desc(certificateAmendments.openedAt));
      for (const row of rows) {
        const amendment = toAmendment(row.amendment);
        if (row.of && amendment && !found.has(row.of)) found.set(row.of, { ...amendment, jobId: row.jobId, jobNumber: row.jobNumber, jobStatus: row.jobStatus });
      }
      return found;
    },

    async lockJob(tx: Db, id: string): Promise<JobRow | null> {
      const [row] = await tx.select().from(jobs).where(eq(jobs.id, id)).for('update');
      return row ?? null;
    },

    async insert(tx: Db, values: typeof jobs.$inferInsert): Promise<JobRow> {
      const [row] = await tx.insert(jobs).values(values).returning();
      return row;
    },

    async update(tx: Db, id: string, values: Partial<typeof jobs.$inferInsert>): Promise<JobRow> {
      const [row] = await tx.update(jobs).set(values).where(eq(jobs.id, id)).returning();
      return row;
    },

    async setStatus(tx: Db, id: string, from: JobStatus, values: Partial<typeof jobs.$inferInsert>): Promise<JobRow | null> {
      const [row] = await tx.update(jobs).set(values).where(and(eq(jobs.id, id), eq(jobs.status, from))).returning();
      return row ?? null;
    },

    async points(jobId: string, tx: Db = db): Promise<PointRow[]> {
      return tx.select().from(calibrationPoints).where(eq(calibrationPoints.jobId, jobId)).orderBy(asc(calibrationPoints.position), asc(calibrationPoints.createdAt));
    },

    async point(id: string, tx: Db = db): Promise<PointRow | null> {
      const [row] = await tx.select().from(calibrationPoints).where(eq(calibrationPoints.id, id));
      return row ?? null;
    },

    async insertPoint(tx: Db, values: typeof calibrationPoints.$inferInsert): Promise<PointRow> {
      const [row] = await tx.insert(calibrationPoints).values(values).returning();
      return row;
    },

    async updatePoint(tx: Db, id: string, values: Partial<typeof calibrationPoints.$inferInsert>): Promise<PointRow> {
      const [row] = await tx.update(calibrationPoints).set(values).where(eq(calibrationPoints.id, id)).returning();
      return row;
    },

    async deletePoint(tx: Db, id: string): Promise<void> {
      await tx.delete(calibrationPoints).where(eq(calibrationPoints.id, id));
    },

    async readings(pointId: string, tx: Db = db): Promise<ReadingRow[]> {
      return tx.select().from(readings).where(eq(readings.pointId, pointId)).orderBy(asc(readings.symbol));
    },

    async readingsOfJob(jobId: string, tx: Db = db): Promise<ReadingRow[]> {
      return tx
        .select({ r: readings })
        .from(readings)
        .innerJoin(calibrationPoints, eq(calibrationPoints.id, readings.pointId))
        .where(eq(calibrationPoints.jobId, jobId))
        .then((rows) => rows.map((x) => x.r));
    },

    async upsertReadings(tx: Db, values: typeof readings.$inferInsert): Promise<ReadingRow> {
      const [row] = await tx
        .insert(readings)
        .values(values)
        .onConflictDoUpdate({ target: [readings.pointId, readings.symbol], set: { values: values.values, fileName: values.fileName, sha256: values.sha256, column: values.column, uploadedBy: values.uploadedBy, uploadedAt: values.uploadedAt } })
        .returning();
      return row;
    },

    async deleteReadings(tx: Db, pointId: string, symbol: string): Promise<void> {
      await tx.delete(readings).where(and(eq(readings.pointId, pointId), eq(readings.symbol, symbol)));
    },
  };
}

export type JobsRepository = ReturnType<typeof createJobsRepository>;
