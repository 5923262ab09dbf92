/**
 * Display units offered for an input's SI unit, and conversion of distribution parameters:
 * positions (mean, min, max, mode, value, readings) convert with the offset (°C ↔ K), widths
 * (sd, expanded, halfWidth, scale) as intervals (SI Brochure §2.3.1; GUM 7.2).
 */
import { convert, convertInterval, formatUnit } from '../../../../shared/format/units';
import type { Distribution } from '../../../../shared/schemas/budget.schema';

const CHOICES: Record<string, string[]> = {
  K: ['K', '°C', 'mK'],
  m: ['m', 'mm', 'µm', 'nm'],
};

export function unitChoices(si: string | undefined): string[] {
  if (!si) return [];
  return CHOICES[formatUnit(si)] ?? [formatUnit(si)];
}

export const POSITION_KEYS = new Set(['mean', 'min', 'max', 'mode', 'value']);
export const WIDTH_KEYS = new Set(['sd', 'expanded', 'halfWidth', 'scale', 'd']);

/** A parameter of the distribution in the display unit. */
export function toDisplay(key: string, v: number, si: string | undefined, shown: string | undefined): number {
  if (!si || !shown || formatUnit(si) === formatUnit(shown)) return v;
  if (POSITION_KEYS.has(key)) return convert(v, si, shown);
  if (WIDTH_KEYS.has(key)) return convertInterval(v, si, shown);
  return v;
}

export function fromDisplay(key: string, v: number, si: string | undefined, shown: string | undefined): number {
  if (!si || !shown || formatUnit(si) === formatUnit(shown)) return v;
  if (POSITION_KEYS.has(key)) return convert(v, shown, si);
  if (WIDTH_KEYS.has(key)) return convertInterval(v, shown, si);
  return v;
}

/** The parameter fields of each distribution form, in order, with their labels. */
export function parameterKeys(d: Distribution): Array<{ key: string; label: string }> {
  switch (d.type) {
    case 'normal':
      return 'sd' in d ? [{ key: 'mean', label: 'mean' }, { key: 'sd', label: 'u' }] : [{ key: 'mean', label: 'mean' }, { key: 'expanded', label: 'U' }, { key: 'k', label: 'k' }];
    case 'rectangular':
      return 'halfWidth' in d ? [{ key: 'mean', label: 'centre' }, { key: 'halfWidth', label: 'half-width a' }] : [{ key: 'min', label: 'min' }, { key: 'max', label: 'max' }];
    case 'triangular':
      return [{ key: 'min', label: 'min' }, { key: 'max', label: 'max' }, { key: 'mode', label: 'mode' }];
    case 'arcsine':
      return [{ key: 'min', label: 'min' }, { key: 'max', label: 'max' }];
    case 'trapezoidal':
      return [{ key: 'min', label: 'min' }, { key: 'max', label: 'max' }, { key: 'beta', label: 'β' }];
    case 'curvilinear-trapezoid':
      return [{ key: 'min', label: 'min' }, { key: 'max', label: 'max' }, { key: 'd', label: 'd' }];
    case 'student-t':
      return [{ key: 'mean', label: 'mean' }, { key: 'scale', label: 'scale' }, { key: 'dof', label: 'ν' }];
    case 'exponential':
      return [{ key: 'mean', label: 'mean' }];
    case 'gamma':
      return [{ key: 'shape', label: 'shape' }, { key: 'scale', label: 'scale' }];
    case 'constant':
      return [{ key: 'value', label: 'value' }];
    case 'readings':
      return [];
  }
}

export const DISTRIBUTION_LABELS: Record<Distribution['type'], string> = {
  normal: 'normal',
  rectangular: 'rectangular',
  triangular: 'triangular',
  arcsine: 'U-shaped (arcsine)',
  trapezoidal: 'trapezoidal',
  'curvilinear-trapezoid': 'curvilinear trapezoid',
  'student-t': 't (scaled, shifted)',
  readings: 'readings (Type A)',
  exponential: 'exponential',
  gamma: 'gamma',
  constant: 'exact (no uncertainty)',
};

/** A budget row's distribution (the engine's type keyword) as the editor names it; an unknown keyword as it is. */
export function distributionLabel(type: string): string {
  return Object.prototype.hasOwnProperty.call(DISTRIBUTION_LABELS, type) ? DISTRIBUTION_LABELS[type as Distribution['type']] : type;
}

/** A new distribution of `type` around the same estimate and, roughly, the same width. */
export function switchType(type: Distribution['type'], estimate: number, u: number): Distribution {
  const w = u > 0 ? u : Math.abs(estimate) * 1e-3 || 1e-3;
  switch (type) {
    case 'normal':
      return { type, mean: estimate, sd: w };
    case 'rectangular':
      return { type, mean: estimate, halfWidth: w * Math.sqrt(3) };
    case 'triangular':
      return { type, min: estimate - w * Math.sqrt(6), max: estimate + w * Math.sqrt(6) };
    case 'arcsine':
      return { type, min: estimate - w * Math.SQRT2, max: estimate + w * Math.SQRT2 };
    case 'trapezoidal':
      return { type, min: estimate - 2 * w, max: estimate + 2 * w, beta: 0.5 };
    case 'curvilinear-trapezoid':
      return { type, min: estimate - w * Math.sqrt(3), max: estimate + w * Math.sqrt(3), d: 0 };
    case 'student-t':
      return { type, mean: estimate, scale: w, dof: 10 };
    case 'exponential':
      return { type, mean: Math.max(estimate, w) };
    case 'gamma':
      return { type, shape: 2, scale: Math.max(estimate, w) / 2 };
    case 'constant':
      return { type, value: estimate };
    case 'readings':
      return { type, values: [estimate - w, estimate + w] };
  }
}
