/** Monte Carlo propagation of distributions (JCGM 101:2008 §7). */
export { runMonteCarlo, DEFAULT_CHUNK } from './run-monte-carlo';
export { coverageInterval, coverageCount } from './coverage-interval';
export { OutputAccumulator, EXACT_CAPACITY, FINE_BINS, PLOT_BINS, type Summary } from './output-accumulator';
export { selectInPlace } from './select-in-place';
