export { recordAudit, AUDIT_CHAIN_LOCK_KEY, type AuditActor, type AuditEntry, type RecordedAudit } from './record';
export { verifyAuditChain, type AuditChainReport } from './verify';
export { canonicalJson } from './canonical-json';
export { auditActor } from './actor';
