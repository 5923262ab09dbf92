import { EngineError } from '../errors';
import type { Distribution } from '../types';

/** A distribution with its parameters checked and put in one canonical form per type. */
export type Resolved =
  | { type: 'normal'; mean: number; sd: number }
  | { type: 'rectangular'; a: number; b: number }
  | { type: 'triangular'; a: number; b: number; c: number }
  | { type: 'arcsine'; a: number; b: number }
  | { type: 'trapezoidal'; a: number; b: number; beta: number }
  | { type: 'curvilinear-trapezoid'; a: number; b: number; d: number }
  | { type: 'student-t'; mean: number; scale: number; dof: number }
  | { type: 'readings'; mean: number; scale: number; dof: number; n: number }
  | { type: 'exponential'; mean: number }
  | { type: 'gamma'; shape: number; scale: number }
  | { type: 'constant'; value: number };

function fail(symbol: string, message: string): never {
  throw new EngineError('INVALID_DISTRIBUTION', `input "${symbol}": ${message}`);
}

function num(symbol: string, name: string, v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) fail(symbol, `${name} must be a finite number`);
  return v;
}

function limits(symbol: string, d: Record<string, unknown>): { a: number; b: number } {
  const a = num(symbol, 'min', d.min), b = num(symbol, 'max', d.max);
  if (!(a < b)) fail(symbol, `min (${a}) must be less than max (${b})`);
  return { a, b };
}

/**
 * Check a distribution's parameters and bring them to one form per type (JCGM 101:2008 §6.4).
 * The zod schema catches most mistakes; this is the engine's own guard so it never crashes on a
 * document that bypassed the schema. Throws EngineError('INVALID_DISTRIBUTION') naming the input;
 * too few readings give EngineError('TOO_FEW_READINGS').
 *
 * Readings x_1 … x_n become mean x̄, scale s/√n with s² = Σ(x_i − x̄)²/(n − 1), ν = n − 1
 * (JCGM 100 4.2.1–4.2.3; JCGM 101 §6.4.9.7). x̄ and s are computed in two passes.
 */
export function resolveDistribution(dist: Distribution, symbol: string): Resolved {
  const d = dist as Record<string, unknown> & { type: string };
  switch (d.type) {
    case 'normal': {
      const mean = num(symbol, 'mean', d.mean);
      let sd: number;
      if (d.sd !== undefined) sd = num(symbol, 'sd', d.sd);
      else {
        const U = num(symbol, 'expanded', d.expanded), k = num(symbol, 'k', d.k);
        if (!(k > 0)) fail(symbol, `k must be greater than zero, got ${k}`);
        if (U < 0) fail(symbol, `expanded uncertainty must not be negative, got ${U}`);
        sd = U / k;
      }
      if (sd < 0) fail(symbol, `sd must not be negative, got ${sd}`);
      return { type: 'normal', mean, sd };
    }
    case 'rectangular': {
      if (d.halfWidth !== undefined) {
        const mean = num(symbol, 'mean', d.mean), hw = num(symbol, 'halfWidth', d.halfWidth);
        if (!(hw > 0)) fail(symbol, `halfWidth must be greater than zero, got ${hw}`);
        return { type: 'rectangular', a: mean - hw, b: mean + hw };
      }
      return { type: 'rectangular', ...limits(symbol, d) };
    }
    case 'triangular': {
      const { a, b } = limits(symbol, d);
      const c = d.mode === undefined || d.mode === null ? (a + b) / 2 : num(symbol, 'mode', d.mode);
      if (c < a || c > b) fail(symbol, `mode (${c}) must lie between min and max`);
      return { type: 'triangular', a, b, c };
    }
    case 'arcsine':
      return { type: 'arcsine', ...limits(symbol, d) };
    case 'trapezoidal': {
      const { a, b } = limits(symbol, d);
      const beta = num(symbol, 'beta', d.beta);
      if (beta < 0 || beta > 1) fail(symbol, `beta must lie between 0 and 1, got ${beta}`);
      return { type: 'trapezoidal', a, b, beta };
    }
    case 'curvilinear-trapezoid': {
      const { a, b } = limits(symbol, d);
      const dd = num(symbol, 'd', d.d);
      if (dd < 0 || dd > (b - a) / 2) fail(symbol, `d must lie between 0 and (max − min)/2, got ${dd}`);
      return { type: 'curvilinear-trapezoid', a, b, d: dd };
    }
    case 'student-t': {
      const mean = num(symbol, 'mean', d.mean), scale = num(symbol, 'scale', d.scale);
      const dof = typeof d.dof === 'number' ? d.dof : NaN;
      if (scale < 0) fail(symbol, `scale must not be negative, got ${scale}`);
      if (!(dof > 0)) fail(symbol, `dof must be greater than zero, got ${String(d.dof)}`);
      return { type: 'student-t', mean, scale, dof };
    }
    case 'readings': {
      const values = d.values;
      if (!Array.isArray(values)) fail(symbol, 'values must be an array of numbers');
      values.forEach((v, i) => num(symbol, `reading ${i + 1}`, v));
      const n = values.length;
      if (n < 2) throw new EngineError('TOO_FEW_READINGS', `input "${symbol}": at least two readings are needed for a Type A evaluation, got ${n}`);
      let sum = 0;
      for (const v of values as number[]) sum += v;
      const mean = sum / n;
      let ss = 0;
      for (const v of values as number[]) ss += (v - mean) ** 2;
      const s = Math.sqrt(ss / (n - 1));
      return { type: 'readings', mean, scale: s / Math.sqrt(n), dof: n - 1, n };
    }
    case 'exponential': {
      const mean = num(symbol, 'mean', d.mean);
      if (!(mean > 0)) fail(symbol, `mean must be greater than zero, got ${mean}`);
      return { type: 'exponential', mean };
    }
    case 'gamma': {
      const shape = num(symbol, 'shape', d.shape), scale = num(symbol, 'scale', d.scale);
      if (!(shape > 0)) fail(symbol, `shape must be greater than zero, got ${shape}`);
      if (!(scale > 0)) fail(symbol, `scale must be greater than zero, got ${scale}`);
      return { type: 'gamma', shape, scale };
    }
    case 'constant':
      return { type: 'constant', value: num(symbol, 'value', d.value) };
    default:
      return fail(symbol, `unknown distribution type "${String(d.type)}"`);
  }
}
