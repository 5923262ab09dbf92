import { Router } from 'express';
import { z } from 'zod';
import { createJobSchema, jobListQuerySchema, updateJobSchema, type JobListQuery } from '../../../shared/schemas/jobs.schema';
import { currentUser, requireRole } from '../../auth/require-role';
import { validate } from '../../middleware/validate';
import type { PointsService } from '../points/points.service';
import { createPointSchema } from '../../../shared/schemas/jobs.schema';
import { budgetCsv, budgetXlsx, type ExportPoint } from './jobs.export';
import type { JobsService } from './jobs.service';
import type { JobSources } from './sources';

const idParams = z.object({ id: z.uuid({ message: 'not a job id' }) });
const exportQuery = z.object({ format: z.enum(['csv', 'xlsx'], { error: 'format must be csv or xlsx' }).default('csv') });
const READERS = ['analyst', 'quality_manager', 'signatory'] as const;

/** /api/jobs: analysts write their jobs; quality managers and signatories read. */
export function jobsRoutes(jobs: JobsService, points: PointsService, sources: JobSources): Router {
  const r = Router();

  r.get('/', requireRole(...READERS), validate({ query: jobListQuerySchema }), async (_req, res) => {
    res.json(await jobs.list(res.locals.query as JobListQuery));
  });

  r.get('/options', requireRole('analyst'), async (_req, res) => {
    res.json(await jobs.options());
  });

  /** The register's standards with their certified values and due dates, for filling inputs. */
  r.get('/reference-standards', requireRole(...READERS), async (_req, res) => {
    res.json({ standards: await sources.listStandards() });
  });

  r.post('/', requireRole('analyst'), validate({ body: createJobSchema }), async (req, res) => {
    res.status(201).json({ job: await jobs.create(req.body, currentUser(res)) });
  });

  r.get('/:id', requireRole(...READERS), validate({ params: idParams }), async (req, res) => {
    res.json(await jobs.get(req.params.id as string));
  });

  r.patch('/:id', requireRole('analyst'), validate({ params: idParams, body: updateJobSchema }), async (req, res) => {
    res.json({ job: await jobs.update(req.params.id as string, req.body, currentUser(res)) });
  });

  r.get('/:id/checks', requireRole(...READERS), validate({ params: idParams }), async (req, res) => {
    res.json(await jobs.checks(req.params.id as string));
  });

  r.post('/:id/submit', requireRole('analyst'), validate({ params: idParams }), async (req, res) => {
    res.json(await jobs.submit(req.params.id as string, currentUser(res)));
  });

  r.post('/:id/points', requireRole('analyst'), validate({ params: idParams, body: createPointSchema }), async (req, res) => {
    res.status(201).json({ point: await points.add(req.params.id as string, req.body, currentUser(res)) });
  });

  r.get('/:id/export', requireRole(...READERS), validate({ params: idParams, query: exportQuery }), async (req, res) => {
    const { format } = res.locals.query as z.infer<typeof exportQuery>;
    const data = await jobs.get(req.params.id as string);
    const list: ExportPoint[] = data.points.map((p) => ({ label: `Point ${p.position} (${p.nominalValue} ${p.nominalUnit})`, point: p }));
    await sendExport(res, format, `${data.job.number}-budget`, data.job.number, data.template.definition, list);
  });

  return r;
}

export async function sendExport(
  res: import('express').Response,
  format: 'csv' | 'xlsx',
  baseName: string,
  title: string,
  def: Parameters<typeof budgetCsv>[1],
  list: ExportPoint[],
) {
  const safe = baseName.replace(/[^A-Za-z0-9._-]+/g, '_');
  if (format === 'csv') {
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="${safe}.csv"`);
    res.send(budgetCsv(title, def, list));
  } else {
    res.setHeader('Content-Type', 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
    res.setHeader('Content-Disposition', `attachment; filename="${safe}.xlsx"`);
    res.send(await budgetXlsx(title, def, list));
  }
}
