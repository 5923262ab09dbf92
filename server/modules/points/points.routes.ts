import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { fromStandardSchema, monteCarloRequestSchema, typedReadingsSchema, updatePointSchema } from '../../../shared/schemas/jobs.schema';
import { symbolSchema } from '../../../shared/schemas/budget.schema';
import { currentUser, requireRole } from '../../auth/require-role';
import { AppError } from '../../errors/app-error';
import { validate } from '../../middleware/validate';
import type { PointRuns as RunRegistry } from '../../tasks/monte-carlo-runs';
import { sendExport } from '../jobs/jobs.routes';
import type { JobsService } from '../jobs/jobs.service';
import type { PointsService } from './points.service';
import { MAX_READINGS_FILE_BYTES, readingsFromFile, readingsFromText } from './readings-parser';

const idParams = z.object({ id: z.uuid({ message: 'not a point id' }) });
const symbolParams = z.object({ id: z.uuid({ message: 'not a point id' }), symbol: symbolSchema });
const exportQuery = z.object({ format: z.enum(['csv', 'xlsx'], { error: 'format must be csv or xlsx' }).default('csv') });
const uploadFields = z.object({ column: z.string().max(100).optional(), unit: z.string().max(64).optional() }).strict();

/** Multer in memory with a size limit; its errors become the API's envelope (413 for a file too large). */
function singleFile(field: string): RequestHandler {
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_READINGS_FILE_BYTES, files: 1, fields: 5 } }).single(field);
  return (req, res, next) => {
    upload(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') return next(new AppError(413, 'FILE_TOO_LARGE', `The file is larger than ${MAX_READINGS_FILE_BYTES / 1024 / 1024} MB; readings files are accepted up to that size. Nothing was saved.`));
        return next(new AppError(400, 'UPLOAD_INVALID', `The upload was not accepted: ${err.message}. Send one file in the field "${field}".`));
      }
      next(err);
    });
  };
}

/** /api/points: a calibration point of a draft job, its readings, reference values and calculations. */
export function pointsRoutes(points: PointsService, jobs: JobsService, runs: RunRegistry): Router {
  const r = Router();
  const READERS = ['analyst', 'quality_manager', 'signatory'] as const;

  r.get('/:id', requireRole(...READERS), validate({ params: idParams }), async (req, res) => {
    res.json(await points.get(req.params.id as string));
  });

  r.patch('/:id', requireRole('analyst'), validate({ params: idParams, body: updatePointSchema }), async (req, res) => {
    res.json({ point: await points.update(req.params.id as string, req.body, currentUser(res)) });
  });

  r.delete('/:id', requireRole('analyst'), validate({ params: idParams }), async (req, res) => {
    await points.remove(req.params.id as string, currentUser(res));
    res.status(204).end();
  });

  r.put('/:id/readings/:symbol', requireRole('analyst'), validate({ params: symbolParams, body: typedReadingsSchema }), async (req, res) => {
    const { values, text, unit } = req.body as z.infer<typeof typedReadingsSchema>;
    const parsed = values ? { values, column: null } : readingsFromText(text!);
    if (values && values.length < 2) throw new AppError(422, 'READINGS_INVALID', 'A Type A evaluation needs at least two readings (GUM 4.2). Nothing was saved.');
    const out = await points.setReadings(req.params.id as string, req.params.symbol as string, parsed.values, unit, { fileName: null, sha256: null, column: null }, currentUser(res));
    res.json(out);
  });

  r.post('/:id/readings/:symbol/upload', requireRole('analyst'), singleFile('file'), validate({ params: symbolParams, body: uploadFields }), async (req, res) => {
    const file = req.file;
    if (!file) throw new AppError(400, 'FILE_MISSING', 'Attach the readings file (CSV or XLSX) in the field "file".');
    const { column, unit } = req.body as z.infer<typeof uploadFields>;
    const parsed = await readingsFromFile(file.buffer, column);
    const name = file.originalname.slice(0, 255);
    const out = await points.setReadings(req.params.id as string, req.params.symbol as string, parsed.values, unit, { fileName: name, sha256: points.sha256(file.buffer), column: parsed.column }, currentUser(res));
    res.json({ ...out, kind: parsed.kind, header: parsed.header });
  });

  r.put('/:id/inputs/:symbol/standard', requireRole('analyst'), validate({ params: symbolParams, body: fromStandardSchema }), async (req, res) => {
    res.json(await points.fromStandard(req.params.id as string, req.params.symbol as string, req.body, currentUser(res)));
  });

  r.post('/:id/calculate', requireRole('analyst'), validate({ params: idParams }), async (req, res) => {
    res.json({ point: await points.calculate(req.params.id as string, currentUser(res)) });
  });

  r.post('/:id/monte-carlo', requireRole('analyst'), validate({ params: idParams, body: monteCarloRequestSchema }), async (req, res) => {
    const user = currentUser(res);
    const pointId = req.params.id as string;
    const body = req.body as z.infer<typeof monteCarloRequestSchema>;
    const { doc, readAt, trials } = await points.budgetForRun(pointId, user);
    const active = await runs.activeFor(pointId);
    if (active) throw new AppError(409, 'RUN_IN_PROGRESS', 'A Monte Carlo run for this point is already in progress: wait for it or cancel it.');
    const seed = body.seed ?? (await import('node:crypto')).randomInt(0, 2 ** 32 - 1);
    const run = await runs.start({
      pointId,
      ownerId: user.id,
      doc,
      trials: body.trials ?? trials ?? 1_000_000,
      seed,
      readAt,
      actor: user,
    });
    res.status(202).json({ runId: run.id, trials: run.trials, seed: run.seed });
  });

  r.get('/:id/export', requireRole(...READERS), validate({ params: idParams, query: exportQuery }), async (req, res) => {
    const { format } = res.locals.query as z.infer<typeof exportQuery>;
    const { point } = await points.get(req.params.id as string);
    const data = await jobs.get(point.jobId);
    await sendExport(res, format, `${data.job.number}-point-${point.position}`, `${data.job.number}, point ${point.position}`, data.template.definition, [
      { label: `Point ${point.position} (${point.nominalValue} ${point.nominalUnit})`, point },
    ]);
  });

  return r;
}
