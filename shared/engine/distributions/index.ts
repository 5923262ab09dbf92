/** Input distributions of JCGM 101:2008 §6.4: GUM summaries and Monte Carlo samplers. */
export { summarizeInput, gumMoments } from './summarize-input';
export { resolveDistribution, type Resolved } from './resolve';
export { createSampler, type ColumnSampler } from './create-sampler';
export { correlationGroups, type CorrelationGroup } from './correlation-groups';
export { createCorrelatedNormalSampler, type GroupSampler } from './correlated-normal-sampler';
export { cholesky } from './cholesky';
export { createGammaSampler } from './gamma';
export { fillStandardNormal, nextStandardNormal, type RandomSource } from './standard-normal';
