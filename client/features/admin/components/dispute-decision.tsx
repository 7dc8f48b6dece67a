import { formatCents } from '@shared/catalogue';
import type { DisputeCase } from '@shared/schemas/disputes';
import { formatFee, formatMoment, outcomeWords } from './admin-words';

/** What goes to each side of a dispute: under the resolution form as it is filled, and in the decision once made. */
export function Split({ toShop, toBuilder, feeBps, shopName, builderName }: { toShop: number; toBuilder: number; feeBps: number | null; shopName: string; builderName: string }) {
  return (
    <dl className="grid grid-cols-[1fr_auto] gap-x-4 gap-y-1 text-sm">
      <dt>
        To {shopName} (the shop)
        {toShop > 0 && feeBps !== null && feeBps > 0 && <span className="block text-ink-soft">Tenthmark’s {formatFee(feeBps)} fee comes out of this</span>}
      </dt>
      <dd className="text-right font-semibold tabular-nums" data-testid="resolve-to-shop">
        {formatCents(toShop)}
      </dd>
      <dt>Back to {builderName} (the builder)</dt>
      <dd className="text-right font-semibold tabular-nums" data-testid="resolve-to-builder">
        {formatCents(toBuilder)}
      </dd>
    </dl>
  );
}

export function DisputeDecision({ data }: { data: DisputeCase }) {
  const resolution = data.dispute.resolution;
  if (!resolution) return null;
  return (
    <div className="flex flex-col gap-3" data-testid="dispute-decision">
      <p className="text-lg font-bold">{outcomeWords[resolution.outcome]}</p>
      <p className="text-sm text-ink-soft">
        Decided on {formatMoment(resolution.at)}
      </p>
      <Split toShop={resolution.shopCents} toBuilder={resolution.refundCents} feeBps={data.job.feeBps} shopName={data.shop?.name ?? 'the shop'} builderName={data.builder.name} />
      <div>
        <p className="text-sm font-semibold">Written decision</p>
        <p className="whitespace-pre-wrap break-words rounded-lg bg-paper-sunk px-3 py-2">{resolution.decision}</p>
      </div>
    </div>
  );
}
