import { forwardRef, type ButtonHTMLAttributes } from 'react';
import { cn } from '../../lib/cn';

type Variant = 'primary' | 'secondary' | 'quiet';

const variants: Record<Variant, string> = {
  primary: 'bg-ember text-white hover:bg-ember-strong border border-ember-strong',
  secondary: 'bg-surface text-ink border border-line-strong hover:bg-sunken',
  quiet: 'bg-transparent text-ink hover:bg-sunken border border-transparent',
};

export const buttonClasses = (variant: Variant = 'primary', extra?: string) =>
  cn(
    'inline-flex items-center justify-center gap-2 rounded-field px-4 py-2 text-sm font-semibold',
    'transition-colors disabled:cursor-not-allowed disabled:opacity-60',
    variants[variant],
    extra,
  );

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: Variant;
}

export const Button = forwardRef<HTMLButtonElement, ButtonProps>(function Button(
  { variant = 'primary', className, type = 'button', ...props },
  ref,
) {
  return <button ref={ref} type={type} className={buttonClasses(variant, className)} {...props} />;
});
