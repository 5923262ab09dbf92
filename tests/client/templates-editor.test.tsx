/**
 * The template editor as a quality manager sees it: live parse errors marked at the offending
 * character (the engine's checkEquations, run in the browser), equations typeset with KaTeX, the
 * GUM budget preview at the defaults (JCGM 100 §5.1.2), and a draft with a missing required
 * field refused with the field named and nothing typed lost.
 */
import { QueryClientProvider } from '@tanstack/react-query';
import { fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { TemplateEditor } from '../../src/features/templates/components/template-editor';
import { createQueryClient } from '../../src/lib/query-client';
import type { TemplateDefinition } from '../../shared/schemas/template.schema';
import { json, meFor, mockFetch, renderApp } from './render-app';

const definition: TemplateDefinition = {
  name: 'Comparison with a reference thermometer (test)',
  measurand: { symbol: 'E', unit: 'K', description: 'error of indication' },
  equations: ['E = T_ind - T_ref'],
  inputs: [
    { symbol: 'T_ind', unit: 'K', description: 'indication', source: 'readings', distribution: { type: 'normal', mean: 300.3, sd: 0.03 } },
    { symbol: 'T_ref', unit: 'K', description: 'reference temperature', source: 'reference', distribution: { type: 'normal', mean: 300, sd: 0.04 } },
  ],
  certificate: { resultLabel: 'Error of indication', methodStatement: 'Comparison with a reference thermometer.' },
} as TemplateDefinition;

// The live check waits for typing to pause; the whole form renders slowly under happy-dom on a
// small machine. Generous waits keep this about behaviour, not speed.
const SLOW = { timeout: 20_000 };
vi.setConfig({ testTimeout: 60_000 });

function renderEditor(props: Partial<Parameters<typeof TemplateEditor>[0]> = {}) {
  const onSave = vi.fn();
  const qc = createQueryClient();
  render(
    <QueryClientProvider client={qc}>
      <TemplateEditor definition={definition} readOnly={false} onSave={onSave} {...props} />
    </QueryClientProvider>,
  );
  return { onSave };
}

describe('template editor', () => {
  it('when an equation has a stray parenthesis, then a caret marks character 18 and the message names the problem', async () => {
    renderEditor();
    const eq = screen.getByLabelText('Equation 1');
    fireEvent.change(eq, { target: { value: 'E = T_ind - T_ref)' } });
    const caret = await screen.findByTestId('equation-0-caret', {}, SLOW);
    expect(caret.textContent).toBe(`${' '.repeat(17)}^`);
    const message = document.getElementById('equation-0-error')!;
    expect(message.textContent).toMatch(/At character 18: .*Unexpected operator \)/);
    expect(eq.getAttribute('aria-invalid')).toBe('true');
    expect(eq.getAttribute('aria-describedby')).toBe('equation-0-error');
  });

  it('when an equation uses an unknown symbol, then the whole symbol is underlined and named', async () => {
    renderEditor();
    fireEvent.change(screen.getByLabelText('Equation 1'), { target: { value: 'E = T_ind - T_rfe' } });
    const caret = await screen.findByTestId('equation-0-caret', {}, SLOW);
    expect(caret.textContent).toBe(`${' '.repeat(12)}^^^^^`);
    expect(document.getElementById('equation-0-error')!.textContent).toMatch(/"T_rfe"/);
  });

  it('when the error is fixed, then the mark goes and the equation is typeset with italic symbols and upright subscripts', async () => {
    renderEditor();
    const eq = screen.getByLabelText('Equation 1');
    fireEvent.change(eq, { target: { value: 'E = T_ind - T_ref)' } });
    await screen.findByTestId('equation-0-caret', {}, SLOW);
    fireEvent.change(eq, { target: { value: 'E = T_ind - T_ref' } });
    await waitFor(() => expect(screen.queryByTestId('equation-0-caret')).toBeNull(), SLOW);
    const math = await screen.findByTestId('equation-0-math', {}, SLOW);
    expect(math.querySelector('.katex')).not.toBeNull();
    // KaTeX's MathML copy carries the structure: T with the upright subscript "ind".
    const annotation = math.querySelector('annotation')?.textContent ?? '';
    expect(annotation).toContain('T_{\\mathrm{ind}}');
  });

  it('shows the GUM budget at the defaults: one row per input, y, u, k and the result line', async () => {
    renderEditor();
    const table = await screen.findByRole('table', { name: /GUM uncertainty budget/ }, SLOW);
    expect(within(table).getAllByRole('row')).toHaveLength(3);
    // y = 300.3 − 300 = 0.3 K, u = √(0.03² + 0.04²) = 0.05 K, k = 2 for ν = ∞ and p = 95.45 % (worked by hand).
    const result = screen.getByText(/Result at the defaults/).parentElement!.textContent!;
    expect(result).toMatch(/0\.30 ± 0\.10 K \(k = 2\.00, p ≈ 95 %\)/);
    expect(within(table).getByText('36.0 %')).toBeTruthy();
    expect(within(table).getByText('64.0 %')).toBeTruthy();
  });

  it('when a required field is emptied and the draft is saved, then it is not sent, the field is named, and the typing stays', async () => {
    const { onSave } = renderEditor();
    const meaning = screen.getByLabelText('T_ref: meaning') as HTMLTextAreaElement;
    fireEvent.change(meaning, { target: { value: '' } });
    fireEvent.change(screen.getByLabelText('Equation 1'), { target: { value: 'E = T_ind - T_ref + 0' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save draft' }));
    const alert = await screen.findByRole('alert', {}, SLOW);
    expect(alert.textContent).toMatch(/not saved/);
    expect(await screen.findByText('each input needs a meaning', {}, SLOW)).toBeTruthy();
    expect(onSave).not.toHaveBeenCalled();
    expect((screen.getByLabelText('Equation 1') as HTMLInputElement).value).toBe('E = T_ind - T_ref + 0');
  });

  it('read-only (a released version): every field is disabled and there is no save button', () => {
    renderEditor({ readOnly: true });
    expect((screen.getByLabelText('Equation 1') as HTMLInputElement).closest('fieldset')!.disabled).toBe(true);
    expect(screen.queryByRole('button', { name: 'Save draft' })).toBeNull();
  });
});

describe('template list', () => {
  it('shows each model with its latest version and its state in words', async () => {
    const v = (id: string, version: number, status: string) => ({ id, version, status, updatedAt: '2026-12-01T10:00:00.000Z', releasedAt: status === 'draft' ? null : '2026-11-20T10:00:00.000Z', retiredAt: null });
    mockFetch({
      'GET /api/me': () => json(200, meFor('quality_manager')),
      'GET /api/templates': () =>
        json(200, {
          templates: [
            { id: 't1', key: null, name: 'Blackbody radiance (test)', summary: null, measurand: { symbol: 'L_lambda', unit: 'W m^-2 sr^-1 m^-1' }, createdAt: '2026-11-01T10:00:00.000Z', latest: v('a2', 2, 'draft'), versions: [v('a2', 2, 'draft'), v('a1', 1, 'released')] },
          ],
        }),
    });
    renderApp('/app/templates');
    const table = await screen.findByRole('table', { name: 'Measurement models' }, SLOW);
    const row = within(table).getByRole('row', { name: /Blackbody radiance/ });
    expect(within(row).getByText('Draft')).toBeTruthy();
    expect(within(row).getByText('2')).toBeTruthy();
    expect(within(row).getByRole('link', { name: /Version 1, released/ }).getAttribute('href')).toBe('/app/templates/versions/a1');
    expect(row.textContent).toContain('W m⁻² sr⁻¹ m⁻¹');
    expect(row.textContent).toContain('λ');
  });
});

describe('default distribution in the unit people see', () => {
  // SI Brochure (9th ed.) §2.3.1: t/°C = T/K − 273.15; a width (U, sd, half-width) is the same
  // in °C and K; 1 µm = 10⁻⁶ m.
  it('shows and takes °C and µm, and keeps kelvin and metres in the model', async () => {
    const { DistributionField } = await import('../../src/features/templates/components/distribution-field');
    const onChange = vi.fn();
    const { rerender } = render(<DistributionField label="T_amb" value={{ type: 'normal', mean: 296.15, sd: 1 }} onChange={onChange} unit="K" shownAs="°C" />);
    const centre = screen.getByLabelText('T_amb: centre') as HTMLInputElement;
    expect(centre.value).toBe('23');
    expect(screen.getByText('centre (°C)')).toBeTruthy();
    fireEvent.change(centre, { target: { value: '23.1' } });
    expect(onChange.mock.calls.at(-1)![0].mean).toBeCloseTo(296.25, 9);
    expect(onChange.mock.calls.at(-1)![0].sd).toBe(1);
    // The stored kelvin value comes back as the typed 23.1, not 23.100000000000023.
    rerender(<DistributionField label="T_amb" value={onChange.mock.calls.at(-1)![0]} onChange={onChange} unit="K" shownAs="°C" />);
    expect((screen.getByLabelText('T_amb: centre') as HTMLInputElement).value).toBe('23.1');

    rerender(<DistributionField label="lambda" value={{ type: 'rectangular', mean: 1e-5, halfWidth: 1e-6 }} onChange={onChange} unit="m" shownAs="µm" />);
    expect((screen.getByLabelText('lambda: centre') as HTMLInputElement).value).toBe('10');
    expect((screen.getByLabelText('lambda: half-width a') as HTMLInputElement).value).toBe('1');
    fireEvent.change(screen.getByLabelText('lambda: half-width a'), { target: { value: '0.5' } });
    expect(onChange.mock.calls.at(-1)![0].halfWidth).toBeCloseTo(5e-7, 18);
  });

  it('stays in SI while the unit shown is not one it can convert to', async () => {
    const { DistributionField } = await import('../../src/features/templates/components/distribution-field');
    render(<DistributionField label="T_x" value={{ type: 'normal', mean: 300, sd: 0.1 }} onChange={() => {}} unit="K" shownAs="°" />);
    expect((screen.getByLabelText('T_x: centre') as HTMLInputElement).value).toBe('300');
    expect(screen.getByText('centre (K)')).toBeTruthy();
  });
});
