/** Minimal typings for the parts of jstat 1.9.6 the engine uses (jstat ships no types). */
declare module 'jstat' {
  interface JStat {
    studentt: { inv(p: number, dof: number): number; cdf(x: number, dof: number): number };
    normal: { inv(p: number, mean: number, sd: number): number; cdf(x: number, mean: number, sd: number): number };
  }
  /** jstat is CommonJS: its module object is jStat itself, with a `jStat` property (Node ESM sees only the default export). */
  const jstat: JStat & { jStat: JStat };
  export default jstat;
}
