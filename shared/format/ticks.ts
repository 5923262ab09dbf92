/**
 * Axis ticks for charts on screen and in the certificate: positions at 1, 2 or 5 × 10ⁿ from
 * d3-array's `ticks` (the same rule as d3's linear scales), and one number of decimals for every
 * label of an axis, taken from the step, so an axis reads "0.0 0.5 1.0 1.5" rather than
 * "0 0.5 1 1.5" or "0.4878 1.088".
 */
import { tickStep, ticks } from 'd3-array';
import { formatNumber } from './number';

export interface AxisTicks {
  values: number[];
  /** Decimals that show every tick exactly (0 for steps of 1 and above). */
  decimals: number;
  /** The label of one tick, with the axis' decimals (a power of ten for very large or small steps). */
  label: (value: number) => string;
}

export function axisTicks(lo: number, hi: number, count = 5): AxisTicks {
  if (!(hi > lo) || !Number.isFinite(lo) || !Number.isFinite(hi)) {
    return { values: Number.isFinite(lo) ? [lo] : [], decimals: 0, label: (v) => formatNumber(v, { digits: 3 }) };
  }
  const values = ticks(lo, hi, count).map((v) => (v === 0 ? 0 : v)); // no −0
  const step = Math.abs(tickStep(lo, hi, count));
  const exponent = Math.floor(Math.log10(step) + 1e-9);
  // Steps of 2.5 × 10ⁿ do not occur in d3's rule (1, 2, 5 only), so one decimal per power suffices.
  const decimals = Math.max(0, -exponent);
  const extreme = Math.max(Math.abs(lo), Math.abs(hi));
  const scientific = step < 1e-3 || extreme >= 1e6;
  const label = scientific
    ? (v: number) => (v === 0 ? '0' : formatNumber(v, { digits: Math.max(1, Math.floor(Math.log10(Math.abs(v)) + 1e-9) - exponent + 1), notation: 'scientific' }))
    : (v: number) => formatNumber(v, { decimals, notation: 'fixed' });
  return { values, decimals, label };
}
