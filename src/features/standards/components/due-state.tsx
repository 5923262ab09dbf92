import type { DueState } from '../../../../shared/schemas/standards.schema';
import { cn } from '../../../lib/cn';

const days = (n: number) => `${n} ${Math.abs(n) === 1 ? 'day' : 'days'}`;

/** Calibration due state in words with a shape (never colour alone). */
export function DueStateText({ due, daysToDue, className }: { due: DueState; daysToDue: number; className?: string }) {
  if (due === 'overdue') {
    return (
      <span className={cn('inline-flex items-center gap-1 font-semibold text-danger', className)}>
        <span aria-hidden="true">▲</span>
        Overdue by {days(-daysToDue)}
      </span>
    );
  }
  if (due === 'due_soon') {
    return (
      <span className={cn('inline-flex items-center gap-1 font-semibold text-warn', className)}>
        <span aria-hidden="true">◆</span>
        {daysToDue === 0 ? 'Due today' : `Due soon: in ${days(daysToDue)}`}
      </span>
    );
  }
  return (
    <span className={cn('inline-flex items-center gap-1 text-ok', className)}>
      <span aria-hidden="true">●</span>
      In date
    </span>
  );
}
