/**
 * Cross-customer access (issue 8): a customer user who asks, by id, for another organisation's
 * certificate, job, PDF, e-mail, point, upload, customer record or item gets 404 (or 403 where the
 * route is not for customers at all), never the data. Every route with an id parameter is tried
 * with every id of the other organisation's records (found by walking the router, so a new route
 * is covered without being listed here), and no answer may carry that organisation's name,
 * certificate number or job number.
 * Sources: OWASP ASVS 4.0 V4.2.1 (protection against insecure direct object references), V4.1.3
 * (least privilege); answering 404 rather than 403 for another tenant's record is common practice,
 * no source (it does not confirm that the record exists).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../../setup/test-app';
import { approve, submittedJob } from '../certificates-helpers';
import { listRoutes } from './routes';

const FOREIGN_ORG = 'Oakhollow Food Processing (demo)';
let t: TestApp;
let own: { certificateId: string; number: string; jobId: string };
let foreign: { certificateId: string; number: string; jobId: string; jobNumber: string; customerId: string; ids: string[] };

beforeAll(async () => {
  t = await createTestApp();
  const a = await submittedJob(t);
  const ownCert = await approve(t, a.jobId);
  own = { certificateId: ownCert.id, number: ownCert.number, jobId: a.jobId };
  const b = await submittedJob(t, { organisation: FOREIGN_ORG });
  const cert = await approve(t, b.jobId);
  const [c] = await t.database.query<{ id: string }>('select id from customers where organisation = $1', [FOREIGN_ORG]);
  const q = async (sql: string, params: unknown[]) => (await t.database.query<{ id: string }>(sql, params)).map((r) => String(r.id));
  const ids = [
    cert.id,
    b.jobId,
    c.id,
    ...(await q('select id from calibration_points where job_id = $1', [b.jobId])),
    ...(await q('select id from customer_items where customer_id = $1', [c.id])),
    ...(await q('select outbox_id as id from certificate_mails where certificate_id = $1', [cert.id])),
    ...(await q('select id from certificate_mails where certificate_id = $1', [cert.id])),
    ...(await q('select r.id from readings r join calibration_points p on p.id = r.point_id where p.job_id = $1', [b.jobId])),
  ];
  foreign = { certificateId: cert.id, number: cert.number, jobId: b.jobId, jobNumber: b.number, customerId: c.id, ids: [...new Set(ids)] };
}, 240_000);
afterAll(() => t?.close());

describe('a customer user and another organisation’s records', () => {
  it('sees the own organisation’s certificate (control)', async () => {
    const customer = await t.signIn('customer');
    const res = await customer.get(`/api/portal/certificates/${own.certificateId}`).expect(200);
    expect(JSON.stringify(res.body)).toContain(own.number);
    await customer.get(`/api/portal/certificates/${own.certificateId}/pdf`).expect(200);
  });

  it('does not see the other organisation in any list', async () => {
    const customer = await t.signIn('customer');
    const lists = listRoutes(t.app).filter((r) => r.method === 'GET' && r.path.startsWith('/api/') && !r.path.includes(':') && !r.path.startsWith('/api/auth'));
    for (const r of lists) {
      const res = await customer.get(r.path);
      const text = res.text ?? '';
      expect(text, r.path).not.toContain(foreign.number);
      expect(text, r.path).not.toContain(foreign.jobNumber);
      expect(text, r.path).not.toContain(FOREIGN_ORG);
      expect(text, r.path).not.toContain(foreign.certificateId);
    }
  });

  it('gets 404 or 403 — never the data — for every route asked with the other organisation’s ids', async () => {
    expect(foreign.ids.length).toBeGreaterThanOrEqual(4);
    const customer = await t.signIn('customer');
    const routes = listRoutes(t.app).filter((r) => r.path.startsWith('/api/') && /:(id|jobId)\b/.test(r.path));
    expect(routes.some((r) => r.path === '/api/portal/certificates/:id/pdf')).toBe(true);
    const tried: string[] = [];
    for (const r of routes) {
      for (const id of foreign.ids) {
        const url = r.path.replace(/:(id|jobId)\b/, id).replace(/:(\w+)/g, (_m, name: string) => (name === 'index' ? '0' : name === 'symbol' ? 'T_ind' : '00000000-0000-4000-8000-000000000000'));
        const method = r.method === 'ALL' ? 'get' : (r.method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete');
        const res = await customer[method](url).send(method === 'get' || method === 'delete' ? undefined : {});
        const label = `${r.method} ${url}`;
        tried.push(label);
        // 404 (not found for this user), 403 (not a customer route), 400/422 (refused before any lookup).
        expect([400, 403, 404, 422], `${label} answered ${res.status}`).toContain(res.status);
        const text = res.text ?? '';
        expect(text, label).not.toContain(foreign.number);
        expect(text, label).not.toContain(foreign.jobNumber);
        expect(text, label).not.toContain(FOREIGN_ORG);
        if (res.status === 400 || res.status === 422) expect(r.path.startsWith('/api/portal'), `${label}: a portal route must answer 404`).toBe(false);
      }
    }
    // The portal's own routes answer 404 for the other organisation's certificate and job.
    await customer.get(`/api/portal/certificates/${foreign.certificateId}`).expect(404);
    await customer.get(`/api/portal/certificates/${foreign.certificateId}/pdf`).expect(404);
    await customer.get(`/api/portal/jobs/${foreign.jobId}`).expect(404);
    expect(tried.length).toBeGreaterThan(20);
  });
});
