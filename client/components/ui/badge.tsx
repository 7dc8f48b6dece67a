import type { ReactNode } from 'react';
import type { Term, Tone } from '@shared/glossary';
import { cn } from '@client/lib/cn';

export type BadgeTone = 'neutral' | 'info' | 'success' | 'caution' | 'error' | 'muted';

/** The badge colour for each tone of the glossary (shared/glossary.ts). */
export const toneOfTerm: Record<Tone, BadgeTone> = { success: 'success', warning: 'caution', danger: 'error', neutral: 'neutral', active: 'info', quiet: 'muted' };

const tones: Record<BadgeTone, string> = {
  neutral: 'bg-slate-50 text-slate-800 ring-slate-300',
  info: 'bg-slate-700 text-white ring-slate-700',
  success: 'bg-pass-soft text-pass ring-pass/40',
  caution: 'bg-caution-soft text-caution ring-caution/40',
  error: 'bg-fail-soft text-fail ring-fail/40',
  muted: 'bg-paper-sunk text-ink-soft ring-slate-200',
};

/** A short state word in a pill: a status, "verified", "lowest price". Text colours meet AA on their grounds. */
export function Badge({ tone = 'neutral', children, className }: { tone?: BadgeTone; children: ReactNode; className?: string }) {
  return (
    <span className={cn('inline-flex items-center gap-1 whitespace-nowrap rounded-full px-2.5 py-0.5 text-sm font-bold ring-1', tones[tone], className)}>
      {children}
    </span>
  );
}

/** A status from the glossary as a badge, in its name and colour. */
export function TermBadge({ term, className, prefix }: { term: Term; className?: string; prefix?: string }) {
  return (
    <Badge tone={toneOfTerm[term.tone]} className={className}>
      {prefix && <span className="sr-only">{prefix}</span>}
      {term.label}
    </Badge>
  );
}
