/**
 * Numbers as people read them on screen and in the certificate.
 *
 * Conventions (sources: ISO 80000-1:2022 §7.3.1; SI Brochure, 9th ed. (2019) §5.4.4):
 * - Decimal marker: the point.
 * - Digit groups of three, separated by U+202F NARROW NO-BREAK SPACE. The SI Brochure asks for
 *   "a thin space"; U+202F is the thin space that never lets a line break split a number
 *   (U+2009 THIN SPACE is a break opportunity). Exported as {@link GROUP_SEPARATOR}.
 * - A group is set only when the integer part has five or more digits ("1234", "12 345"):
 *   the SI Brochure §5.4.4 says a single digit is customarily not isolated.
 * - Negative values use U+2212 MINUS SIGN (ISO 80000-2), not the hyphen.
 * - Powers of ten as "× 10⁻³" (ISO 80000-1 §7.3.2), never "e-3"; plain e notation belongs to
 *   inputs and exports only.
 */

/** U+202F NARROW NO-BREAK SPACE: the digit-group separator. */
export const GROUP_SEPARATOR = '\u202F';
/** U+2212 MINUS SIGN. */
export const MINUS = '\u2212';
/** U+00D7 MULTIPLICATION SIGN, spaced, as in "1.2 × 10⁻³". */
export const TIMES = '\u00D7';

const SUPERSCRIPT: Record<string, string> = {
  '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹', '-': '⁻', '+': '⁺',
};

/** "-3" → "⁻³". */
export function superscript(n: number | string): string {
  return String(n)
    .split('')
    .map((ch) => SUPERSCRIPT[ch] ?? ch)
    .join('');
}

/** "10⁻³" style power of ten. */
export function powerOfTen(exponent: number): string {
  return `10${superscript(exponent < 0 ? `-${-exponent}` : exponent)}`;
}

/** Groups the integer digits of an unsigned decimal string ("50000838.5" → "50 000 838.5"). */
export function groupDigits(unsigned: string): string {
  const [int, frac] = unsigned.split('.');
  const grouped = int.length >= 5 ? int.replace(/\B(?=(\d{3})+(?!\d))/g, GROUP_SEPARATOR) : int;
  return frac === undefined ? grouped : `${grouped}.${frac}`;
}

/** Replaces a leading "-" by U+2212. */
function withSign(negative: boolean, body: string): string {
  return negative ? `${MINUS}${body}` : body;
}

/** Decimal exponent of |x| (floor(log10|x|)), robust at exact powers of ten. */
export function decimalExponent(x: number): number {
  if (x === 0 || !Number.isFinite(x)) return 0;
  // toExponential gives the exponent of the decimal representation without log10 round-off.
  return Number(Math.abs(x).toExponential().split('e')[1]);
}

export interface FormatNumberOptions {
  /** Significant digits (default: as many as needed, up to 15). Ignored when `decimals` is given. */
  digits?: number;
  /** Fixed number of decimals (for values rounded to the decimal place of their uncertainty). */
  decimals?: number;
  /**
   * 'auto' (default): a power of ten when |x| ≥ 10⁶ or 0 < |x| < 10⁻³; 'fixed': never;
   * 'scientific': always.
   */
  notation?: 'auto' | 'fixed' | 'scientific';
}

const AUTO_LARGE = 1e6;
const AUTO_SMALL = 1e-3;

function fixedBody(abs: number, options: FormatNumberOptions): string {
  if (options.decimals !== undefined) return abs.toFixed(Math.max(0, Math.min(100, options.decimals)));
  if (options.digits !== undefined) {
    const rounded = Number(abs.toPrecision(options.digits));
    const decimals = Math.max(0, options.digits - 1 - decimalExponent(rounded));
    return rounded.toFixed(Math.min(100, decimals));
  }
  // Shortest round-trip representation, trimmed to 15 significant digits to hide binary noise.
  const s = Number(abs.toPrecision(15)).toString();
  if (!s.includes('e')) return s;
  return Number(s).toFixed(Math.min(100, Math.max(0, -decimalExponent(abs) + 14))).replace(/\.?0+$/, '');
}

/**
 * Formats a number for display.
 *
 * @example formatNumber(50000838) // "50 000 838"
 * @example formatNumber(0.000123, { digits: 2 }) // "1.2 × 10⁻⁴"
 * @example formatNumber(-273.15) // "−273.15"
 *
 * Special cases: NaN → "—" (no value); ±Infinity → "∞" / "−∞".
 */
export function formatNumber(value: number, options: FormatNumberOptions = {}): string {
  if (Number.isNaN(value)) return '—';
  if (!Number.isFinite(value)) return withSign(value < 0, '∞');
  const negative = value < 0;
  const abs = Math.abs(value);
  const notation = options.notation ?? 'auto';
  const scientific =
    notation === 'scientific' || (notation === 'auto' && abs !== 0 && (abs >= AUTO_LARGE || abs < AUTO_SMALL));
  if (!scientific || abs === 0) {
    const body = fixedBody(abs, options);
    const isZero = Number(body) === 0;
    return withSign(negative && !isZero, groupDigits(body));
  }
  let exponent = decimalExponent(abs);
  let mantissa = abs / 10 ** exponent;
  let body: string;
  if (options.digits !== undefined) {
    body = mantissa.toFixed(Math.max(0, options.digits - 1));
    if (Number(body) >= 10) {
      exponent += 1;
      mantissa /= 10;
      body = mantissa.toFixed(Math.max(0, options.digits - 1));
    }
  } else if (options.decimals !== undefined) {
    body = mantissa.toFixed(options.decimals);
  } else {
    body = Number(mantissa.toPrecision(15)).toString();
  }
  return withSign(negative, `${body} ${TIMES} ${powerOfTen(exponent)}`);
}
