/**
 * What users see of the certificate workflow: the public check says authentic or not in words,
 * the customer sees each certificate's status as text, and an approval refused for a wrong
 * password says so next to the password field (UI-NOTES: status as text; errors say what is wrong).
 */
import { fireEvent, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { json, meFor, mockFetch, renderApp } from './render-app';

const header = { number: 'EMB-C-2026-0007', issueDate: '2026-11-24', lab: 'Harrowgate Radiometry Laboratory (demo)', customer: 'Brightwater Glassworks Ltd (demo)', status: 'superseded', supersededBy: 'EMB-C-2026-0009', withdrawnOn: null };

describe('public verification page', () => {
  it('when the dropped file matches an issued certificate, then it says authentic and which certificate replaced it', async () => {
    mockFetch({ 'POST /api/verify/file': () => json(200, { authentic: true, sha256: 'ab'.repeat(32), certificate: header }) });
    renderApp('/verify');
    const input = await screen.findByLabelText('Certificate PDF file');
    fireEvent.change(input, { target: { files: [new File(['%PDF-1.7'], 'c.pdf', { type: 'application/pdf' })] } });
    expect(await screen.findByText('Authentic: this is the file the laboratory issued')).toBeTruthy();
    expect(screen.getByTestId('verify-status').textContent).toBe('Superseded by EMB-C-2026-0009');
  });

  it('when the file differs, then it says not authentic and shows the fingerprint', async () => {
    mockFetch({ 'POST /api/verify/file': () => json(200, { authentic: false, sha256: 'cd'.repeat(32), certificate: null }) });
    renderApp('/verify');
    const input = await screen.findByLabelText('Certificate PDF file');
    fireEvent.change(input, { target: { files: [new File(['%PDF-1.7 changed'], 'c.pdf', { type: 'application/pdf' })] } });
    expect(await screen.findByText('Not authentic: no issued certificate has exactly this file')).toBeTruthy();
    expect(screen.getByText(/cdcdcd/)).toBeTruthy();
  });
});

describe('customer portal', () => {
  it('shows each certificate with its status in words and a download link', async () => {
    const row = { id: 'c1', number: 'EMB-C-2026-0007', jobId: null, jobNumber: null, customer: 'Brightwater Glassworks Ltd (demo)', itemLabel: 'Handheld infrared thermometer', issuedAt: '2026-11-24T10:00:00.000Z', issueDate: '2026-11-24', signatoryName: 'Sam', status: 'superseded', supersededBy: 'EMB-C-2026-0009', amends: null, amendReason: null, pdfSha256: 'ab', pdfSize: 10, openAmendment: null };
    mockFetch({ 'GET /api/me': () => json(200, meFor('customer')), 'GET /api/portal/certificates': () => json(200, { certificates: [row] }) });
    renderApp('/app/my-certificates');
    expect((await screen.findByTestId('certificate-status')).textContent).toMatch(/^Superseded by EMB-C-2026-0009/);
    expect(screen.getByRole('link', { name: 'Download EMB-C-2026-0007.pdf' }).getAttribute('href')).toBe('/api/portal/certificates/c1/pdf');
  });
});
