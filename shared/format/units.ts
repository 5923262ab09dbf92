/**
 * Units shown to people, and conversions between them and the SI units used inside.
 *
 * Display conventions (SI Brochure, 9th ed. (2019) §5.4.3 and §5.4.6; ISO 80000-1:2022 §7.2):
 * - A space between the number and the unit, also for "%" and "°C"; none for the plane-angle
 *   signs °, ′, ″.
 * - Unit products written with a space and negative exponents as superscripts:
 *   "W m⁻² sr⁻¹ nm⁻¹".
 * - The micro prefix as U+00B5 MICRO SIGN ("µm"), the character most fonts and keyboards give.
 *
 * The engine computes in SI (K, m, W m⁻² sr⁻¹ m⁻¹). Conversions here are exact scalings or the
 * ITS-90 offset 273.15 K (SI Brochure §2.3.1); results are rounded to 15 significant digits to
 * hide binary round-off (650e-9 m → 650 nm, not 650.0000000000001 nm).
 */
import { formatNumber, superscript, type FormatNumberOptions } from './number';

const NO_SPACE_UNITS = new Set(['°', '′', '″']);

/** Aliases people or files may type, mapped to the display form. */
const UNIT_ALIASES: Record<string, string> = {
  degC: '°C',
  'deg C': '°C',
  Celsius: '°C',
  um: 'µm',
  'μm': 'µm', // U+03BC GREEK SMALL LETTER MU → U+00B5 MICRO SIGN
  percent: '%',
};

/**
 * Turns an ASCII unit ("W m-2 sr-1 nm-1", "W*m^-2*sr^-1", "um", "degC") into its display form
 * ("W m⁻² sr⁻¹ nm⁻¹", "W m⁻² sr⁻¹", "µm", "°C"). Already-formatted units pass unchanged.
 */
export function formatUnit(unit: string): string {
  const trimmed = unit.trim();
  if (trimmed === '') return '';
  if (UNIT_ALIASES[trimmed]) return UNIT_ALIASES[trimmed];
  return trimmed
    .split(/[\s*·]+/)
    .filter(Boolean)
    .map((factor) => {
      const m = /^([^\d^+-]+?)\^?([+-]?\d+)$/.exec(factor);
      const base = m ? m[1] : factor;
      const shown = UNIT_ALIASES[base] ?? base.replace(/^u(?=[a-zA-Z])/, 'µ').replace(/μ/g, 'µ');
      return m ? `${shown}${superscript(m[2].replace('+', ''))}` : shown;
    })
    .join(' ');
}

/** "773.15 K", "12 %", "45°". The unit is formatted with {@link formatUnit}. */
export function formatQuantity(value: number, unit: string, options?: FormatNumberOptions): string {
  const shown = formatUnit(unit);
  const number = formatNumber(value, options);
  if (shown === '') return number;
  return NO_SPACE_UNITS.has(shown) ? `${number}${shown}` : `${number} ${shown}`;
}

/** Rounds to 15 significant digits (hides binary noise from decimal scalings). */
function clean(x: number): number {
  return Number.isFinite(x) ? Number(x.toPrecision(15)) : x;
}

/** Celsius temperature offset, exactly 273.15 K (SI Brochure §2.3.1). */
export const CELSIUS_OFFSET = 273.15;

/** T/K → t/°C. For a temperature difference or an uncertainty use {@link convertInterval}. */
export const kelvinToCelsius = (kelvin: number): number => clean(kelvin - CELSIUS_OFFSET);
/** t/°C → T/K. */
export const celsiusToKelvin = (celsius: number): number => clean(celsius + CELSIUS_OFFSET);
export const metresToNanometres = (m: number): number => clean(m * 1e9);
export const nanometresToMetres = (nm: number): number => clean(nm * 1e-9);
export const metresToMicrometres = (m: number): number => clean(m * 1e6);
export const micrometresToMetres = (um: number): number => clean(um * 1e-6);
/** Spectral radiance per metre of wavelength → per nanometre (W m⁻² sr⁻¹ m⁻¹ → W m⁻² sr⁻¹ nm⁻¹). */
export const perMetreToPerNanometre = (perM: number): number => clean(perM * 1e-9);
/** W m⁻² sr⁻¹ nm⁻¹ → W m⁻² sr⁻¹ m⁻¹. */
export const perNanometreToPerMetre = (perNm: number): number => clean(perNm * 1e9);
/** W m⁻² sr⁻¹ m⁻¹ → W m⁻² sr⁻¹ µm⁻¹. */
export const perMetreToPerMicrometre = (perM: number): number => clean(perM * 1e-6);
/** W m⁻² sr⁻¹ µm⁻¹ → W m⁻² sr⁻¹ m⁻¹. */
export const perMicrometreToPerMetre = (perUm: number): number => clean(perUm * 1e6);

/** A display unit: its SI unit, the factor to SI and (temperatures only) an offset. */
interface UnitDefinition {
  si: string;
  factor: number;
  offset: number;
}

const UNITS: Record<string, UnitDefinition> = {
  K: { si: 'K', factor: 1, offset: 0 },
  mK: { si: 'K', factor: 1e-3, offset: 0 },
  '°C': { si: 'K', factor: 1, offset: CELSIUS_OFFSET },
  m: { si: 'm', factor: 1, offset: 0 },
  mm: { si: 'm', factor: 1e-3, offset: 0 },
  'µm': { si: 'm', factor: 1e-6, offset: 0 },
  nm: { si: 'm', factor: 1e-9, offset: 0 },
  'W m⁻² sr⁻¹ m⁻¹': { si: 'W m⁻² sr⁻¹ m⁻¹', factor: 1, offset: 0 },
  'W m⁻² sr⁻¹ µm⁻¹': { si: 'W m⁻² sr⁻¹ m⁻¹', factor: 1e6, offset: 0 },
  'W m⁻² sr⁻¹ nm⁻¹': { si: 'W m⁻² sr⁻¹ m⁻¹', factor: 1e9, offset: 0 },
  'W m⁻² m⁻¹': { si: 'W m⁻² m⁻¹', factor: 1, offset: 0 },
  'W m⁻² µm⁻¹': { si: 'W m⁻² m⁻¹', factor: 1e6, offset: 0 },
  'W m⁻² nm⁻¹': { si: 'W m⁻² m⁻¹', factor: 1e9, offset: 0 },
  'W m⁻² sr⁻¹': { si: 'W m⁻² sr⁻¹', factor: 1, offset: 0 },
  'W m⁻²': { si: 'W m⁻²', factor: 1, offset: 0 },
};

/** Units {@link convert} knows, in display form. */
export const CONVERTIBLE_UNITS = Object.keys(UNITS);

function definition(unit: string): UnitDefinition {
  const def = UNITS[formatUnit(unit)];
  if (!def) throw new RangeError(`Unknown unit "${unit}"; known: ${CONVERTIBLE_UNITS.join(', ')}`);
  return def;
}

function checkCompatible(from: string, to: string): [UnitDefinition, UnitDefinition] {
  const a = definition(from);
  const b = definition(to);
  if (a.si !== b.si) throw new RangeError(`Cannot convert ${formatUnit(from)} to ${formatUnit(to)}: different quantities`);
  return [a, b];
}

/**
 * Converts a value (a temperature, a wavelength, a radiance) from one unit to another.
 * °C ↔ K applies the offset; use {@link convertInterval} for differences and uncertainties.
 * @throws RangeError for an unknown unit or units of different quantities.
 */
export function convert(value: number, from: string, to: string): number {
  const [a, b] = checkCompatible(from, to);
  if (a === b) return value;
  return clean(((value + a.offset) * a.factor) / b.factor - b.offset);
}

/**
 * Converts a difference or an uncertainty: scalings only, no offset (an uncertainty of 0.05 K
 * is 0.05 °C; GUM 7.2 reports u and U in the unit of the result).
 */
export function convertInterval(value: number, from: string, to: string): number {
  const [a, b] = checkCompatible(from, to);
  if (a === b) return value;
  return clean((value * a.factor) / b.factor);
}

/** A unit as printed beside a figure: formatUnit, and nothing for a dimensionless quantity ("1"). */
export function printedUnit(unit: string): string {
  const f = formatUnit(unit);
  return f === '1' ? '' : f;
}

/**
 * One budget row's estimate, u(x_i) and c_i in the unit shown for the input (the engine's are SI):
 * the estimate converts as a position (°C has an offset), u as a width, and c_i per shown unit
 * (∂y/∂x_shown = ∂y/∂x_SI · one shown unit in SI), so |c_i| u(x_i) is unchanged (SI Brochure
 * §2.3.1). An unknown or incompatible unit leaves SI. `unit` is the unit to print beside the
 * figures: empty for a dimensionless input ("1").
 */
export function inDisplayUnit(b: { estimate: number; u: number; c: number }, si: string, shown: string | undefined): { estimate: number; u: number; c: number; unit: string } {
  if (!shown || formatUnit(shown) === formatUnit(si)) return { estimate: b.estimate, u: b.u, c: b.c, unit: printedUnit(si) };
  try {
    return { estimate: convert(b.estimate, si, shown), u: convertInterval(b.u, si, shown), c: b.c * convertInterval(1, shown, si), unit: printedUnit(shown) };
  } catch {
    return { estimate: b.estimate, u: b.u, c: b.c, unit: printedUnit(si) };
  }
}

/**
 * The unit of a sensitivity coefficient c_i = ∂y/∂x_i (JCGM 100:2008 §5.1.3): the unit of y per
 * unit of x_i, both as shown. Empty when the two units have the same size (K per °C: a pure
 * number); the unit of y alone for a dimensionless input; "K/µm" for one unit per another, and
 * "W m⁻² sr⁻¹ nm⁻¹ K⁻¹" when y's unit is itself a product (SI Brochure, 9th ed. (2019) §5.4.6:
 * one solidus at most, products with negative exponents).
 */
export function sensitivityUnit(yUnit: string, xUnit: string): string {
  const y = printedUnit(yUnit);
  const x = printedUnit(xUnit);
  if (x === '') return y;
  if (x === y) return '';
  try {
    if (convertInterval(1, x, y) === 1) return '';
  } catch {
    /* different quantities: y per x */
  }
  const single = !/\s/.test(x) && !/[⁰¹²³⁴⁵⁶⁷⁸⁹⁻]/.test(x);
  if (y === '') return single ? `${x}⁻¹` : `1/(${x})`;
  if (!single) return `${y}/(${x})`;
  return /\s/.test(y) ? `${y} ${x}⁻¹` : `${y}/${x}`;
}
