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
 * Mono, whose every glyph advances 0.6 em: 1.25 em (2.5 em) leaves room for rounding. Not 2ch:
 * the Greek face of Noto Sans Mono (src/styles/fonts.css) is declared after the Latin one and
 * without a unicode-range, so it is the first face for every character; it has no "0", and the
 * browser then takes 1ch as 0.5 em (CSS Values and Units Level 4, §6.1.1 `ch`). A 2ch slot was
 * narrower than "°C", which widened it and moved those rows' figures 2.6 px to the left.
 */
export function UnitSlot({ children, wide = false }: { children: string; wide?: boolean }) {
  return <span className={cn('inline-block text-left text-ink-muted', wide ? 'min-w-[2.5em]' : 'min-w-[1.25em]')}>{children}</span>;
}
