/** Validation of the GUM framework against Monte Carlo (JCGM 101:2008 §8) and §7.9.2 tolerances. */
export { validateGumAgainstMcm } from './validate-gum-against-mcm';
export { numericalTolerance } from './numerical-tolerance';
