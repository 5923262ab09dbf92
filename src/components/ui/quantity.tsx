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
