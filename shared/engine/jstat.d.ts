/** Minimal typings for the parts of jstat 1.9.6 the engine uses (jstat ships no types). */
declare module 'jstat' {
  interface Quantile {
    inv(p: number, ...params: number[]): number;
    cdf(x: number, ...params: number[]): number;
  }
  export const jStat: {
    studentt: { inv(p: number, dof: number): number; cdf(x: number, dof: number): number };
    normal: { inv(p: number, mean: number, sd: number): number; cdf(x: number, mean: number, sd: number): number };
    [name: string]: Quantile | unknown;
  };
}
