import { sigma as SIGMA_SI } from './constants';

const sigma = SIGMA_SI; // module-local copy (fast in hot loops under every loader)

/**
 * Stefan–Boltzmann law, radiant exitance of a blackbody: M = σT⁴ in W m⁻², with
 * σ = 2π⁵k⁴/(15h³c²) from the exact 2019 SI constants (≈ 5.670 374 419e-8 W m⁻² K⁻⁴).
 * Special cases: T < 0 or NaN → NaN; T = 0 → 0.
 *
 * @param T thermodynamic temperature / K
 * @example stefan_boltzmann(1000) // ≈ 56 703.744 W m⁻²
 */
export function stefan_boltzmann(T: number): number {
  if (!(T >= 0)) return NaN;
  const t2 = T * T;
  return sigma * t2 * t2;
}
