/**
 * What the analyst sees of an amendment (ISO/IEC 17025:2017 §7.8.8): the draft revision says, on
 * its page and in the jobs list, which certificate it amends and why, and that the approved result
 * replaces that certificate, and links back to the job that certificate was issued from; the job
 * whose certificate is amended names the draft, with a link and its status, on its page and in the
 * jobs list. An ordinary job says nothing of the kind.
 */
import { fireEvent, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { json, meFor, mockFetch, renderApp } from './render-app';

const reason = 'The item’s serial number was printed without its suffix; corrected.';
const amendment = { certificateNumber: 'EMB-C-2026-0007', reason, status: 'open' as const, newCertificateNumber: null };
/** The draft EMB-2026-0012 (j1) amends the certificate issued from job EMB-2026-0008 (j0). */
const amends = { ...amendment, jobId: 'j0', jobNumber: 'EMB-2026-0008' };

const listRow = (over: Record<string, unknown>) => ({
  id: 'j1', number: 'EMB-2026-0012', status: 'draft', itemLabel: 'Handheld infrared thermometer, s/n HT-0042', calibratedOn: '2026-11-20', receivedOn: '2026-11-18',
  updatedAt: '2026-11-25T09:00:00.000Z', customerId: 'c1', templateVersionId: 't1', customer: 'Brightwater Glassworks Ltd (demo)', analyst: 'Ada Demo', points: 2, amends: null, amendedBy: null, ...over,
});

const job = (over: Record<string, unknown>) => ({
  id: 'j1', number: 'EMB-2026-0012', status: 'draft', customerId: 'c1', customer: 'Brightwater Glassworks Ltd (demo)', itemId: 'i1', itemLabel: 'Handheld infrared thermometer, s/n HT-0042',
  templateVersionId: 't1', receivedOn: null, calibratedOn: null, location: '', environment: {}, reviewComment: null, rejectedAt: null, submittedAt: null,
  analystId: 'u1', analyst: 'Ada Demo', createdAt: '2026-11-25T09:00:00.000Z', updatedAt: '2026-11-25T09:00:00.000Z', amends: null, amendedBy: null, ...over,
});

const detail = (jobOver: Record<string, unknown>) => ({
  job: job(jobOver),
  template: { id: 't1', name: 'Infrared thermometer (demo)', version: 1, key: null, definition: { measurand: { symbol: 'E', unit: 'K', description: 'error of indication' }, inputs: [], certificate: { resultLabel: 'Error of indication' } } },
  points: [],
  readings: [],
  standards: [],
});

function mockJob(jobOver: Record<string, unknown>, others: Record<string, Record<string, unknown>> = {}) {
  mockFetch({
    'GET /api/me': () => json(200, meFor('analyst')),
    'GET /api/jobs/j1': () => json(200, detail(jobOver)),
    'GET /api/jobs/j1/checks': () => json(200, { reasons: [], notes: [], cmc: {} }),
    'GET /api/jobs/reference-standards': () => json(200, { standards: [] }),
    ...Object.fromEntries(Object.entries(others).flatMap(([id, over]) => [
      [`GET /api/jobs/${id}`, () => json(200, detail({ id, ...over }))],
      [`GET /api/jobs/${id}/checks`, () => json(200, { reasons: [], notes: [], cmc: {} })],
    ])),
  });
}

describe('job page of an amendment', () => {
  it('when the draft amends an issued certificate, then a notice at the top names it, gives the reason and says the approved result replaces it', async () => {
    mockJob({ amends });
    renderApp('/app/jobs/j1');
    await screen.findByRole('heading', { level: 1, name: /EMB-2026-0012/ });
    const label = screen.getByText('Amendment of certificate EMB-C-2026-0007');
    const notice = label.parentElement!;
    expect(notice.textContent).toContain(`Certificate EMB-C-2026-0007 was issued from job EMB-2026-0008. Reason: ${reason.replace(/\.$/, '')}.`);
    expect(notice.textContent).toMatch(/This draft is a copy of that job: .* When an authorised signatory approves it, the new certificate replaces EMB-C-2026-0007, which is then marked superseded\./);
    // Near the top: before the calibration points.
    const points = screen.getByRole('heading', { name: 'Calibration points' });
    expect(notice.compareDocumentPosition(points) & Node.DOCUMENT_POSITION_FOLLOWING).toBeTruthy();
  });

  it('when the notice names the job the amended certificate came from, then its number links to that job\'s page', async () => {
    const amendedBy = { ...amendment, jobId: 'j1', jobNumber: 'EMB-2026-0012', jobStatus: 'draft' as const };
    mockJob({ amends }, { j0: { number: 'EMB-2026-0008', status: 'issued', amendedBy } });
    renderApp('/app/jobs/j1');
    const notice = (await screen.findByText('Amendment of certificate EMB-C-2026-0007')).parentElement!;
    const link = within(notice).getByRole('link', { name: 'EMB-2026-0008' });
    expect(link.getAttribute('href')).toBe('/app/jobs/j0');
    fireEvent.click(link);
    await screen.findByRole('heading', { level: 1, name: /EMB-2026-0008/ });
    // The original job names the draft in turn, and links to it.
    const back = screen.getByText('Certificate EMB-C-2026-0007 is being amended').parentElement!;
    expect(within(back).getByRole('link', { name: 'EMB-2026-0012' }).getAttribute('href')).toBe('/app/jobs/j1');
    expect(screen.queryByText('Amendment of certificate EMB-C-2026-0007')).toBeNull();
  });

  it('when the amendment has been issued, then the page names the certificate that replaced the old one and still links to the original job', async () => {
    mockJob({ status: 'issued', amends: { ...amends, status: 'issued', newCertificateNumber: 'EMB-C-2026-0009' } });
    renderApp('/app/jobs/j1');
    const label = await screen.findByText('Amendment of certificate EMB-C-2026-0007');
    expect(label.parentElement!.textContent).toContain('Certificate EMB-C-2026-0009, issued from this job, replaced EMB-C-2026-0007, which is now marked superseded.');
    expect(within(label.parentElement!).getByRole('link', { name: 'EMB-2026-0008' }).getAttribute('href')).toBe('/app/jobs/j0');
  });

  it('when the job is not an amendment, then no amendment notice is shown', async () => {
    mockJob({});
    renderApp('/app/jobs/j1');
    await screen.findByRole('heading', { level: 1, name: /EMB-2026-0012/ });
    expect(screen.queryByText(/Amendment of certificate/)).toBeNull();
  });
});

describe('job page of the job whose certificate is amended', () => {
  const amendedBy = { ...amendment, jobId: 'j2', jobNumber: 'EMB-2026-0015', jobStatus: 'draft' as const };

  it('when an amendment is being prepared, then a notice names the draft with a link and its status, the reason, and that the certificate stays current until approval', async () => {
    mockJob({ status: 'issued', amendedBy }, { j2: { number: 'EMB-2026-0015', amends: { ...amendment, jobId: 'j1', jobNumber: 'EMB-2026-0012' } } });
    renderApp('/app/jobs/j1');
    await screen.findByRole('heading', { level: 1, name: /EMB-2026-0012/ });
    const notice = screen.getByText('Certificate EMB-C-2026-0007 is being amended').parentElement!;
    expect(notice.textContent).toContain('The amendment is prepared in job EMB-2026-0015 Draft.');
    expect(notice.textContent).toContain(`Reason: ${reason.replace(/\.$/, '')}.`);
    expect(notice.textContent).toContain('EMB-C-2026-0007, issued from this job, stays current until an authorised signatory approves the amendment; it is then marked superseded by the new certificate.');
    const points = screen.getByRole('heading', { name: 'Calibration points' });
    expect(notice.compareDocumentPosition(points) & Node.DOCUMENT_POSITION_FOLLOWING).toBeTruthy();

    // The link opens the draft, which says what it amends.
    const link = within(notice).getByRole('link', { name: 'EMB-2026-0015' });
    expect(link.getAttribute('href')).toBe('/app/jobs/j2');
    fireEvent.click(link);
    await screen.findByRole('heading', { level: 1, name: /EMB-2026-0015/ });
    expect(screen.getByText('Amendment of certificate EMB-C-2026-0007')).toBeTruthy();
    expect(screen.queryByText(/is being amended/)).toBeNull();
  });

  it('when the draft has been submitted, then the notice gives that status', async () => {
    mockJob({ status: 'issued', amendedBy: { ...amendedBy, jobStatus: 'submitted' } });
    renderApp('/app/jobs/j1');
    const label = await screen.findByText('Certificate EMB-C-2026-0007 is being amended');
    expect(within(label.parentElement!).getByText('Submitted for review')).toBeTruthy();
  });

  it('when the amendment has been issued, then the notice names the job and the certificate that replaced this one', async () => {
    mockJob({ status: 'issued', amendedBy: { ...amendedBy, status: 'issued', jobStatus: 'issued', newCertificateNumber: 'EMB-C-2026-0009' } });
    renderApp('/app/jobs/j1');
    const label = await screen.findByText('Certificate EMB-C-2026-0007 was amended');
    const notice = label.parentElement!;
    expect(notice.textContent).toContain('Amended by job EMB-2026-0015 Certificate issued.');
    expect(notice.textContent).toContain('Certificate EMB-C-2026-0009, issued from that job, replaced EMB-C-2026-0007, which is now marked superseded.');
    expect(within(notice).getByRole('link', { name: 'EMB-2026-0015' }).getAttribute('href')).toBe('/app/jobs/j2');
  });

  it('when the job\'s certificate is not amended, then no such notice is shown', async () => {
    mockJob({ status: 'issued' });
    renderApp('/app/jobs/j1');
    await screen.findByRole('heading', { level: 1, name: /EMB-2026-0012/ });
    expect(screen.queryByText(/is being amended|was amended/)).toBeNull();
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
    expect(ordinary.textContent).not.toMatch(/Amends|amended/);
  });

  it('marks the original job while its certificate is being amended, and once it was, naming the amending job', async () => {
    const amendedBy = { ...amendment, jobId: 'j1', jobNumber: 'EMB-2026-0012', jobStatus: 'draft' as const };
    const replaced = { ...amendedBy, status: 'issued' as const, newCertificateNumber: 'EMB-C-2026-0009', jobStatus: 'issued' as const };
    mockFetch({
      'GET /api/me': () => json(200, meFor('analyst')),
      'GET /api/customers': () => json(200, { customers: [] }),
      'GET /api/jobs': () => json(200, {
        jobs: [
          listRow({ id: 'j0', number: 'EMB-2026-0008', status: 'issued', amendedBy }),
          listRow({ id: 'j3', number: 'EMB-2026-0003', status: 'issued', amendedBy: replaced }),
          listRow({ id: 'j4', number: 'EMB-2026-0004', status: 'issued' }),
          listRow({ amends }),
        ],
        total: 4, page: 1, pageSize: 25,
      }),
    });
    renderApp('/app/jobs');
    const table = await screen.findByRole('table', { name: 'Calibration jobs' });
    const row = async (number: string) => (await within(table).findByRole('link', { name: number })).closest('tr')!;
    const open = within(await row('EMB-2026-0008')).getByText(/^Being amended/);
    expect(open.textContent).toBe('Being amended in EMB-2026-0012');
    expect(open.getAttribute('title')).toBe(`Certificate EMB-C-2026-0007 is being amended in job EMB-2026-0012. Reason: ${reason.replace(/\.$/, '')}.`);
    // The same quiet style as the amendment's own mark: small, muted, not a status.
    expect(open.className).toBe(within(await row('EMB-2026-0012')).getByText(/^Amends/).className);
    const done = within(await row('EMB-2026-0003')).getByText(/^Amended by/);
    expect(done.textContent).toBe('Amended by EMB-2026-0012');
    expect(done.getAttribute('title')).toMatch(/^Certificate EMB-C-2026-0007 was replaced by EMB-C-2026-0009, issued from job EMB-2026-0012\. Reason: /);
    expect((await row('EMB-2026-0004')).textContent).not.toMatch(/Amends|amended/i);
  });
});
