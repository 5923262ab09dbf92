/**
 * Uploads and exports (issue 8).
 * Uploads: each upload route refuses a file over its size limit (413) and a file whose content
 * (not its name or declared type) is not of the accepted kind (415/400), in the envelope, and
 * stores nothing. Sources: OWASP ASVS 4.0 V12.1.1 (no large files that could fill storage),
 * V12.2.1 (files from untrusted sources checked to be of the expected type by their content).
 * Exports: no cell of a CSV or XLSX export begins with = + - @ (or tab / carriage return) as text,
 * so a spreadsheet never runs it as a formula; hostile text put into the records comes back with a
 * leading apostrophe. Source: OWASP, "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection).
 */
import path from 'node:path';
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { customerItems, customers, referenceStandards, referenceStandardValues } from '../../../server/db/schema';
import { CERTIFICATE_MAX_BYTES } from '../../../server/modules/standards/standards.service';
import { MAX_READINGS_FILE_BYTES } from '../../../server/modules/points/readings-parser';
import { VERIFY_MAX_BYTES } from '../../../shared/schemas/certificates-api.schema';
import { apiErrorSchema } from '../../../shared/schemas/api-error.schema';
import { createTestApp, type TestApp } from '../../setup/test-app';
import { listRoutes, routeKey } from './routes';

const FIX = path.join(__dirname, '../../fixtures/readings');
const HOSTILE = ['=HYPERLINK("http://example.com/x","click")', '+1+1', '-2+3', '@SUM(A1:A9)', '\t=1+1', '\r=1+1'];
const FORMULA = /^[=+\-@\t\r]/;
// Tiny PNG signature + IHDR: file-type detects image/png from these bytes.
const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da636400010000050001', 'hex');

type Agent = Awaited<ReturnType<TestApp['signIn']>>;
let t: TestApp;
let analyst: Agent;
let qm: Agent;
let jobId: string;
let pointId: string;
let standardId: string;

const binary = (req: request.Test) =>
  req.buffer(true).parse((r, cb) => {
    const chunks: Buffer[] = [];
    r.on('data', (c: Buffer) => chunks.push(c));
    r.on('end', () => cb(null, Buffer.concat(chunks)));
  });

function expectEnvelope(res: request.Response, status: number, code?: string) {
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  const body = apiErrorSchema.parse(res.body);
  if (code) expect(body.error.code).toBe(code);
}

async function addStandard(name: string, kind: string, value: { quantity: string; value: number; unit: string; U: number; k: number }) {
  const db = t.database.db;
  const [s] = await db.insert(referenceStandards).values({ name, kind, serialNumber: `SN-${name.length}`, certificateNumber: `CAL-${name.length}`, issuingLaboratory: 'Invented Lab', calibrationDate: '2026-01-10', dueDate: '2099-01-01' }).returning();
  await db.insert(referenceStandardValues).values({ standardId: s.id, position: 0, quantity: value.quantity, value: value.value, unit: value.unit, expandedUncertainty: value.U, coverageFactor: value.k });
  return s.id;
}

beforeAll(async () => {
  t = await createTestApp();
  analyst = await t.signIn('analyst');
  qm = await t.signIn('quality_manager');
  const db = t.database.db;
  const [c] = await db.select().from(customers).limit(1);
  const [item] = await db.insert(customerItems).values({ customerId: c.id, description: 'Handheld infrared thermometer', maker: 'Invented Optics', model: 'IR-8', serialNumber: 'SEC-1' }).returning();
  const thermometer = await addStandard('Security PRT', 'reference_thermometer', { quantity: 'temperature', value: 353.15, unit: 'K', U: 0.06, k: 2 });
  const blackbody = await addStandard('Security blackbody', 'blackbody_source', { quantity: 'effective emissivity', value: 0.995, unit: '1', U: 0.004, k: 2 });
  standardId = thermometer;
  const opts = await analyst.get('/api/jobs/options').expect(200);
  const versionId = opts.body.templateVersions.find((v: { key: string }) => v.key === 'ir-thermometer-blackbody').id;
  const job = await analyst.post('/api/jobs').send({ customerId: c.id, itemId: item.id, templateVersionId: versionId, receivedOn: '2026-11-28', calibratedOn: '2026-12-01', location: 'Room 2', environment: { temperature: { value: 23.1, u: 0.3, unit: '°C' }, humidity: { value: 41, u: 3, unit: '%' } } }).expect(201);
  jobId = job.body.job.id;
  const point = await analyst.post(`/api/jobs/${jobId}/points`).send({ nominalValue: 80 }).expect(201);
  pointId = point.body.point.id;
  await analyst.post(`/api/points/${pointId}/readings/T_ind/upload`).attach('file', path.join(FIX, 'ir-thermometer-80C.csv')).expect(200);
  await analyst.put(`/api/points/${pointId}/inputs/T_ref/standard`).send({ standardId: thermometer }).expect(200);
  await analyst.put(`/api/points/${pointId}/inputs/eps_bb/standard`).send({ standardId: blackbody }).expect(200);
  await analyst.post(`/api/points/${pointId}/calculate`).expect(200);
}, 240_000);
afterAll(() => t?.close());

describe('uploads: size limit and type from content', () => {
  const stored = () => (t.database.query<{ n: number }>('select count(*)::int as n from readings').then((r) => r[0].n));

  it('lists the upload routes this file covers (a new upload route must be added here)', () => {
    const uploads = listRoutes(t.app).map(routeKey).filter((k) => /upload|certificate$|\/verify\/file/.test(k) && k.startsWith('POST'));
    expect(uploads.sort()).toEqual(['POST /api/points/:id/readings/:symbol/upload', 'POST /api/standards/:id/certificate', 'POST /api/verify/file'].sort());
  });

  it('when a reference-standard certificate is over the limit or not a PDF by content, then 413 / 415 and nothing is stored', async () => {
    const before = (await qm.get(`/api/standards/${standardId}`).expect(200)).body;
    const big = Buffer.concat([Buffer.from('%PDF-1.7\n'), Buffer.alloc(CERTIFICATE_MAX_BYTES + 1, 0x20)]);
    expectEnvelope(await qm.post(`/api/standards/${standardId}/certificate`).attach('file', big, { filename: 'cert.pdf', contentType: 'application/pdf' }), 413, 'FILE_TOO_LARGE');
    // A PNG named .pdf and declared application/pdf: the content decides.
    expectEnvelope(await qm.post(`/api/standards/${standardId}/certificate`).attach('file', PNG, { filename: 'cert.pdf', contentType: 'application/pdf' }), 415, 'UNSUPPORTED_FILE_TYPE');
    expectEnvelope(await qm.post(`/api/standards/${standardId}/certificate`).attach('file', Buffer.from('just text, not a pdf'), { filename: 'cert.pdf', contentType: 'application/pdf' }), 415, 'UNSUPPORTED_FILE_TYPE');
    expect((await qm.get(`/api/standards/${standardId}`).expect(200)).body).toEqual(before);
    expect(t.deps.config.dataDir).toBeTruthy();
  });

  it('when a readings file is over the limit or is another kind of file, then 413 / 400 and no readings are saved', async () => {
    const n = await stored();
    const big = Buffer.alloc(MAX_READINGS_FILE_BYTES + 1, '1\n');
    expectEnvelope(await analyst.post(`/api/points/${pointId}/readings/T_ind/upload`).attach('file', big, { filename: 'r.csv', contentType: 'text/csv' }), 413, 'FILE_TOO_LARGE');
    const png = await analyst.post(`/api/points/${pointId}/readings/T_ind/upload`).attach('file', PNG, { filename: 'r.csv', contentType: 'text/csv' });
    expect(png.status).toBeGreaterThanOrEqual(400);
    expect(png.status).toBeLessThan(500);
    expect(apiErrorSchema.parse(png.body).error.message).toMatch(/PNG/);
    expect(await stored()).toBe(n);
  });

  it('when a file to verify is over the limit or not a PDF, then 413 / 400', async () => {
    const big = Buffer.concat([Buffer.from('%PDF-1.7\n'), Buffer.alloc(VERIFY_MAX_BYTES + 1, 0x20)]);
    expectEnvelope(await request(t.app).post('/api/verify/file').set('Content-Type', 'application/pdf').send(big), 413, 'FILE_TOO_LARGE');
    const png = await request(t.app).post('/api/verify/file').set('Content-Type', 'application/pdf').send(PNG);
    expect(png.status).toBe(400);
    apiErrorSchema.parse(png.body);
  });
});

describe('exports: formula injection neutralised', () => {
  const cellsOfCsv = (text: string) => (Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: true }).data as string[][]).flat();
  async function cellsOfXlsx(bytes: Buffer) {
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(bytes as unknown as ArrayBuffer);
    const out: unknown[] = [];
    wb.eachSheet((ws) => ws.eachRow((row) => row.eachCell((c) => out.push(c.value))));
    return out;
  }
  // A plain number such as "-0.25" or "-1e-5" is read as that number, not as a formula.
  const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
  const dangerous = (cells: unknown[]) => cells.filter((c) => typeof c === 'string' && FORMULA.test(c) && !NUMBER.test(c));
  const formulas = (cells: unknown[]) => cells.filter((c) => typeof c === 'object' && c !== null && ('formula' in c || 'sharedFormula' in c));

  it('lists the export routes this file covers (a new export route must be added here)', () => {
    const exports = listRoutes(t.app).map(routeKey).filter((k) => k.startsWith('GET') && /export/.test(k));
    expect(exports.sort()).toEqual(['GET /api/audit/export.csv', 'GET /api/jobs/:id/export', 'GET /api/points/:id/export'].sort());
  });

  it('when input descriptions hold formula-like text, then the job and point budget exports (CSV and XLSX) carry it as inert text', async () => {
    // Put hostile text where an export prints user-controlled text (the inputs' descriptions).
    await t.database.query(
      `update calibration_points set inputs = (select jsonb_agg(jsonb_set(i, '{description}', to_jsonb(($2::text[])[((o - 1) % array_length($2::text[], 1)) + 1]))) from jsonb_array_elements(inputs) with ordinality as x(i, o)) where id = $1`,
      [pointId, HOSTILE],
    );
    for (const url of [`/api/points/${pointId}/export`, `/api/jobs/${jobId}/export`]) {
      const csv = await analyst.get(url).query({ format: 'csv' }).expect(200);
      const cells = cellsOfCsv(csv.text);
      expect(dangerous(cells), url).toEqual([]);
      for (const h of HOSTILE) expect(cells, `${url} ${JSON.stringify(h)}`).toContain(`'${h}`);
      const xlsx = await binary(analyst.get(url).query({ format: 'xlsx' })).expect(200);
      const xcells = await cellsOfXlsx(xlsx.body as Buffer);
      expect(dangerous(xcells), url).toEqual([]);
      expect(formulas(xcells), url).toEqual([]);
      // XML normalises a carriage return in cell text, so that one is only checked in the CSV.
      for (const h of HOSTILE.filter((x) => !x.includes('\r'))) expect(xcells).toContain(`'${h}`);
    }
  });

  it('when an actor name and a record hold formula-like text, then the audit CSV export carries it as inert text', async () => {
    const admin = await t.signIn('admin');
    const name = '=cmd|\' /C calc\'!A0';
    await admin.post('/api/users').send({ name, email: 'formula@example.org', role: 'quality_manager', password: 'a-good-long-password' }).expect(201);
    const hostile = await t.signInAs('formula@example.org', 'a-good-long-password');
    await hostile.post('/api/customers').send({ organisation: '@SUM(1+1)*cmd|\' /C calc\'!A0', address: '-1+1' }).expect(201);
    const csv = await qm.get('/api/audit/export.csv').expect(200);
    const cells = cellsOfCsv(csv.text);
    expect(cells).toContain(`'${name}`);
    expect(dangerous(cells)).toEqual([]);
  });
});
