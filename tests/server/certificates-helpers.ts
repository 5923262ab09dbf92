/** Shared set-up of the certificate tests: an invented submitted job, and its approval. */
import { expect } from 'vitest';
import { insertDemoJob } from '../../server/modules/certificates/demo-job';
import { DEMO_PASSWORD } from '../../server/db/seed';
import type { TestApp } from '../setup/test-app';

export async function submittedJob(t: TestApp, opts: { analystEmail?: string; organisation?: string } = {}) {
  return insertDemoJob(t.database.db, { status: 'submitted', now: t.deps.clock(), trials: 20_000, ...opts });
}

/** The demo signatory approves the job with the right password; returns the issued certificate row. */
export async function approve(t: TestApp, jobId: string) {
  const signatory = await t.signIn('signatory');
  const res = await signatory.post(`/api/review/jobs/${jobId}/approve`).send({ password: DEMO_PASSWORD });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.certificate as { id: string; number: string; pdfSha256: string; status: string; jobId: string; jobNumber: string };
}
