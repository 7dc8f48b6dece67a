import type { JobStatus } from '@shared/schemas/jobs';
import { TermBadge } from '@client/components/ui/badge';
import { statusWords } from './job-words';

/** A job's status in plain words. */
export function JobStatusBadge({ status, className }: { status: JobStatus; className?: string }) {
  return <TermBadge term={statusWords[status]} className={className} prefix="Status: " />;
}
