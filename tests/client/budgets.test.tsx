// The budget table and unit handling of the budget editor. Expected values: GUM 5.1.2 (linear
// model y = a + b, so c = 1 and u_c² = Σu²), SI Brochure §2.3.1 (t/°C = T/K − 273.15).
import { render, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { evaluateGum } from '../../shared/engine';
import { BudgetTable, formatShare } from '../../src/features/budgets/components/budget-table';
import { inDisplayUnit } from '../../shared/format/units';
import { distributionLabel, fromDisplay, toDisplay, unitChoices } from '../../src/features/budgets/components/units';

const doc = {
  measurand: { symbol: 'y', unit: 'K' },
  equations: ['y = a + b'],
  inputs: [
    { symbol: 'a', unit: 'K', distribution: { type: 'normal' as const, mean: 373.15, sd: 0.3 } },
    { symbol: 'b', unit: 'K', distribution: { type: 'normal' as const, mean: 0, sd: 0.4 } },
  ],
};

describe('budget table', () => {
  it('shows each input with c, contribution and share as a number and a bar', () => {
    const result = evaluateGum(doc);
    render(<BudgetTable result={result} inputs={doc.inputs} />);
    const table = screen.getByRole('table', { name: 'Uncertainty budget' });
    const rowB = within(table).getByText('b').closest('tr')!;
    // share of b = 0.4² / (0.3² + 0.4²) = 0.64
    expect(rowB.textContent).toContain('64 %');
    const bar = rowB.querySelector('span.bg-ember') as HTMLElement;
    expect(parseFloat(bar.style.width)).toBeCloseTo(64, 9);
    // u_c = 0.5 K, with its unit
    expect(table.querySelector('tfoot')!.textContent).toContain('0.500 K');
  });

  it('says "< 0.01 %" for a share too small to matter instead of printing its digits', () => {
    expect(formatShare(0.64)).toBe('64 %');
    expect(formatShare(8.8e-4)).toBe('0.088 %');
    expect(formatShare(8.0e-7)).toBe('< 0.01 %'); // was "0.000080 %", wider than its column
    expect(formatShare(0)).toBe('0.0 %');
  });
});

describe('distribution names in budget tables (the budget editor, a closed job, the review)', () => {
  it('names each engine keyword as the input editor does, and leaves an unknown one as it is', () => {
    expect(distributionLabel('constant')).toBe('exact (no uncertainty)');
    expect(distributionLabel('readings')).toBe('readings (Type A)');
    expect(distributionLabel('normal')).toBe('normal');
    expect(distributionLabel('toString')).toBe('toString');
  });
});

describe('display units', () => {
  it('offers °C for kelvin inputs and converts positions with the offset, widths without', () => {
    expect(unitChoices('K')).toContain('°C');
    expect(toDisplay('mean', 373.15, 'K', '°C')).toBeCloseTo(100, 12);
    expect(toDisplay('halfWidth', 0.1, 'K', '°C')).toBeCloseTo(0.1, 12);
    expect(fromDisplay('mean', 8, 'm', 'µm')).toBeCloseTo(8e-6, 18);
    expect(fromDisplay('k', 2, 'K', '°C')).toBe(2);
    // d of the trapezoid with inexact limits (JCGM 101 §6.4.3) is a width: 1 µm, not 10⁻⁶ µm.
    expect(toDisplay('d', 1e-6, 'm', 'µm')).toBeCloseTo(1, 12);
  });
});

describe('budget rows in the unit chosen for each input', () => {
  // SI Brochure (9th ed.) §2.3.1: t/°C = T/K − 273.15, and a temperature difference of 1 °C is 1 K;
  // 1 µm = 10⁻⁶ m. c_i is per unit of x_i, so c_i·u(x_i) (the contribution) does not change.
  it('gives the estimate with the offset, u without it, and c per shown unit', () => {
    const t = inDisplayUnit({ estimate: 353.15, u: 0.01, c: -0.9989 }, 'K', '°C');
    expect(t.estimate).toBeCloseTo(80, 10);
    expect(t.u).toBeCloseTo(0.01, 12);
    expect(t.c).toBeCloseTo(-0.9989, 12);
    expect(t.unit).toBe('°C');
    const l = inDisplayUnit({ estimate: 1e-5, u: 5.77e-7, c: 2161 }, 'm', 'µm');
    expect(l.estimate).toBeCloseTo(10, 10);
    expect(l.u).toBeCloseTo(0.577, 10);
    expect(l.c).toBeCloseTo(2.161e-3, 12);
    expect(l.c * l.u).toBeCloseTo(2161 * 5.77e-7, 12);
  });

  it('shows the table in °C when the editor shows that input in °C', () => {
    const result = evaluateGum(doc);
    render(<BudgetTable result={result} inputs={doc.inputs} shownUnits={{ a: '°C' }} />);
    const rowA = within(screen.getByRole('table', { name: 'Uncertainty budget' })).getByText('a').closest('tr')!;
    expect(rowA.textContent).toContain('100.0000');
    expect(rowA.textContent).toContain('°C');
  });
});
