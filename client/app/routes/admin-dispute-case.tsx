import type { ReactNode } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Card, PageTitle } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { useDisputeCase, formatMoment, DisputeMoney, DisputeParties, DisputeStatements, DisputeStatusBadge, EvidenceTimeline, DisputeDecision, ResolveDisputeForm } from '@client/features/admin';
import { ApiError } from '@client/lib/api-client';

function Section({ title, children, className }: { title: string; children: ReactNode; className?: string }) {
  return (
    <Card className={className}>
      <h2 className="mb-4 text-xl font-bold tracking-tight">{title}</h2>
      {children}
    </Card>
  );
}

function BackLink() {
  return (
    <Link to="/admin/disputes" className="mb-4 inline-block text-sm font-semibold text-slate-700 underline underline-offset-4">
      ← Dispute queue
    </Link>
  );
}

export function AdminDisputeCaseRoute() {
  const { disputeId = '' } = useParams();
  const caseQuery = useDisputeCase(disputeId);

  if (caseQuery.isPending) {
    return (
      <div>
        <BackLink />
        <PageTitle title="Dispute" />
        <p className="text-ink-soft">Loading the case …</p>
      </div>
    );
  }
  if (caseQuery.isError) {
    const missing = caseQuery.error instanceof ApiError && caseQuery.error.status === 404;
    return (
      <div>
        <BackLink />
        <PageTitle title={missing ? 'No such dispute' : 'The case could not be loaded'} />
        <Notice tone="error" onRetry={missing ? undefined : () => void caseQuery.refetch()}>{caseQuery.error.message}</Notice>
      </div>
    );
  }

  const data = caseQuery.data;
  const { dispute } = data;
  return (
    <div>
      <BackLink />
      <PageTitle
        title={`Dispute: ${data.job.title || 'Untitled job'}`}
        lead={
          <span className="flex flex-wrap items-center gap-3">
            <DisputeStatusBadge status={dispute.status} />
            <span>
              Opened {formatMoment(dispute.openedAt)}
              {dispute.resolution && `, decided ${formatMoment(dispute.resolution.at)}`}
            </span>
          </span>
        }
      />
      <div className="grid grid-cols-1 items-start gap-6 lg:grid-cols-[3fr_2fr]">
        <div className="flex min-w-0 flex-col gap-6">
          <Section title="The case">
            <div className="flex flex-col gap-6">
              <DisputeParties data={data} />
              <DisputeStatements data={data} />
            </div>
          </Section>
          <Section title="Evidence">
            <EvidenceTimeline items={data.timeline} builderName={data.builder.name} shopName={data.shop?.name ?? 'the shop'} />
          </Section>
        </div>
        <div className="flex min-w-0 flex-col gap-6">
          <Section title="Money">
            <DisputeMoney money={data.money} />
          </Section>
          {dispute.status === 'open' ? (
            <Section title="Decide">
              <ResolveDisputeForm data={data} />
            </Section>
          ) : (
            <Section title="Decision">
              <DisputeDecision data={data} />
            </Section>
          )}
        </div>
      </div>
    </div>
  );
}
