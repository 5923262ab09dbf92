/** Seeded random numbers for Monte Carlo (JCGM 101:2008 Annex C). */
export { Xoshiro128StarStar } from './xoshiro128';
export { createStreams, createRandom } from './create-streams';
export { splitMix64 } from './splitmix64';
