import { Router } from 'express';
import { sql } from 'drizzle-orm';
import type { AppDeps } from '../../context';

/** GET /api/health (public): the process answers and the database responds. */
export function healthRoutes(deps: Pick<AppDeps, 'database' | 'clock'>): Router {
  const r = Router();
  r.get('/', async (_req, res) => {
    await deps.database.db.execute(sql`select 1`);
    res.json({ status: 'ok', database: deps.database.kind, time: deps.clock().toISOString() });
  });
  return r;
}
