/**
 * A measurement result as reported: "y ± U unit (k = 2.05, p ≈ 95 %)".
 *
 * Sources: GUM (JCGM 100:2008) §7.2.2 and §7.2.4 (the value, U, its unit and k stated together;
 * the value rounded to the decimal place of the uncertainty); GUM §7.2.6 (U with at most two
 * significant digits); EA-4/02 M:2022 §5 (normal rounding, except round up when normal rounding
 * would lower U by more than 5 %).
 */
import { decimalExponent, formatNumber, powerOfTen, TIMES } from './number';
import { formatUnit } from './units';

/**
 * Rounds an expanded uncertainty to `digits` significant digits (default 2), rounding up when
 * normal rounding would make it more than 5 % smaller (EA-4/02 M:2022).
 * Returns the rounded value and its decimal place (the exponent of its last digit).
 */
export function roundUncertainty(U: number, digits = 2): { value: number; lastDigitExponent: number } {
  if (!Number.isFinite(U) || U <= 0) return { value: U, lastDigitExponent: 0 };
  let e = decimalExponent(U) - (digits - 1);
  const step = 10 ** e;
  let rounded = Math.round(U / step) * step;
  if (rounded < U * 0.95) rounded = Math.ceil(U / step - 1e-9) * step;
  // Rounding may carry into a new digit (9.96 → 10): the last digit moves one place left.
  if (decimalExponent(rounded) - (digits - 1) > e) e += 1;
  return { value: Number(rounded.toPrecision(digits + 1)), lastDigitExponent: e };
}

/** Coverage probability as shown: 0.9545 → "p ≈ 95 %", 0.95 → "p = 95 %", 0.9973 → "p ≈ 99.7 %". */
export function formatCoverageProbability(p: number): string {
  const percent = p * 100;
  for (const decimals of [0, 1, 2]) {
    const shown = Number(percent.toFixed(decimals));
    if (shown < 100 || percent >= 100) {
      const exact = Math.abs(shown - percent) < 1e-9;
      return `p ${exact ? '=' : '≈'} ${formatNumber(shown, { decimals })} %`;
    }
  }
  return `p ≈ ${formatNumber(percent, { decimals: 3 })} %`;
}

/** Coverage factor to two decimals, as certificates print it ("2.00", "2.05"). */
export function formatCoverageFactor(k: number): string {
  return formatNumber(k, { decimals: 2, notation: 'fixed' });
}

/**
 * "773.21 ± 0.14 K (k = 2.05, p ≈ 95 %)".
 * Very large or small values share one power of ten: "(5.32 ± 0.11) × 10⁻³ W m⁻² sr⁻¹ nm⁻¹ (…)".
 * The unit is formatted for display; pass "" for a dimensionless result.
 */
export function formatResult(value: number, U: number, unit: string, k: number, p: number): string {
  return `${formatValueAndU(value, U, unit)} (k = ${formatCoverageFactor(k)}, ${formatCoverageProbability(p)})`;
}

/**
 * "773.21 ± 0.14 K": U rounded to two significant digits, the value to its decimal place (GUM
 * 7.2.6), without the coverage statement (a Monte Carlo interval has no k).
 */
export function formatValueAndU(value: number, U: number, unit: string): string {
  const shownUnit = formatUnit(unit);
  const unitPart = shownUnit ? ` ${shownUnit}` : '';
  if (!Number.isFinite(value) || !Number.isFinite(U) || U <= 0) {
    return `${formatNumber(value)} ± ${formatNumber(U)}${unitPart}`;
  }
  const { value: Ur, lastDigitExponent } = roundUncertainty(U);
  const magnitude = Math.max(Math.abs(value), Ur);
  const useExponent = magnitude >= 1e6 || magnitude < 1e-3;
  if (!useExponent) {
    const decimals = Math.max(0, -lastDigitExponent);
    // U = 1 400 K puts the last digit in the hundreds: the value is rounded there too (GUM 7.2.6).
    const yRounded = lastDigitExponent > 0 ? Math.round(value / 10 ** lastDigitExponent) * 10 ** lastDigitExponent : value;
    const y = formatNumber(yRounded, { decimals, notation: 'fixed' });
    const u = formatNumber(Ur, { decimals, notation: 'fixed' });
    return `${y} ± ${u}${unitPart}`;
  }
  // Engineering-free shared exponent: the exponent of the larger of |y| and U.
  const exponent = decimalExponent(magnitude);
  const scale = 10 ** exponent;
  const decimals = Math.max(0, exponent - lastDigitExponent);
  const y = formatNumber(value / scale, { decimals, notation: 'fixed' });
  const u = formatNumber(Ur / scale, { decimals, notation: 'fixed' });
  return `(${y} ± ${u}) ${TIMES} ${powerOfTen(exponent)}${unitPart}`;
}

/**
 * An environmental condition as stated on a certificate: "23.1 ± 0.5 °C" — U to at most two
 * significant digits and the value to its decimal place (GUM 7.2.6) — or the value alone, "23.1 °C", when no
 * uncertainty is recorded for it (never "± 0"). `space` goes between the number and the unit (the
 * PDF passes a no-break space; SI Brochure §5.4.3: a space also before "%").
 */
export function formatCondition(c: { value: number; U: number; unit: string }, space = ' '): string {
  const unit = formatUnit(c.unit);
  const tail = unit ? `${space}${unit}` : '';
  if (!(c.U > 0) || !Number.isFinite(c.U)) return `${formatNumber(c.value)}${tail}`;
  const U = formatNumber(Number(c.U.toPrecision(2)), { notation: 'fixed' });
  const decimals = U.split('.')[1]?.length ?? 0;
  return `${formatNumber(c.value, { decimals, notation: 'fixed' })} ± ${U}${tail}`;
}
