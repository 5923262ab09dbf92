// Display follows UI-NOTES: SI Brochure 9th ed. §5.4.3 (space before the unit), §5.4.4 (thin-space
// groups), ISO 80000-1 §7.3.2 (× 10ⁿ), GUM 7.2.2 (y ± U unit with k and p).
import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { Quantity, ResultText, UnitSlot } from '../../src/components/ui/quantity';

describe('number display components', () => {
  it('Quantity shows the value, a space and the person’s unit, in tabular figures', () => {
    render(<Quantity value={2.5e-7} unit="W m-2 sr-1 nm-1" digits={2} />);
    const el = screen.getByText('2.5 × 10⁻⁷ W m⁻² sr⁻¹ nm⁻¹');
    expect(el.className).toContain('tabular-nums');
  });
  it('ResultText reads y ± U unit (k, p)', () => {
    render(<ResultText value={773.2149} U={0.13567} unit="K" k={2.05} p={0.9545} />);
    expect(screen.getByText('773.21 ± 0.14 K (k = 2.05, p ≈ 95 %)')).toBeTruthy();
  });
  it('UnitSlot reserves one width for "K", "°C" and no unit, in em, never in ch (1ch is 0.5 em with the fonts as declared)', () => {
    // happy-dom does no layout: the alignment itself was checked on a screenshot in chromium
    // (figures of the °C rows had ended 2.6 px left of those in K with a 2ch slot).
    const { container } = render(<>{['K', '°C', ''].map((u) => <UnitSlot key={u}>{u}</UnitSlot>)}<UnitSlot wide>K/µm</UnitSlot></>);
    const classes = [...container.querySelectorAll('span')].map((s) => s.className);
    expect(classes.slice(0, 3).every((c) => c.includes('min-w-[1.25em]'))).toBe(true);
    expect(classes[3]).toContain('min-w-[2.5em]');
    expect(classes.join(' ')).not.toMatch(/\dch\]/);
  });
});
