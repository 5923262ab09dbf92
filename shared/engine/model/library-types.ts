export interface RadiometricLibrary {
  functions: Readonly<Record<string, (...args: number[]) => number>>;
  /** c1L c2 c2_its90 sigma h c0 kB, SI units. */
  constants: Readonly<Record<string, number>>;
}
