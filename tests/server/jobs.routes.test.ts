/**
 * Jobs, points, readings and submission checks over the API (supertest, fresh PGlite).
 * Magnitudes are invented; the rules tested are ILAC-P14:09/2020 §5.4 (reported U not below the
 * CMC), GUM 4.2 (Type A: mean, s, s/√n, ν = n − 1) and JCGM 101 §8 (validation shown).
 */
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { createTestApp, type TestApp } from '../setup/test-app';
import { customerItems, customers, readings, referenceStandards, referenceStandardValues, calibrationPoints } from '../../server/db/schema';
import { typeA } from '../../shared/engine';
import { jobListSchema } from '../../shared/schemas/jobs.schema';
import { approve, submittedJob } from './certificates-helpers';

const FIX = path.join(__dirname, '../fixtures/readings');
const NOW = new Date('2026-12-01T10:00:00Z');
// The clock moves one millisecond per reading, as a real one would between requests.
let ticks = 0;
const clock = () => new Date(NOW.getTime() + ticks++);

let t: TestApp;
let analyst: Awaited<ReturnType<TestApp['signIn']>>;
let customerId: string;
let itemId: string;
let thermometerId: string;
let blackbodyId: string;
let overdueId: string;
let versionId: string;

async function addStandard(name: string, kind: string, due: string, value: { quantity: string; value: number; unit: string; U: number; k: number }) {
  const db = t.database.db;
  const [s] = await db.insert(referenceStandards).values({ name, kind, serialNumber: `SN-${name.length}`, certificateNumber: `CAL-${name.length}`, issuingLaboratory: 'Invented Lab', calibrationDate: '2026-01-10', dueDate: due }).returning();
  await db.insert(referenceStandardValues).values({ standardId: s.id, position: 0, quantity: value.quantity, value: value.value, unit: value.unit, expandedUncertainty: value.U, coverageFactor: value.k });
  return s.id;
}

beforeAll(async () => {
  t = await createTestApp({ clock });
  analyst = await t.signIn('analyst');
  const db = t.database.db;
  const [c] = await db.select().from(customers).limit(1);
  customerId = c.id;
  const [item] = await db.insert(customerItems).values({ customerId, description: 'Handheld infrared thermometer', maker: 'Invented Optics', model: 'IR-8', serialNumber: 'A-1001' }).returning();
  itemId = item.id;
  thermometerId = await addStandard('Reference PRT 1', 'reference_thermometer', '2027-06-30', { quantity: 'temperature', value: 353.15, unit: 'K', U: 0.06, k: 2 });
  blackbodyId = await addStandard('Cavity blackbody 2', 'blackbody_source', '2027-03-31', { quantity: 'effective emissivity', value: 0.995, unit: '1', U: 0.004, k: 2 });
  overdueId = await addStandard('Old cavity blackbody', 'blackbody_source', '2026-11-15', { quantity: 'effective emissivity', value: 0.995, unit: '1', U: 0.004, k: 2 });
  const opts = await analyst.get('/api/jobs/options').expect(200);
  versionId = opts.body.templateVersions.find((v: { key: string }) => v.key === 'ir-thermometer-blackbody').id;
}, 240_000);

afterAll(async () => {
  await t?.close();
});

async function newJob() {
  const res = await analyst.post('/api/jobs').send({ customerId, itemId, templateVersionId: versionId, receivedOn: '2026-11-28', calibratedOn: '2026-12-01', location: 'Laboratory room 2', environment: { temperature: { value: 23.1, u: 0.3, unit: '°C' }, humidity: { value: 41, u: 3, unit: '%' } } }).expect(201);
  return res.body.job as { id: string; number: string; status: string };
}

async function newPoint(jobId: string, nominal = 80) {
  const res = await analyst.post(`/api/jobs/${jobId}/points`).send({ nominalValue: nominal }).expect(201);
  return res.body.point as { id: string; inputs: Array<{ symbol: string; distribution: unknown }> };
}

async function fillPoint(pointId: string, blackbody = blackbodyId) {
  await analyst.post(`/api/points/${pointId}/readings/T_ind/upload`).attach('file', path.join(FIX, 'ir-thermometer-80C.csv')).expect(200);
  await analyst.put(`/api/points/${pointId}/inputs/T_ref/standard`).send({ standardId: thermometerId }).expect(200);
  await analyst.put(`/api/points/${pointId}/inputs/eps_bb/standard`).send({ standardId: blackbody }).expect(200);
}

async function readingsState(pointId: string) {
  const [p] = await t.database.db.select().from(calibrationPoints).where(eq(calibrationPoints.id, pointId));
  const rows = await t.database.db.select().from(readings).where(eq(readings.pointId, pointId));
  return { inputs: p.inputs, changedAt: p.changedAt.toISOString(), rows: rows.map((r) => ({ values: r.values, fileName: r.fileName, sha256: r.sha256 })) };
}

/** Reads a server-sent event stream to its end. */
async function readEvents(runId: string): Promise<Array<{ event: string; data: Record<string, unknown> }>> {
  const res = await analyst
    .get(`/api/runs/${runId}/events`)
    .buffer(true)
    .parse((response, cb) => {
      let text = '';
      response.setEncoding('utf8');
      response.on('data', (d: string) => (text += d));
      response.on('end', () => cb(null, text));
    })
    .expect(200);
  expect(res.headers['content-type']).toMatch(/text\/event-stream/);
  return String(res.body)
    .split('\n\n')
    .filter((b) => b.includes('data:'))
    .map((b) => ({ event: /event: (\w+)/.exec(b)![1], data: JSON.parse(/data: (.*)/.exec(b)![1]) }));
}

describe('jobs', () => {
  it('when an analyst opens a job from a released model, then it gets the next number and is a draft', async () => {
    const a = await newJob();
    const b = await newJob();
    expect(a.number).toMatch(/^EMB-2026-\d{4}$/);
    expect(Number(b.number.slice(-4))).toBe(Number(a.number.slice(-4)) + 1);
    expect(a.status).toBe('draft');
  });

  it('when the list is filtered and searched, then only matching jobs come back, paged', async () => {
    const job = await newJob();
    const all = await analyst.get('/api/jobs').query({ pageSize: 2 }).expect(200);
    expect(all.body.jobs).toHaveLength(2);
    expect(all.body.total).toBeGreaterThanOrEqual(3);
    const byNumber = await analyst.get('/api/jobs').query({ q: job.number }).expect(200);
    expect(byNumber.body.jobs.map((j: { id: string }) => j.id)).toEqual([job.id]);
    const byItem = await analyst.get('/api/jobs').query({ q: 'infrared', status: 'draft' }).expect(200);
    expect(byItem.body.total).toBeGreaterThanOrEqual(3);
    const none = await analyst.get('/api/jobs').query({ status: 'issued' }).expect(200);
    expect(none.body.jobs).toEqual([]);
    await analyst.get('/api/jobs').query({ status: 'lost' }).expect(400);
  });

  it('when a request is unauthenticated or from another role, then 401 or 403', async () => {
    await t.agent().get('/api/jobs').expect(401);
    const customer = await t.signIn('customer');
    await customer.get('/api/jobs').expect(403);
    const qm = await t.signIn('quality_manager');
    await qm.get('/api/jobs').expect(200);
    await qm.post('/api/jobs').send({ customerId, itemId, templateVersionId: versionId }).expect(403);
  });

  it('when the item belongs to another customer or the version does not exist, then 400 naming the field', async () => {
    const [other] = await t.database.db.select().from(customers).where(eq(customers.organisation, (await t.database.db.select().from(customers))[1].organisation));
    const res = await analyst.post('/api/jobs').send({ customerId: other.id, itemId, templateVersionId: versionId }).expect(400);
    expect(res.body.error.issues[0].path).toEqual(['body', 'itemId']);
    await analyst.get('/api/jobs/00000000-0000-4000-8000-000000000000').expect(404);
  });
});

describe('readings', () => {
  it('when a CSV with a header is uploaded, then n, mean, s, s/√n and ν = n − 1 are reported (GUM 4.2) and stored with the file', async () => {
    const job = await newJob();
    const p = await newPoint(job.id);
    expect(p.inputs.find((i) => i.symbol === 'T_ind')!.distribution).toBeNull();
    const res = await analyst.post(`/api/points/${p.id}/readings/T_ind/upload`).attach('file', path.join(FIX, 'ir-thermometer-80C.csv')).expect(200);
    const values = [80.2, 81.1, 79.6, 80.9, 80.4, 79.5, 81.3, 80.0, 80.7, 79.9];
    const ref = typeA(values);
    expect(res.body.typeA.n).toBe(10);
    expect(res.body.typeA.mean).toBeCloseTo(ref.mean, 12);
    expect(res.body.typeA.s).toBeCloseTo(ref.s, 12);
    expect(res.body.typeA.u).toBeCloseTo(ref.s / Math.sqrt(10), 12);
    expect(res.body.typeA.dof).toBe(9);
    expect(res.body.typeA.unit).toBe('°C');
    expect(res.body.sha256).toMatch(/^[0-9a-f]{64}$/);
    // Stored in SI (K): the display unit °C converts, it does not reinterpret.
    const state = await readingsState(p.id);
    expect(state.rows[0].fileName).toBe('ir-thermometer-80C.csv');
    expect((state.rows[0].values as number[])[0]).toBeCloseTo(353.35, 9);
  });

  it('when readings are typed or pasted, then they are accepted in the same way', async () => {
    const job = await newJob();
    const p = await newPoint(job.id);
    const typed = await analyst.put(`/api/points/${p.id}/readings/T_ind`).send({ values: [80.1, 80.3, 80.2], unit: '°C' }).expect(200);
    expect(typed.body.typeA.n).toBe(3);
    const pasted = await analyst.put(`/api/points/${p.id}/readings/T_ind`).send({ text: '80.1\n80.3\t\n80,2\n' }).expect(200);
    expect(pasted.body.typeA.n).toBe(3);
  });

  it('when an XLSX workbook is uploaded with a named column, then that column is read (type decided by content)', async () => {
    const ExcelJS = (await import('exceljs')).default;
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet('run');
    ws.addRow(['time', 'indication']);
    for (const [i, v] of [80.2, 80.6, 80.4, 80.3].entries()) ws.addRow([`10:0${i}`, v]);
    const buf = Buffer.from(await wb.xlsx.writeBuffer());
    const job = await newJob();
    const p = await newPoint(job.id);
    const res = await analyst.post(`/api/points/${p.id}/readings/T_ind/upload`).field('column', 'indication').attach('file', buf, 'readings.bin').expect(200);
    expect(res.body.kind).toBe('xlsx');
    expect(res.body.typeA.n).toBe(4);
    expect(res.body.column).toBe('indication');
  });

  describe('bad files get a clear message and change nothing', () => {
    let pointId: string;
    let before: Awaited<ReturnType<typeof readingsState>>;
    beforeAll(async () => {
      const job = await newJob();
      const p = await newPoint(job.id);
      pointId = p.id;
      await analyst.post(`/api/points/${p.id}/readings/T_ind/upload`).attach('file', path.join(FIX, 'with-header.csv')).expect(200);
      before = await readingsState(pointId);
    });

    const upload = (file: string | Buffer, name?: string, column?: string) => {
      const req = analyst.post(`/api/points/${pointId}/readings/T_ind/upload`);
      if (column) req.field('column', column);
      return typeof file === 'string' ? req.attach('file', path.join(FIX, file)) : req.attach('file', file, name);
    };

    it('malformed CSV (unterminated quote)', async () => {
      const res = await upload('malformed-quotes.csv', undefined, 'indication').expect(422);
      expect(res.body.error.message).toMatch(/cannot be read.*quote/i);
      expect(await readingsState(pointId)).toEqual(before);
    });

    it('empty column', async () => {
      const res = await upload('empty-column.csv', undefined, 'indication').expect(422);
      expect(res.body.error.message).toMatch(/column indication is empty/i);
      expect(await readingsState(pointId)).toEqual(before);
    });

    it('non-numeric cells, each named by row and column', async () => {
      const res = await upload('non-numeric.csv').expect(422);
      expect(res.body.error.message).toContain('row 4, column indication: "abc" is not a number');
      expect(res.body.error.message).toContain('row 6, column indication: "12..5" is not a number');
      expect(await readingsState(pointId)).toEqual(before);
    });

    it('oversized file', async () => {
      const big = Buffer.from('373.4\n'.repeat(400_000));
      const res = await upload(big, 'big.csv').expect(413);
      expect(res.body.error.code).toBe('FILE_TOO_LARGE');
      expect(res.body.error.message).toMatch(/larger than 2 MB/);
      expect(await readingsState(pointId)).toEqual(before);
    });

    it('a file that is neither CSV nor XLSX, and a missing column name', async () => {
      const png = Buffer.from('89504e470d0a1a0a0000000d49484452', 'hex');
      const res = await upload(png, 'readings.csv').expect(422);
      expect(res.body.error.message).toMatch(/PNG/);
      const two = Buffer.from('a,b\n1,2\n3,4\n');
      const res2 = await upload(two, 'two.csv').expect(422);
      expect(res2.body.error.message).toMatch(/2 columns \("a", "b"\): say which column/);
      expect(await readingsState(pointId)).toEqual(before);
    });
  });
});

describe('submission checks', () => {
  it('when an input is missing, the result is absent, and a standard is overdue, then 422 lists every reason with its point and input', async () => {
    const job = await newJob();
    const p = await newPoint(job.id);
    await analyst.put(`/api/points/${p.id}/inputs/eps_bb/standard`).send({ standardId: overdueId }).expect(200);
    const res = await analyst.post(`/api/jobs/${job.id}/submit`).expect(422);
    expect(res.body.error.code).toBe('SUBMIT_REFUSED');
    const issues = res.body.error.issues as Array<{ path: string[]; message: string }>;
    const codes = issues.map((i) => `${i.path[2]}:${i.path[3]}`);
    expect(codes).toContain('T_ind:INPUT_MISSING');
    expect(codes).toContain('T_ref:INPUT_MISSING');
    expect(codes).toContain('eps_bb:STANDARD_OVERDUE');
    expect(codes).toContain('-:NO_RESULT');
    expect(issues.every((i) => i.path[1] === p.id)).toBe(true);
    expect(issues.find((i) => i.path[3] === 'STANDARD_OVERDUE')!.message).toMatch(/due on 2026-11-15/);
    // Messages name the input as the budget table writes it (ISO 80000-1 §7.1: ε for eps, the
    // subscript after "_"); the model identifier stays in the path, where the client places it.
    const message = (symbol: string, code: string) => issues.find((i) => i.path[2] === symbol && i.path[3] === code)!.message;
    expect(message('eps_bb', 'STANDARD_OVERDUE')).toMatch(/^Point 1: ε_bb comes from Old cavity blackbody/);
    expect(message('T_ind', 'INPUT_MISSING')).toBe('Point 1: T_ind has no value yet: enter or upload its readings.');
    expect(issues.map((i) => i.message).join('\n')).not.toMatch(/eps_bb/);
    const after = await analyst.get(`/api/jobs/${job.id}`).expect(200);
    expect(after.body.job.status).toBe('draft');
  });

  it('when U is below the CMC, then submission is refused until the point is marked outside the scope with a reason (ILAC-P14 §5.4)', async () => {
    const job = await newJob();
    const p = await newPoint(job.id);
    await fillPoint(p.id);
    // Narrow readings: U falls below the 0.5 K CMC of the 243.15 K … 373.15 K range.
    await analyst.put(`/api/points/${p.id}/readings/T_ind`).send({ values: [80.40, 80.42, 80.41, 80.39, 80.40], unit: '°C' }).expect(200);
    await analyst.post(`/api/points/${p.id}/calculate`).expect(200);
    const run = await analyst.post(`/api/points/${p.id}/monte-carlo`).send({ trials: 100_000, seed: 7 }).expect(202);
    await readEvents(run.body.runId);
    const res = await analyst.post(`/api/jobs/${job.id}/submit`).expect(422);
    const below = (res.body.error.issues as Array<{ path: string[]; message: string }>).filter((i) => i.path[3] === 'U_BELOW_CMC');
    expect(below).toHaveLength(1);
    expect(below[0].message).toMatch(/^Point 1: U = \d\.\d\d K is below the CMC of 0\.50 K/);
    await analyst.patch(`/api/points/${p.id}`).send({ outsideScope: true }).expect(400);
    await analyst.patch(`/api/points/${p.id}`).send({ outsideScope: true, outsideScopeReason: 'Customer asked for the instrument’s own repeatability only.' }).expect(200);
    const ok = await analyst.post(`/api/jobs/${job.id}/submit`).expect(200);
    expect(ok.body.job.status).toBe('submitted');
    await analyst.patch(`/api/points/${p.id}`).send({ nominalValue: 81 }).expect(409);
  });

  it('when every check passes, then the job is submitted and the review view has points, results and standards', async () => {
    const job = await newJob();
    const p = await newPoint(job.id);
    await fillPoint(p.id);
    const calc = await analyst.post(`/api/points/${p.id}/calculate`).expect(200);
    expect(calc.body.point.result.gum.U).toBeGreaterThan(0.5);
    let refused = await analyst.post(`/api/jobs/${job.id}/submit`).expect(422);
    expect(refused.body.error.issues.map((i: { path: string[] }) => i.path[3])).toEqual(['NO_MONTE_CARLO']);

    const run = await analyst.post(`/api/points/${p.id}/monte-carlo`).send({ trials: 100_000, seed: 12345 }).expect(202);
    const events = await readEvents(run.body.runId);
    const progress = events.filter((e) => e.event === 'progress');
    expect(progress.length).toBeGreaterThanOrEqual(1);
    expect(progress.every((e) => e.data.target === 100_000)).toBe(true);
    const done = events.at(-1)!;
    expect(done.event).toBe('done');
    expect((done.data.result as { mcm: { trials: number; seed: number } }).mcm).toMatchObject({ trials: 100_000, seed: 12345 });

    const stored = await analyst.get(`/api/points/${p.id}`).expect(200);
    expect(stored.body.point.resultSeed).toBe(12345);
    expect(stored.body.point.resultEngineVersion).toMatch(/^emberline-engine /);
    expect(stored.body.point.result.validation).not.toBeNull();
    expect(stored.body.point.current).toBe(true);

    // A change after the run makes the result stale.
    await analyst.put(`/api/points/${p.id}/readings/T_ind`).send({ values: [80.2, 81.1, 79.6, 80.9, 80.4, 79.5, 81.3, 80.0, 80.7, 79.8], unit: '°C' }).expect(200);
    refused = await analyst.post(`/api/jobs/${job.id}/submit`).expect(422);
    expect(refused.body.error.issues.map((i: { path: string[] }) => i.path[3])).toContain('RESULT_STALE');
    const run2 = await analyst.post(`/api/points/${p.id}/monte-carlo`).send({ trials: 100_000, seed: 1 }).expect(202);
    await readEvents(run2.body.runId);

    const ok = await analyst.post(`/api/jobs/${job.id}/submit`).expect(200);
    expect(ok.body.job.status).toBe('submitted');
    const { createJobsService } = await import('../../server/modules/jobs/jobs.service');
    const { createJobsRepository } = await import('../../server/modules/jobs/jobs.repository');
    const { createJobSources } = await import('../../server/modules/jobs/sources');
    const svc = createJobsService({ db: t.database.db, jobsRepo: createJobsRepository(t.database.db), sources: createJobSources(t.database.db, () => NOW), clock: () => NOW });
    const review = await svc.getJobForReview(job.id);
    expect(review.item?.serial).toBe('A-1001');
    expect(review.points[0].result?.mcm?.seed).toBe(1);
    expect(review.standards.map((s) => s.id).sort()).toEqual([thermometerId, blackbodyId].sort());
    // Rejection returns it to draft with the comment kept.
    await t.database.db.transaction((tx) => svc.transitionJob(tx, job.id, 'submitted', 'draft', { id: 'system', name: 'Reviewer', role: 'signatory' }, 'Size-of-source term looks small.'));
    const back = await analyst.get(`/api/jobs/${job.id}`).expect(200);
    expect(back.body.job.status).toBe('draft');
    expect(back.body.job.reviewComment).toBe('Size-of-source term looks small.');
  }, 60_000);
});

describe('Monte Carlo runs and calculations', () => {
  it('when a run is cancelled, then its stream ends with "cancelled" and no result is stored', async () => {
    const job = await newJob();
    const p = await newPoint(job.id);
    await fillPoint(p.id);
    const run = await analyst.post(`/api/points/${p.id}/monte-carlo`).send({ trials: 20_000_000, seed: 3 }).expect(202);
    await analyst.post(`/api/points/${p.id}/monte-carlo`).send({ trials: 1000 }).expect(409);
    await analyst.delete(`/api/runs/${run.body.runId}`).expect(202);
    const events = await readEvents(run.body.runId);
    expect(events.at(-1)!.event).toBe('cancelled');
    const stored = await analyst.get(`/api/points/${p.id}`).expect(200);
    expect(stored.body.point.result).toBeNull();
  }, 60_000);

  it('when a budget document is posted to /api/calculations/gum, then the GUM result comes back; an invalid one gets 422', async () => {
    const def = JSON.parse(fs.readFileSync('tests/fixtures/budgets/ir-thermometer.json', 'utf8'));
    const res = await analyst.post('/api/calculations/gum').send({ budget: def }).expect(200);
    expect(res.body.result.gum.budget.length).toBeGreaterThan(0);
    expect(res.body.result.mcm).toBeNull();
    const bad = await analyst.post('/api/calculations/gum').send({ budget: { equations: ['y = x +'], inputs: [] } }).expect(422);
    expect(bad.body.error.message).toMatch(/invalid|input/i);
  });

  it('when a budget is exported, then CSV and XLSX come back and formula-like text is neutralised', async () => {
    const job = await newJob();
    const p = await newPoint(job.id);
    await fillPoint(p.id);
    await analyst.post(`/api/points/${p.id}/calculate`).expect(200);
    const csv = await analyst.get(`/api/points/${p.id}/export`).query({ format: 'csv' }).expect(200);
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    expect(csv.text).toContain('T_ind');
    expect(csv.text).toContain('sensitivity coefficient');
    const { neutralise } = await import('../../server/modules/jobs/jobs.export');
    expect(neutralise('=HYPERLINK("x")')).toBe(`'=HYPERLINK("x")`);
    expect(neutralise('-1+2')).toBe(`'-1+2`);
    expect(neutralise('@SUM(A1)')).toBe(`'@SUM(A1)`);
    expect(neutralise(-1.5)).toBe(-1.5);
    const xlsx = await analyst.get(`/api/jobs/${job.id}/export`).query({ format: 'xlsx' }).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    }).expect(200);
    expect((xlsx.body as Buffer).subarray(0, 2).toString()).toBe('PK');
  });
});

describe('jobs list search and amendments (ISO/IEC 17025:2017 §7.8.8)', () => {
  it('when a job\'s certificate is amended, then searching for the amending job\'s number finds that job and the original, as the list marks it', async () => {
    const { jobId: originalId } = await submittedJob(t);
    const cert = await approve(t, originalId);
    const qm = await t.signIn('quality_manager');
    const opened = await qm.post(`/api/certificates/${cert.id}/amend`).send({ reason: 'The calibration date was entered one day late.' }).expect(201);
    const revisionId = opened.body.jobId as string;
    const revisionNumber = opened.body.jobNumber as string;

    const ids = (res: { body: { jobs: Array<{ id: string }> } }) => res.body.jobs.map((j) => j.id).sort();
    const found = await analyst.get('/api/jobs').query({ q: revisionNumber }).expect(200);
    expect(jobListSchema.safeParse(found.body).success).toBe(true);
    expect(ids(found)).toEqual([originalId, revisionId].sort());
    expect(found.body.total).toBe(2);
    // The original is the row marked 'Being amended in <revision>'.
    const original = found.body.jobs.find((j: { id: string }) => j.id === originalId);
    expect(original.amendedBy).toMatchObject({ jobId: revisionId, jobNumber: revisionNumber, jobStatus: 'draft', status: 'open' });
    // Any case, part of the number, and together with the other filters.
    expect(ids(await analyst.get('/api/jobs').query({ q: revisionNumber.toLowerCase() }).expect(200))).toEqual([originalId, revisionId].sort());
    const issued = await analyst.get('/api/jobs').query({ q: revisionNumber, status: 'issued' }).expect(200);
    expect(ids(issued)).toEqual([originalId]);
    expect(issued.body.total).toBe(1);
    expect(ids(await analyst.get('/api/jobs').query({ q: revisionNumber, status: 'draft' }).expect(200))).toEqual([revisionId]);
    // A number no job has finds nothing, amended or not.
    const none = await analyst.get('/api/jobs').query({ q: 'EMB-1999-9999' }).expect(200);
    expect(none.body).toMatchObject({ jobs: [], total: 0 });
  }, 120_000);
});
