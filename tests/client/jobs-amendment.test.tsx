/**
 * What the analyst sees of an amendment (ISO/IEC 17025:2017 §7.8.8): the draft revision says, on
 * its page and in the jobs list, which certificate it amends and why, and that the approved result
 * replaces that certificate. An ordinary job says nothing of the kind.
 */
import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { json, meFor, mockFetch, renderApp } from './render-app';

const reason = 'The item’s serial number was printed without its suffix; corrected.';
const amends = { certificateNumber: 'EMB-C-2026-0007', reason, status: 'open' as const, newCertificateNumber: null };

const listRow = (over: Record<string, unknown>) => ({
  id: 'j1', number: 'EMB-2026-0012', status: 'draft', itemLabel: 'Handheld infrared thermometer, s/n HT-0042', calibratedOn: '2026-11-20', receivedOn: '2026-11-18',
  updatedAt: '2026-11-25T09:00:00.000Z', customerId: 'c1', templateVersionId: 't1', customer: 'Brightwater Glassworks Ltd (demo)', analyst: 'Ada Demo', points: 2, amends: null, ...over,
});

const job = (over: Record<string, unknown>) => ({
  id: 'j1', number: 'EMB-2026-0012', status: 'draft', customerId: 'c1', customer: 'Brightwater Glassworks Ltd (demo)', itemId: 'i1', itemLabel: 'Handheld infrared thermometer, s/n HT-0042',
  templateVersionId: 't1', receivedOn: null, calibratedOn: null, location: '', environment: {}, reviewComment: null, rejectedAt: null, submittedAt: null,
  analystId: 'u1', analyst: 'Ada Demo', createdAt: '2026-11-25T09:00:00.000Z', updatedAt: '2026-11-25T09:00:00.000Z', amends: null, ...over,
});

const detail = (jobOver: Record<string, unknown>) => ({
  job: job(jobOver),
  template: { id: 't1', name: 'Infrared thermometer (demo)', version: 1, key: null, definition: { measurand: { symbol: 'E', unit: 'K', description: 'error of indication' }, inputs: [], certificate: { resultLabel: 'Error of indication' } } },
  points: [],
  readings: [],
  standards: [],
});

function mockJob(jobOver: Record<string, unknown>) {
  mockFetch({
    'GET /api/me': () => json(200, meFor('analyst')),
    'GET /api/jobs/j1': () => json(200, detail(jobOver)),
    'GET /api/jobs/j1/checks': () => json(200, { reasons: [], notes: [], cmc: {} }),
    'GET /api/jobs/reference-standards': () => json(200, { standards: [] }),
  });
}

describe('job page of an amendment', () => {
  it('when the draft amends an issued certificate, then a notice at the top names it, gives the reason and says the approved result replaces it', async () => {
    mockJob({ amends });
    renderApp('/app/jobs/j1');
    await screen.findByRole('heading', { level: 1, name: /EMB-2026-0012/ });
    const label = screen.getByText('Amendment of certificate EMB-C-2026-0007');
    const notice = label.parentElement!;
    expect(notice.textContent).toContain(`Reason: ${reason.replace(/\.$/, '')}.`);
    expect(notice.textContent).toMatch(/When an authorised signatory approves it, the new certificate replaces EMB-C-2026-0007, which is then marked superseded\./);
    // Near the top: before the calibration points.
    const points = screen.getByRole('heading', { name: 'Calibration points' });
    expect(notice.compareDocumentPosition(points) & Node.DOCUMENT_POSITION_FOLLOWING).toBeTruthy();
  });

  it('when the amendment has been issued, then the page names the certificate that replaced the old one', async () => {
    mockJob({ status: 'issued', amends: { ...amends, status: 'issued', newCertificateNumber: 'EMB-C-2026-0009' } });
    renderApp('/app/jobs/j1');
    const label = await screen.findByText('Amendment of certificate EMB-C-2026-0007');
    expect(label.parentElement!.textContent).toContain('Certificate EMB-C-2026-0009, issued from this job, replaced EMB-C-2026-0007, which is now marked superseded.');
  });

  it('when the job is not an amendment, then no amendment notice is shown', async () => {
    mockJob({});
    renderApp('/app/jobs/j1');
    await screen.findByRole('heading', { level: 1, name: /EMB-2026-0012/ });
    expect(screen.queryByText(/Amendment of certificate/)).toBeNull();
  });
});

describe('jobs list', () => {
  it('marks the row of an amendment with the certificate it amends, and no other row', async () => {
    mockFetch({
      'GET /api/me': () => json(200, meFor('analyst')),
      'GET /api/customers': () => json(200, { customers: [] }),
      'GET /api/jobs': () => json(200, { jobs: [listRow({ amends }), listRow({ id: 'j2', number: 'EMB-2026-0011' })], total: 2, page: 1, pageSize: 25 }),
    });
    renderApp('/app/jobs');
    const table = await screen.findByRole('table', { name: 'Calibration jobs' });
    const amendment = (await within(table).findByRole('link', { name: 'EMB-2026-0012' })).closest('tr')!;
    expect(within(amendment).getByText(/^Amends/).textContent).toBe('Amends EMB-C-2026-0007');
    const ordinary = within(table).getByRole('link', { name: 'EMB-2026-0011' }).closest('tr')!;
    expect(ordinary.textContent).not.toMatch(/Amends/);
  });
});
