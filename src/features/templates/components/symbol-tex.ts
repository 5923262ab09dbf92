/**
 * How model symbols read as mathematics: quantity symbols in italics, Greek letters where the
 * ASCII name spells one (lambda → λ, eps → ε, sigma → σ, nu → ν …), descriptive subscripts
 * upright (T_ref → T with subscript "ref"), and a leading d before a capital read as δ
 * (dT_res → δT_res), as ISO 80000-1 §7.1 and GUM usage write them.
 */
import { parse, type MathNode } from 'mathjs';

const GREEK: Record<string, string> = {
  alpha: 'alpha', beta: 'beta', gamma: 'gamma', delta: 'delta', eps: 'varepsilon', epsilon: 'varepsilon',
  zeta: 'zeta', eta: 'eta', theta: 'theta', kappa: 'kappa', lambda: 'lambda', mu: 'mu', nu: 'nu',
  xi: 'xi', rho: 'rho', sigma: 'sigma', tau: 'tau', phi: 'varphi', chi: 'chi', psi: 'psi', omega: 'omega',
  Gamma: 'Gamma', Delta: 'Delta', Theta: 'Theta', Lambda: 'Lambda', Sigma: 'Sigma', Phi: 'Phi', Omega: 'Omega',
};
const GREEK_TEXT: Record<string, string> = {
  alpha: 'α', beta: 'β', gamma: 'γ', delta: 'δ', varepsilon: 'ε', zeta: 'ζ', eta: 'η', theta: 'θ', kappa: 'κ',
  lambda: 'λ', mu: 'µ', nu: 'ν', xi: 'ξ', rho: 'ρ', sigma: 'σ', tau: 'τ', varphi: 'φ', chi: 'χ', psi: 'ψ', omega: 'ω',
  Gamma: 'Γ', Delta: 'Δ', Theta: 'Θ', Lambda: 'Λ', Sigma: 'Σ', Phi: 'Φ', Omega: 'Ω',
};

/** Library constants with their conventional symbols. */
const CONSTANTS_TEX: Record<string, string> = {
  c1L: 'c_{1\\mathrm{L}}', c2: 'c_2', c2_its90: 'c_{2,\\mathrm{ITS\\text{-}90}}', sigma: '\\sigma', h: 'h', c0: 'c_0', kB: 'k_{\\mathrm{B}}', pi: '\\pi',
};

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

const LIBRARY_FUNCTIONS = new Set(['planck', 'planck_nu', 'planck_temperature', 'band_radiance', 'stefan_boltzmann', 'wien_peak', 'sh_signal', 'sh_temperature', 'its90_ratio']);

const texEscape = (s: string) => s.replace(/[\\{}$&#^_%~]/g, (c) => `\\${c}`);

export function symbolTex(name: string): string {
  if (CONSTANTS_TEX[name]) return CONSTANTS_TEX[name];
  const p = splitSymbol(name);
  const base = p.greek ? `\\${p.base}` : p.base.length === 1 ? p.base : `\\mathit{${texEscape(p.base)}}`;
  const sub = p.sub === null ? '' : p.sub.startsWith('\\') || (p.sub.length === 1 && /[a-z]/i.test(p.sub)) ? `_{${p.sub}}` : `_{\\mathrm{${texEscape(p.sub)}}}`;
  return `${p.prefix ? '\\delta ' : ''}${base}${sub}`;
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
 * no markup (an <option>, a text-only chart label). The model identifier itself stays the key.
 */
export function symbolPlain(name: string): string {
  const { base, sub } = symbolText(name);
  return sub === null ? base : `${base}_${sub}`;
}

/** TeX of one equation "target = expression"; null when it cannot be read. */
export function equationTex(text: string): string | null {
  let node: MathNode;
  try {
    node = parse(text);
  } catch {
    return null;
  }
  const options = { parenthesis: 'auto' as const, implicit: 'show' as const, handler: (n: MathNode): string | undefined => handler(n) };
  const handler = (n: MathNode): string | undefined => {
    if (n.type === 'SymbolNode') return symbolTex((n as unknown as { name: string }).name);
    if (n.type === 'FunctionNode') {
      const f = n as unknown as { fn: { name?: string }; args: MathNode[] };
      const name = f.fn?.name ?? '';
      // mathjs typesets its own functions (exp, sqrt, log …); library names such as
      // planck_temperature would otherwise read their underscore as a subscript.
      if (name.includes('_') || LIBRARY_FUNCTIONS.has(name)) {
        return `\\operatorname{${texEscape(name)}}\\left(${f.args.map((a) => a.toTex(options)).join(',\\,')}\\right)`;
      }
    }
    return undefined;
  };
  const a = node as unknown as { type: string; object?: MathNode & { name?: string }; value?: MathNode };
  if (a.type === 'AssignmentNode' && a.object?.type === 'SymbolNode' && a.value) {
    return `\\displaystyle ${symbolTex(a.object.name!)} = ${a.value.toTex(options)}`;
  }
  return node.toTex(options);
}
