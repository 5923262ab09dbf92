// The analyst's budget editor names input quantities as the review page and the certificate
// do: italic symbols, Greek letters where the model identifier spells one, real subscripts
// (ISO 80000-1:2009 §7.1; JCGM 100:2008 §4.1.1 for x_i and the input quantities). The model
// identifier stays the key (data attributes, accessible names, tooltips) because the analyst
// types it in equations and finds it in the CSV export. The model is the shipped IR-thermometer
// template, its values the template's own.
import { fireEvent, render, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { evaluateGum } from '../../shared/engine';
import { pointBudget } from '../../shared/jobs/point-budget';
import type { PointInput } from '../../shared/schemas/jobs.schema';
import type { TemplateDefinition } from '../../shared/schemas/template.schema';
import { BudgetEditor } from '../../src/features/budgets/components/budget-editor';
import { SymbolTick } from '../../src/features/budgets/components/charts';
import { symbolPlain } from '../../src/features/templates/components/symbol-tex';
import template from '../../templates/ir-thermometer-blackbody.json';

const definition = template as unknown as TemplateDefinition;
const inputs = definition.inputs.map((i) => ({ ...i })) as unknown as PointInput[];

function point(over: { inputs?: PointInput[]; withResult?: boolean } = {}) {
  const ins = over.inputs ?? inputs;
  const result = over.withResult ? evaluateGum(pointBudget(definition, { inputs: ins, correlations: [] })!, { codegen: false }) : null;
  return {
    id: 'p1', jobId: 'j1', position: 1, nominalValue: 100, nominalUnit: '°C', inputs: ins, correlations: [],
    outsideScope: false, outsideScopeReason: null, result, resultEngineVersion: result ? 'test' : null, resultSeed: null,
    computedAt: result ? '2026-01-01T00:00:00Z' : null, changedAt: '2026-01-01T00:00:00Z', current: true,
    reported: result ? { y: result.gum.y, U: result.gum.U, k: result.gum.k, note: null } : null,
  } as unknown as Parameters<typeof BudgetEditor>[0]['point'];
}

function renderEditor(p = point()) {
  return render(<BudgetEditor point={p} definition={definition} standards={[]} reasons={[]} today="2026-01-01" editable onSaved={async () => {}} />);
}

/** What a reader sees of a typeset symbol: base in italics, subscript as <sub>. */
function typeset(el: Element) {
  const sym = el.querySelector('span[title]')!;
  return { title: sym.getAttribute('title'), base: sym.querySelector('i')?.textContent, sub: sym.querySelector('sub')?.textContent ?? null };
}

describe('typeset symbols in the budget editor', () => {
  it('names each input row with its typeset symbol, the model identifier as tooltip and key', () => {
    const { container } = renderEditor();
    const first = (s: string) => container.querySelector(`tr[data-input="${s}"] td`)!;
    expect(typeset(first('eps_bb'))).toEqual({ title: 'eps_bb', base: 'ε', sub: 'bb' });
    expect(typeset(first('lambda_eff'))).toEqual({ title: 'lambda_eff', base: 'λ', sub: 'eff' });
    expect(typeset(first('dT_res'))).toEqual({ title: 'dT_res', base: 'δT', sub: 'res' });
    expect(typeset(first('T_ref'))).toEqual({ title: 'T_ref', base: 'T', sub: 'ref' });
    // The raw identifier is not printed as the row's name…
    expect(first('eps_bb').textContent).not.toContain('eps_bb');
    // …and the fields keep their names, which keyboard users and the e2e flow rely on.
    expect(screen.getByLabelText('mean of T_ref')).toBeTruthy();
    expect(screen.getByLabelText('half-width a of dT_res')).toBeTruthy();
  });

  it('shows the live budget table and its measurand typeset, no model identifier in the text', async () => {
    renderEditor();
    const table = await screen.findByRole('table', { name: 'Uncertainty budget' });
    const row = table.querySelector('tr[data-symbol="lambda_eff"]')!;
    expect(typeset(row.querySelector('td')!)).toEqual({ title: 'lambda_eff', base: 'λ', sub: 'eff' });
    for (const raw of ['eps_bb', 'lambda_eff', 'dT_res', 'T_ref', 'T_amb']) expect(table.textContent).not.toContain(raw);
    expect(typeset(table.querySelector('tfoot td')!)).toEqual({ title: 'E', base: 'E', sub: null });
  });

  it('lists inputs still to be filled by their symbols', async () => {
    const unfilled = inputs.map((i) => (i.symbol === 'eps_bb' || i.symbol === 'dT_res' ? { ...i, distribution: null } : i));
    renderEditor(point({ inputs: unfilled }));
    const message = await screen.findByText((_, el) => el?.tagName === 'P' && /^Fill .* to see the budget\.$/.test(el.textContent ?? ''));
    expect(message.textContent).toBe('Fill εbb and δTres to see the budget.');
    expect([...message.querySelectorAll('span[title]')].map((s) => s.getAttribute('title'))).toEqual(['eps_bb', 'dT_res']);
  });

  it('offers correlations between symbols and shows r(T_ref, ε_bb) typeset', () => {
    renderEditor();
    const first = screen.getByLabelText('first input') as HTMLSelectElement;
    // An <option> takes no markup: the plain Unicode form from the same mapping, the identifier as value.
    const eps = [...first.options].find((o) => o.value === 'eps_bb')!;
    expect(eps.textContent).toBe('ε_bb');
    fireEvent.change(first, { target: { value: 'T_ref' } });
    fireEvent.change(screen.getByLabelText('second input'), { target: { value: 'eps_bb' } });
    fireEvent.click(screen.getByRole('button', { name: 'Add correlation' }));
    const r = screen.getByLabelText('r between T_ref and eps_bb');
    const item = r.closest('li')!;
    expect(item.textContent).toMatch(/^r\(Tref, εbb\)/);
    expect([...item.querySelectorAll('span[title]')].map((s) => s.getAttribute('title'))).toEqual(['T_ref', 'eps_bb']);
  });

  it('heads the readings panel with the typeset symbol, its group keeping the identifier', () => {
    renderEditor();
    const row = document.querySelector('tr[data-input="T_ind"]') as HTMLElement;
    fireEvent.click(within(row).getByRole('button', { name: 'Change readings' }));
    const group = screen.getByRole('group', { name: 'Readings of T_ind' });
    const heading = within(group).getByRole('heading');
    expect(heading.textContent).toBe('Readings of Tind, in °C');
    expect(typeset(heading)).toEqual({ title: 'T_ind', base: 'T', sub: 'ind' });
  });

  it('states the stored result with the measurand typeset', () => {
    renderEditor(point({ withResult: true }));
    const stored = screen.getByRole('region', { name: 'Stored result' });
    const line = within(stored).getByText((_, el) => el?.tagName === 'P' && /^E = /.test(el.textContent ?? ''));
    expect(typeset(line)).toEqual({ title: 'E', base: 'E', sub: null });
  });
});

describe('symbols in chart axes', () => {
  it('draws a contributions tick as SVG text with an italic base and a lowered subscript', () => {
    const { container } = render(
      <svg>
        <SymbolTick x={80} y={20} payload={{ value: 'eps_bb' }} />
      </svg>,
    );
    expect(container.querySelector('title')!.textContent).toBe('eps_bb');
    const spans = [...container.querySelectorAll('text tspan')];
    expect(spans.map((s) => s.textContent)).toEqual(['ε', 'bb']);
    expect(spans[0]!.getAttribute('font-style')).toBe('italic');
    expect(spans[1]!.getAttribute('font-style')).toBe('normal'); // descriptive subscript upright
    expect(Number(spans[1]!.getAttribute('dy'))).toBeGreaterThan(0);
  });

  it('gives the plain Unicode form where no markup can go', () => {
    expect(symbolPlain('eps_bb')).toBe('ε_bb');
    expect(symbolPlain('lambda_eff')).toBe('λ_eff');
    expect(symbolPlain('dT_res')).toBe('δT_res');
    expect(symbolPlain('T_lambda')).toBe('T_λ');
    expect(symbolPlain('E')).toBe('E');
  });
});
