import { TEMPLATE_STATUS_LABELS, type TemplateStatus } from '../../../../shared/schemas/template.schema';
import { cn } from '../../../lib/cn';

const TONES: Record<TemplateStatus, string> = {
  draft: 'border-info text-info bg-info-soft',
  released: 'border-ok text-ok bg-ok-soft',
  retired: 'border-line-strong text-ink-muted bg-sunken',
};

/** A version's state, in words (colour only repeats it). */
export function StatusText({ status, className }: { status: TemplateStatus; className?: string }) {
  return <span className={cn('inline-block rounded-pill border px-2 py-0.5 text-xs font-semibold', TONES[status], className)}>{TEMPLATE_STATUS_LABELS[status]}</span>;
}
