/**
 * A closed job (approved or issued) can never be changed again: a new certificate comes from an
 * amendment (ISO/IEC 17025:2017 §7.8.8). Its page says so in one line instead of "Checks before
 * review", does not ask for the checks, leaves out the controls nobody could use (saving,
 * calculating, Monte Carlo, pickers, correlations, scope) and reads as a record: the inputs and
 * the scope as text, not as disabled fields; the budget, the stored result and its charts as
 * before. A draft or submitted job keeps its checks and controls. The point and its values come
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
  return openWith(status, point, role);
}

function openWith(status: JobStatus, p: Omit<typeof point, 'outsideScopeReason'> & { outsideScopeReason: string | null }, role: Role = 'analyst', standards: unknown[] = []) {
  fetchSpy = mockFetch({
    'GET /api/me': () => json(200, meFor(role)),
    'GET /api/jobs/j1': () => json(200, { job: job(status), template: { id: 't1', name: definition.name ?? 'IR thermometer', version: 1, key: null, definition }, points: [p], readings: [], standards }),
    'GET /api/jobs/j1/checks': () => json(200, { reasons: [reason], notes: [], cmc: {} }),
    'GET /api/jobs/reference-standards': () => json(200, { standards: [] }),
  });
  renderApp('/app/jobs/j1');
  return screen.findByRole('heading', { level: 1, name: /EMB-2026-0012/ });
}

let fetchSpy: ReturnType<typeof mockFetch>;
/** Paths the page asked for, in order. */
const asked = () => fetchSpy.mock.calls.map(([input]) => new URL(typeof input === 'string' ? input : input instanceof URL ? input.href : input.url, 'http://localhost').pathname);

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

  it('does not ask for its checks, nor for the register of standards', async () => {
    await open('issued');
    await screen.findByRole('table', { name: 'Uncertainty budget' });
    expect(asked()).toContain('/api/jobs/j1');
    expect(asked()).not.toContain('/api/jobs/j1/checks');
    expect(asked()).not.toContain('/api/jobs/reference-standards');
  });

  it('shows the inputs as text, not as fields: value, unit, distribution and parameters in the unit chosen for each input', async () => {
    await open('issued');
    const inputs = screen.getByRole('region', { name: 'Input quantities' });
    expect(within(inputs).queryAllByRole('textbox')).toEqual([]);
    expect(within(inputs).queryAllByRole('combobox')).toEqual([]);
    expect(within(inputs).queryAllByRole('button')).toEqual([]);
    expect(inputs.querySelectorAll('input, select, textarea')).toHaveLength(0);
    const row = (symbol: string) => inputs.querySelector(`tr[data-input="${symbol}"]`)!;
    const cells = (symbol: string) => [...row(symbol).querySelectorAll('td')].map((td) => td.textContent);
    // The template's values (templates/ir-thermometer-blackbody.json), kept in SI and shown in °C,
    // µm or as a pure number; a figure and its unit joined by a no-break space.
    const nb = '\u00a0';
    expect(cells('T_ref').slice(1)).toEqual(['°C', 'normal', `mean = 100${nb}°C, U = 0.06${nb}°C, k = 2`]);
    expect(cells('T_ref')[0]).toMatch(/from: reference standard certificate$/);
    expect(cells('T_amb').slice(1)).toEqual(['°C', 'normal', `mean = 23${nb}°C, u = 1${nb}°C`]);
    expect(cells('dT_unif').slice(1)).toEqual(['K', 'rectangular', `centre = 0${nb}K, half-width a = 0.1${nb}K`]);
    expect(cells('eps_bb').slice(1)).toEqual(['1', 'normal', 'mean = 0.995, U = 0.004, k = 2']);
    expect(cells('eps_set').slice(1)).toEqual(['1', 'exact (no uncertainty)', 'value = 1']);
    expect(cells('lambda_eff').slice(1)).toEqual(['µm', 'rectangular', `centre = 10${nb}µm, half-width a = 1${nb}µm`]);
    // Symbols of quantities in italics, words upright (ISO 80000-1 §7.1).
    expect([...row('lambda_eff').querySelectorAll('[data-parameter] i')].map((i) => i.textContent)).toEqual(['a']);
    expect([...row('T_ref').querySelectorAll('[data-parameter] i')].map((i) => i.textContent)).toEqual(['U', 'k']);
    // Repeated readings as the editor summarises them (GUM 4.2): 373.35 … 373.55 K are 100.2 … 100.4 °C.
    expect(cells('T_ind').slice(1, 3)).toEqual(['°C', 'readings (Type A)']);
    expect(screen.getByTestId('typea-T_ind').textContent).toBe(`n = 10, mean = 100.31${nb}°C, s = 0.065828${nb}°C, s/√n = 0.020817${nb}°C, ν = 9`);
    expect(screen.getByTestId('correlations').textContent).toBe('No correlation between the inputs.');
    expect(screen.getByTestId('scope-record').textContent).toBe('Scope of accreditation: this point is within the scope.');
  });

  it('keeps everything that is read: budget, stored result, charts and exports', async () => {
    await open('issued');
    expect(screen.getByRole('heading', { name: 'Budget (GUM)' })).toBeTruthy();
    const budget = await screen.findByRole('table', { name: 'Uncertainty budget' });
    expect(budget.querySelector('tr[data-symbol="eps_bb"]')).toBeTruthy();
    // The budget names each distribution as the inputs above it do, not by the engine's keyword.
    expect(budget.querySelector('tr[data-symbol="eps_set"]')!.textContent).toContain('exact (no uncertainty)');
    const stored = screen.getByRole('region', { name: 'Stored result' });
    expect(within(stored).getByText('Contributions, largest first')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Point budget as CSV' })).toBeTruthy();
    expect(screen.getByText(/Scope of accreditation/)).toBeTruthy();
  });

  it('shows the budget as stored with the result the certificate came from, not recomputed by today\'s engine', async () => {
    // A stored budget row that today's engine would not give (as after an engine change): the
    // record shows what was stored (ISO/IEC 17025:2017 §7.5.1, technical records; common practice).
    const stored = structuredClone(result);
    const row = stored.gum.budget.find((b) => b.symbol === 'eps_bb')!;
    row.contribution = 98.7654;
    await openWith('issued', { ...point, result: stored });
    const budget = await screen.findByRole('table', { name: 'Uncertainty budget' });
    const recomputed = result.gum.budget.find((b) => b.symbol === 'eps_bb')!;
    expect(stored.gum.budget.find((b) => b.symbol === 'eps_bb')!.contribution).not.toBe(recomputed.contribution);
    expect(budget.querySelector('tr[data-symbol="eps_bb"]')!.textContent).toContain('98.8');
  });

  it('names the standard a value was taken from and gives a point outside the scope its reason, as text', async () => {
    // The budget editor's note names the standard; a note that does not is preceded by the standard.
    const taken = inputs.map((i) =>
      i.symbol === 'eps_bb' ? { ...i, standardId: 's1', standardNote: 'Cavity blackbody RB-900, certificate DEMO-CAL-0007: effective emissivity' }
      : i.symbol === 'T_ref' ? { ...i, standardId: 's2', standardNote: 'correction at 0 °C from its certificate' }
      : i);
    const standards = [
      { id: 's1', name: 'Cavity blackbody RB-900', identifier: null, kind: 'blackbody_source', certificateNumber: 'DEMO-CAL-0007', dueDate: '2027-01-01', status: 'active', values: [] },
      { id: 's2', name: 'Reference thermometer PRT-A', identifier: null, kind: 'reference_thermometer', certificateNumber: 'DEMO-CAL-0003', dueDate: '2027-01-01', status: 'active', values: [] },
    ];
    await openWith('issued', { ...point, inputs: taken, outsideScope: true, outsideScopeReason: 'Below the range of the accredited method.' }, 'analyst', standards);
    const inputsRegion = screen.getByRole('region', { name: 'Input quantities' });
    const note = (symbol: string) => inputsRegion.querySelector(`tr[data-input="${symbol}"] td:last-child p`)!.textContent;
    expect(note('eps_bb')).toBe('Cavity blackbody RB-900, certificate DEMO-CAL-0007: effective emissivity');
    expect(note('T_ref')).toBe('Reference thermometer PRT-A, certificate DEMO-CAL-0003: correction at 0 °C from its certificate');
    expect(screen.getByTestId('scope-record').textContent).toBe('Scope of accreditation: this point is outside the scope. Reason, printed on the certificate: Below the range of the accredited method.');
    expect(screen.queryByRole('checkbox')).toBeNull();
  });
});

describe('an approved job', () => {
  it('is closed too', async () => {
    await open('approved', 'signatory');
    expect(screen.getByTestId('job-closed').textContent).toMatch(/^Closed: this job has been approved, and its points can no longer be changed\./);
    expect(screen.queryByRole('heading', { name: 'Checks before review' })).toBeNull();
    expect(button('Run Monte Carlo')).toBeNull();
    await screen.findByRole('table', { name: 'Uncertainty budget' });
    expect(asked()).not.toContain('/api/jobs/j1/checks');
    expect(screen.getByRole('region', { name: 'Input quantities' }).querySelectorAll('input, select')).toHaveLength(0);
  });
});

describe('jobs that are not closed', () => {
  it('the analyst\'s draft keeps its checks and every control', async () => {
    await open('draft');
    expect(screen.queryByTestId('job-closed')).toBeNull();
    expect(screen.getByRole('heading', { name: 'Checks before review' })).toBeTruthy();
    // The checks are asked for once the job is known to be a draft.
    expect((await screen.findByRole('list', { name: 'What to fix before submitting' })).textContent).toContain('overdue');
    for (const name of ['Save budget', 'Save and calculate', 'Run Monte Carlo', 'Submit for review', 'Add point', 'Save', 'Change readings', 'Take from a reference standard', 'Add correlation']) {
      expect(button(name), name).toBeTruthy();
    }
    expect(screen.getByRole('heading', { name: 'Budget (GUM, computed as you type)' })).toBeTruthy();
    expect(asked()).toContain('/api/jobs/j1/checks');
  });

  it('the draft says nothing passes until its checks have answered', async () => {
    let answer!: (r: Response) => void;
    fetchSpy = mockFetch({
      'GET /api/me': () => json(200, meFor('analyst')),
      'GET /api/jobs/j1': () => json(200, { job: job('draft'), template: { id: 't1', name: definition.name ?? 'IR thermometer', version: 1, key: null, definition }, points: [point], readings: [], standards: [] }),
      'GET /api/jobs/j1/checks': () => new Promise<Response>((resolve) => (answer = resolve)),
      'GET /api/jobs/reference-standards': () => json(200, { standards: [] }),
    });
    renderApp('/app/jobs/j1');
    await screen.findByText('Running the checks…');
    expect(screen.queryByText('✓ Every check passes.')).toBeNull();
    expect(screen.getByRole('tab').textContent).not.toMatch(/to fix|ready/);
    answer(json(200, { reasons: [], notes: [], cmc: {} }));
    await screen.findByText('✓ Every check passes.');
    expect(screen.getByRole('tab').textContent).toMatch(/✓ ready$/);
  });

  it('a submitted job keeps its checks and shows the controls disabled, as it may yet be sent back', async () => {
    await open('submitted');
    expect(screen.queryByTestId('job-closed')).toBeNull();
    expect(screen.getByRole('heading', { name: 'Checks before review' })).toBeTruthy();
    expect((button('Run Monte Carlo') as HTMLButtonElement).disabled).toBe(true);
    expect((button('Save and calculate') as HTMLButtonElement).disabled).toBe(true);
    expect(button('Submit for review')).toBeNull();
    // Its inputs stay the editor's fields, disabled.
    expect((screen.getByLabelText('mean of T_ref') as HTMLInputElement).disabled).toBe(true);
    expect(screen.queryByTestId('scope-record')).toBeNull();
    expect(asked()).toContain('/api/jobs/j1/checks');
  });
});
