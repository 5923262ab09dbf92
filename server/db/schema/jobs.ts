import { bigint, boolean, doublePrecision, index, integer, jsonb, pgSequence, pgTable, text, timestamp, uniqueIndex, uuid, date, check } from 'drizzle-orm/pg-core';
import { sql } from 'drizzle-orm';
import { user } from './auth';
import { customers } from './customers';

/** Source of job numbers (EMB-<year>-<nnnn>); never reused, also when a job is deleted. */
export const jobNumberSeq = pgSequence('job_number_seq', { startWith: 1, increment: 1 });

export const JOB_STATUSES = ['draft', 'submitted', 'approved', 'issued'] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];

/** Environmental conditions during the calibration, with their standard uncertainties. */
export type JobEnvironment = {
  temperature?: { value: number; u?: number; unit: string };
  humidity?: { value: number; u?: number; unit: string };
};

/**
 * A calibration job: one customer's item calibrated with one released template version.
 * Item and template version are ids of the register (issue 7) and template (issue 4) tables;
 * they are checked by the service when the job is created.
 */
export const jobs = pgTable(
  'jobs',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    number: text('number').notNull(),
    customerId: uuid('customer_id')
      .notNull()
      .references(() => customers.id, { onDelete: 'restrict' }),
    itemId: uuid('item_id').notNull(),
    /** The item as it was described when the job was opened (for lists and text search). */
    itemLabel: text('item_label').notNull().default(''),
    templateVersionId: uuid('template_version_id').notNull(),
    receivedOn: date('received_on', { mode: 'string' }),
    calibratedOn: date('calibrated_on', { mode: 'string' }),
    location: text('location').notNull().default(''),
    environment: jsonb('environment').$type<JobEnvironment>().notNull().default({}),
    status: text('status', { enum: JOB_STATUSES }).notNull().default('draft'),
    /** The reviewer's comment of the last rejection, kept after the job returns to draft. */
    reviewComment: text('review_comment'),
    rejectedAt: timestamp('rejected_at', { withTimezone: true }),
    submittedAt: timestamp('submitted_at', { withTimezone: true }),
    analystId: uuid('analyst_id')
      .notNull()
      .references(() => user.id, { onDelete: 'restrict' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex('jobs_number_idx').on(t.number),
    index('jobs_status_idx').on(t.status),
    index('jobs_customer_idx').on(t.customerId),
    check('jobs_status_check', sql`${t.status} in ('draft', 'submitted', 'approved', 'issued')`),
  ],
);

/**
 * One calibration point of a job: its nominal value and the filled budget (the inputs and
 * correlations of the shared budget document; each input may carry `standardId`), the stored
 * result with the engine version and seed, and when it was computed against `changedAt`.
 */
export const calibrationPoints = pgTable(
  'calibration_points',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    jobId: uuid('job_id')
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    position: integer('position').notNull(),
    nominalValue: doublePrecision('nominal_value').notNull(),
    nominalUnit: text('nominal_unit').notNull(),
    inputs: jsonb('inputs').$type<Array<Record<string, unknown>>>().notNull(),
    correlations: jsonb('correlations').$type<Array<{ between: [string, string]; r: number }>>().notNull().default([]),
    outsideScope: boolean('outside_scope').notNull().default(false),
    outsideScopeReason: text('outside_scope_reason'),
    result: jsonb('result').$type<Record<string, unknown>>(),
    resultEngineVersion: text('result_engine_version'),
    /** Monte Carlo seed (0 … 2^32 − 1, beyond a 4-byte integer). */
    resultSeed: bigint('result_seed', { mode: 'number' }),
    computedAt: timestamp('computed_at', { withTimezone: true }),
    /** Last change of anything the result depends on; a result is current when computedAt ≥ changedAt. */
    changedAt: timestamp('changed_at', { withTimezone: true }).notNull().defaultNow(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('calibration_points_job_idx').on(t.jobId)],
);

/** The repeated readings behind a Type A input, with the upload they came from. */
export const readings = pgTable(
  'readings',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    pointId: uuid('point_id')
      .notNull()
      .references(() => calibrationPoints.id, { onDelete: 'cascade' }),
    symbol: text('symbol').notNull(),
    values: jsonb('values').$type<number[]>().notNull(),
    /** 'typed' for values entered or pasted; otherwise the uploaded file's name. */
    fileName: text('file_name'),
    sha256: text('sha256'),
    column: text('column'),
    uploadedBy: uuid('uploaded_by')
      .notNull()
      .references(() => user.id, { onDelete: 'restrict' }),
    uploadedAt: timestamp('uploaded_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex('readings_point_symbol_idx').on(t.pointId, t.symbol)],
);
