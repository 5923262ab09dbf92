import { Router } from 'express';
import { z } from 'zod';
import { evaluateGum } from '../../../shared/engine';
import { requireRole, currentUser } from '../../auth/require-role';
import { ForbiddenError, NotFoundError } from '../../errors/app-error';
import { validate } from '../../middleware/validate';
import type { TaskEvent as RunEvent } from '../../tasks/types';
import type { PointRuns as RunRegistry } from '../../tasks/monte-carlo-runs';

const runParams = z.object({ id: z.uuid({ message: 'not a run id' }) });
const gumBody = z.object({ budget: z.unknown() }).strict();

/**
 * /api/calculations/gum: a stateless GUM evaluation of a budget document (what the browser
 * computes itself; also the request the load benchmark times). /api/runs/:id: a Monte Carlo
 * run's events (SSE) and its cancellation.
 */
export function calculationsRoutes(): Router {
  const r = Router();
  r.post('/gum', requireRole('analyst', 'quality_manager', 'signatory'), validate({ body: gumBody }), (req, res) => {
    // EngineError (invalid document, model refused) → 422 through the error handler.
    res.json({ result: evaluateGum((req.body as z.infer<typeof gumBody>).budget) });
  });
  return r;
}

export function runsRoutes(runs: RunRegistry): Router {
  const r = Router();

  r.get('/:id/events', requireRole('analyst', 'quality_manager', 'signatory'), validate({ params: runParams }), async (req, res) => {
    const run = await runs.get(req.params.id as string);
    if (!run) throw new NotFoundError('There is no such Monte Carlo run (finished runs are kept for ten minutes).');
    res.status(200);
    res.setHeader('Content-Type', 'text/event-stream; charset=utf-8');
    res.setHeader('Cache-Control', 'no-cache, no-transform');
    res.setHeader('Connection', 'keep-alive');
    res.setHeader('X-Accel-Buffering', 'no');
    res.flushHeaders();
    const send = (ev: RunEvent) => {
      res.write(`event: ${ev.type}\ndata: ${JSON.stringify(ev)}\n\n`);
      if (ev.type !== 'progress') {
        run.events.off('event', send);
        res.end();
      }
    };
    res.write(`retry: 2000\n\n`);
    send(run.last);
    if (run.state !== 'running') return;
    run.events.on('event', send);
    req.on('close', () => run.events.off('event', send));
  });

  r.delete('/:id', requireRole('analyst'), validate({ params: runParams }), async (req, res) => {
    const run = await runs.get(req.params.id as string);
    if (!run) throw new NotFoundError('There is no such Monte Carlo run.');
    if (run.ownerId !== currentUser(res).id) throw new ForbiddenError('Only the analyst who started this run can cancel it.');
    run.cancel();
    res.status(202).json({ runId: run.id, state: run.state === 'running' ? 'cancelling' : run.state });
  });

  return r;
}
