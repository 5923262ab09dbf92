/**
 * A closed job (approved or issued) can never be changed again: a new certificate comes from an
 * amendment (ISO/IEC 17025:2017 §7.8.8). Its page says so in one line instead of "Checks before
 * review", leaves out the controls nobody could use (saving, calculating, Monte Carlo, pickers,
 * correlations, scope) and keeps what is read: the inputs, the budget, the stored result and its
 * charts. A draft or submitted job keeps its checks and controls. The point and its values come
 * from the shipped IR-thermometer template.
 */
import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { evaluateGum } from '../../shared/engine';
import { pointBudget } from '../../shared/jobs/point-budget';
import type { JobStatus, PointInput } from '../../shared/schemas/jobs.schema';
import type { Role } from '../../shared/schemas/roles';
import type { TemplateDefinition } from '../../shared/schemas/template.schema';
import template from '../../templates/ir-thermometer-blackbody.json';
import { json, meFor, mockFetch, renderApp } from './render-app';

const definition = template as unknown as TemplateDefinition;
const inputs = definition.inputs.map((i) => ({ ...i })) as unknown as PointInput[];
const result = evaluateGum(pointBudget(definition, { inputs, correlations: [] })!, { codegen: false });

const point = {
  id: 'p1', jobId: 'j1', position: 1, nominalValue: 100, nominalUnit: '°C', inputs, correlations: [], outsideScope: false, outsideScopeReason: null,
  result, resultEngineVersion: 'test', resultSeed: null, computedAt: '2026-11-20T10:00:00Z', changedAt: '2026-11-20T10:00:00Z', current: true,
  reported: { method: 'gum', y: result.gum.y, U: result.gum.U, k: result.gum.k, interval: result.gum.interval, note: null },
};

const job = (status: JobStatus) => ({
  id: 'j1', number: 'EMB-2026-0012', status, customerId: 'c1', customer: 'Brightwater Glassworks Ltd (demo)', itemId: 'i1', itemLabel: 'Handheld infrared thermometer, s/n HT-0042',
  templateVersionId: 't1', receivedOn: '2026-11-18', calibratedOn: '2026-11-20', location: 'Laboratory room 2', environment: {}, reviewComment: null, rejectedAt: null,
  submittedAt: status === 'draft' ? null : '2026-11-21T09:00:00.000Z', analystId: 'u1', analyst: 'Ada Demo', createdAt: '2026-11-18T09:00:00.000Z',
  updatedAt: '2026-11-21T09:00:00.000Z', amends: null, amendedBy: null,
});

// A check that would refuse the point today (as when a standard has since fallen due).
const reason = { code: 'STANDARD_OVERDUE', message: 'Point 1: ε_bb comes from a standard whose calibration is overdue.', pointId: 'p1', pointPosition: 1, symbol: 'eps_bb' };

function open(status: JobStatus, role: Role = 'analyst') {
  mockFetch({
    'GET /api/me': () => json(200, meFor(role)),
    'GET /api/jobs/j1': () => json(200, { job: job(status), template: { id: 't1', name: definition.name ?? 'IR thermometer', version: 1, key: null, definition }, points: [point], readings: [], standards: [] }),
    'GET /api/jobs/j1/checks': () => json(200, { reasons: [reason], notes: [], cmc: {} }),
    'GET /api/jobs/reference-standards': () => json(200, { standards: [] }),
  });
  renderApp('/app/jobs/j1');
  return screen.findByRole('heading', { level: 1, name: /EMB-2026-0012/ });
}

const button = (name: string) => screen.queryAllByRole('button', { name })[0] ?? null;

describe('an issued job', () => {
  it.each(['analyst', 'quality_manager', 'signatory'] as const)('shows the %s one line that it is closed instead of the checks, and no control that can never be used', async (role) => {
    await open('issued', role);
    const line = screen.getByTestId('job-closed');
    expect(line.textContent).toBe('Closed: the certificate has been issued from this job, and its points can no longer be changed. A new certificate can only come from an amendment, which opens a new draft copy of the job.');
    // Near the top, before the points.
    expect(line.compareDocumentPosition(screen.getByRole('heading', { name: 'Calibration points' })) & Node.DOCUMENT_POSITION_FOLLOWING).toBeTruthy();

    expect(screen.queryByRole('heading', { name: 'Checks before review' })).toBeNull();
    expect(screen.queryByText(/✓ Every check passes|What to fix/)).toBeNull();
    for (const name of ['Save budget', 'Save and calculate', 'Run Monte Carlo', 'Submit for review', 'Add point', 'Save', 'Change readings', 'Take from a reference standard', 'Add correlation']) {
      expect(button(name), name).toBeNull();
    }
    expect(screen.queryByRole('heading', { name: 'Monte Carlo (JCGM 101)' })).toBeNull();
    expect(screen.queryByLabelText('first input')).toBeNull();
    expect(screen.queryByText(/Tab moves along a row/)).toBeNull();
    // What a check would say today is not held against a closed job.
    expect(screen.queryByText(/overdue/)).toBeNull();
    expect(screen.getByRole('tab').textContent).not.toMatch(/to fix|ready/);
  });

  it('keeps everything that is read: inputs, budget, stored result, charts and exports', async () => {
    await open('issued');
    expect(screen.getByRole('heading', { name: 'Input quantities' })).toBeTruthy();
    expect((screen.getByLabelText('mean of T_ref') as HTMLInputElement).value).not.toBe('');
    expect(screen.getByRole('heading', { name: 'Budget (GUM)' })).toBeTruthy();
    const budget = await screen.findByRole('table', { name: 'Uncertainty budget' });
    expect(budget.querySelector('tr[data-symbol="eps_bb"]')).toBeTruthy();
    const stored = screen.getByRole('region', { name: 'Stored result' });
    expect(within(stored).getByText('Contributions, largest first')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Point budget as CSV' })).toBeTruthy();
    expect(screen.getByText(/Scope of accreditation/)).toBeTruthy();
  });
});

describe('an approved job', () => {
  it('is closed too', async () => {
    await open('approved', 'signatory');
    expect(screen.getByTestId('job-closed').textContent).toMatch(/^Closed: this job has been approved, and its points can no longer be changed\./);
    expect(screen.queryByRole('heading', { name: 'Checks before review' })).toBeNull();
    expect(button('Run Monte Carlo')).toBeNull();
  });
});

describe('jobs that are not closed', () => {
  it('the analyst\'s draft keeps its checks and every control', async () => {
    await open('draft');
    expect(screen.queryByTestId('job-closed')).toBeNull();
    expect(screen.getByRole('heading', { name: 'Checks before review' })).toBeTruthy();
    expect(screen.getByRole('list', { name: 'What to fix before submitting' }).textContent).toContain('overdue');
    for (const name of ['Save budget', 'Save and calculate', 'Run Monte Carlo', 'Submit for review', 'Add point', 'Save', 'Change readings', 'Take from a reference standard', 'Add correlation']) {
      expect(button(name), name).toBeTruthy();
    }
    expect(screen.getByRole('heading', { name: 'Budget (GUM, computed as you type)' })).toBeTruthy();
  });

  it('a submitted job keeps its checks and shows the controls disabled, as it may yet be sent back', async () => {
    await open('submitted');
    expect(screen.queryByTestId('job-closed')).toBeNull();
    expect(screen.getByRole('heading', { name: 'Checks before review' })).toBeTruthy();
    expect((button('Run Monte Carlo') as HTMLButtonElement).disabled).toBe(true);
    expect((button('Save and calculate') as HTMLButtonElement).disabled).toBe(true);
    expect(button('Submit for review')).toBeNull();
  });
});
