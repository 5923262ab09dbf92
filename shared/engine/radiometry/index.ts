/**
 * The radiometric library of the model language (DESIGN.md, "The model language"), SI units:
 * m, K, W m⁻² sr⁻¹ m⁻¹. Exact 2019 SI constants everywhere, except `its90_ratio`, which uses the
 * ITS-90 c2 = 0.014 388 m K.
 *
 * Every function returns NaN outside its domain (non-positive temperature or wavelength, NaN
 * arguments) instead of throwing, so that a compiled kernel stays a plain loop; the Monte Carlo
 * and GUM code turn a non-finite model value into EngineError('NON_FINITE').
 *
 * For the model compiler: closed forms for symbolic differentiation are, with x = c2/(λT),
 *   planck = c1L/λ⁵/(exp(c2/(λT)) − 1),   planck_nu = 2hν³/c0²/(exp(hν/(kB T)) − 1),
 *   planck_temperature = c2/(λ log(1 + c1L/(λ⁵ L))),   stefan_boltzmann = sigma T⁴,
 *   wien_peak = WIEN_B/T,   sh_signal = C/(exp(c2/(A T + B)) − 1),
 *   sh_temperature = c2/(A log(C/S + 1)) − B/A,
 *   its90_ratio = (exp(c2_its90/(λ TX)) − 1)/(exp(c2_its90/(λ T)) − 1),
 *   ∂band_radiance/∂λ1 = −planck(λ1, T), ∂/∂λ2 = planck(λ2, T), ∂/∂T has no elementary form
 *   (use a central difference).
 */
import { band_radiance } from './band-radiance';
import { its90_ratio } from './its90-ratio';
import { planck } from './planck';
import { planck_nu } from './planck-nu';
import { planck_temperature } from './planck-temperature';
import { sh_signal } from './sh-signal';
import { sh_temperature } from './sh-temperature';
import { stefan_boltzmann } from './stefan-boltzmann';
import { wien_peak } from './wien-peak';

export { RADIATION_CONSTANTS, c1L, c2, c2_its90, sigma, h, c0, kB } from './constants';
export { WIEN_B } from './wien-peak';
export { band_radiance, its90_ratio, planck, planck_nu, planck_temperature, sh_signal, sh_temperature, stefan_boltzmann, wien_peak };

/** The library by name, with the number of arguments each function takes. */
export const RADIOMETRIC_FUNCTIONS: Readonly<Record<string, { arity: number; fn: (...a: number[]) => number }>> = Object.freeze({
  planck: { arity: 2, fn: planck as (...a: number[]) => number },
  planck_nu: { arity: 2, fn: planck_nu as (...a: number[]) => number },
  planck_temperature: { arity: 2, fn: planck_temperature as (...a: number[]) => number },
  band_radiance: { arity: 3, fn: band_radiance as (...a: number[]) => number },
  stefan_boltzmann: { arity: 1, fn: stefan_boltzmann as (...a: number[]) => number },
  wien_peak: { arity: 1, fn: wien_peak as (...a: number[]) => number },
  sh_signal: { arity: 4, fn: sh_signal as (...a: number[]) => number },
  sh_temperature: { arity: 4, fn: sh_temperature as (...a: number[]) => number },
  its90_ratio: { arity: 3, fn: its90_ratio as (...a: number[]) => number },
});
