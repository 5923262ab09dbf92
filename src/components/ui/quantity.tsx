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
 * with and without a unit end in one column of a budget table.
 */
export function UnitSlot({ children, wide = false }: { children: string; wide?: boolean }) {
  return <span className={cn('inline-block text-left text-ink-muted', wide ? 'min-w-[4ch]' : 'min-w-[2ch]')}>{children}</span>;
}
