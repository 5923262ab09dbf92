/**
 * Certificate wording of numbers and dates. Number formatting itself comes from shared/format
 * (ISO 80000-1 / SI Brochure conventions); this file composes the certificate's phrases from it.
 * Quantity symbols read as on the screens: shared/format/symbols.ts.
 */
import { formatCoverageProbability, formatNumber, formatUnit, groupDigits, MINUS } from '../../shared/format';

/** U+00A0 NO-BREAK SPACE keeps a number and its unit on one line ("0.28 K"). */
export const NBSP = '\u00A0';

/**
 * An engine `reported` string ("-0.28", "1234.5") as printed: U+2212 for the minus sign and
 * thin-space digit groups from five integer digits on, digits otherwise untouched.
 */
export function printReported(s: string): string {
  const trimmed = s.trim();
  const negative = trimmed.startsWith('-') || trimmed.startsWith(MINUS);
  const body = negative ? trimmed.slice(1) : trimmed;
  return `${negative ? MINUS : ''}${groupDigits(body)}`;
}

/**
 * "0.28 K", "W m⁻² sr⁻¹ nm⁻¹" units via shared/format; a unit is always separated by a space,
 * including "%" (SI Brochure §5.4.3), here a no-break one.
 */
export function withUnit(value: string, unit: string): string {
  const shown = formatUnit(unit);
  return shown ? `${value}${NBSP}${shown}` : value;
}

/** "p ≈ 95 %" (ISO/IEC 17025:2017 7.8.4.1, ILAC-P14: the coverage probability is stated). */
export function coverageProbability(p: number): string {
  return formatCoverageProbability(p);
}

/** Value ± U with the unit once at the end when both share it: "0.28 ± 0.22 K". */
export function plusMinus(value: string, U: string, unit: string): string {
  return withUnit(`${printReported(value)} ± ${printReported(U)}`, unit);
}

/** Any number in a table: `digits` significant digits, × 10ⁿ outside 10⁻³ … 10⁶. */
export function num(value: number, digits?: number): string {
  return formatNumber(value, digits === undefined ? {} : { digits });
}

/** Fixed decimals (a value rounded to the place of its uncertainty). */
export function fixed(value: number, decimals: number): string {
  return formatNumber(value, { decimals, notation: 'fixed' });
}

/** Degrees of freedom: integer, or ∞. */
export function dof(v: number | 'infinite' | null): string {
  if (v === null) return 'n/a';
  if (v === 'infinite' || !Number.isFinite(v)) return '∞';
  return v >= 1e6 ? formatNumber(v, { digits: 2 }) : formatNumber(Math.floor(v + 1e-9), { decimals: 0 });
}

/** Share 0…1 as a percentage with one decimal, "12.3 %". */
export function percent(share: number): string {
  return `${(share * 100).toFixed(1)}${NBSP}%`;
}

const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];

/** "2026-11-24" → "24 November 2026": unambiguous in any locale. */
export function longDate(iso: string): string {
  const [y, m, d] = iso.slice(0, 10).split('-').map(Number);
  return `${d} ${MONTHS[m - 1]} ${y}`;
}

/** One day, or "19 to 20 November 2026" / "30 November to 2 December 2026". */
export function dateRange(from: string, to?: string): string {
  if (!to || to === from) return longDate(from);
  const [fy, fm] = from.split('-');
  const [ty, tm] = to.split('-');
  const [, , fd] = from.split('-').map(Number);
  if (fy === ty && fm === tm) return `${fd} to ${longDate(to)}`;
  if (fy === ty) return `${longDate(from).replace(` ${fy}`, '')} to ${longDate(to)}`;
  return `${longDate(from)} to ${longDate(to)}`;
}

/** "2026-11-24T09:41:00Z" → "24 November 2026, 09:41 UTC". */
export function dateTimeUtc(iso: string): string {
  const d = new Date(iso);
  const date = d.toISOString().slice(0, 10);
  return `${longDate(date)}, ${d.toISOString().slice(11, 16)} UTC`;
}
