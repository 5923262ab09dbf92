import { desc, sql } from 'drizzle-orm';
import { PgTransaction } from 'drizzle-orm/pg-core';
import type { Db } from '../db/client';
import { auditLog } from '../db/schema';
import { toJsonValue } from './canonical-json';
import { auditRowHash, GENESIS_HASH } from './hash';

export type AuditActor = { id: string; name?: string | null; role?: string | null };

export type AuditEntry = {
  /** Who did it; null for the system (seed, background work). */
  actor: AuditActor | null;
  /** A verb in snake_case: 'create', 'update', 'upload_file', 'deactivate', … */
  action: string;
  /** The table or record kind, e.g. 'reference_standard', 'user', 'lab_settings'. */
  entity: string;
  entityId: string;
  before?: unknown;
  after?: unknown;
  /** Defaults to now; services pass `deps.clock()`. */
  at?: Date;
};

export type RecordedAudit = { seq: number; hash: string };

/** Key of the transaction-level advisory lock that serialises appends to the chain. */
export const AUDIT_CHAIN_LOCK_KEY = 0x61756469; // 'audi'

/**
 * Appends one row to the audit trail. Call it with the transaction that makes the change
 * (`db.transaction(async (tx) => { …change…; await recordAudit(tx, …) })`), so the row exists
 * exactly when the change does. Appends are serialised by a transaction-level advisory lock,
 * held until commit: concurrent writers queue, each reads the committed last row and links to
 * it, so the chain cannot fork. Called outside a transaction it opens one of its own.
 */
export async function recordAudit(db: Db, entry: AuditEntry): Promise<RecordedAudit> {
  if (!(db instanceof PgTransaction)) return db.transaction((tx) => recordAudit(tx, entry));

  await db.execute(sql`select pg_advisory_xact_lock(${AUDIT_CHAIN_LOCK_KEY})`);
  const [last] = await db.select({ hash: auditLog.hash }).from(auditLog).orderBy(desc(auditLog.seq)).limit(1);
  const next = await db.execute(sql`select nextval(pg_get_serial_sequence('audit_log', 'seq')) as seq`);
  const seq = Number((next as unknown as { rows: Array<{ seq: string | number }> }).rows[0].seq);

  const row = {
    seq,
    // Postgres keeps microseconds, JavaScript milliseconds: the value hashed is the value stored.
    at: new Date((entry.at ?? new Date()).getTime()),
    actorId: entry.actor?.id ?? null,
    actorName: entry.actor?.name ?? null,
    actorRole: entry.actor?.role ?? null,
    action: entry.action,
    entity: entry.entity,
    entityId: entry.entityId,
    before: entry.before === undefined ? null : toJsonValue(entry.before),
    after: entry.after === undefined ? null : toJsonValue(entry.after),
    prevHash: last?.hash ?? GENESIS_HASH,
  };
  const hash = auditRowHash(row);
  // jsonb null and SQL NULL differ: keep "no before/after" as SQL NULL.
  await db.insert(auditLog).values({ ...row, before: row.before ?? sql`null`, after: row.after ?? sql`null`, hash });
  return { seq, hash };
}
