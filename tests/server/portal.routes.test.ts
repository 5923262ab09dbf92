/**
 * The customer portal: a customer user sees only their own organisation's certificates; another
 * organisation's certificate, PDF or job answers 404 as if it did not exist (common practice, no
 * source: not revealing that an id exists).
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sha256Hex } from '../../server/signing';
import { createTestApp, type TestApp } from '../setup/test-app';
import { approve, submittedJob } from './certificates-helpers';

let t: TestApp;
let own: { id: string; number: string; pdfSha256: string };
let ownJob: string;
let foreign: { id: string; number: string };
let foreignJob: string;

const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};

beforeAll(async () => {
  t = await createTestApp();
  ownJob = (await submittedJob(t)).jobId;
  own = await approve(t, ownJob);
  foreignJob = (await submittedJob(t, { organisation: 'Oakhollow Food Processing (demo)' })).jobId;
  foreign = await approve(t, foreignJob);
}, 240_000);
afterAll(() => t?.close());

describe('customer portal', () => {
  it('lists only the organisation’s own certificates, with their status', async () => {
    const customer = await t.signIn('customer');
    const res = await customer.get('/api/portal/certificates').expect(200);
    const numbers = res.body.certificates.map((c: { number: string }) => c.number);
    expect(numbers).toContain(own.number);
    expect(numbers).not.toContain(foreign.number);
    expect(res.body.certificates.find((c: { number: string }) => c.number === own.number).status).toBe('current');
  });

  it('downloads the same bytes as issued', async () => {
    const customer = await t.signIn('customer');
    const res = await customer.get(`/api/portal/certificates/${own.id}/pdf`).buffer(true).parse(binary).expect(200);
    expect(sha256Hex(res.body as Buffer)).toBe(own.pdfSha256);
    const audit = await t.database.query<{ actor_role: string }>("select actor_role from audit_log where entity = 'certificate' and action = 'download' and entity_id = $1", [own.id]);
    expect(audit.map((a) => a.actor_role)).toContain('customer');
  });

  it('answers 404 for another organisation’s certificate, its PDF and its job', async () => {
    const customer = await t.signIn('customer');
    await customer.get(`/api/portal/certificates/${foreign.id}`).expect(404);
    await customer.get(`/api/portal/certificates/${foreign.id}/pdf`).expect(404);
    await customer.get(`/api/portal/jobs/${foreignJob}`).expect(404);
    await customer.get(`/api/portal/jobs/${ownJob}`).expect(200);
    await customer.get('/api/portal/certificates/not-an-id').expect(404);
    // The lab's own routes stay closed to customers.
    await customer.get(`/api/jobs/${foreignJob}`).expect(403);
    await customer.get(`/api/certificates/${foreign.id}/pdf`).expect(403);
  });

  it('is closed to staff and to anyone not signed in', async () => {
    await request(t.app).get('/api/portal/certificates').expect(401);
    await (await t.signIn('signatory')).get('/api/portal/certificates').expect(403);
  });
});
