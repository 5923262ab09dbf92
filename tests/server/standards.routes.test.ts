/*
 * Reference-standard register (ISO/IEC 17025:2017 §6.4.13 equipment records: identity,
 * calibration dates and results, due date; §6.5 metrological traceability). Due-soon window of
 * 30 days: common practice, no source (the lab's own procedure decides).
 */
import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema';
import { standardDetailSchema, standardListSchema, type StandardInput } from '../../shared/schemas/standards.schema';
import { getStandardForBudget, dueState } from '../../server/modules/standards/standards.service';
import { verifyAuditChain } from '../../server/audit';
import { createTestApp, type TestApp } from '../setup/test-app';

type Agent = Awaited<ReturnType<TestApp['signIn']>>;

/** A minimal PDF (ISO 32000-1 §7.5: header, body, xref, trailer). */
export function tinyPdf(text = 'demo certificate'): Buffer {
  return Buffer.from(
    `%PDF-1.4\n1 0 obj << /Type /Catalog /Pages 2 0 R >> endobj\n2 0 obj << /Type /Pages /Kids [] /Count 0 >> endobj\n% ${text}\ntrailer << /Root 1 0 R >>\n%%EOF\n`,
    'latin1',
  );
}
const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8ffff3f0005fe02fea7d6a4e30000000049454e44ae426082', 'hex');

const NOW = new Date('2026-06-15T10:00:00Z');

const input = (over: Partial<StandardInput> = {}): StandardInput => ({
  name: 'Test blackbody TB-1',
  kind: 'blackbody_source',
  serialNumber: 'TB1-001',
  certificateNumber: 'CERT-TEST-1',
  issuingLaboratory: 'Test Calibration Lab (demo)',
  calibrationDate: '2026-01-10',
  dueDate: '2027-01-10',
  values: [
    { quantity: 'Emissivity', value: 0.998, unit: '', expandedUncertainty: 0.002, coverageFactor: 2 },
    { quantity: 'Correction', value: 0.1, unit: 'K', expandedUncertainty: 0.3, coverageFactor: 2, atValue: 500, atUnit: '°C' },
  ],
  ...over,
});

describe('/api/standards', () => {
  let t: TestApp;
  let qm: Agent;
  let analyst: Agent;
  let created: string;
  let now = NOW;
  const filesDir = () => path.join(t.dataDir, 'files');
  const storedFiles = () => (fs.existsSync(filesDir()) ? fs.readdirSync(filesDir()) : []);

  beforeAll(async () => {
    t = await createTestApp({ clock: () => now });
    qm = await t.signIn('quality_manager');
    analyst = await t.signIn('analyst');
  });
  afterAll(() => t?.close());

  it('when the analyst lists the seeded register, then one standard is due soon and one overdue (seed clock)', async () => {
    const body = standardListSchema.parse((await analyst.get('/api/standards').expect(200)).body);
    expect(body.today).toBe('2026-06-15');
    expect(body.standards).toHaveLength(5);
    expect(body.standards.filter((s) => s.due === 'due_soon').map((s) => s.name)).toEqual(['Reference thermometer PRT-A (demo)']);
    expect(body.standards.filter((s) => s.due === 'overdue').map((s) => s.name)).toEqual(['Reference thermometer PRT-B (demo)']);
    const kinds = new Set(body.standards.map((s) => s.kind));
    expect(kinds).toEqual(new Set(['blackbody_source', 'reference_thermometer', 'transfer_radiation_thermometer', 'spectroradiometer']));
  });

  it('when filtering by due state, kind or text, then only matching standards come back', async () => {
    const overdue = standardListSchema.parse((await analyst.get('/api/standards?due=overdue').expect(200)).body);
    expect(overdue.standards.map((s) => s.serialNumber)).toEqual(['PRT-4472-B']);
    const thermometers = standardListSchema.parse((await analyst.get('/api/standards?kind=reference_thermometer').expect(200)).body);
    expect(thermometers.standards).toHaveLength(2);
    const text = standardListSchema.parse((await analyst.get('/api/standards?q=sr400').expect(200)).body);
    expect(text.standards.map((s) => s.kind)).toEqual(['spectroradiometer']);
    const bad = await analyst.get('/api/standards?due=later').expect(400);
    expect(bad.body.error.issues[0].path).toEqual(['query', 'due']);
  });

  it('when a quality manager creates a standard, then it is stored with its certified values, u = U/k, and audited', async () => {
    const res = await qm.post('/api/standards').send(input()).expect(201);
    const s = standardDetailSchema.parse(res.body.standard);
    created = s.id;
    expect(s).toMatchObject({ status: 'in_service', due: 'ok', hasCertificateFile: false, certificateFile: null });
    expect(s.values.map((v) => v.standardUncertainty)).toEqual([0.001, 0.15]);
    expect(s.values[1]).toMatchObject({ atValue: 500, atUnit: '°C' });
    const [row] = await t.database.query<{ actor_role: string; action: string }>(`select * from audit_log where entity = 'reference_standard' and entity_id = $1`, [s.id]);
    expect(row).toMatchObject({ actor_role: 'quality_manager', action: 'create' });
  });

  it('when the body is not valid, then 400 names each field and nothing is created', async () => {
    const res = await qm
      .post('/api/standards')
      .send({ ...input({ name: 'Bad one' }), kind: 'kettle', dueDate: '2025-01-01', values: [{ quantity: 'x', value: 'one', unit: '', expandedUncertainty: -1, coverageFactor: 0 }] })
      .expect(400);
    const paths = apiErrorSchema.parse(res.body).error.issues!.map((i) => i.path.join('.'));
    expect(paths).toEqual(expect.arrayContaining(['body.kind', 'body.values.0.value', 'body.values.0.expandedUncertainty', 'body.values.0.coverageFactor']));
    const dates = await qm.post('/api/standards').send(input({ name: 'Bad dates', calibrationDate: '2026-02-30' })).expect(400);
    expect(dates.body.error.issues[0].message).toMatch(/not a real calendar date/);
    const order = await qm.post('/api/standards').send(input({ name: 'Bad order', dueDate: '2025-01-01' })).expect(400);
    expect(order.body.error.issues[0].message).toMatch(/due date cannot be before/);
    expect(await t.database.query(`select 1 from reference_standards where name like 'Bad%'`)).toHaveLength(0);
  });

  it('when the name is already used (any case), then 409', async () => {
    const res = await qm.post('/api/standards').send(input({ name: 'test BLACKBODY tb-1' })).expect(409);
    expect(res.body.error.code).toBe('NAME_TAKEN');
  });

  it('when not signed in, then 401; when an analyst or customer writes, then 403; a customer cannot read', async () => {
    await request(t.app).get('/api/standards').expect(401);
    await request(t.app).post('/api/standards').send(input()).expect(401);
    await analyst.post('/api/standards').send(input({ name: 'By analyst' })).expect(403);
    await analyst.put(`/api/standards/${created}`).send(input()).expect(403);
    await analyst.post(`/api/standards/${created}/certificate`).attach('file', tinyPdf(), 'c.pdf').expect(403);
    const customer = await t.signIn('customer');
    await customer.get('/api/standards').expect(403);
    await customer.get(`/api/standards/${created}`).expect(403);
    const admin = await t.signIn('admin');
    await admin.get(`/api/standards/${created}`).expect(200);
    await admin.post('/api/standards').send(input({ name: 'By admin' })).expect(403);
  });

  it('when the id is unknown, then 404; when it is not a uuid, then 400', async () => {
    const unknown = '00000000-0000-4000-8000-000000000000';
    await analyst.get(`/api/standards/${unknown}`).expect(404);
    await qm.put(`/api/standards/${unknown}`).send(input({ name: 'Nobody' })).expect(404);
    await qm.post(`/api/standards/${unknown}/certificate`).attach('file', tinyPdf(), 'c.pdf').expect(404);
    await analyst.get(`/api/standards/${unknown}/certificate`).expect(404);
    await analyst.get('/api/standards/not-an-id').expect(400);
  });

  it('when a standard is updated, then kept values keep their ids, removed ones go, and the audit row has before and after', async () => {
    const before = standardDetailSchema.parse((await qm.get(`/api/standards/${created}`).expect(200)).body.standard);
    const [first] = before.values;
    const res = await qm
      .put(`/api/standards/${created}`)
      .send(input({ status: 'out_of_service', values: [{ ...first, value: 0.997 }, { quantity: 'Correction', value: 0.2, unit: 'K', expandedUncertainty: 0.4, coverageFactor: 2, atValue: 800, atUnit: '°C' }] }))
      .expect(200);
    const s = standardDetailSchema.parse(res.body.standard);
    expect(s.status).toBe('out_of_service');
    expect(s.values[0]).toMatchObject({ id: first.id, value: 0.997 });
    expect(s.values[1].id).not.toBe(before.values[1].id);
    expect(s.values).toHaveLength(2);
    const [row] = await t.database.query<{ before: { status: string }; after: { status: string } }>(
      `select * from audit_log where entity = 'reference_standard' and entity_id = $1 and action = 'update'`,
      [created],
    );
    expect(row.before.status).toBe('in_service');
    expect(row.after.status).toBe('out_of_service');
  });

  it('when a PDF certificate is uploaded, then it is stored under its SHA-256 and downloads byte-identical', async () => {
    const pdf = tinyPdf('upload test');
    const res = await qm.post(`/api/standards/${created}/certificate`).attach('file', pdf, { filename: 'TB-1 certificate.pdf', contentType: 'application/pdf' }).expect(201);
    const s = standardDetailSchema.parse(res.body.standard);
    const sha = (await import('node:crypto')).createHash('sha256').update(pdf).digest('hex');
    expect(s.certificateFile).toMatchObject({ name: 'TB-1 certificate.pdf', size: pdf.length, sha256: sha });
    expect(fs.readFileSync(path.join(filesDir(), sha))).toEqual(pdf);
    const dl = await analyst.get(`/api/standards/${created}/certificate`).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    }).expect(200);
    expect(dl.headers['content-type']).toMatch(/application\/pdf/);
    expect(dl.headers['content-disposition']).toMatch(/attachment; filename="TB-1 certificate.pdf"/);
    expect(dl.body).toEqual(pdf);
    const audit = await t.database.query(`select 1 from audit_log where entity_id = $1 and action = 'upload_file'`, [created]);
    expect(audit).toHaveLength(1);
  });

  it('when the upload is not a PDF by content (whatever its name or declared type), then 415 with a clear message and nothing is stored', async () => {
    const filesBefore = storedFiles();
    const [{ n: auditBefore }] = await t.database.query<{ n: number }>('select count(*)::int as n from audit_log');
    const other = standardDetailSchema.parse((await qm.post('/api/standards').send(input({ name: 'No file yet', serialNumber: 'NF-1' })).expect(201)).body.standard);
    const png = await qm.post(`/api/standards/${other.id}/certificate`).attach('file', PNG, { filename: 'cert.pdf', contentType: 'application/pdf' }).expect(415);
    expect(png.body.error).toMatchObject({ code: 'UNSUPPORTED_FILE_TYPE' });
    expect(png.body.error.message).toMatch(/must be a PDF file \(application\/pdf\), but its content is image\/png\. Nothing was stored\./);
    const txt = await qm.post(`/api/standards/${other.id}/certificate`).attach('file', Buffer.from('just text, not a PDF'), { filename: 'cert.pdf', contentType: 'application/pdf' }).expect(415);
    expect(txt.body.error.message).toMatch(/not a recognised file type/);
    const empty = await qm.post(`/api/standards/${other.id}/certificate`).attach('file', Buffer.alloc(0), 'empty.pdf').expect(400);
    expect(empty.body.error.message).toMatch(/empty/);
    const none = await qm.post(`/api/standards/${other.id}/certificate`).field('note', 'no file').expect(400);
    expect(none.body.error.message).toMatch(/No file was sent in the form field "file"/);
    expect(storedFiles()).toEqual(filesBefore);
    const after = standardDetailSchema.parse((await qm.get(`/api/standards/${other.id}`).expect(200)).body.standard);
    expect(after.certificateFile).toBeNull();
    const [{ n: auditAfter }] = await t.database.query<{ n: number }>('select count(*)::int as n from audit_log');
    expect(auditAfter).toBe(auditBefore + 1); // only the create
  });

  it('when the upload is over the size limit, then 413 with a clear message, nothing is stored and the earlier file is kept', async () => {
    const filesBefore = storedFiles();
    const big = Buffer.concat([tinyPdf(), Buffer.alloc(10 * 1024 * 1024, 0x20)]);
    const res = await qm.post(`/api/standards/${created}/certificate`).attach('file', big, 'big.pdf').expect(413);
    expect(res.body.error).toMatchObject({ code: 'FILE_TOO_LARGE' });
    expect(res.body.error.message).toMatch(/larger than the limit of 10 MB\. Nothing was stored\./);
    expect(storedFiles()).toEqual(filesBefore);
    const s = standardDetailSchema.parse((await qm.get(`/api/standards/${created}`).expect(200)).body.standard);
    expect(s.certificateFile?.name).toBe('TB-1 certificate.pdf');
  });

  it('when the stored file was changed on disk, then the download refuses it (409) instead of serving other bytes', async () => {
    const s = standardDetailSchema.parse((await qm.get(`/api/standards/${created}`).expect(200)).body.standard);
    const p = path.join(filesDir(), s.certificateFile!.sha256);
    const good = fs.readFileSync(p);
    fs.writeFileSync(p, Buffer.from('%PDF-1.4 tampered'));
    try {
      const res = await analyst.get(`/api/standards/${created}/certificate`).expect(409);
      expect(res.body.error.code).toBe('FILE_INTEGRITY');
    } finally {
      fs.writeFileSync(p, good);
    }
  });

  it('when the clock passes the due date, then the standard is flagged overdue; getStandardForBudget reports values and due date', async () => {
    const standard = standardDetailSchema.parse((await qm.post('/api/standards').send(input({ name: 'Due in a week', serialNumber: 'W-1', dueDate: '2026-06-22' })).expect(201)).body.standard);
    expect(standard).toMatchObject({ due: 'due_soon', daysToDue: 7 });
    now = new Date('2026-06-23T00:30:00Z');
    try {
      const later = standardDetailSchema.parse((await analyst.get(`/api/standards/${standard.id}`).expect(200)).body.standard);
      expect(later).toMatchObject({ due: 'overdue', daysToDue: -1 });
      const forBudget = await getStandardForBudget(t.database.db, standard.id, now);
      expect(forBudget).toMatchObject({ dueDate: '2026-06-22', due: 'overdue', status: 'in_service', certificateNumber: 'CERT-TEST-1' });
      expect(forBudget!.values.map((v) => [v.value, v.expandedUncertainty, v.coverageFactor, v.standardUncertainty])).toEqual([
        [0.998, 0.002, 2, 0.001],
        [0.1, 0.3, 2, 0.15],
      ]);
      expect(await getStandardForBudget(t.database.db, '00000000-0000-4000-8000-000000000000', now)).toBeNull();
    } finally {
      now = NOW;
    }
  });

  it('dueState: due day itself is due soon, the day after overdue, 31 days out is ok', () => {
    expect(dueState('2026-06-15', '2026-06-15')).toEqual({ due: 'due_soon', daysToDue: 0 });
    expect(dueState('2026-06-14', '2026-06-15')).toEqual({ due: 'overdue', daysToDue: -1 });
    expect(dueState('2026-07-15', '2026-06-15')).toEqual({ due: 'due_soon', daysToDue: 30 });
    expect(dueState('2026-07-16', '2026-06-15')).toEqual({ due: 'ok', daysToDue: 31 });
  });

  it('the audit chain over all of this verifies', async () => {
    expect((await verifyAuditChain(t.database.db)).ok).toBe(true);
  });
});
