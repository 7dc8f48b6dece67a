import { cn } from '@client/lib/cn';

/** The caution shown beside computed machining figures: they guide; the makers' specifications and the law govern. */
export function GuidanceCaution({ className }: { className?: string }) {
  return (
    <p className={cn('border-l-4 border-caution pl-3 text-sm text-caution', className)} data-testid="guidance-caution">
      <strong>These figures are guidance only.</strong> Engine and piston makers&apos; specifications, calibrated instruments, local codes
      and licensed practice govern.
    </p>
  );
}
