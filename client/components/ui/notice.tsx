import type { ReactNode } from 'react';
import { cn } from '@client/lib/cn';

type Tone = 'info' | 'success' | 'error' | 'caution';

const tones: Record<Tone, string> = {
  info: 'bg-slate-50 text-slate-900 ring-slate-200',
  success: 'bg-pass-soft text-pass ring-pass/30',
  error: 'bg-fail-soft text-fail ring-fail/30',
  caution: 'bg-caution-soft text-caution ring-caution/30',
};

/**
 * A boxed message. With `onRetry` (a load that failed), it carries a Retry
 * button that asks again.
 */
export function Notice({
  tone = 'info',
  title,
  children,
  className,
  onRetry,
}: {
  tone?: Tone;
  title?: string;
  children?: ReactNode;
  className?: string;
  onRetry?: () => void;
}) {
  return (
    <div role={tone === 'error' ? 'alert' : 'status'} className={cn('rounded-lg px-4 py-3 text-sm ring-1', tones[tone], className)}>
      {title && <p className="font-bold">{title}</p>}
      {children && <div className={cn(title && 'mt-1')}>{children}</div>}
      {onRetry && (
        <button
          type="button"
          onClick={onRetry}
          className="mt-2 min-h-10 rounded-md bg-white px-3 text-sm font-semibold text-slate-800 ring-1 ring-slate-300 hover:bg-slate-100"
        >
          Retry
        </button>
      )}
    </div>
  );
}
