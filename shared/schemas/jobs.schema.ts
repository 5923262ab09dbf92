/**
 * Contracts of calibration jobs, their points and readings (API bodies and answers).
 * A point's inputs are the budget document's inputs (budget.schema.ts) with what the lab's
 * workflow adds: where the value came from, the unit shown to people and the reference
 * standard it was taken from. An input not filled yet has `distribution: null`.
 */
import { z } from 'zod';
import { correlationSchema, distributionSchema, symbolSchema } from './budget.schema';
import { INPUT_SOURCES } from './template.schema';

export const JOB_STATUSES = ['draft', 'submitted', 'approved', 'issued'] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];
export const JOB_STATUS_LABELS: Record<JobStatus, string> = {
  draft: 'Draft',
  submitted: 'Submitted for review',
  approved: 'Approved',
  issued: 'Certificate issued',
};

const isoDate = z
  .string({ error: 'a date must be given as YYYY-MM-DD' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, { message: 'a date must be given as YYYY-MM-DD' })
  .refine((s) => !Number.isNaN(Date.parse(s)), { message: 'not a calendar date' });

const conditionSchema = z
  .object({
    value: z.number({ error: 'the value must be a number' }).refine(Number.isFinite, { message: 'the value must be finite' }),
    u: z.number({ error: 'the uncertainty must be a number' }).nonnegative({ message: 'the uncertainty must not be negative' }).optional(),
    unit: z.string().max(20),
  })
  .strict();

export const environmentSchema = z
  .object({ temperature: conditionSchema.optional(), humidity: conditionSchema.optional() })
  .strict();
export type Environment = z.infer<typeof environmentSchema>;

export const createJobSchema = z
  .object({
    customerId: z.uuid({ message: 'choose a customer' }),
    itemId: z.uuid({ message: 'choose the item to calibrate' }),
    templateVersionId: z.uuid({ message: 'choose a released measurement model' }),
    receivedOn: isoDate.nullable().optional(),
    calibratedOn: isoDate.nullable().optional(),
    location: z.string().max(200, { message: 'the location must be at most 200 characters' }).optional(),
    environment: environmentSchema.optional(),
  })
  .strict();
export type CreateJob = z.infer<typeof createJobSchema>;

export const updateJobSchema = createJobSchema.omit({ customerId: true, templateVersionId: true }).partial().strict();
export type UpdateJob = z.infer<typeof updateJobSchema>;

export const jobListQuerySchema = z.object({
  status: z.enum(JOB_STATUSES, { error: `status must be one of: ${JOB_STATUSES.join(', ')}` }).optional(),
  customerId: z.uuid({ message: 'customerId must be a customer id' }).optional(),
  q: z.string().max(100).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});
export type JobListQuery = z.infer<typeof jobListQuerySchema>;

/**
 * An amendment (ISO/IEC 17025:2017 §7.8.8) as both of its jobs tell it: the issued certificate
 * amended, the reason given, and whether the amendment is still being prepared (`open`) or its
 * new certificate has been issued and replaced the old one (`issued`).
 */
const amendmentSchema = z.object({
  certificateNumber: z.string(),
  reason: z.string(),
  status: z.enum(['open', 'issued']),
  /** The certificate issued from the amending job, which replaced the amended one; null while open. */
  newCertificateNumber: z.string().nullable(),
});

/**
 * What a job says about the amendment it was opened for: the amendment (`certificateNumber` is
 * the certificate it amends), and the job that certificate was issued from, which this job revises.
 */
export const jobAmendsSchema = amendmentSchema.extend({
  jobId: z.string(),
  jobNumber: z.string(),
});
export type JobAmends = z.infer<typeof jobAmendsSchema>;

/** A job record as the API answers it (create, update, submit). */
export const jobSchema = z.object({
  id: z.string(),
  number: z.string(),
  status: z.enum(JOB_STATUSES),
  customerId: z.string(),
  customer: z.string().nullable(),
  itemId: z.string(),
  itemLabel: z.string(),
  templateVersionId: z.string(),
  receivedOn: z.string().nullable(),
  calibratedOn: z.string().nullable(),
  location: z.string(),
  environment: environmentSchema,
  reviewComment: z.string().nullable(),
  rejectedAt: z.string().nullable(),
  submittedAt: z.string().nullable(),
  analystId: z.string(),
  analyst: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type JobDto = z.infer<typeof jobSchema>;

/**
 * What a job says about an amendment of the certificate issued from it (ISO/IEC 17025:2017
 * §7.8.8): the amendment (`certificateNumber` is this job's certificate), and the job opened to
 * prepare it, with that job's own status.
 */
export const jobAmendedBySchema = amendmentSchema.extend({
  jobId: z.string(),
  jobNumber: z.string(),
  jobStatus: z.enum(JOB_STATUSES),
});
export type JobAmendedBy = z.infer<typeof jobAmendedBySchema>;

/**
 * The job on its own page (GET /api/jobs/:id): the record, the amendment it was opened for, if
 * any, and the amendment of its own certificate, if any (at most one: only a current certificate
 * can be amended, one amendment at a time, and the issued amendment supersedes it).
 */
export const jobViewSchema = jobSchema.extend({ amends: jobAmendsSchema.nullable(), amendedBy: jobAmendedBySchema.nullable() });
export type JobView = z.infer<typeof jobViewSchema>;

/**
 * One row of the jobs list (GET /api/jobs): some of the record, with names and counts, and either
 * side of an amendment as on the job's page.
 */
export const jobListRowSchema = jobSchema
  .pick({ id: true, number: true, status: true, itemLabel: true, calibratedOn: true, receivedOn: true, updatedAt: true, customerId: true, templateVersionId: true })
  .extend({ customer: z.string(), analyst: z.string(), points: z.number(), amends: jobAmendsSchema.nullable(), amendedBy: jobAmendedBySchema.nullable() });
export type JobListRow = z.infer<typeof jobListRowSchema>;
export const jobListSchema = z.object({ jobs: z.array(jobListRowSchema), total: z.number(), page: z.number(), pageSize: z.number() });

export const pointInputSchema = z
  .object({
    symbol: symbolSchema,
    unit: z.string().max(64).optional(),
    description: z.string().max(500).optional(),
    displayUnit: z.string().max(64).optional(),
    source: z.enum(INPUT_SOURCES).optional(),
    referenceKind: z.string().max(100).optional(),
    distribution: distributionSchema.nullable(),
    dof: z.number().positive().nullable().optional(),
    /** The reference standard whose certificate gave the value. */
    standardId: z.string().max(100).nullable().optional(),
    /** What the value was taken from on that certificate (shown, kept for the review). */
    standardNote: z.string().max(300).nullable().optional(),
  })
  .strict();
export type PointInput = z.infer<typeof pointInputSchema>;

export const createPointSchema = z
  .object({
    nominalValue: z.number({ error: 'the nominal value must be a number' }).refine(Number.isFinite, { message: 'the nominal value must be finite' }),
    nominalUnit: z.string().max(64).optional(),
  })
  .strict();

export const updatePointSchema = z
  .object({
    nominalValue: z.number().refine(Number.isFinite, { message: 'the nominal value must be finite' }).optional(),
    nominalUnit: z.string().max(64).optional(),
    inputs: z.array(pointInputSchema).max(200).optional(),
    correlations: z.array(correlationSchema).max(500).optional(),
    outsideScope: z.boolean().optional(),
    outsideScopeReason: z.string().max(1000).nullable().optional(),
  })
  .strict()
  .refine((p) => !p.outsideScope || (p.outsideScopeReason ?? '').trim().length >= 3, {
    message: 'say why the point is outside the scope of accreditation',
    path: ['outsideScopeReason'],
  });
export type UpdatePoint = z.infer<typeof updatePointSchema>;

export const typedReadingsSchema = z
  .object({
    /** Numbers, or text pasted from a spreadsheet (one value per line, or separated by spaces, tabs, semicolons). */
    values: z.array(z.number().refine(Number.isFinite, { message: 'each reading must be a finite number' })).max(100_000).optional(),
    text: z.string().max(1_000_000).optional(),
    /** Unit of the readings (default: the input's display unit); converted to the input's SI unit. */
    unit: z.string().max(64).optional(),
  })
  .strict()
  .refine((b) => (b.values === undefined) !== (b.text === undefined), { message: 'give either values or text' });

export const fromStandardSchema = z
  .object({
    standardId: z.string().min(1).max(100),
    /** Which certified value of the standard (its index in the standard's list); default the first. */
    valueIndex: z.number().int().min(0).optional(),
  })
  .strict();

export const submitReasonSchema = z.object({
  code: z.string(),
  message: z.string(),
  pointId: z.string().nullable(),
  pointPosition: z.number().nullable(),
  symbol: z.string().nullable(),
});
export type SubmitReason = z.infer<typeof submitReasonSchema>;

export const monteCarloRequestSchema = z
  .object({
    trials: z.number().int().min(1000).max(100_000_000).optional(),
    seed: z.number().int().min(0).max(2 ** 32 - 1).optional(),
  })
  .strict();
