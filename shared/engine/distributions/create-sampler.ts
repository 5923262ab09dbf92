import type { Distribution } from '../types';
import { createGammaSampler as createGammaImported } from './gamma';
import { resolveDistribution, type Resolved } from './resolve';
import { fillStandardNormal as fillNormalImported, nextStandardNormal as nextNormalImported, type RandomSource } from './standard-normal';

// Module-local copies of imported functions: some loaders (tsx) turn imported bindings into
// getter calls, which costs in per-trial loops.
const createGammaSampler = createGammaImported, nextStandardNormal = nextNormalImported, fillStandardNormal = fillNormalImported;

/** Fills a column of Monte Carlo draws of one input from a random source. */
export interface ColumnSampler {
  fill(rng: RandomSource, out: Float64Array, n: number): void;
}

/**
 * Scaled-shifted Student-t variates: t = z / √(χ²_ν/ν) with z ~ N(0,1) and χ²_ν = 2·Gamma(ν/2)
 * (Marsaglia–Tsang), x = μ + s·t (JCGM 101:2008 §6.4.9). z and χ² are drawn trial by trial so
 * the stream, and therefore the result, does not depend on the chunk size.
 */
function scaledTSampler(mean: number, scale: number, dof: number): ColumnSampler {
  const gamma = createGammaSampler(dof / 2);
  return {
    fill(rng, out, n) {
      for (let i = 0; i < n; i++) {
        const z = nextStandardNormal(rng);
        const chi2 = 2 * gamma(rng);
        out[i] = mean + scale * (z / Math.sqrt(chi2 / dof));
      }
    },
  };
}

function samplerFor(r: Resolved): ColumnSampler {
  switch (r.type) {
    case 'normal': {
      const { mean, sd } = r;
      return {
        fill(rng, out, n) {
          fillStandardNormal(rng, out, n);
          for (let i = 0; i < n; i++) out[i] = mean + sd * out[i];
        },
      };
    }
    case 'rectangular': {
      const { a } = r, w = r.b - r.a;
      return {
        fill(rng, out, n) {
          rng.fill(out, n);
          for (let i = 0; i < n; i++) out[i] = a + w * out[i];
        },
      };
    }
    case 'triangular': {
      // Inverse distribution function of the triangle on [a, b] with mode c (JCGM 101 §6.4.5).
      const { a, b, c } = r, w = b - a, fc = (c - a) / w, kl = w * (c - a), kr = w * (b - c);
      return {
        fill(rng, out, n) {
          rng.fill(out, n);
          for (let i = 0; i < n; i++) {
            const u = out[i];
            out[i] = u < fc ? a + Math.sqrt(u * kl) : b - Math.sqrt((1 - u) * kr);
          }
        },
      };
    }
    case 'arcsine': {
      // ξ = (a + b)/2 + (b − a)/2 · sin(2πr) (JCGM 101 §6.4.6).
      const mid = (r.a + r.b) / 2, half = (r.b - r.a) / 2, twoPi = 2 * Math.PI;
      return {
        fill(rng, out, n) {
          rng.fill(out, n);
          for (let i = 0; i < n; i++) out[i] = mid + half * Math.sin(twoPi * out[i]);
        },
      };
    }
    case 'trapezoidal': {
      // ξ = a + (b − a)/2 · [(1 + β) r1 + (1 − β) r2] (JCGM 101 §6.4.4).
      const { a, beta } = r, half = (r.b - r.a) / 2;
      return {
        fill(rng, out, n) {
          for (let i = 0; i < n; i++) {
            const r1 = rng.next();
            out[i] = a + half * ((1 + beta) * r1 + (1 - beta) * rng.next());
          }
        },
      };
    }
    case 'curvilinear-trapezoid': {
      // a_s ~ R(a − d, a + d), b_s = a + b − a_s, ξ ~ R(a_s, b_s) (JCGM 101 §6.4.3; DESIGN.md).
      const { a, b, d } = r;
      return {
        fill(rng, out, n) {
          for (let i = 0; i < n; i++) {
            const as = a - d + 2 * d * rng.next();
            const bs = a + b - as;
            out[i] = as + (bs - as) * rng.next();
          }
        },
      };
    }
    case 'student-t':
    case 'readings': {
      const { mean, scale, dof } = r;
      if (scale === 0) return { fill: (_rng, out, n) => out.fill(mean, 0, n) };
      return scaledTSampler(mean, scale, dof);
    }
    case 'exponential': {
      // ξ = −μ ln r (JCGM 101 §6.4.10).
      const { mean } = r;
      return {
        fill(rng, out, n) {
          rng.fill(out, n);
          for (let i = 0; i < n; i++) out[i] = -mean * Math.log(out[i]);
        },
      };
    }
    case 'gamma': {
      const { scale } = r, gamma = createGammaSampler(r.shape);
      return {
        fill(rng, out, n) {
          for (let i = 0; i < n; i++) out[i] = scale * gamma(rng);
        },
      };
    }
    case 'constant': {
      const { value } = r;
      return { fill: (_rng, out, n) => out.fill(value, 0, n) };
    }
  }
}

/**
 * A Monte Carlo sampler for one input's distribution (JCGM 101:2008 §6.4), filling Float64Array
 * chunks from a seeded uniform source, with no allocation per trial. Each trial consumes the
 * stream in order, so filling in chunks of any size gives the same values as one fill. `readings` are sampled as the scaled-shifted t x̄ + (s/√n)·t_{n−1}
 * (§6.4.9); `student-t` as mean + scale·t_ν (its standard deviation scale·√(ν/(ν−2)) is larger
 * than the GUM's u = scale).
 *
 * @throws EngineError INVALID_DISTRIBUTION, TOO_FEW_READINGS (see resolveDistribution)
 * @example
 * const s = createSampler({ type: 'rectangular', min: 0, max: 1 }, 'x');
 * const out = new Float64Array(1000); s.fill(createRandom(1), out, 1000);
 */
export function createSampler(dist: Distribution, symbol: string): ColumnSampler {
  return samplerFor(resolveDistribution(dist, symbol));
}
