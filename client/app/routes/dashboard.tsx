import { Link } from 'react-router-dom';
import { homePageTitle } from '@shared/glossary';
import type { Me } from '@shared/schemas/auth';
import { Card, PageTitle } from '@client/components/ui/card';
import { AdminOverview } from '@client/features/admin';
import { ConfirmEmailNotice, useMe } from '@client/features/auth';
import { WorkQueueList } from '@client/features/bids';
import { JobStatusBadge } from '@client/features/jobs';
import { NeedsYouList } from '@client/features/notifications';

const roleWords: Record<Me['role'], { title: string; lead: string }> = {
  builder: {
    title: homePageTitle('builder'),
    lead: 'Post a block for machining, compare what shops offer, and pay only once the measured results check out.',
  },
  shop: {
    title: homePageTitle('shop'),
    lead: 'Find blocks that need your machines, bid with a price and a turnaround, and hand over measured results.',
  },
  admin: {
    title: homePageTitle('admin'),
    lead: 'Keep the marketplace honest: verify shops, settle disagreements and watch the money held for jobs.',
  },
};

/** Why the address matters for this role: what waits until it is confirmed. */
const confirmReasons: Record<Me['role'], string> = {
  builder: 'Shops rely on reaching you about your jobs, so publishing a job and paying wait until you confirm it.',
  shop: 'Builders rely on reaching you about their blocks, so bidding waits until you confirm it.',
  admin: 'Confirming lets the people you help reach you.',
};

export function DashboardRoute() {
  const { data: me } = useMe();
  if (!me) return null;
  const words = roleWords[me.role];
  return (
    <div>
      <PageTitle title={words.title} lead={words.lead} />
      {!me.emailVerified && <ConfirmEmailNotice title="Please confirm your e-mail address" reason={confirmReasons[me.role]} className="mb-6" />}
      <NeedsYouList />
      {me.role === 'shop' && (
        <Card className="mb-6" aria-labelledby="next-due-heading">
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <h2 className="text-xl font-bold" id="next-due-heading">
              Next due in your shop
            </h2>
            <Link to="/queue" className="font-semibold text-slate-700 underline underline-offset-4">
              See the whole work queue
            </Link>
          </div>
          <WorkQueueList limit={3} StatusBadge={JobStatusBadge} headingId="next-due-heading" />
        </Card>
      )}
      {me.role === 'builder' && (
        <Card className="mb-6 flex flex-wrap items-center gap-4">
          <p className="flex-1 text-ink-soft">Have a block that needs machining? Describe it once; shops bid with a price and a turnaround.</p>
          <Link to="/jobs/new" className="inline-flex min-h-11 items-center rounded-lg bg-slate-700 px-4 py-2 font-semibold text-white hover:bg-slate-800">
            Post a job
          </Link>
          <Link to="/jobs" className="font-semibold text-slate-700 underline underline-offset-4">
            See my jobs
          </Link>
        </Card>
      )}
      {me.role === 'admin' && <AdminOverview />}
      <Card>
        <h2 className="text-xl font-bold">Your account</h2>
        <dl className="mt-4 grid gap-x-6 gap-y-2 sm:grid-cols-[max-content_1fr]">
          <dt className="font-semibold text-ink-soft">Name</dt>
          <dd>{me.displayName}</dd>
          <dt className="font-semibold text-ink-soft">E-mail</dt>
          <dd>
            {me.email} {me.emailVerified ? <span className="text-pass">(confirmed)</span> : <span className="text-caution">(not confirmed yet)</span>}
          </dd>
          <dt className="font-semibold text-ink-soft">Role</dt>
          <dd className="capitalize">{me.role}</dd>
          <dt className="font-semibold text-ink-soft">Sign-in</dt>
          <dd>{[me.hasPassword && 'e-mail and password', me.githubLinked && 'GitHub'].filter(Boolean).join(', ')}</dd>
        </dl>
      </Card>
    </div>
  );
}
