import type { ReactNode } from 'react';
import { cn } from '@client/lib/cn';

type Tone = 'info' | 'success' | 'error' | 'caution';

const tones: Record<Tone, string> = {
  info: 'bg-slate-50 text-slate-900 ring-slate-200',
  success: 'bg-pass-soft text-pass ring-pass/30',
  error: 'bg-fail-soft text-fail ring-fail/30',
  caution: 'bg-caution-soft text-caution ring-caution/30',
};

export function Notice({ tone = 'info', title, children, className }: { tone?: Tone; title?: string; children?: ReactNode; className?: string }) {
  return (
    <div role={tone === 'error' ? 'alert' : 'status'} className={cn('rounded-lg px-4 py-3 text-sm ring-1', tones[tone], className)}>
      {title && <p className="font-bold">{title}</p>}
      {children && <div className={cn(title && 'mt-1')}>{children}</div>}
    </div>
  );
}
