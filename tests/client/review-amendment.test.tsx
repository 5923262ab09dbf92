/**
 * The signatory's review of an amendment (ISO/IEC 17025:2017 §7.8.8) says, as the analyst's job
 * page does, which certificate it amends, the job that certificate was issued from (a link to
 * it) and why; the review of an ordinary job says nothing of the kind. Numbers and names invented.
 */
import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { json, meFor, mockFetch, renderApp } from './render-app';

const reason = 'The item’s serial number was printed without its suffix; corrected.';

const review = (amends: unknown) => ({
  job: { id: 'j1', number: 'EMB-2026-0012', status: 'submitted', customer: 'Brightwater Glassworks Ltd (demo)', itemLabel: 'Handheld infrared thermometer, s/n HT-0042', analyst: 'Ada Demo', analystId: 'u2', submittedAt: '2026-11-25T09:00:00.000Z', reviewComment: null, rejectedAt: null },
  template: { name: 'Infrared thermometer (demo)', version: 1 },
  points: [],
  checks: { reasons: [], notes: [] },
  preview: null,
  blocking: [],
  amends,
  settings: { forbidSelfApproval: true },
});

function open(amends: unknown) {
  mockFetch({
    'GET /api/me': () => json(200, meFor('signatory')),
    'GET /api/review/jobs/j1': () => json(200, review(amends)),
  });
  renderApp('/app/review/j1');
  return screen.findByRole('heading', { level: 1, name: 'Review of job EMB-2026-0012' });
}

describe('review page of an amendment', () => {
  it('names the certificate amended and links to the job it was issued from, as the job page does', async () => {
    await open({ certificateNumber: 'EMB-C-2026-0007', reason, jobId: 'j0', jobNumber: 'EMB-2026-0008' });
    const notice = screen.getByText('Amendment of certificate EMB-C-2026-0007').parentElement!;
    expect(notice.textContent).toContain(`Certificate EMB-C-2026-0007 was issued from job EMB-2026-0008. Reason: ${reason.replace(/\.$/, '')}. When approved, the new certificate replaces EMB-C-2026-0007, which is then marked superseded.`);
    const link = screen.getByRole('link', { name: 'EMB-2026-0008' });
    expect(link.getAttribute('href')).toBe('/app/jobs/j0');
    expect(notice.contains(link)).toBe(true);
  });

  it('an ordinary job has no amendment notice and no link to another job', async () => {
    await open(null);
    expect(screen.queryByText(/Amendment of certificate/)).toBeNull();
    expect(screen.queryByRole('link', { name: /^EMB-\d{4}-\d{4}$/ })).toBeNull();
  });
});
