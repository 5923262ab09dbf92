import { useEffect, useState, type InputHTMLAttributes } from 'react';
import { cn } from '../../../lib/cn';

/** Parses what people type into a number: e notation accepted, U+2212 minus read as "-". */
export function parseNumber(text: string): number {
  const t = text.trim().replace(/\u2212/g, '-').replace(/[\u202F\u2009 ]/g, '');
  if (t === '' || !/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(t)) return Number.NaN;
  return Number(t);
}

const show = (v: number | undefined) => (v === undefined || Number.isNaN(v) ? '' : String(v));

/**
 * A number field that keeps what is typed (so "1e-" can become "1e-5") and reports the parsed
 * value; plain e notation is accepted in inputs (UI-NOTES). Unparseable text reports NaN, which
 * the schema names as "must be a finite number".
 */
export function NumberInput({
  value,
  onChange,
  invalid,
  className,
  ...props
}: { value: number | undefined; onChange: (v: number | undefined) => void; invalid?: boolean } & Omit<InputHTMLAttributes<HTMLInputElement>, 'value' | 'onChange'>) {
  const [text, setText] = useState(show(value));
  useEffect(() => {
    // Follow outside changes (reset, type switch) without fighting the user's typing.
    if (parseNumber(text) !== value && !(Number.isNaN(parseNumber(text)) && value !== undefined && Number.isNaN(value))) setText(show(value));
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [value]);
  return (
    <input
      inputMode="decimal"
      autoComplete="off"
      spellCheck={false}
      {...props}
      value={text}
      aria-invalid={invalid || undefined}
      onChange={(e) => {
        setText(e.target.value);
        onChange(e.target.value.trim() === '' ? undefined : parseNumber(e.target.value));
      }}
      className={cn('w-full min-w-0 rounded-field border bg-surface px-2 py-1 text-right font-mono text-sm tabular-nums text-ink', invalid ? 'border-danger' : 'border-line-strong', className)}
    />
  );
}
