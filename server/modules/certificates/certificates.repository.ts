import { and, desc, eq, inArray, sql, type SQL } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { certificateAmendments, certificateMails, certificates, customers, jobs, mailOutbox, reviewSettings } from '../../db/schema';
import type { CertificateRow } from '../../../shared/schemas/certificates-api.schema';
import type { CertificateData } from '../../../shared/schemas/certificate.schema';

export type CertificateRecord = Omit<typeof certificates.$inferSelect, 'pdf'>;
export type AmendmentRecord = typeof certificateAmendments.$inferSelect;

/** Every column but the PDF bytes (lists never carry them). */
const columns = {
  id: certificates.id,
  number: certificates.number,
  jobId: certificates.jobId,
  customerId: certificates.customerId,
  data: certificates.data,
  pdfSha256: certificates.pdfSha256,
  pdfSize: certificates.pdfSize,
  signingFingerprint: certificates.signingFingerprint,
  issuedAt: certificates.issuedAt,
  signatoryId: certificates.signatoryId,
  signatoryName: certificates.signatoryName,
  amendsId: certificates.amendsId,
  amendReason: certificates.amendReason,
  status: certificates.status,
  supersededById: certificates.supersededById,
  supersededAt: certificates.supersededAt,
  withdrawnAt: certificates.withdrawnAt,
  withdrawnReason: certificates.withdrawnReason,
};

/** Drizzle queries of certificates, their amendments, their e-mails and the review settings. */
export function createCertificatesRepository(db: Db) {
  async function numbersOf(ids: string[], tx: Db = db): Promise<Map<string, string>> {
    if (ids.length === 0) return new Map();
    const rows = await tx.select({ id: certificates.id, number: certificates.number }).from(certificates).where(inArray(certificates.id, ids));
    return new Map(rows.map((r) => [r.id, r.number]));
  }

  async function rows(where: SQL | undefined, tx: Db = db): Promise<CertificateRow[]> {
    const list = await tx
      .select({ c: columns, customer: customers.organisation, jobNumber: jobs.number, itemLabel: jobs.itemLabel })
      .from(certificates)
      .innerJoin(customers, eq(customers.id, certificates.customerId))
      .leftJoin(jobs, eq(jobs.id, certificates.jobId))
      .where(where)
      .orderBy(desc(certificates.issuedAt), desc(certificates.number));
    const linked = [...new Set(list.flatMap((r) => [r.c.supersededById, r.c.amendsId]).filter((x): x is string => Boolean(x)))];
    const numbers = await numbersOf(linked, tx);
    const ids = list.map((r) => r.c.id);
    const open = ids.length
      ? await tx
          .select({ certificateId: certificateAmendments.certificateId, jobId: certificateAmendments.newJobId, jobNumber: jobs.number, reason: certificateAmendments.reason })
          .from(certificateAmendments)
          .innerJoin(jobs, eq(jobs.id, certificateAmendments.newJobId))
          .where(and(inArray(certificateAmendments.certificateId, ids), eq(certificateAmendments.status, 'open')))
      : [];
    return list.map(({ c, customer, jobNumber, itemLabel }) => {
      const data = c.data as CertificateData;
      const o = open.find((x) => x.certificateId === c.id);
      return {
        id: c.id,
        number: c.number,
        jobId: c.jobId,
        jobNumber: jobNumber ?? null,
        customer,
        itemLabel: itemLabel ?? [data.item.description, data.item.maker, data.item.model, `s/n ${data.item.serialNumber}`].join(', '),
        issuedAt: c.issuedAt.toISOString(),
        issueDate: data.dates.issue,
        signatoryName: c.signatoryName,
        status: c.status,
        supersededBy: c.supersededById ? (numbers.get(c.supersededById) ?? null) : null,
        amends: c.amendsId ? (numbers.get(c.amendsId) ?? null) : null,
        amendReason: c.amendReason,
        pdfSha256: c.pdfSha256,
        pdfSize: c.pdfSize,
        openAmendment: o ? { jobId: o.jobId, jobNumber: o.jobNumber, reason: o.reason } : null,
      };
    });
  }

  return {
    numbersOf,

    async nextNumber(tx: Db, year: number): Promise<string> {
      const res = await tx.execute(sql`select nextval('certificate_number_seq') as n`);
      const n = Number((res as unknown as { rows: Array<{ n: string | number }> }).rows[0].n);
      return `EMB-C-${year}-${String(n).padStart(4, '0')}`;
    },

    async insert(tx: Db, values: typeof certificates.$inferInsert): Promise<CertificateRecord> {
      const [row] = await tx.insert(certificates).values(values).returning(columns);
      return row;
    },

    async get(id: string, tx: Db = db): Promise<CertificateRecord | null> {
      if (!/^[0-9a-f-]{36}$/i.test(id)) return null;
      const [row] = await tx.select(columns).from(certificates).where(eq(certificates.id, id));
      return row ?? null;
    },

    async getByNumber(number: string): Promise<CertificateRecord | null> {
      const [row] = await db.select(columns).from(certificates).where(eq(certificates.number, number));
      return row ?? null;
    },

    async getByHash(sha256: string): Promise<CertificateRecord | null> {
      const [row] = await db.select(columns).from(certificates).where(eq(certificates.pdfSha256, sha256));
      return row ?? null;
    },

    /** Certificate rows for lists, newest first; `customerId` limits them to one organisation. */
    list: (filter: { customerId?: string; ids?: string[]; jobId?: string } = {}, tx: Db = db) => {
      const where: SQL[] = [];
      if (filter.customerId) where.push(eq(certificates.customerId, filter.customerId));
      if (filter.ids) where.push(filter.ids.length ? inArray(certificates.id, filter.ids) : sql`false`);
      if (filter.jobId) where.push(eq(certificates.jobId, filter.jobId));
      return rows(where.length ? and(...where) : undefined, tx);
    },

    async pdf(id: string): Promise<Buffer | null> {
      const [row] = await db.select({ pdf: certificates.pdf }).from(certificates).where(eq(certificates.id, id));
      return row?.pdf ?? null;
    },

    async lock(tx: Db, id: string): Promise<CertificateRecord | null> {
      const [row] = await tx.select(columns).from(certificates).where(eq(certificates.id, id)).for('update');
      return row ?? null;
    },

    async markSuperseded(tx: Db, id: string, byId: string, at: Date): Promise<boolean> {
      const r = await tx
        .update(certificates)
        .set({ status: 'superseded', supersededById: byId, supersededAt: at })
        .where(and(eq(certificates.id, id), eq(certificates.status, 'current')))
        .returning({ id: certificates.id });
      return r.length === 1;
    },

    async markWithdrawn(tx: Db, id: string, reason: string, at: Date): Promise<boolean> {
      const r = await tx
        .update(certificates)
        .set({ status: 'withdrawn', withdrawnAt: at, withdrawnReason: reason })
        .where(and(eq(certificates.id, id), eq(certificates.status, 'current')))
        .returning({ id: certificates.id });
      return r.length === 1;
    },

    async insertAmendment(tx: Db, values: typeof certificateAmendments.$inferInsert): Promise<AmendmentRecord> {
      const [row] = await tx.insert(certificateAmendments).values(values).returning();
      return row;
    },

    async openAmendmentOfCertificate(certificateId: string, tx: Db = db): Promise<AmendmentRecord | null> {
      const [row] = await tx
        .select()
        .from(certificateAmendments)
        .where(and(eq(certificateAmendments.certificateId, certificateId), eq(certificateAmendments.status, 'open')));
      return row ?? null;
    },

    /** The amendment a job was opened for (open or issued), with the amended certificate's number. */
    async amendmentOfJob(jobId: string, tx: Db = db): Promise<(AmendmentRecord & { certificateNumber: string }) | null> {
      const [row] = await tx
        .select({ a: certificateAmendments, certificateNumber: certificates.number })
        .from(certificateAmendments)
        .innerJoin(certificates, eq(certificates.id, certificateAmendments.certificateId))
        .where(eq(certificateAmendments.newJobId, jobId));
      return row ? { ...row.a, certificateNumber: row.certificateNumber } : null;
    },

    async amendmentsOfJobs(jobIds: string[]): Promise<Map<string, { certificateNumber: string; reason: string }>> {
      if (jobIds.length === 0) return new Map();
      const list = await db
        .select({ jobId: certificateAmendments.newJobId, certificateNumber: certificates.number, reason: certificateAmendments.reason })
        .from(certificateAmendments)
        .innerJoin(certificates, eq(certificates.id, certificateAmendments.certificateId))
        .where(inArray(certificateAmendments.newJobId, jobIds));
      return new Map(list.map((r) => [r.jobId, { certificateNumber: r.certificateNumber, reason: r.reason }]));
    },

    async markAmendmentIssued(tx: Db, id: string, newCertificateId: string): Promise<void> {
      await tx.update(certificateAmendments).set({ status: 'issued', newCertificateId }).where(eq(certificateAmendments.id, id));
    },

    async insertMail(tx: Db, values: typeof certificateMails.$inferInsert): Promise<void> {
      await tx.insert(certificateMails).values(values);
    },

    async mailsOf(certificateId: string) {
      return db
        .select({ id: mailOutbox.id, to: mailOutbox.to, status: mailOutbox.status, attempts: mailOutbox.attempts, lastError: mailOutbox.lastError, sentAt: mailOutbox.sentAt })
        .from(certificateMails)
        .innerJoin(mailOutbox, eq(mailOutbox.id, certificateMails.outboxId))
        .where(eq(certificateMails.certificateId, certificateId))
        .orderBy(mailOutbox.createdAt);
    },

    /** Certificate number of each outbox row that carried one. */
    async certificateNumbersOfMails(outboxIds: string[]): Promise<Map<string, string>> {
      if (outboxIds.length === 0) return new Map();
      const list = await db
        .select({ outboxId: certificateMails.outboxId, number: certificates.number, certificateId: certificates.id })
        .from(certificateMails)
        .innerJoin(certificates, eq(certificates.id, certificateMails.certificateId))
        .where(inArray(certificateMails.outboxId, outboxIds));
      return new Map(list.map((r) => [r.outboxId, r.number]));
    },

    async certificateOfMail(outboxId: string, tx: Db = db): Promise<string | null> {
      const [row] = await tx.select({ id: certificateMails.certificateId }).from(certificateMails).where(eq(certificateMails.outboxId, outboxId));
      return row?.id ?? null;
    },

    async settings(tx: Db = db): Promise<{ forbidSelfApproval: boolean }> {
      const [row] = await tx.select().from(reviewSettings).where(eq(reviewSettings.id, 1));
      return { forbidSelfApproval: row?.forbidSelfApproval ?? true };
    },

    async saveSettings(tx: Db, s: { forbidSelfApproval: boolean }, now: Date): Promise<void> {
      await tx
        .insert(reviewSettings)
        .values({ id: 1, forbidSelfApproval: s.forbidSelfApproval, updatedAt: now })
        .onConflictDoUpdate({ target: reviewSettings.id, set: { forbidSelfApproval: s.forbidSelfApproval, updatedAt: now } });
    },
  };
}

export type CertificatesRepository = ReturnType<typeof createCertificatesRepository>;
