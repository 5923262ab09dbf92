/** Monte Carlo propagation of distributions (JCGM 101:2008 §7). */
export { runMonteCarlo, DEFAULT_CHUNK, BLOCK_TRIALS, BlockStarts, TrialSampler, checkFinite } from './run-monte-carlo';
export { runMonteCarloInBlocks, computeBlock, type BlockTask, type BlockRunner } from './run-in-blocks';
export { coverageInterval, coverageCount } from './coverage-interval';
export { OutputAccumulator, EXACT_CAPACITY, FINE_BINS, PLOT_BINS, type Summary } from './output-accumulator';
export { selectInPlace } from './select-in-place';
export { McmWorkspace } from './workspace';
