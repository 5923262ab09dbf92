/**
 * How a model identifier reads as a quantity symbol, in plain text: Greek letters where the
 * ASCII name spells one (lambda → λ, eps → ε, sigma → σ, nu → ν …), the part after "_" as the
 * subscript (T_ref → T with subscript "ref"), trailing digits as a subscript (x1 → x with
 * subscript "1"), and a leading d before a capital read as δ (dT_res → δT_res), as ISO 80000-1 §7.1 and GUM usage
 * write them. The client typesets these parts (src/features/templates/components/symbol-tex.ts), and
 * so does the certificate PDF (server/pdf: {@link symbolText} and {@link subscriptUpright});
 * messages from the server use {@link symbolPlain}. The model identifier itself stays the key.
 */

/** Greek names as TeX command names (without the backslash). */
const GREEK: Record<string, string> = {
  alpha: 'alpha', beta: 'beta', gamma: 'gamma', delta: 'delta', eps: 'varepsilon', epsilon: 'varepsilon',
  zeta: 'zeta', eta: 'eta', theta: 'theta', kappa: 'kappa', lambda: 'lambda', mu: 'mu', nu: 'nu',
  xi: 'xi', rho: 'rho', sigma: 'sigma', tau: 'tau', phi: 'varphi', chi: 'chi', psi: 'psi', omega: 'omega',
  Gamma: 'Gamma', Delta: 'Delta', Theta: 'Theta', Lambda: 'Lambda', Sigma: 'Sigma', Phi: 'Phi', Omega: 'Omega',
};
/**
 * The letters themselves. A quantity symbol takes the Greek letter, U+03BC GREEK SMALL LETTER MU
 * for "mu"; U+00B5 MICRO SIGN is the prefix micro and belongs to units only (shared/format/units.ts;
 * SI Brochure, 9th ed. (2019) §3).
 */
const GREEK_TEXT: Record<string, string> = {
  alpha: 'α', beta: 'β', gamma: 'γ', delta: 'δ', varepsilon: 'ε', zeta: 'ζ', eta: 'η', theta: 'θ', kappa: 'κ',
  lambda: 'λ', mu: 'μ', nu: 'ν', xi: 'ξ', rho: 'ρ', sigma: 'σ', tau: 'τ', varphi: 'φ', chi: 'χ', psi: 'ψ', omega: 'ω',
  Gamma: 'Γ', Delta: 'Δ', Theta: 'Θ', Lambda: 'Λ', Sigma: 'Σ', Phi: 'Φ', Omega: 'Ω',
};

/** An identifier's parts; a Greek base or subscript is given by its TeX name ("varepsilon", "\\lambda"). */
export type SymbolParts = { prefix: 'delta' | null; base: string; greek: boolean; sub: string | null };

export function splitSymbol(name: string): SymbolParts {
  const [head, ...rest] = name.split('_');
  let sub = rest.length ? rest.join(',') : null;
  let prefix: SymbolParts['prefix'] = null;
  let base = head;
  const d = /^d([A-Z].*)$/.exec(head);
  if (d) {
    prefix = 'delta';
    base = d[1];
  }
  const digits = /^([A-Za-z]+?)(\d+)$/.exec(base);
  if (digits && !GREEK[base]) {
    base = digits[1];
    sub = sub ? `${digits[2]},${sub}` : digits[2];
  }
  if (sub && GREEK[sub]) sub = `\\${GREEK[sub]}`;
  return { prefix, base: GREEK[base] ?? base, greek: base in GREEK, sub };
}

/** The symbol as plain text for HTML: base (Greek where spelled) and subscript, separately. */
export function symbolText(name: string): { base: string; sub: string | null } {
  const p = splitSymbol(name);
  const base = p.greek ? GREEK_TEXT[p.base] ?? p.base : p.base;
  const sub = p.sub?.startsWith('\\') ? GREEK_TEXT[p.sub.slice(1)] ?? p.sub : p.sub;
  return { base: `${p.prefix ? 'δ' : ''}${base}`, sub };
}

/**
 * Whether a subscript is set upright: a descriptive one (ref, bb, eff, a number) is, a single
 * letter standing for a quantity or an index (x_i) stays italic (ISO 80000-1 §7.1).
 */
export function subscriptUpright(sub: string): boolean {
  return !(sub.length === 1 && /[a-z]/i.test(sub));
}

/**
 * The symbol as one line of plain Unicode text ("ε_bb", "δT_res", "λ_eff"), for places that take
 * no markup (an <option>, a text-only chart label, a message). The model identifier stays the key.
 */
export function symbolPlain(name: string): string {
  const { base, sub } = symbolText(name);
  return sub === null ? base : `${base}_${sub}`;
}
