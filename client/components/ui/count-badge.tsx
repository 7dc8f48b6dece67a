import { cn } from '@client/lib/cn';

/**
 * A small count beside a navigation label ("Messages 3"). Screen readers hear
 * the count with its meaning ("3 unread"); nothing shows at zero.
 */
export function CountBadge({ count, meaning, className }: { count: number; meaning: string; className?: string }) {
  if (count <= 0) return null;
  return (
    <>
      <span
        aria-hidden
        className={cn('ml-1.5 inline-flex h-5 min-w-5 items-center justify-center rounded-full bg-brass-700 px-1.5 text-xs font-bold tabular-nums text-white', className)}
        data-testid="count-badge"
      >
        {count > 99 ? '99+' : count}
      </span>
      <span className="sr-only">
        {' '}
        ({count} {meaning})
      </span>
    </>
  );
}
