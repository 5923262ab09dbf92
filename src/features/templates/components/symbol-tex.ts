/**
 * How model symbols read as mathematics: quantity symbols in italics, Greek letters where the
 * ASCII name spells one (lambda → λ, eps → ε, sigma → σ, nu → ν …), descriptive subscripts
 * upright (T_ref → T with subscript "ref"), and a leading d before a capital read as δ
 * (dT_res → δT_res), as ISO 80000-1 §7.1 and GUM usage write them. The reading of an identifier
 * (Greek, subscript, δ) is shared with the server's messages: shared/format/symbols.ts.
 */
import { parse, type MathNode } from 'mathjs';
import { splitSymbol } from '../../../../shared/format/symbols';

export { splitSymbol, subscriptUpright, symbolPlain, symbolText, type SymbolParts } from '../../../../shared/format/symbols';

/** Library constants with their conventional symbols. */
const CONSTANTS_TEX: Record<string, string> = {
  c1L: 'c_{1\\mathrm{L}}', c2: 'c_2', c2_its90: 'c_{2,\\mathrm{ITS\\text{-}90}}', sigma: '\\sigma', h: 'h', c0: 'c_0', kB: 'k_{\\mathrm{B}}', pi: '\\pi',
};

const LIBRARY_FUNCTIONS = new Set(['planck', 'planck_nu', 'planck_temperature', 'band_radiance', 'stefan_boltzmann', 'wien_peak', 'sh_signal', 'sh_temperature', 'its90_ratio']);

const texEscape = (s: string) => s.replace(/[\\{}$&#^_%~]/g, (c) => `\\${c}`);

export function symbolTex(name: string): string {
  if (CONSTANTS_TEX[name]) return CONSTANTS_TEX[name];
  const p = splitSymbol(name);
  const base = p.greek ? `\\${p.base}` : p.base.length === 1 ? p.base : `\\mathit{${texEscape(p.base)}}`;
  const sub = p.sub === null ? '' : p.sub.startsWith('\\') || (p.sub.length === 1 && /[a-z]/i.test(p.sub)) ? `_{${p.sub}}` : `_{\\mathrm{${texEscape(p.sub)}}}`;
  return `${p.prefix ? '\\delta ' : ''}${base}${sub}`;
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
