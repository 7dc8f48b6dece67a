import type { ButtonHTMLAttributes } from 'react';
import { cn } from '@client/lib/cn';

type Variant = 'primary' | 'secondary' | 'quiet' | 'danger';

const variants: Record<Variant, string> = {
  primary: 'bg-slate-700 text-white hover:bg-slate-800 disabled:bg-slate-400',
  secondary: 'bg-paper-raised text-slate-800 ring-1 ring-inset ring-slate-300 hover:bg-slate-50 disabled:text-ink-faint',
  quiet: 'text-slate-700 hover:bg-slate-50 underline-offset-4 hover:underline',
  danger: 'bg-fail text-white hover:brightness-110',
};

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: Variant;
  busy?: boolean;
}

export function Button({ variant = 'primary', busy = false, className, children, disabled, type = 'button', ...rest }: ButtonProps) {
  return (
    <button
      type={type}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      className={cn(
        'inline-flex min-h-11 items-center justify-center gap-2 rounded-lg px-4 py-2 text-base font-semibold transition-colors disabled:cursor-not-allowed',
        variants[variant],
        className,
      )}
      {...rest}
    >
      {busy && <span aria-hidden className="size-4 animate-spin rounded-full border-2 border-current border-t-transparent" />}
      {children}
    </button>
  );
}
