/**
 * Radiation constants from the exact defining constants of the 2019 SI (SI Brochure, 9th edition,
 * 2019, Table 1): h, c and k are exact; the derived values below are computed from them in double
 * precision (no rounded published value is used).
 */

/** Planck constant h / (J s), exact (SI Brochure 2019, Table 1). */
export const h = 6.62607015e-34;
/** Speed of light in vacuum c / (m s⁻¹), exact (SI Brochure 2019, Table 1). */
export const c0 = 299_792_458;
/** Boltzmann constant k / (J K⁻¹), exact (SI Brochure 2019, Table 1). */
export const kB = 1.380649e-23;

/** First radiation constant for spectral radiance c1L = 2hc² / (W m² sr⁻¹) ≈ 1.191 042 972e-16. */
export const c1L = 2 * h * c0 * c0;
/** Second radiation constant c2 = hc/k / (m K) ≈ 1.438 776 877e-2. */
export const c2 = (h * c0) / kB;
/**
 * Second radiation constant as fixed by the text of ITS-90 (Preston-Thomas, Metrologia 27 (1990)
 * 3–10, §2.4): c2 = 0.014 388 m K. Used only by `its90_ratio`.
 */
export const c2_its90 = 0.014388;
/** Stefan–Boltzmann constant σ = 2π⁵k⁴/(15h³c²) / (W m⁻² K⁻⁴) ≈ 5.670 374 419e-8. */
export const sigma = (2 * Math.PI ** 5 * kB ** 4) / (15 * h ** 3 * c0 ** 2);

/** The constants the model language offers by name (DESIGN.md, "The model language"). */
export const RADIATION_CONSTANTS = Object.freeze({ c1L, c2, c2_its90, sigma, h, c0, kB });
