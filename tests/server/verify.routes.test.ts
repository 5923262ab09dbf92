/**
 * Public verification (no sign-in): a PDF is authentic when the SHA-256 of its exact bytes
 * matches an issued certificate (FIPS 180-4 hash; one changed byte changes it); a number lookup
 * gives the certificate's header and status only (common practice, no source).
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../setup/test-app';
import { approve, submittedJob } from './certificates-helpers';

let t: TestApp;
let cert: { id: string; number: string };
let pdf: Buffer;

beforeAll(async () => {
  t = await createTestApp();
  const { jobId } = await submittedJob(t);
  cert = await approve(t, jobId);
  const rows = await t.database.query<{ pdf: Uint8Array }>('select pdf from certificates where id = $1', [cert.id]);
  pdf = Buffer.from(rows[0].pdf);
}, 180_000);
afterAll(() => t?.close());

const post = (bytes: Buffer) => request(t.app).post('/api/verify/file').set('Content-Type', 'application/pdf').send(bytes);

describe('verify a PDF', () => {
  it('when the issued PDF is sent, then it is authentic, current, with the header only', async () => {
    const res = await post(pdf).expect(200);
    expect(res.body.authentic).toBe(true);
    expect(res.body.certificate).toEqual({
      number: cert.number,
      issueDate: expect.stringMatching(/^\d{4}-\d{2}-\d{2}$/),
      lab: 'Kestrel Vale Radiometry Laboratory (demo)',
      customer: 'Brightwater Glassworks Ltd (demo)',
      status: 'current',
      supersededBy: null,
      withdrawnOn: null,
    });
  });

  it('when one byte of the PDF is changed, then it is not authentic', async () => {
    const copy = Buffer.from(pdf);
    const at = Math.floor(copy.length / 2);
    copy[at] = copy[at] ^ 0x01;
    const res = await post(copy).expect(200);
    expect(res.body.authentic).toBe(false);
    expect(res.body.certificate).toBeNull();
  });

  it('when the body is empty or not a PDF, then 400 with a message saying so', async () => {
    const empty = await request(t.app).post('/api/verify/file').set('Content-Type', 'application/pdf').expect(400);
    expect(empty.body.error.message).toMatch(/No file/);
    const text = await post(Buffer.from('hello, not a pdf')).expect(400);
    expect(text.body.error.message).toMatch(/not a PDF/);
  });

  it('when the file is larger than the limit, then 413 naming the limit', async () => {
    const big = Buffer.concat([Buffer.from('%PDF-'), Buffer.alloc(10 * 1024 * 1024 + 10)]);
    const res = await post(big).expect(413);
    expect(res.body.error.message).toMatch(/10 MB/);
  });
});

describe('verify a number', () => {
  it('when the number is issued, then its header and status; otherwise not found', async () => {
    const res = await request(t.app).get(`/api/verify/number/${cert.number.toLowerCase()}`).expect(200);
    expect(res.body.found).toBe(true);
    expect(res.body.certificate.number).toBe(cert.number);
    expect(Object.keys(res.body.certificate).sort()).toEqual(['customer', 'issueDate', 'lab', 'number', 'status', 'supersededBy', 'withdrawnOn']);
    const none = await request(t.app).get('/api/verify/number/EMB-C-1999-9999').expect(200);
    expect(none.body).toEqual({ found: false, certificate: null });
    await request(t.app).get('/api/verify/number/%3Cscript%3E').expect(400);
  });

  it('when a certificate is withdrawn, then the check says so', async () => {
    const { jobId } = await submittedJob(t);
    const other = await approve(t, jobId);
    const qm = await t.signIn('quality_manager');
    await qm.post(`/api/certificates/${other.id}/withdraw`).send({ reason: 'Issued for the wrong item.' }).expect(200);
    const res = await request(t.app).get(`/api/verify/number/${other.number}`).expect(200);
    expect(res.body.certificate.status).toBe('withdrawn');
    expect(res.body.certificate.withdrawnOn).toMatch(/^\d{4}-\d{2}-\d{2}$/);
  }, 120_000);
});

describe('rate limit', () => {
  it('when one address checks too often, then 429 with a message', async () => {
    let last = 200;
    for (let i = 0; i < 40 && last !== 429; i++) last = (await request(t.app).get('/api/verify/number/EMB-C-1999-0001')).status;
    expect(last).toBe(429);
  });
});
