/**
 * API contracts of review and approval, issued certificates, the customer portal, the public
 * verification and the e-mail log (issue 6). The certificate's own content is
 * ./certificate.schema.ts (CertificateData).
 */
import { z } from 'zod';
import { certificateSchema } from './certificate.schema';
import { jobAmendsSchema } from './jobs.schema';

export const CERTIFICATE_STATUSES = ['current', 'superseded', 'withdrawn'] as const;
export const certificateStatusSchema = z.enum(CERTIFICATE_STATUSES);
export type CertificateStatus = z.infer<typeof certificateStatusSchema>;

/** Words for a certificate's status (always shown as text, not colour alone). */
export function certificateStatusText(c: { status: CertificateStatus; supersededBy?: string | null }): string {
  if (c.status === 'superseded') return c.supersededBy ? `Superseded by ${c.supersededBy}` : 'Superseded';
  if (c.status === 'withdrawn') return 'Withdrawn';
  return 'Current';
}

/* ---------------------------------------------------------------- review */

export const rejectBodySchema = z
  .object({ comment: z.string({ error: 'say why the job is sent back' }).trim().min(3, { message: 'say why the job is sent back (at least 3 characters)' }).max(4000) })
  .strict();

export const approveBodySchema = z
  .object({ password: z.string({ error: 'enter your password to sign' }).min(1, { message: 'enter your password to sign' }).max(256) })
  .strict();

export const reviewSettingsSchema = z.object({ forbidSelfApproval: z.boolean() }).strict();
export type ReviewSettings = z.infer<typeof reviewSettingsSchema>;

export const reviewQueueRowSchema = z.object({
  jobId: z.string(),
  jobNumber: z.string(),
  customer: z.string(),
  itemLabel: z.string(),
  analyst: z.string(),
  analystId: z.string(),
  submittedAt: z.string().nullable(),
  points: z.number(),
  /** Set when the job is an amendment of an issued certificate. */
  amends: z.object({ certificateNumber: z.string(), reason: z.string() }).nullable(),
});
export type ReviewQueueRow = z.infer<typeof reviewQueueRowSchema>;
export const reviewQueueSchema = z.object({ jobs: z.array(reviewQueueRowSchema) });

export const readinessIssueSchema = z.object({ code: z.string(), message: z.string() });

/**
 * The review page: the job as the jobs module gives it (points with results, checks), the
 * certificate preview built from the same CertificateData as the PDF, and what would block approval.
 */
export const reviewDetailSchema = z.object({
  job: z.object({
    id: z.string(),
    number: z.string(),
    status: z.string(),
    customer: z.string().nullable(),
    itemLabel: z.string(),
    analyst: z.string().nullable(),
    analystId: z.string(),
    submittedAt: z.string().nullable(),
    reviewComment: z.string().nullable(),
    rejectedAt: z.string().nullable(),
  }),
  template: z.object({ name: z.string(), version: z.number() }),
  points: z.array(
    z.object({
      id: z.string(),
      position: z.number(),
      nominal: z.string(),
      current: z.boolean(),
      result: z.unknown().nullable(),
      reported: z.unknown().nullable(),
      inputs: z.array(z.object({ symbol: z.string(), description: z.string().optional(), unit: z.string().optional(), displayUnit: z.string().optional(), source: z.string().optional() }).passthrough()),
      cmc: z.unknown().nullable(),
      outsideScope: z.boolean(),
      outsideScopeReason: z.string().nullable(),
    }),
  ),
  checks: z.object({ reasons: z.array(z.object({ code: z.string(), message: z.string() }).passthrough()), notes: z.array(z.object({ code: z.string(), message: z.string() }).passthrough()) }),
  /** null when the certificate cannot be assembled yet (see `blocking`). */
  preview: certificateSchema.nullable(),
  /** What stops approval: failed checks, missing certificate content, the reviewer being the analyst. */
  blocking: z.array(readinessIssueSchema),
  /**
   * Set while the job is an amendment being prepared: the certificate it amends, why, and the job
   * that certificate was issued from (`jobId`, `jobNumber`), as the job's own page names it.
   */
  amends: jobAmendsSchema.pick({ certificateNumber: true, reason: true, jobId: true, jobNumber: true }).nullable(),
  settings: reviewSettingsSchema,
});
export type ReviewDetail = z.infer<typeof reviewDetailSchema>;

/* ---------------------------------------------------------- certificates */

export const certificateRowSchema = z.object({
  id: z.string(),
  number: z.string(),
  jobId: z.string().nullable(),
  jobNumber: z.string().nullable(),
  customer: z.string(),
  itemLabel: z.string(),
  issuedAt: z.string(),
  issueDate: z.string(),
  signatoryName: z.string(),
  status: certificateStatusSchema,
  supersededBy: z.string().nullable(),
  amends: z.string().nullable(),
  amendReason: z.string().nullable(),
  pdfSha256: z.string(),
  pdfSize: z.number(),
  /** An amendment of this certificate is being prepared (its new job number). */
  openAmendment: z.object({ jobId: z.string(), jobNumber: z.string(), reason: z.string() }).nullable(),
});
export type CertificateRow = z.infer<typeof certificateRowSchema>;
export const certificateListSchema = z.object({ certificates: z.array(certificateRowSchema) });

export const mailDeliverySchema = z.object({
  id: z.string(),
  to: z.array(z.string()),
  status: z.string(),
  attempts: z.number(),
  lastError: z.string().nullable(),
  sentAt: z.string().nullable(),
});

export const certificateDetailSchema = z.object({
  certificate: certificateRowSchema,
  data: certificateSchema,
  mails: z.array(mailDeliverySchema),
});
export type CertificateDetail = z.infer<typeof certificateDetailSchema>;

export const amendBodySchema = z
  .object({ reason: z.string({ error: 'say why the certificate is amended' }).trim().min(5, { message: 'say why the certificate is amended (at least 5 characters)' }).max(2000) })
  .strict();

export const withdrawBodySchema = z
  .object({ reason: z.string({ error: 'say why the certificate is withdrawn' }).trim().min(5, { message: 'say why the certificate is withdrawn (at least 5 characters)' }).max(2000) })
  .strict();

export const amendResponseSchema = z.object({ jobId: z.string(), jobNumber: z.string(), certificateNumber: z.string() });

/* -------------------------------------------------------------- verify */

/** What the public check reveals: the certificate's own header and its status, nothing more. */
export const publicCertificateSchema = z.object({
  number: z.string(),
  issueDate: z.string(),
  lab: z.string(),
  customer: z.string(),
  status: certificateStatusSchema,
  supersededBy: z.string().nullable(),
  withdrawnOn: z.string().nullable(),
});
export type PublicCertificate = z.infer<typeof publicCertificateSchema>;

export const verifyFileResponseSchema = z.object({
  authentic: z.boolean(),
  sha256: z.string(),
  certificate: publicCertificateSchema.nullable(),
});
export type VerifyFileResponse = z.infer<typeof verifyFileResponseSchema>;

export const verifyNumberResponseSchema = z.object({ found: z.boolean(), certificate: publicCertificateSchema.nullable() });
export type VerifyNumberResponse = z.infer<typeof verifyNumberResponseSchema>;

/** Largest PDF the verification page accepts. */
export const VERIFY_MAX_BYTES = 10 * 1024 * 1024;

/* ---------------------------------------------------------------- mail */

export const outboxRowSchema = z.object({
  id: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  status: z.enum(['queued', 'sending', 'sent', 'failed']),
  attempts: z.number(),
  lastError: z.string().nullable(),
  nextAttemptAt: z.string(),
  sentAt: z.string().nullable(),
  createdAt: z.string(),
  attachments: z.array(z.object({ filename: z.string(), size: z.number() })),
  certificateNumber: z.string().nullable(),
});
export type OutboxRow = z.infer<typeof outboxRowSchema>;
export const outboxListSchema = z.object({ messages: z.array(outboxRowSchema) });

export const mailboxMessageSchema = z.object({
  id: z.string(),
  receivedAt: z.string(),
  from: z.string().nullable(),
  to: z.array(z.string()),
  subject: z.string(),
  text: z.string(),
  attachments: z.array(z.object({ index: z.number(), filename: z.string().nullable(), contentType: z.string(), size: z.number() })),
});
export type MailboxMessage = z.infer<typeof mailboxMessageSchema>;
export const mailboxSchema = z.object({ available: z.boolean(), messages: z.array(mailboxMessageSchema) });
