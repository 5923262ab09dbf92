import { formatQuantity, formatResult, type FormatNumberOptions } from '../../../shared/format';
import { cn } from '../../lib/cn';

/** A value with its unit ("773.15 K"), tabular figures, never broken across lines. */
export function Quantity({ value, unit, className, ...options }: { value: number; unit: string; className?: string } & FormatNumberOptions) {
  return <span className={cn('font-mono tabular-nums whitespace-nowrap', className)}>{formatQuantity(value, unit, options)}</span>;
}

/** A reported result: "y ± U unit (k = 2.05, p ≈ 95 %)". */
export function ResultText({ value, U, unit, k, p, className }: { value: number; U: number; unit: string; k: number; p: number; className?: string }) {
  return <span className={cn('font-mono tabular-nums', className)}>{formatResult(value, U, unit, k, p)}</span>;
}

/**
 * A unit after a figure in a fixed-width slot (`wide` for a c_i unit such as "K/µm"), so figures
 * with and without a unit end in one column of a budget table, decimal point under decimal point.
 *
 * The slot holds two glyphs ("°C", "µm"; wide: four) of the tables' monospaced font, Noto Sans
 * Mono, whose every glyph advances 0.6 em: 1.25 em (2.5 em) leaves room for rounding. In em, not
 * ch: `ch` is measured on the "0" of whichever face comes first for that character (CSS Values and
 * Units Level 4, §6.1.1), and when a face without a "0" came first (the Greek face before its
 * unicode-range was declared, src/styles/fonts.css) 1ch was 0.5 em and a 2ch slot narrower than
 * "°C", which moved those rows' figures 2.6 px to the left.
 */
export function UnitSlot({ children, wide = false }: { children: string; wide?: boolean }) {
  return <span className={cn('inline-block text-left text-ink-muted', wide ? 'min-w-[2.5em]' : 'min-w-[1.25em]')}>{children}</span>;
}
