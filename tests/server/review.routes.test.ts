/**
 * Review and approval: the queue of submitted jobs, the review page with the certificate preview,
 * rejection with a comment, approval as an electronic signature (the password again) and the rule
 * that the job's own analyst does not approve it (ISO/IEC 17025:2017 §7.8.1.1 review and
 * authorisation before release; the separation of preparing and approving is common practice,
 * no source).
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../server/db/seed';
import { reviewDetailSchema } from '../../shared/schemas/certificates-api.schema';
import { createTestApp, type TestApp } from '../setup/test-app';
import { approve, submittedJob } from './certificates-helpers';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
}, 120_000);
afterAll(() => t?.close());

describe('review queue and page', () => {
  it('when a job is submitted, then the signatory finds it in the queue and its review page shows the certificate preview', async () => {
    const { jobId, number } = await submittedJob(t);
    const signatory = await t.signIn('signatory');
    const queue = await signatory.get('/api/review/queue').expect(200);
    expect(queue.body.jobs.map((j: { jobNumber: string }) => j.jobNumber)).toContain(number);
    const page = await signatory.get(`/api/review/jobs/${jobId}`).expect(200);
    expect(page.body.blocking).toEqual([]);
    expect(page.body.preview.results).toHaveLength(2);
    expect(page.body.preview.results[0].nominal.label).toBe('50 °C');
    expect(page.body.preview.traceability.standards.length).toBe(2);
    expect(page.body.preview.signatory.name).toBe('Sam Signatory (demo)');
  });

  it('when the job is an amendment, then the page names the certificate it amends, why, and the job that certificate was issued from (ISO/IEC 17025:2017 §7.8.8)', async () => {
    const { jobId: originalId, number: originalNumber } = await submittedJob(t);
    const cert = await approve(t, originalId);
    const reason = 'The serial number of the item was misprinted.';
    const qm = await t.signIn('quality_manager');
    const opened = await qm.post(`/api/certificates/${cert.id}/amend`).send({ reason }).expect(201);
    const revisionId = opened.body.jobId as string;
    await (await t.signIn('analyst')).post(`/api/jobs/${revisionId}/submit`).expect(200);

    const page = await (await t.signIn('signatory')).get(`/api/review/jobs/${revisionId}`).expect(200);
    expect(reviewDetailSchema.safeParse(page.body).success).toBe(true);
    expect(page.body.amends).toEqual({ certificateNumber: cert.number, reason, jobId: originalId, jobNumber: originalNumber });
    // The quality manager reads the same page; the original job's own review names no amendment.
    expect((await qm.get(`/api/review/jobs/${revisionId}`).expect(200)).body.amends.jobId).toBe(originalId);
    expect((await qm.get(`/api/review/jobs/${originalId}`).expect(200)).body.amends).toBeNull();
  }, 120_000);

  it('when not signed in or an analyst, then 401 and 403', async () => {
    await request(t.app).get('/api/review/queue').expect(401);
    const analyst = await t.signIn('analyst');
    await analyst.get('/api/review/queue').expect(403);
  });

  it('when the job does not exist, then 404', async () => {
    const signatory = await t.signIn('signatory');
    await signatory.get('/api/review/jobs/00000000-0000-4000-8000-000000000000').expect(404);
    await signatory.get('/api/review/jobs/not-a-job').expect(404);
  });
});

describe('reject', () => {
  it('when the signatory rejects with a comment, then the job is a draft again and keeps the comment for the analyst', async () => {
    const { jobId } = await submittedJob(t);
    const signatory = await t.signIn('signatory');
    await signatory.post(`/api/review/jobs/${jobId}/reject`).send({ comment: '' }).expect(400);
    await signatory.post(`/api/review/jobs/${jobId}/reject`).send({ comment: 'Point 2: the readings file is from the wrong day.' }).expect(200);
    const analyst = await t.signIn('analyst');
    const job = await analyst.get(`/api/jobs/${jobId}`).expect(200);
    expect(job.body.job.status).toBe('draft');
    expect(job.body.job.reviewComment).toBe('Point 2: the readings file is from the wrong day.');
    await signatory.post(`/api/review/jobs/${jobId}/reject`).send({ comment: 'again' }).expect(409);
  });
});

describe('approve', () => {
  it('when the password is wrong, then approval is refused and nothing is issued', async () => {
    const { jobId } = await submittedJob(t);
    const signatory = await t.signIn('signatory');
    const res = await signatory.post(`/api/review/jobs/${jobId}/approve`).send({ password: 'not-my-password' }).expect(403);
    expect(res.body.error.code).toBe('PASSWORD_REJECTED');
    await signatory.post(`/api/review/jobs/${jobId}/approve`).send({}).expect(400);
    const page = await signatory.get(`/api/review/jobs/${jobId}`).expect(200);
    expect(page.body.job.status).toBe('submitted');
    const rows = await t.database.query('select count(*)::int as n from certificates where job_id = $1', [jobId]);
    expect(rows[0].n).toBe(0);
  });

  it('when the signatory is the job’s own analyst, then approval is refused while the lab setting is on (default)', async () => {
    const { jobId } = await submittedJob(t, { analystEmail: 'signatory@emberline-demo.test' });
    const signatory = await t.signIn('signatory');
    const page = await signatory.get(`/api/review/jobs/${jobId}`).expect(200);
    expect(page.body.blocking.map((b: { code: string }) => b.code)).toContain('OWN_JOB');
    const res = await signatory.post(`/api/review/jobs/${jobId}/approve`).send({ password: DEMO_PASSWORD }).expect(403);
    expect(res.body.error.message).toMatch(/another authorised signatory/);
  });

  it('when an analyst tries to approve, then 403', async () => {
    const { jobId } = await submittedJob(t);
    const analyst = await t.signIn('analyst');
    await analyst.post(`/api/review/jobs/${jobId}/approve`).send({ password: DEMO_PASSWORD }).expect(403);
  });

  it('when the password is right, then the certificate is issued, numbered from the sequence, and the job is issued', async () => {
    const { jobId } = await submittedJob(t);
    const cert = await approve(t, jobId);
    expect(cert.number).toMatch(/^EMB-C-\d{4}-\d{4}$/);
    expect(cert.status).toBe('current');
    const signatory = await t.signIn('signatory');
    const page = await signatory.get(`/api/review/jobs/${jobId}`).expect(200);
    expect(page.body.job.status).toBe('issued');
    await signatory.post(`/api/review/jobs/${jobId}/approve`).send({ password: DEMO_PASSWORD }).expect(409);
    const audit = await t.database.query<{ action: string; entity: string }>("select action, entity from audit_log where entity_id = $1 or entity_id = $2 order by seq", [jobId, cert.id]);
    expect(audit.map((a) => `${a.entity}:${a.action}`)).toEqual(expect.arrayContaining(['job:approve', 'job:issue', 'certificate:issue', 'certificate:queue_email']));
  }, 60_000);
});
