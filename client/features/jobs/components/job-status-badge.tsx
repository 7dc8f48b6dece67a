import type { JobStatus } from '@shared/schemas/jobs';
import { Badge } from '@client/components/ui/badge';
import { statusWords } from './job-words';

/** A job's status in plain words. */
export function JobStatusBadge({ status, className }: { status: JobStatus; className?: string }) {
  const words = statusWords[status];
  return (
    <Badge tone={words.tone} className={className}>
      <span className="sr-only">Status: </span>
      {words.label}
    </Badge>
  );
}
