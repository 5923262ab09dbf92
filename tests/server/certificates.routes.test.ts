/**
 * Issued certificates: the signed PDF as poppler-utils reads it, the frozen record (database
 * trigger), downloads of the same bytes, and amendments (ISO/IEC 17025:2017 §7.8.8: a new,
 * uniquely numbered certificate that names the one it replaces and why; the old one superseded,
 * never deleted).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { DEMO_PASSWORD } from '../../server/db/seed';
import { sha256Hex } from '../../server/signing';
import { jobListSchema, jobViewSchema } from '../../shared/schemas/jobs.schema';
import { createTestApp, type TestApp } from '../setup/test-app';
import { approve, submittedJob } from './certificates-helpers';
import { fonts, pageTexts, pdfsig, tempDir, writeTemp } from './pdf/poppler';

let t: TestApp;
let cert: { id: string; number: string; pdfSha256: string; jobId: string; jobNumber: string };
let pdf: Buffer;
let path: string;

const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

beforeAll(async () => {
  t = await createTestApp();
  const { jobId } = await submittedJob(t);
  cert = await approve(t, jobId);
  const qm = await t.signIn('quality_manager');
  const res = await qm.get(`/api/certificates/${cert.id}/pdf`).buffer(true).parse(binary).expect(200);
  expect(res.headers['content-type']).toBe('application/pdf');
  pdf = res.body as Buffer;
  path = writeTemp(tempDir(), `${cert.number}.pdf`, pdf);
}, 180_000);
afterAll(() => t?.close());

describe('the issued PDF (poppler-utils)', () => {
  it('pdfsig: the PKCS#7 signature is valid', () => {
    expect(pdfsig(path)).toContain('Signature is Valid.');
  });

  it('pdffonts: every font is embedded', () => {
    const list = fonts(path);
    expect(list.length).toBeGreaterThan(0);
    expect(list.filter((f) => !f.embedded)).toEqual([]);
  });

  it('pdftotext: λ, ±, °C and "k =" are there, and the certificate number is on every page (ISO/IEC 17025:2017 §7.8.2.1 d)', () => {
    const pages = pageTexts(path);
    const all = pages.join('\n');
    for (const s of ['λ', '±', '°C', 'k =']) expect(all).toContain(s);
    expect(pages.length).toBeGreaterThan(1);
    pages.forEach((p) => expect(p).toContain(cert.number));
    expect(all).toContain('Brightwater Glassworks Ltd (demo)');
    expect(all).toContain('Sam Signatory (demo)');
  });

  it('the stored SHA-256 is the hash of the downloaded bytes', () => {
    expect(sha256Hex(pdf)).toBe(cert.pdfSha256);
  });

  it('each download is audited', async () => {
    const rows = await t.database.query<{ n: number }>("select count(*)::int as n from audit_log where entity = 'certificate' and action = 'download' and entity_id = $1", [cert.id]);
    expect(rows[0].n).toBeGreaterThanOrEqual(1);
  });
});

describe('the issued record is frozen (database trigger)', () => {
  it('refuses changing the number, the data, the PDF or its hash, and deleting the row', async () => {
    await expect(t.database.query("update certificates set number = 'X-1' where id = $1", [cert.id])).rejects.toThrow(/frozen/);
    await expect(t.database.query("update certificates set pdf_sha256 = 'abc' where id = $1", [cert.id])).rejects.toThrow(/frozen/);
    await expect(t.database.query("update certificates set data = '{}'::jsonb where id = $1", [cert.id])).rejects.toThrow(/frozen/);
    await expect(t.database.query("update certificates set pdf = '\\x00'::bytea where id = $1", [cert.id])).rejects.toThrow(/frozen/);
    await expect(t.database.query('update certificates set issued_at = now() where id = $1', [cert.id])).rejects.toThrow(/frozen/);
    await expect(t.database.query('delete from certificates where id = $1', [cert.id])).rejects.toThrow(/never deleted/);
    await expect(t.database.query('truncate certificates cascade')).rejects.toThrow(/never deleted/);
  });
});

describe('staff access', () => {
  it('lists certificates for signatories, quality managers and admins only', async () => {
    const s = await t.signIn('signatory');
    const list = await s.get('/api/certificates').expect(200);
    expect(list.body.certificates.map((c: { number: string }) => c.number)).toContain(cert.number);
    const detail = await s.get(`/api/certificates/${cert.id}`).expect(200);
    expect(detail.body.data.certificateNumber).toBe(cert.number);
    await (await t.signIn('analyst')).get('/api/certificates').expect(403);
    await (await t.signIn('customer')).get('/api/certificates').expect(403);
    await request(t.app).get('/api/certificates').expect(401);
    await s.get('/api/certificates/00000000-0000-4000-8000-000000000000').expect(404);
  });
});

describe('amendment (ISO/IEC 17025:2017 §7.8.8)', () => {
  it('when an amendment is opened, then the new draft job names the certificate it amends, the job it came from and the reason, and the original job names the draft', async () => {
    const { jobId: originalJobId } = await submittedJob(t);
    const issued = await approve(t, originalJobId);
    const reason = 'The calibration date was entered one day late.';
    const qm = await t.signIn('quality_manager');
    const before = (await qm.get(`/api/jobs/${originalJobId}`).expect(200)).body.job;
    expect(before.amendedBy).toBeNull();
    const originalJob = { jobId: originalJobId, jobNumber: before.number as string };
    const opened = await qm.post(`/api/certificates/${issued.id}/amend`).send({ reason }).expect(201);
    const newJobId = opened.body.jobId as string;

    // The analyst's job page and jobs list say which certificate the draft amends, the job it was
    // issued from (for a link back), and why.
    const analyst = await t.signIn('analyst');
    const page = await analyst.get(`/api/jobs/${newJobId}`).expect(200);
    expect(page.body.job.status).toBe('draft');
    expect(page.body.job.amends).toEqual({ certificateNumber: issued.number, reason, status: 'open', newCertificateNumber: null, ...originalJob });
    expect(jobViewSchema.safeParse(page.body.job).success).toBe(true);
    const list = await analyst.get('/api/jobs').query({ q: issued.number }).expect(200);
    expect(list.body.jobs.map((j: { id: string }) => j.id)).toEqual([newJobId]);
    expect(list.body.jobs[0].amends).toEqual({ certificateNumber: issued.number, reason, status: 'open', newCertificateNumber: null, ...originalJob });
    expect(list.body.jobs[0].amendedBy).toBeNull();
    // In the list, the original job names the draft that amends its certificate, as its page does.
    const listed = async () => {
      const all = await analyst.get('/api/jobs').query({ pageSize: 100 }).expect(200);
      expect(jobListSchema.safeParse(all.body).success).toBe(true);
      return all.body.jobs.find((j: { id: string }) => j.id === originalJobId);
    };
    const original = await listed();
    expect(original.amends).toBeNull();
    expect(original.amendedBy).toEqual({ certificateNumber: issued.number, reason, status: 'open', newCertificateNumber: null, jobId: newJobId, jobNumber: opened.body.jobNumber, jobStatus: 'draft' });
    expect((await analyst.get(`/api/jobs/${originalJobId}`).expect(200)).body.job.amends).toBeNull();
    // Readers of the job (quality manager) see the same.
    expect((await qm.get(`/api/jobs/${newJobId}`).expect(200)).body.job.amends.certificateNumber).toBe(issued.number);

    // The original job's page names the draft that amends its certificate, and the draft's status.
    const amendedBy = async (status: 'open' | 'issued', jobStatus: string, newCertificateNumber: string | null) => {
      const body = (await analyst.get(`/api/jobs/${originalJobId}`).expect(200)).body;
      expect(jobViewSchema.safeParse(body.job).success).toBe(true);
      expect(body.job.amendedBy).toEqual({ certificateNumber: issued.number, reason, status, newCertificateNumber, jobId: newJobId, jobNumber: opened.body.jobNumber, jobStatus });
    };
    await amendedBy('open', 'draft', null);
    expect(page.body.job.amendedBy).toBeNull();

    // Once approved, the job names the certificate that replaced the amended one.
    await analyst.post(`/api/jobs/${newJobId}/submit`).expect(200);
    await amendedBy('open', 'submitted', null);
    const next = await approve(t, newJobId);
    const after = await analyst.get(`/api/jobs/${newJobId}`).expect(200);
    expect(after.body.job.amends).toEqual({ certificateNumber: issued.number, reason, status: 'issued', newCertificateNumber: next.number, ...originalJob });
    await amendedBy('issued', 'issued', next.number);
    expect(after.body.job.amendedBy).toBeNull();
    expect((await listed()).amendedBy).toEqual({ certificateNumber: issued.number, reason, status: 'issued', newCertificateNumber: next.number, jobId: newJobId, jobNumber: opened.body.jobNumber, jobStatus: 'issued' });
  }, 120_000);

  it('when an amendment is opened, reviewed and approved, then the new certificate names the old one and why, and the old one is superseded but still verifies', async () => {
    const qm = await t.signIn('quality_manager');
    await qm.post(`/api/certificates/${cert.id}/amend`).send({ reason: '' }).expect(400);
    const opened = await qm.post(`/api/certificates/${cert.id}/amend`).send({ reason: 'The serial number of the item was misprinted.' }).expect(201);
    await qm.post(`/api/certificates/${cert.id}/amend`).send({ reason: 'A second amendment at once' }).expect(409);
    const newJobId = opened.body.jobId as string;

    // The new revision is a draft of the same analyst: submit it again like any job.
    const analyst = await t.signIn('analyst');
    await analyst.post(`/api/jobs/${newJobId}/submit`).expect(200);
    const signatory = await t.signIn('signatory');
    const page = await signatory.get(`/api/review/jobs/${newJobId}`).expect(200);
    expect(page.body.amends).toEqual({ certificateNumber: cert.number, reason: 'The serial number of the item was misprinted.', jobId: cert.jobId, jobNumber: cert.jobNumber });
    expect(page.body.preview.amends.certificateNumber).toBe(cert.number);

    const res = await signatory.post(`/api/review/jobs/${newJobId}/approve`).send({ password: DEMO_PASSWORD }).expect(201);
    const next = res.body.certificate;
    expect(next.number).not.toBe(cert.number);
    expect(next.amends).toBe(cert.number);
    expect(next.amendReason).toBe('The serial number of the item was misprinted.');

    const old = await signatory.get(`/api/certificates/${cert.id}`).expect(200);
    expect(old.body.certificate.status).toBe('superseded');
    expect(old.body.certificate.supersededBy).toBe(next.number);

    const verified = await request(t.app).post('/api/verify/file').set('Content-Type', 'application/pdf').send(pdf).expect(200);
    expect(verified.body.authentic).toBe(true);
    expect(verified.body.certificate.status).toBe('superseded');
    expect(verified.body.certificate.supersededBy).toBe(next.number);

    // Superseded is final: no second amendment, no withdrawal.
    await qm.post(`/api/certificates/${cert.id}/amend`).send({ reason: 'Another change of mind' }).expect(409);
    await qm.post(`/api/certificates/${cert.id}/withdraw`).send({ reason: 'Another change of mind' }).expect(409);
    await expect(t.database.query("update certificates set status = 'current', superseded_by_id = null where id = $1", [cert.id])).rejects.toThrow(/final/);
  }, 120_000);
});
