import { boolean, doublePrecision, index, integer, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

export const TASK_STATES = ['queued', 'active', 'done', 'failed', 'cancelled'] as const;
export type TaskState = (typeof TASK_STATES)[number];

/**
 * Background tasks run through the durable queue (server/tasks/durable.ts, pg-boss on PostgreSQL).
 * pg-boss owns delivery (its own `pgboss` schema); this row is what every app instance reads:
 * state, progress, the result, a cancel request, and `completions` — raised exactly when the
 * task's completion step (storing the result) commits, so a task done twice would show 2.
 * The in-process runner (PGlite, the default) keeps the same information in memory instead.
 */
export const taskRuns = pgTable(
  'task_runs',
  {
    /** The same id as the pg-boss job. */
    id: uuid('id').primaryKey(),
    kind: text('kind').notNull(),
    /** What the task is about (a calibration point id for Monte Carlo), for "is one running?". */
    subject: text('subject'),
    ownerId: text('owner_id'),
    state: text('state').$type<TaskState>().notNull().default('queued'),
    progressDone: doublePrecision('progress_done').notNull().default(0),
    progressTarget: doublePrecision('progress_target').notNull().default(0),
    result: jsonb('result'),
    errorCode: text('error_code'),
    errorMessage: text('error_message'),
    cancelRequested: boolean('cancel_requested').notNull().default(false),
    attempts: integer('attempts').notNull().default(0),
    completions: integer('completions').notNull().default(0),
    /** The app instance that last started it, and the one that finished it. */
    startedBy: text('started_by'),
    finishedBy: text('finished_by'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    startedAt: timestamp('started_at', { withTimezone: true }),
    finishedAt: timestamp('finished_at', { withTimezone: true }),
    /** Milliseconds the last attempt ran (worker side), for the final event. */
    elapsedMs: integer('elapsed_ms'),
  },
  (t) => [index('task_runs_subject_idx').on(t.kind, t.subject, t.state)],
);

export type TaskRunRow = typeof taskRuns.$inferSelect;
