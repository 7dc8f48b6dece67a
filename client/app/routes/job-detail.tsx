import { useQuery } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { Link, useParams } from 'react-router-dom';
import type { JobDetail } from '@shared/schemas/jobs';
import { RevealWhenSettled } from '@client/components/reveal-when-settled';
import { Card } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { HomePageLink, useMe } from '@client/features/auth';
import { bidQueries, BidComparison, ShopBidPanel } from '@client/features/bids';
import { useJob, JobFiguresPanel, JobOwnerActions, JobLogistics, JobOperations, JobSpec, JobStatusBadge, otherShopExplain, plural, staffExplain, statusWords, workingShopExplain, PhotoGallery, PhotoUploader } from '@client/features/jobs';
import { ConversationPanel, type Bidder } from '@client/features/messages';
import { ApiError } from '@client/lib/api-client';
import { cn } from '@client/lib/cn';
import { formatDay } from '@client/lib/dates';
import { useWatchJob } from '@client/lib/realtime';
import { JobMoneyPanel, ShopExtraWork } from '@client/features/payments';
import { InspectionReview } from '@client/features/inspections';
import { MilestonesPanel, ShippingPanel } from '@client/features/milestones';
import { DisputePanel } from '@client/features/disputes';
import { ReviewPanel } from '@client/features/reviews';

function Section({ title, children, action }: { title: string; children: ReactNode; action?: ReactNode }) {
  return (
    <Card className="flex flex-col gap-4">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 className="text-xl font-bold tracking-tight">{title}</h2>
        {action}
      </div>
      {children}
    </Card>
  );
}

function LoadFailed({ error, onRetry }: { error: Error; onRetry: () => void }) {
  const status = error instanceof ApiError ? error.status : 0;
  // A malformed id (the server refuses it as a bad request) names no job, as surely as an unknown one.
  const missing = status === 404 || status === 400;
  const title = missing ? 'No such job' : status === 403 ? 'You cannot open this job' : 'The job could not be loaded';
  const lead = missing
    ? 'It may have been removed, or the link may be mistyped. A draft is visible only to the builder writing it.'
    : status === 403
      ? 'A job is open to the builder who posted it, to shops while it takes bids, and afterwards to the shops that bid on it.'
      : 'Try again in a moment.';
  return (
    <div className="mx-auto max-w-lg">
      <Notice tone="error" title={title} onRetry={missing || status === 403 ? undefined : onRetry}>
        {!missing && <p>{error.message}</p>}
        <p className={cn(!missing && 'mt-1')}>{lead}</p>
      </Notice>
      <p className="mt-4">
        <HomePageLink before="Back to" className="font-semibold text-slate-700 underline underline-offset-4" />
      </p>
    </div>
  );
}

/** Who reads the job page, as far as the status sentence goes: the working shop, a shop that lost the award, anyone else (null while unknown). */
type Reader = 'working shop' | 'other shop' | 'staff' | 'other' | null;

function statusSentence(job: JobDetail, reader: Reader): string | null {
  if (reader === null) return null;
  if (reader === 'working shop') return workingShopExplain[job.status];
  if (reader === 'staff') return staffExplain[job.status];
  if (reader === 'other shop' && job.awardedBidId) return job.status === 'cancelled' ? (statusWords.cancelled.explain ?? null) : otherShopExplain;
  return statusWords[job.status].explain ?? null;
}

function Header({ job, reader }: { job: JobDetail; reader: Reader }) {
  const isOwner = job.viewer.isOwner;
  const sentence = statusSentence(job, reader);
  return (
    <header className="flex flex-col gap-3">
      {isOwner && (
        <Link to="/jobs" className="self-start text-sm font-semibold text-slate-700 underline underline-offset-4">
          ← My jobs
        </Link>
      )}
      <h1 className="text-3xl font-extrabold tracking-tight text-ink">{job.title}</h1>
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
        <JobStatusBadge status={job.status} />
        {sentence && (
          <span className="text-ink-soft" data-testid="job-status-sentence">
            {sentence}
          </span>
        )}
      </div>
      <p className="text-ink-soft">
        {job.engineFamily} · {job.cylinders} cylinders · needed by {formatDay(job.neededBy)}
        {job.status !== 'draft' && ` · ${plural(job.bidCount, 'bid')}`}
      </p>
    </header>
  );
}

/**
 * A job as its reader needs it: the builder manages photos, publishes, edits,
 * cancels and compares bids; a shop sees the spec and its own bid; an
 * administrator sees everything without the buttons.
 */
export function JobDetailRoute() {
  const { jobId = '' } = useParams();
  const { data: me } = useMe();
  const jobQuery = useJob(jobId);
  useWatchJob(jobId);
  // The builder writes to the shops that bid: the same bids the comparison shows (one request, shared by key).
  const ownerTalks = jobQuery.data?.viewer.isOwner === true && jobQuery.data.status !== 'draft';
  // A shop sees only its own bids: enough to know whether it is the one doing the work.
  const shopAfterAward = me?.role === 'shop' && Boolean(jobQuery.data?.awardedBidId);
  const bidsQuery = useQuery({ ...bidQueries.forJob(jobId), enabled: ownerTalks || shopAfterAward });

  // The bids decide which panels this reader gets (the awarded shop's work, the builder's comparison and
  // conversations); the page waits for them too, rather than drawing panels that later move down.
  if (jobQuery.isPending || bidsQuery.isLoading) return <p className="text-ink-soft">Loading the job …</p>;
  if (jobQuery.isError) return <LoadFailed error={jobQuery.error} onRetry={() => void jobQuery.refetch()} />;

  const job = jobQuery.data;
  const isOwner = job.viewer.isOwner;
  const photosOpen = job.status === 'draft' || job.status === 'open';
  const showBids = (isOwner || me?.role === 'admin') && job.status !== 'draft';
  const awardedBid = bidsQuery.data?.find((bid) => bid.id === job.awardedBidId);
  const isAwardedShop = me?.role === 'shop' && Boolean(awardedBid);
  // The work itself (progress, the inspection record) is for the builder, the shop doing it and administrators.
  const workViewer = isOwner ? 'builder' : isAwardedShop ? 'shop' : me?.role === 'admin' ? 'admin' : null;
  // A shop learns whether it does the work once its own bids are in; until then the sentence waits rather than guess.
  const reader: Reader = me?.role === 'admin' ? 'staff' : me?.role !== 'shop' || !job.awardedBidId ? 'other' : bidsQuery.isPending ? null : isAwardedShop ? 'working shop' : 'other shop';
  const bidders: Bidder[] = [...(bidsQuery.data ?? [])]
    .sort((a, b) => b.updatedAt.localeCompare(a.updatedAt))
    .filter((bid, index, all) => all.findIndex((other) => other.shop.id === bid.shop.id) === index)
    .map((bid) => ({ shopId: bid.shop.id, name: bid.shop.name, bidStatus: bid.status }));

  const isShop = me?.role === 'shop';
  const specSections = (
    <>
      <Section title="Work wanted">
        <JobOperations spec={job.spec} />
      </Section>
      <Section title="Specification">
        <JobSpec spec={job.spec} />
      </Section>
      {job.spec.notes && (
        <Section title="Notes from the builder">
          <p className="whitespace-pre-wrap text-ink">{job.spec.notes}</p>
        </Section>
      )}
    </>
  );

  return (
    <RevealWhenSettled placeholder={<p className="text-ink-soft">Loading the job …</p>}>
      <div className="flex flex-col gap-6">
        <Header job={job} reader={reader} />
        {isOwner && <JobOwnerActions job={job} />}
        <JobMoneyPanel job={job} isAwardedShop={isAwardedShop} acceptedTotalCents={awardedBid?.totalCents} />
        {workViewer && <InspectionReview job={job} viewer={workViewer} />}
        {workViewer && <DisputePanel job={job} viewer={workViewer} />}
        {workViewer && (job.status === 'completed' || job.status === 'resolved') && <ReviewPanel job={job} viewer={workViewer} />}
        {workViewer && <ShippingPanel job={job} viewer={workViewer} />}
        {workViewer && <MilestonesPanel job={job} canLog={workViewer === 'shop'} />}
        {workViewer === 'shop' && <ShopExtraWork job={job} />}

        {showBids && (
          <Section title="Bids">
            <BidComparison jobId={job.id} jobStatus={job.status} canDecide={isOwner} />
          </Section>
        )}
        {ownerTalks && <ConversationPanel side="builder" jobId={job.id} jobStatus={job.status} bidders={bidders} />}
        {isShop && (
          // The spec beside the bid that prices it (stacked on a phone, the spec first).
          <div className="grid grid-cols-1 items-start gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
            <div className="flex min-w-0 flex-col gap-6">{specSections}</div>
            <div className="min-w-0 lg:sticky lg:top-4">
              <ShopBidPanel job={job} />
            </div>
          </div>
        )}
        {isShop && <ConversationPanel side="shop" jobId={job.id} jobStatus={job.status} />}

        <div className="grid grid-cols-1 items-start gap-6 lg:grid-cols-[minmax(0,1fr)_20rem]">
          <div className="flex min-w-0 flex-col gap-6">
            <Section title="Photos">
              <PhotoGallery jobId={job.id} jobTitle={job.title} photos={job.photos} canRemove={isOwner && photosOpen} />
              {isOwner && photosOpen && <PhotoUploader jobId={job.id} existingCount={job.photos.length} />}
            </Section>
            {!isShop && specSections}
          </div>
          <aside className="flex flex-col gap-6" aria-label="At a glance">
            <Section title="At a glance">
              <JobLogistics job={job} />
            </Section>
            <JobFiguresPanel title="Figures from the spec" input={job.spec} />
          </aside>
        </div>
      </div>
    </RevealWhenSettled>
  );
}
