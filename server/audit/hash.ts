import crypto from 'node:crypto';
import { canonicalJson } from './canonical-json';

/** prev_hash of the first row. */
export const GENESIS_HASH = '0'.repeat(64);

/** What a row's hash covers: every column except `hash` itself. */
export type AuditHashInput = {
  seq: number;
  at: Date;
  actorId: string | null;
  actorName: string | null;
  actorRole: string | null;
  action: string;
  entity: string;
  entityId: string;
  before: unknown;
  after: unknown;
  prevHash: string;
};

/** SHA-256 (FIPS 180-4), hex, over the canonical JSON of the row's content including prev_hash. */
export function auditRowHash(row: AuditHashInput): string {
  const content = canonicalJson({
    seq: row.seq,
    at: row.at.toISOString(),
    actorId: row.actorId,
    actorName: row.actorName,
    actorRole: row.actorRole,
    action: row.action,
    entity: row.entity,
    entityId: row.entityId,
    before: row.before ?? null,
    after: row.after ?? null,
    prevHash: row.prevHash,
  });
  return crypto.createHash('sha256').update(content, 'utf8').digest('hex');
}
