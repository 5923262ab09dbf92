import { asc, gt } from 'drizzle-orm';
import type { Db } from '../db/client';
import { auditLog } from '../db/schema';
import { auditRowHash, GENESIS_HASH } from './hash';

export type AuditChainReport = {
  ok: boolean;
  /** Rows checked (up to and including the first broken one). */
  checked: number;
  /** The first row whose content or link does not match. */
  firstBrokenSeq?: number;
  reason?: string;
  /** seq and hash of the last row, when the chain is intact (a value to write down elsewhere). */
  lastSeq?: number;
  lastHash?: string;
};

/**
 * Walks the whole audit trail in seq order and recomputes every hash. A row is broken when its
 * stored hash differs from the hash of its content (it was edited), or its prev_hash differs from
 * the previous row's hash (a row before it was removed, inserted or edited together with its
 * hash). The chain cannot show rows cut from its end; compare `lastSeq`/`lastHash` with a copy
 * kept elsewhere for that.
 */
export async function verifyAuditChain(db: Db, batchSize = 500): Promise<AuditChainReport> {
  let prevHash = GENESIS_HASH;
  let afterSeq = 0;
  let checked = 0;
  let lastSeq: number | undefined;
  for (;;) {
    const rows = await db.select().from(auditLog).where(gt(auditLog.seq, afterSeq)).orderBy(asc(auditLog.seq)).limit(batchSize);
    if (rows.length === 0) break;
    for (const r of rows) {
      checked++;
      if (r.prevHash !== prevHash) {
        return {
          ok: false,
          checked,
          firstBrokenSeq: r.seq,
          reason: `Row ${r.seq} does not link to the row before it: a row before it was removed, inserted or altered.`,
        };
      }
      const expected = auditRowHash({ ...r, before: r.before, after: r.after });
      if (expected !== r.hash) {
        return { ok: false, checked, firstBrokenSeq: r.seq, reason: `Row ${r.seq} was altered after it was written: its content no longer matches its hash.` };
      }
      prevHash = r.hash;
      lastSeq = r.seq;
    }
    afterSeq = rows[rows.length - 1].seq;
  }
  return { ok: true, checked, ...(lastSeq !== undefined ? { lastSeq, lastHash: prevHash } : {}) };
}
