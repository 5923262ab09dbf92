/**
 * A plain test library of radiometric functions (direct formulas of DESIGN.md with the exact SI
 * constants, computed with JS Math): used to test the model compiler on its own, independently
 * of shared/engine/radiometry. c2 = hc/k, c1L = 2hc² (2019 SI defining constants).
 */
import type { RadiometricLibrary } from '../../../../shared/engine/model/library-types';

const h = 6.62607015e-34;
const c0 = 299792458;
const kB = 1.380649e-23;
const c1L = 2 * h * c0 * c0;
const c2 = (h * c0) / kB;
const sigma = (2 * Math.PI ** 5 * kB ** 4) / (15 * h ** 3 * c0 ** 2);
const c2_its90 = 0.014388;
const planck = (l: number, T: number) => c1L / l ** 5 / Math.expm1(c2 / (l * T));

function simpson(f: (x: number) => number, a: number, b: number, n = 2000): number {
  const w = (b - a) / n;
  let s = f(a) + f(b);
  for (let i = 1; i < n; i++) s += (i % 2 ? 4 : 2) * f(a + i * w);
  return (s * w) / 3;
}

export const stubLibrary: RadiometricLibrary = {
  constants: { c1L, c2, c2_its90, sigma, h, c0, kB },
  functions: {
    planck,
    planck_nu: (nu: number, T: number) => (2 * h * nu ** 3) / c0 ** 2 / Math.expm1((h * nu) / (kB * T)),
    planck_temperature: (l: number, L: number) => c2 / (l * Math.log1p(c1L / (l ** 5 * L))),
    band_radiance: (l1: number, l2: number, T: number) => simpson((l) => planck(l, T), l1, l2),
    stefan_boltzmann: (T: number) => sigma * T ** 4,
    wien_peak: (T: number) => c2 / 4.965114231744276 / T,
    sh_signal: (T: number, A: number, B: number, C: number) => C / Math.expm1(c2 / (A * T + B)),
    sh_temperature: (S: number, A: number, B: number, C: number) => c2 / (A * Math.log1p(C / S)) - B / A,
    its90_ratio: (l: number, T: number, TX: number) => Math.expm1(c2_its90 / (l * TX)) / Math.expm1(c2_its90 / (l * T)),
  },
};
