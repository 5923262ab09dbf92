/**
 * The model language's vocabulary (DESIGN.md, "The model language"): the allowed functions with
 * their number of arguments, the radiometric library's names and the library constants.
 */

/** Elementary functions and how many arguments each accepts. `log` is the natural logarithm. */
export const ELEMENTARY_FUNCTIONS: Readonly<Record<string, { min: number; max: number; js: string }>> = {
  exp: { min: 1, max: 1, js: 'Math.exp' },
  log: { min: 1, max: 1, js: 'Math.log' },
  log10: { min: 1, max: 1, js: 'Math.log10' },
  sqrt: { min: 1, max: 1, js: 'Math.sqrt' },
  abs: { min: 1, max: 1, js: 'Math.abs' },
  sin: { min: 1, max: 1, js: 'Math.sin' },
  cos: { min: 1, max: 1, js: 'Math.cos' },
  tan: { min: 1, max: 1, js: 'Math.tan' },
  asin: { min: 1, max: 1, js: 'Math.asin' },
  acos: { min: 1, max: 1, js: 'Math.acos' },
  atan: { min: 1, max: 1, js: 'Math.atan' },
  min: { min: 1, max: 64, js: 'Math.min' },
  max: { min: 1, max: 64, js: 'Math.max' },
};

/** The radiometric library (shared/engine/radiometry) with its parameter names, SI units. */
export const RADIOMETRIC_SIGNATURES: Readonly<Record<string, readonly string[]>> = {
  planck: ['lambda', 'T'],
  planck_nu: ['nu', 'T'],
  planck_temperature: ['lambda', 'L'],
  band_radiance: ['lambda1', 'lambda2', 'T'],
  stefan_boltzmann: ['T'],
  wien_peak: ['T'],
  sh_signal: ['T', 'A', 'B', 'C'],
  sh_temperature: ['S', 'A', 'B', 'C'],
  its90_ratio: ['lambda', 'T', 'TX'],
};

/**
 * Library constants usable in any equation (exact SI values; c2_its90 = 0.014388 m K), plus `pi`.
 * An input, a document constant or an intermediate of the same name takes precedence.
 */
export const LIBRARY_CONSTANT_NAMES = ['c1L', 'c2', 'c2_its90', 'sigma', 'h', 'c0', 'kB', 'pi'] as const;

export const ALL_FUNCTION_NAMES = [...Object.keys(ELEMENTARY_FUNCTIONS), ...Object.keys(RADIOMETRIC_SIGNATURES)];

export function isAllowedFunction(name: string): boolean {
  return Object.prototype.hasOwnProperty.call(ELEMENTARY_FUNCTIONS, name) || Object.prototype.hasOwnProperty.call(RADIOMETRIC_SIGNATURES, name);
}

export function arityOf(name: string): { min: number; max: number } {
  const e = ELEMENTARY_FUNCTIONS[name];
  if (e) return { min: e.min, max: e.max };
  const r = RADIOMETRIC_SIGNATURES[name];
  return { min: r.length, max: r.length };
}
