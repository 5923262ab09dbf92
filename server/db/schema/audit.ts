import { bigserial, index, jsonb, pgTable, text, timestamp } from 'drizzle-orm/pg-core';

/**
 * The audit trail (ISO/IEC 17025:2017 §7.5, §8.4): one row per change, written in the same
 * transaction as the change by `recordAudit` (server/audit/record.ts). Append-only: a trigger
 * (migration `audit_log_append_only`) refuses UPDATE, DELETE and TRUNCATE. Each row carries the
 * SHA-256 of the row before it (`prev_hash`) and its own (`hash`), so a change made around the
 * trigger is found by `verifyAuditChain`.
 *
 * `seq` is a bigint taken from the table's own sequence (bigserial); it may have gaps (a rolled
 * back transaction uses a number), the chain does not.
 */
export const auditLog = pgTable(
  'audit_log',
  {
    seq: bigserial('seq', { mode: 'number' }).primaryKey(),
    at: timestamp('at', { withTimezone: true }).notNull(),
    /** Null for the system (seed, background work). */
    actorId: text('actor_id'),
    actorName: text('actor_name'),
    actorRole: text('actor_role'),
    action: text('action').notNull(),
    entity: text('entity').notNull(),
    entityId: text('entity_id').notNull(),
    before: jsonb('before'),
    after: jsonb('after'),
    prevHash: text('prev_hash').notNull(),
    hash: text('hash').notNull().unique(),
  },
  (t) => [
    index('audit_log_entity_idx').on(t.entity, t.entityId),
    index('audit_log_actor_idx').on(t.actorId),
    index('audit_log_at_idx').on(t.at),
  ],
);
