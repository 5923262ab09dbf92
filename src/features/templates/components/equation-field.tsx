import type { EquationIssue } from '../../../../shared/engine';
import type { UseFormRegisterReturn } from 'react-hook-form';
import { cn } from '../../../lib/cn';
import { MathTex } from './math-tex';
import { equationTex } from './symbol-tex';

/**
 * One model equation: the text (monospaced, so the caret line below lines up character for
 * character), the first problem found in it marked under the offending characters with the
 * message beside it, and the equation typeset as mathematics once it reads.
 */
export function EquationField({
  index,
  text,
  registration,
  issue,
  readOnly,
  onRemove,
}: {
  index: number;
  text: string;
  registration?: UseFormRegisterReturn;
  issue?: EquationIssue;
  readOnly?: boolean;
  onRemove?: () => void;
}) {
  const id = `equation-${index}`;
  const tex = issue ? null : equationTex(text);
  return (
    <li className="grid grid-cols-[2.5rem_1fr] gap-x-2 gap-y-1">
      <label htmlFor={id} className="pt-1.5 text-right text-xs font-semibold text-ink-muted">
        ({index + 1})
      </label>
      <div className="min-w-0">
        <div className="flex gap-2">
          <input
            id={id}
            {...registration}
            readOnly={readOnly}
            spellCheck={false}
            autoComplete="off"
            aria-label={`Equation ${index + 1}`}
            aria-invalid={issue ? true : undefined}
            aria-describedby={issue ? `${id}-error` : undefined}
            className={cn('w-full rounded-field border bg-surface px-3 py-1.5 font-mono text-sm text-ink', issue ? 'border-danger' : 'border-line-strong', readOnly && 'bg-sunken')}
          />
          {onRemove && !readOnly && (
            <button type="button" onClick={onRemove} className="rounded-field px-2 text-xs text-ink-muted hover:bg-sunken" aria-label={`Remove equation ${index + 1}`}>
              Remove
            </button>
          )}
        </div>
        {issue && (
          <div className="mt-0.5">
            <pre aria-hidden="true" data-testid={`${id}-caret`} className="overflow-hidden pl-[calc(0.75rem+1px)] font-mono text-sm leading-4 text-danger">
              {' '.repeat(issue.position)}
              {'^'.repeat(Math.max(1, Math.min(issue.length, Math.max(1, text.length - issue.position))))}
            </pre>
            <p id={`${id}-error`} className="text-sm font-medium text-danger">
              <span aria-hidden="true">✕ </span>
              At character {issue.position + 1}: {issue.message.replace(/^equation \d+:?\s*/, "")}
            </p>
          </div>
        )}
        {tex && (
          <div className="mt-1 overflow-x-auto py-1 text-base" data-testid={`${id}-math`}>
            <MathTex tex={tex} label={`Equation ${index + 1} typeset`} />
          </div>
        )}
      </div>
    </li>
  );
}
