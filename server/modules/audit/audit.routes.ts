import { Router } from 'express';
import { auditQuerySchema, type AuditQuery } from '../../../shared/schemas/audit.schema';
import { verifyAuditChain } from '../../audit';
import { requireRole } from '../../auth/require-role';
import type { Db } from '../../db/client';
import { validate } from '../../middleware/validate';
import type { AuditRepository } from './audit.repository';
import { csvRow } from './csv';

const CSV_COLUMNS = ['seq', 'at', 'actor_id', 'actor_name', 'actor_role', 'action', 'entity', 'entity_id', 'before', 'after', 'hash'];

/** /api/audit: the audit trail for quality managers and admins (ISO/IEC 17025:2017 §8.4). */
export function auditRoutes(deps: { db: Db; auditRepo: AuditRepository; clock: () => Date }): Router {
  const r = Router();
  r.use(requireRole('quality_manager', 'admin'));
  r.get('/', validate({ query: auditQuerySchema }), async (_req, res) => {
    const q = res.locals.query as AuditQuery;
    const { entries, total } = await deps.auditRepo.page(q);
    res.json({ entries, total, page: q.page, pageSize: q.pageSize });
  });
  r.get('/facets', async (_req, res) => {
    res.json(await deps.auditRepo.facets());
  });
  r.get('/export.csv', validate({ query: auditQuerySchema }), async (_req, res) => {
    const q = res.locals.query as AuditQuery;
    const stamp = deps.clock().toISOString().slice(0, 10);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.attachment(`audit-trail-${stamp}.csv`);
    // UTF-8 byte-order mark: spreadsheet programs then read µ, °, é correctly.
    res.write('\uFEFF' + csvRow(CSV_COLUMNS));
    for await (const e of deps.auditRepo.all(q)) {
      res.write(csvRow([e.seq, e.at, e.actorId, e.actorName, e.actorRole, e.action, e.entity, e.entityId, e.before, e.after, e.hash]));
    }
    res.end();
  });
  r.post('/verify', async (_req, res) => {
    const report = await verifyAuditChain(deps.db);
    res.json({ ...report, verifiedAt: deps.clock().toISOString() });
  });
  return r;
}
