import { NAMES } from '@shared/glossary';
import { Card, PageTitle } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { usePlatformFee, formatFee, formatMoment, PlatformFeeForm } from '@client/features/admin';

export function AdminSettingsRoute() {
  const fee = usePlatformFee();
  return (
    <div>
      <PageTitle title={NAMES.fee} lead="What Tenthmark keeps from each job’s payment to the shop. It is fixed on a job when its bid is accepted." />
      {fee.isPending && <p className="text-ink-soft">Loading the fee …</p>}
      {fee.isError && (
        <Notice tone="error" title="The fee could not be loaded" onRetry={() => void fee.refetch()}>
          {fee.error.message}
        </Notice>
      )}
      {fee.data && (
        <div className="grid grid-cols-1 items-start gap-6 lg:grid-cols-2">
          <Card>
            <h2 className="text-xl font-bold">Current fee</h2>
            <p className="mt-3 text-4xl font-extrabold tabular-nums" data-testid="current-fee">
              {formatFee(fee.data.feeBps)}
            </p>
            <p className="mt-2 text-ink-soft">
              {fee.data.updatedAt
                ? `Last changed ${formatMoment(fee.data.updatedAt)}${fee.data.updatedBy ? ` by ${fee.data.updatedBy}` : ''}.`
                : 'Not changed since Tenthmark started.'}
            </p>
          </Card>
          <Card>
            <h2 className="mb-4 text-xl font-bold">Change the fee</h2>
            <PlatformFeeForm key={fee.data.feeBps} current={fee.data} />
          </Card>
        </div>
      )}
    </div>
  );
}
