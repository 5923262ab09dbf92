import { sql } from 'drizzle-orm';
import { boolean, check, customType, index, integer, jsonb, pgSequence, pgTable, text, timestamp, uniqueIndex, uuid, type AnyPgColumn } from 'drizzle-orm/pg-core';
import { user } from './auth';
import { customers } from './customers';
import { jobs } from './jobs';
import { mailOutbox } from './mail-outbox';

/** PostgreSQL bytea as a Node Buffer (node-postgres gives a Buffer, PGlite a Uint8Array). */
const bytea = customType<{ data: Buffer; driverData: Uint8Array }>({
  dataType: () => 'bytea',
  fromDriver: (v) => (Buffer.isBuffer(v) ? v : Buffer.from(v.buffer, v.byteOffset, v.byteLength)),
  toDriver: (v) => v,
});

/** Source of certificate numbers (EMB-C-<year>-<nnnn>); never reused. */
export const certificateNumberSeq = pgSequence('certificate_number_seq', { startWith: 1, increment: 1 });

export const CERTIFICATE_STATUSES = ['current', 'superseded', 'withdrawn'] as const;
export type CertificateStatus = (typeof CERTIFICATE_STATUSES)[number];

/**
 * An issued calibration certificate (ISO/IEC 17025:2017 §7.8). The number, the frozen
 * CertificateData, the signed PDF, its SHA-256 and the issue time never change once written;
 * the status may only go from current to superseded (§7.8.8 amendment) or withdrawn. Migration
 * 0010's trigger refuses anything else, and any DELETE, whoever sends it.
 */
export const certificates = pgTable(
  'certificates',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    number: text('number').notNull(),
    /** The job it was issued from; null only for the demo certificate built from its own invented data. */
    jobId: uuid('job_id').references(() => jobs.id, { onDelete: 'restrict' }),
    customerId: uuid('customer_id')
      .notNull()
      .references(() => customers.id, { onDelete: 'restrict' }),
    /** shared/schemas/certificate.schema.ts CertificateData, exactly as rendered. */
    data: jsonb('data').notNull(),
    pdf: bytea('pdf').notNull(),
    pdfSha256: text('pdf_sha256').notNull(),
    pdfSize: integer('pdf_size').notNull(),
    /** Fingerprint (SHA-256) of the signing certificate used. */
    signingFingerprint: text('signing_fingerprint').notNull(),
    issuedAt: timestamp('issued_at', { withTimezone: true }).notNull(),
    signatoryId: uuid('signatory_id').references(() => user.id, { onDelete: 'restrict' }),
    signatoryName: text('signatory_name').notNull(),
    /** The certificate this one amends (§7.8.8), and why. */
    amendsId: uuid('amends_id').references((): AnyPgColumn => certificates.id, { onDelete: 'restrict' }),
    amendReason: text('amend_reason'),
    status: text('status').$type<CertificateStatus>().notNull().default('current'),
    supersededById: uuid('superseded_by_id').references((): AnyPgColumn => certificates.id, { onDelete: 'restrict' }),
    supersededAt: timestamp('superseded_at', { withTimezone: true }),
    withdrawnAt: timestamp('withdrawn_at', { withTimezone: true }),
    withdrawnReason: text('withdrawn_reason'),
  },
  (t) => [
    uniqueIndex('certificates_number_idx').on(t.number),
    uniqueIndex('certificates_pdf_sha256_idx').on(t.pdfSha256),
    index('certificates_customer_idx').on(t.customerId),
    index('certificates_job_idx').on(t.jobId),
    check('certificates_status_check', sql`${t.status} IN ('current', 'superseded', 'withdrawn')`),
    check('certificates_superseded_check', sql`(${t.status} = 'superseded') = (${t.supersededById} IS NOT NULL)`),
  ],
);

export const AMENDMENT_STATUSES = ['open', 'issued'] as const;
export type AmendmentStatus = (typeof AMENDMENT_STATUSES)[number];

/**
 * An amendment in progress (§7.8.8): the issued certificate, why it is amended, and the new
 * draft revision of its job that goes through submission and review again.
 */
export const certificateAmendments = pgTable(
  'certificate_amendments',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    certificateId: uuid('certificate_id')
      .notNull()
      .references(() => certificates.id, { onDelete: 'restrict' }),
    newJobId: uuid('new_job_id')
      .notNull()
      .references(() => jobs.id, { onDelete: 'restrict' }),
    reason: text('reason').notNull(),
    openedBy: uuid('opened_by')
      .notNull()
      .references(() => user.id, { onDelete: 'restrict' }),
    openedAt: timestamp('opened_at', { withTimezone: true }).notNull(),
    status: text('status').$type<AmendmentStatus>().notNull().default('open'),
    newCertificateId: uuid('new_certificate_id').references(() => certificates.id, { onDelete: 'restrict' }),
  },
  (t) => [
    uniqueIndex('certificate_amendments_new_job_idx').on(t.newJobId),
    // One open amendment per certificate at a time.
    uniqueIndex('certificate_amendments_one_open_idx').on(t.certificateId).where(sql`${t.status} = 'open'`),
    check('certificate_amendments_status_check', sql`${t.status} IN ('open', 'issued')`),
  ],
);

/** Which outbox message carried which certificate to whom. */
export const certificateMails = pgTable(
  'certificate_mails',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    certificateId: uuid('certificate_id')
      .notNull()
      .references(() => certificates.id, { onDelete: 'restrict' }),
    outboxId: uuid('outbox_id')
      .notNull()
      .references(() => mailOutbox.id, { onDelete: 'restrict' }),
    recipient: text('recipient').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('certificate_mails_certificate_idx').on(t.certificateId), uniqueIndex('certificate_mails_outbox_idx').on(t.outboxId)],
);

/** Review rules of the laboratory: exactly one row, id 1 (absent: the defaults). */
export const reviewSettings = pgTable(
  'review_settings',
  {
    id: integer('id').primaryKey().default(1),
    /** The job's own analyst may not approve it (on by default; ISO/IEC 17025:2017 §7.8.1.1 review before release). */
    forbidSelfApproval: boolean('forbid_self_approval').notNull().default(true),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [check('review_settings_single_row', sql`${t.id} = 1`)],
);
