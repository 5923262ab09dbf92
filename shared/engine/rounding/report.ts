/**
 * Reporting a result (JCGM 100:2008, GUM 7.2.6; EA-4/02 M:2013 §5; ILAC-P14): the expanded
 * uncertainty U to two significant digits (or one), rounded normally except that it is rounded
 * up when normal rounding would make it smaller by more than 5 % (EA-4/02); the estimate rounded
 * to the same decimal place; k to two decimals. All as strings.
 */

export interface RoundedUncertainty {
  /** The rounded U as a number. */
  value: number;
  /** Decimal exponent of the last digit kept (−3 for 0.059, 0 for 59, 2 for 1200). */
  place: number;
  text: string;
  /** True when the EA-4/02 5 % rule rounded U up instead of normally. */
  roundedUp: boolean;
}

/** Tolerance against binary representation noise when a scaled value should be an integer. */
const NOISE = 1e-9;

function toPlace(v: number, place: number, mode: 'round' | 'up'): number {
  // Below 1e-300 the scale factor 10^-place overflows binary64: keep v as it is.
  if (place < -300) return v;
  const scaled = place <= 0 ? v * 10 ** -place : v / 10 ** place;
  const n = mode === 'up' ? Math.ceil(scaled - NOISE * Math.abs(scaled)) : Math.round(scaled + NOISE * Math.abs(scaled) * Math.sign(scaled));
  return place <= 0 ? n / 10 ** -place : n * 10 ** place;
}

/**
 * `v` as text with its last digit at decimal exponent `place`. Number.prototype.toFixed accepts at
 * most 100 digits (ECMA-262 §21.1.3.3), so beyond 10^-100 the text takes an exponent instead.
 */
function fixedText(v: number, place: number): string {
  if (place >= 0) return String(Math.round(v));
  if (-place <= 100) return v.toFixed(-place);
  const exponent = v === 0 ? place : Math.floor(Math.log10(Math.abs(v)));
  return v.toExponential(Math.min(100, Math.max(0, exponent - place)));
}

/** Format `v` with its last digit at decimal exponent `place`. */
export function formatAtPlace(v: number, place: number): string {
  const rounded = toPlace(v, place, 'round');
  const text = fixedText(rounded, place);
  return /^-0(\.0+)?$/.test(text) ? text.slice(1) : text;
}

/**
 * Round U to `digits` significant digits (EA-4/02 5 % rule).
 * @example roundUncertainty(0.058524) // { text: "0.059", place: -3, roundedUp: false }
 * @example roundUncertainty(1.4, 1) // normal rounding gives 1 (−29 %), so "2"
 */
export function roundUncertainty(U: number, digits: 1 | 2 = 2): RoundedUncertainty {
  if (!(U > 0) || !Number.isFinite(U)) return { value: 0, place: 0, text: '0', roundedUp: false };
  let place = Math.floor(Math.log10(U)) - (digits - 1);
  // log10 may be off by one right at a power of ten.
  if (U / 10 ** place >= 10 ** digits * (1 - NOISE)) place += 1;
  if (U / 10 ** place < 10 ** (digits - 1) * (1 - NOISE)) place -= 1;
  let value = toPlace(U, place, 'round');
  let roundedUp = false;
  if (value < U * 0.95) {
    value = toPlace(U, place, 'up');
    roundedUp = true;
  }
  // 9.96 → 10.0: the carry adds a digit; keep `digits` significant digits.
  if (value >= 10 ** (place + digits) * (1 - NOISE)) place += 1;
  const text = fixedText(value, place);
  return { value, place, text, roundedUp };
}

export interface ReportedStrings {
  value: string;
  U: string;
  unit: string;
  k: string;
}

/**
 * The `reported` strings of a result. When U = 0 the value is given to six significant digits.
 * @example reportResult(10000.025, 0.058524, 2.0, 'g') // { value: "10000.025", U: "0.059", unit: "g", k: "2.00" }
 */
export function reportResult(y: number, U: number, k: number, unit: string, digits: 1 | 2 = 2): ReportedStrings {
  const r = roundUncertainty(U, digits);
  const value = r.value > 0 ? formatAtPlace(y, r.place) : String(Number(y.toPrecision(6)));
  return { value, U: r.text, unit, k: k.toFixed(2) };
}
