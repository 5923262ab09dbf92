import { and, asc, desc, eq, gte, isNotNull, lt, sql, type SQL } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { auditLog } from '../../db/schema';
import type { AuditEntry, AuditQuery } from '../../../shared/schemas/audit.schema';

const nextDay = (d: string) => new Date(Date.parse(`${d}T00:00:00Z`) + 86_400_000);

function where(q: Omit<AuditQuery, 'page' | 'pageSize'>): SQL | undefined {
  return and(
    q.entity ? eq(auditLog.entity, q.entity) : undefined,
    q.entityId ? eq(auditLog.entityId, q.entityId) : undefined,
    q.actorId ? eq(auditLog.actorId, q.actorId) : undefined,
    q.from ? gte(auditLog.at, new Date(`${q.from}T00:00:00Z`)) : undefined,
    q.to ? lt(auditLog.at, nextDay(q.to)) : undefined,
  );
}

const toEntry = (r: typeof auditLog.$inferSelect): AuditEntry => ({
  seq: r.seq,
  at: r.at.toISOString(),
  actorId: r.actorId,
  actorName: r.actorName,
  actorRole: r.actorRole,
  action: r.action,
  entity: r.entity,
  entityId: r.entityId,
  before: r.before ?? null,
  after: r.after ?? null,
  hash: r.hash,
});

export function createAuditRepository(db: Db) {
  return {
    /** Newest first. */
    async page(q: AuditQuery): Promise<{ entries: AuditEntry[]; total: number }> {
      const w = where(q);
      const [{ n }] = await db.select({ n: sql<number>`cast(count(*) as int)` }).from(auditLog).where(w);
      const rows = await db
        .select()
        .from(auditLog)
        .where(w)
        .orderBy(desc(auditLog.seq))
        .limit(q.pageSize)
        .offset((q.page - 1) * q.pageSize);
      return { entries: rows.map(toEntry), total: n };
    },
    /** Oldest first, in batches, for the CSV export. */
    async *all(q: Omit<AuditQuery, 'page' | 'pageSize'>, batch = 500): AsyncGenerator<AuditEntry> {
      let after = 0;
      for (;;) {
        const rows = await db
          .select()
          .from(auditLog)
          .where(and(where(q), sql`${auditLog.seq} > ${after}`))
          .orderBy(asc(auditLog.seq))
          .limit(batch);
        if (rows.length === 0) return;
        for (const r of rows) yield toEntry(r);
        after = rows[rows.length - 1].seq;
      }
    },
    async facets(): Promise<{ entities: string[]; actors: Array<{ id: string; name: string | null }> }> {
      const entities = await db.selectDistinct({ entity: auditLog.entity }).from(auditLog).orderBy(asc(auditLog.entity));
      const actors = await db
        .select({ id: auditLog.actorId, name: sql<string | null>`max(${auditLog.actorName})` })
        .from(auditLog)
        .where(isNotNull(auditLog.actorId))
        .groupBy(auditLog.actorId)
        .orderBy(sql`max(${auditLog.actorName})`);
      return { entities: entities.map((e) => e.entity), actors: actors.map((a) => ({ id: a.id!, name: a.name })) };
    },
  };
}
export type AuditRepository = ReturnType<typeof createAuditRepository>;
