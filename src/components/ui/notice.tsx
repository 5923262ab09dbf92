import type { ReactNode } from 'react';
import { cn } from '../../lib/cn';

type Tone = 'info' | 'warn' | 'danger' | 'ok';

const tones: Record<Tone, { box: string; word: string }> = {
  info: { box: 'border-info bg-info-soft text-ink', word: 'text-info' },
  warn: { box: 'border-warn bg-warn-soft text-ink', word: 'text-warn' },
  danger: { box: 'border-danger bg-danger-soft text-ink', word: 'text-danger' },
  ok: { box: 'border-ok bg-ok-soft text-ink', word: 'text-ok' },
};

/** A boxed message. The tone is also said in words (`label`), never by colour alone. */
export function Notice({
  tone = 'info',
  label,
  children,
  role,
  className,
}: {
  tone?: Tone;
  label: string;
  children: ReactNode;
  role?: 'alert' | 'status';
  className?: string;
}) {
  return (
    <div role={role} className={cn('rounded-card border-l-4 px-4 py-3 text-sm', tones[tone].box, className)}>
      <p className={cn('font-semibold', tones[tone].word)}>{label}</p>
      <div className="mt-1">{children}</div>
    </div>
  );
}
