import { describe, expect, it } from 'vitest';
import {
  RADIATION_CONSTANTS, RADIOMETRIC_FUNCTIONS, WIEN_B, band_radiance, its90_ratio, planck, planck_nu,
  planck_temperature, sh_signal, sh_temperature, stefan_boltzmann, wien_peak,
} from '../../../../shared/engine/radiometry';
import bandReference from './fixtures/band-radiance-reference.json';

const rel = (a: number, e: number) => Math.abs(a - e) / Math.abs(e);
const { c1L, c2, c2_its90, sigma, c0 } = RADIATION_CONSTANTS;

describe('radiation constants', () => {
  // /work/shared/reference/README.md §1: computed with numpy from the SI defining constants.
  it('derives c1L, c2, σ and b from the exact 2019 SI h, c, k', () => {
    expect(RADIATION_CONSTANTS.h).toBe(6.62607015e-34); // SI Brochure 2019, Table 1 (exact)
    expect(RADIATION_CONSTANTS.c0).toBe(299792458);
    expect(RADIATION_CONSTANTS.kB).toBe(1.380649e-23);
    expect(rel(c1L, 1.191042972e-16)).toBeLessThan(1e-9);
    expect(rel(c2, 1.438776877e-2)).toBeLessThan(1e-9);
    expect(rel(sigma, 5.670374419e-8)).toBeLessThan(1e-9);
    expect(rel(WIEN_B, 2.897771955e-3)).toBeLessThan(1e-9);
    expect(c2_its90).toBe(0.014388); // ITS-90 text (Preston-Thomas 1990)
  });
});

describe('planck and planck_nu', () => {
  // README §2 table: computed with numpy from the SI defining constants.
  const table = [
    { T: 1000, lambda: 1e-6, L: 6.720461e7, Lnu: 2.241705e-13 },
    { T: 3000, lambda: 650e-9, L: 6.415912e11, Lnu: 9.041998e-10 },
    { T: 5772, lambda: 500e-9, L: 2.623854e13, Lnu: 2.188059e-8 },
  ];
  it.each(table)('L_λ and L_ν at T = $T K, λ = $lambda m', ({ T, lambda, L, Lnu }) => {
    expect(rel(planck(lambda, T), L)).toBeLessThan(1e-6);
    expect(rel(planck_nu(c0 / lambda, T), Lnu)).toBeLessThan(1e-6);
    // L_ν = L_λ λ²/c at ν = c/λ (README §2).
    expect(rel(planck_nu(c0 / lambda, T), (planck(lambda, T) * lambda * lambda) / c0)).toBeLessThan(1e-13);
  });

  it('agrees with the Wien approximation to 1 part in 1000 for λT < 0.002 m K (IEC 60050-845)', () => {
    for (const lambdaT of [1e-4, 5e-4, 1e-3, 1.5e-3, 1.999e-3]) {
      const lambda = 1e-6, T = lambdaT / lambda;
      const wien = (c1L / lambda ** 5) * Math.exp(-c2 / (lambda * T));
      expect(rel(planck(lambda, T), wien)).toBeLessThan(1e-3);
    }
  });

  it('keeps full precision at small c2/λT (Rayleigh–Jeans side): series 1/(eˣ − 1) = 1/x − ½ + x/12 − x³/720', () => {
    // Common practice, no source: the Laurent series of 1/(eˣ − 1).
    const lambda = 1e-2, T = 1e4; // x ≈ 1.44e-4
    const x = c2 / (lambda * T);
    const series = (c1L / lambda ** 5) * (1 / x - 0.5 + x / 12 - x ** 3 / 720);
    expect(rel(planck(lambda, T), series)).toBeLessThan(1e-14);
  });

  it('never overflows to NaN: large c2/λT gives a tiny value or 0', () => {
    expect(planck(1e-9, 1)).toBe(0);
    expect(planck(1e-7, 300)).toBeGreaterThanOrEqual(0);
    expect(Number.isFinite(planck(1e-30, 1e3))).toBe(true);
    expect(planck_nu(1e20, 1)).toBe(0);
  });

  it('returns NaN for T ≤ 0, λ ≤ 0 and NaN arguments (documented special cases)', () => {
    for (const [l, t] of [[1e-6, 0], [1e-6, -1], [0, 1000], [-1e-6, 1000], [NaN, 1000], [1e-6, NaN]]) {
      expect(planck(l, t)).toBeNaN();
      expect(planck_nu(l === 0 ? 0 : c0 / l, t)).toBeNaN();
    }
  });

  it('has its maximum at wien_peak(T) (Wien displacement law, README §1 b)', () => {
    for (const T of [300, 1000, 5772]) {
      const peak = wien_peak(T);
      const Lp = planck(peak, T);
      expect(planck(peak * (1 + 1e-4), T)).toBeLessThan(Lp);
      expect(planck(peak * (1 - 1e-4), T)).toBeLessThan(Lp);
    }
    expect(rel(wien_peak(1000), 2.897771955e-6)).toBeLessThan(1e-9);
    expect(wien_peak(0)).toBeNaN();
  });
});

describe('planck_temperature', () => {
  it('inverts planck to 1e-12 across wavelengths and temperatures', () => {
    for (const lambda of [400e-9, 650e-9, 1.6e-6, 10e-6, 1e-3]) {
      for (const T of [77, 300, 1234.93, 3000, 1e5]) {
        expect(rel(planck_temperature(lambda, planck(lambda, T)), T)).toBeLessThan(1e-12);
      }
    }
  });
  it('handles radiances so small that c1L/(λ⁵L) overflows, and refuses L ≤ 0', () => {
    expect(Number.isFinite(planck_temperature(1e-9, 1e-300))).toBe(true);
    expect(planck_temperature(1e-6, 0)).toBeNaN();
    expect(planck_temperature(1e-6, -1)).toBeNaN();
  });
});

describe('stefan_boltzmann and band_radiance', () => {
  it('σT⁴ at 1000 K = 56 703.744 W/m², and π∫L_λ dλ over a wide band gives the same (README §1)', () => {
    expect(stefan_boltzmann(1000)).toBeCloseTo(56703.744, 3);
    expect(Math.abs(Math.PI * band_radiance(0, Infinity, 1000) - 56703.744)).toBeLessThan(1e-3);
    expect(Math.abs(Math.PI * band_radiance(1e-8, 1, 1000) - 56703.744)).toBeLessThan(1e-3);
    expect(stefan_boltzmann(-1)).toBeNaN();
  });

  // Fixture: mpmath 40-digit adaptive quadrature of L_λ in λ, exact SI constants
  // (fixtures/generate-band-radiance.py).
  it.each(bandReference)('matches a fine quadrature to 1e-9: [$lambda1, $lambda2] m at $T K', ({ lambda1, lambda2, T, band }) => {
    expect(rel(band_radiance(lambda1, lambda2, T), band)).toBeLessThan(1e-9);
  });

  it('is additive over adjacent bands and oriented (λ1 > λ2 gives the negative)', () => {
    const T = 800;
    const whole = band_radiance(1e-6, 20e-6, T);
    expect(rel(band_radiance(1e-6, 3e-6, T) + band_radiance(3e-6, 20e-6, T), whole)).toBeLessThan(1e-13);
    expect(band_radiance(20e-6, 1e-6, T)).toBe(-whole);
    expect(band_radiance(1e-6, 1e-6, T)).toBe(0);
    expect(band_radiance(1e-6, 2e-6, 0)).toBeNaN();
    expect(band_radiance(-1e-6, 2e-6, 300)).toBeNaN();
  });
});

describe('Sakuma–Hattori (CCT-WG5) and ITS-90 ratio', () => {
  // Parameters of a narrow band at 650 nm (README §3: A ≈ λ0(1 − 6σλ²/λ0²), B ≈ c2σλ²/(2λ0²));
  // illustrative values, invented for the test.
  const lambda0 = 650e-9, sl = 10e-9;
  const A = lambda0 * (1 - (6 * sl * sl) / (lambda0 * lambda0));
  const B = (c2 * sl * sl) / (2 * lambda0 * lambda0);
  const C = 2.5e9;

  it('sh_temperature inverts sh_signal (README §3: T = c2/(A ln(C/S + 1)) − B/A)', () => {
    for (const T of [600, 1234.93, 2000, 3000]) expect(rel(sh_temperature(sh_signal(T, A, B, C), A, B, C), T)).toBeLessThan(1e-12);
  });

  it('matches dS/dT = S² A c2 exp(c2/(AT+B)) / (C (AT+B)²) (README §3) by a central difference', () => {
    const T = 1337.33, hT = 1e-3;
    const S = sh_signal(T, A, B, C);
    const d = A * T + B;
    const analytic = (S * S * A * c2 * Math.exp(c2 / d)) / (C * d * d);
    const numeric = (sh_signal(T + hT, A, B, C) - sh_signal(T - hT, A, B, C)) / (2 * hT);
    expect(rel(numeric, analytic)).toBeLessThan(1e-7);
  });

  it('sh_signal is Planck-shaped: with A = λ, B = 0, C = c1L/λ⁵ it equals planck', () => {
    expect(rel(sh_signal(1500, 1e-6, 0, c1L / 1e-30), planck(1e-6, 1500))).toBeLessThan(1e-13);
    expect(sh_signal(10, 1e-9, 0, 1)).toBe(0);
    expect(sh_temperature(0, A, B, C)).toBeNaN();
  });

  it('its90_ratio equals the ITS-90 formula with c2 = 0.014 388 m K (README §3), and 1 at T = TX', () => {
    const lambda = 650e-9, TX = 1337.33;
    for (const T of [1400, 2000, 3000]) {
      const expected = Math.expm1(c2_its90 / (lambda * TX)) / Math.expm1(c2_its90 / (lambda * T));
      expect(rel(its90_ratio(lambda, T, TX), expected)).toBeLessThan(1e-13);
    }
    expect(its90_ratio(lambda, TX, TX)).toBe(1);
    // Differs from a ratio of planck() values (exact SI c2) by the choice of c2.
    expect(Math.abs(its90_ratio(lambda, 2000, TX) / (planck(lambda, 2000) / planck(lambda, TX)) - 1)).toBeGreaterThan(1e-6);
    // Large c2/λT: no ∞/∞.
    expect(Number.isFinite(its90_ratio(1e-8, 100, 120))).toBe(true);
    expect(its90_ratio(lambda, 0, TX)).toBeNaN();
  });
});

describe('RADIOMETRIC_FUNCTIONS', () => {
  it('lists the nine functions of DESIGN.md with their arities', () => {
    expect(Object.keys(RADIOMETRIC_FUNCTIONS).sort()).toEqual(
      ['band_radiance', 'its90_ratio', 'planck', 'planck_nu', 'planck_temperature', 'sh_signal', 'sh_temperature', 'stefan_boltzmann', 'wien_peak'],
    );
    for (const def of Object.values(RADIOMETRIC_FUNCTIONS)) expect(def.fn.length).toBe(def.arity);
  });
});
