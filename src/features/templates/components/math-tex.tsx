import katex from 'katex';
import 'katex/dist/katex.min.css';
import { useMemo } from 'react';
import { cn } from '../../../lib/cn';
import { subscriptUpright, symbolTex, symbolText } from './symbol-tex';

/** TeX typeset by KaTeX (fonts bundled by Vite from katex/dist; nothing from a CDN). */
export function MathTex({ tex, display = false, className, label }: { tex: string; display?: boolean; className?: string; label?: string }) {
  const html = useMemo(() => katex.renderToString(tex, { throwOnError: false, displayMode: display, output: 'htmlAndMathml' }), [tex, display]);
  return <span className={cn('text-ink', className)} aria-label={label} dangerouslySetInnerHTML={{ __html: html }} />;
}

/** A model symbol in running text: italic base (Greek where spelled), upright descriptive subscript. */
export function Sym({ name, className }: { name: string; className?: string }) {
  const { base, sub } = symbolText(name);
  const upright = sub !== null && subscriptUpright(sub);
  return (
    <span className={cn('whitespace-nowrap', className)} title={name}>
      <i>{base}</i>
      {sub !== null && <sub className={upright ? 'not-italic' : 'italic'}>{sub}</sub>}
    </span>
  );
}

export { symbolTex };
