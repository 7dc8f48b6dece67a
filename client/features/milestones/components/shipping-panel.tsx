import { useForm } from 'react-hook-form';
import { toast } from '@client/lib/toast';
import type { z } from 'zod';
import type { JobDetail } from '@shared/schemas/jobs';
import type { PostalAddress, SentToShopInput, ShippingView, sentToShopInputSchema } from '@shared/schemas/shipping';
import { addressError, addressFormValues, PostalAddressBlock, PostalAddressFields, type AddressFormValues } from '@client/components/postal-address';
import { Button } from '@client/components/ui/button';
import { Card } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { TextField } from '@client/components/ui/text-field';
import { applyServerErrors } from '@client/lib/form-errors';
import { useSendToShop, useSetReturnAddress, useShipping } from '../api/shipping';
import { lazyResolver } from '@client/lib/lazy-resolver';

const sentToShopInputResolver = lazyResolver(() => import('@shared/schemas/shipping').then((m) => m.sentToShopInputSchema));
const postalAddressResolver = lazyResolver(() => import('@shared/schemas/shipping').then((m) => m.postalAddressSchema));

/** Paid for and held, or later: the builder may learn where to send the parts. */
const PAID = new Set<JobDetail['status']>(['funded', 'in_work', 'inspection_submitted', 'completed', 'disputed', 'resolved']);
/** The builder logs the parts leaving while the shop has not yet started on a record. */
const SENDING = new Set<JobDetail['status']>(['funded', 'in_work']);
/** The return address may be given until the work is accepted. */
const RETURN_OPEN = new Set<JobDetail['status']>(['funded', 'in_work', 'inspection_submitted', 'completed']);

function SentToShopForm({ jobId }: { jobId: string }) {
  const form = useForm<z.input<typeof sentToShopInputSchema>, unknown, SentToShopInput>({ resolver: sentToShopInputResolver, defaultValues: { carrier: '', trackingNumber: '', note: '' } });
  const send = useSendToShop(jobId);
  const { errors } = form.formState;
  const onSubmit = form.handleSubmit((input) =>
    send.mutate(input, {
      onSuccess: () => {
        toast.success('Logged: sent to the shop. The shop can see the tracking number.');
        form.reset();
      },
      onError: (error) => toast.error(applyServerErrors(error, form.setError, ['carrier', 'trackingNumber', 'note'])),
    }),
  );
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Sent to the shop" className="flex flex-col gap-3">
      <h3 className="font-bold">Sent the parts? Log it for the shop</h3>
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Carrier" error={errors.carrier?.message} {...form.register('carrier')} />
        <TextField label="Tracking number" error={errors.trackingNumber?.message} {...form.register('trackingNumber')} />
      </div>
      <TextField label="Note for the shop (optional)" error={errors.note?.message} {...form.register('note')} />
      <Button type="submit" busy={send.isPending} className="self-start">
        Log “sent to the shop”
      </Button>
    </form>
  );
}

function ReturnAddressForm({ jobId, current }: { jobId: string; current: PostalAddress | null }) {
  const form = useForm<AddressFormValues, unknown, PostalAddress>({ resolver: postalAddressResolver, defaultValues: addressFormValues(current) });
  const save = useSetReturnAddress(jobId);
  const onSubmit = form.handleSubmit((input) =>
    save.mutate(input, {
      onSuccess: (shipping) => {
        toast.success('Return address saved. The shop ships the parts back to it.');
        form.reset(addressFormValues(shipping.returnAddress));
      },
      onError: (error) => toast.error(applyServerErrors(error, form.setError, ['lines.0', 'city', 'region', 'postalCode', 'country'])),
    }),
  );
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Return address" className="flex flex-col gap-3">
      <h3 className="font-bold">{current ? 'Your return address' : 'Where should the shop send the parts back?'}</h3>
      <PostalAddressFields register={(part) => form.register(part)} error={(part) => addressError(form.formState.errors, part)} />
      <Button type="submit" busy={save.isPending} className="self-start">
        {current ? 'Save the return address' : 'Give the return address'}
      </Button>
    </form>
  );
}

function ShopAddress({ shipping, viewer }: { shipping: ShippingView; viewer: 'builder' | 'shop' | 'admin' }) {
  if (!shipping.shopAddress) {
    return viewer === 'shop' ? (
      <p className="text-ink-soft">
        You have not given a receiving address yet. Add it to your shop profile so the builder knows where to send the parts.
      </p>
    ) : (
      <p className="text-ink-soft">The shop has not given a receiving address yet. Ask for it in the conversation.</p>
    );
  }
  return (
    <div className="flex flex-col gap-1">
      <h3 className="font-bold">{viewer === 'builder' ? 'Send the parts to' : viewer === 'shop' ? 'The builder sends the parts to your receiving address' : 'The shop’s receiving address'}</h3>
      <PostalAddressBlock address={shipping.shopAddress} label="The shop’s receiving address" />
    </div>
  );
}

/**
 * Shipping both ways on a `ship` job, for its builder, its shop and admins:
 * where the parts go (once paid for), the builder's "sent to the shop", and
 * the return address the shop needs before it ships them back.
 */
export function ShippingPanel({ job, viewer }: { job: JobDetail; viewer: 'builder' | 'shop' | 'admin' }) {
  const relevant = job.logistics === 'ship' && PAID.has(job.status);
  const shipping = useShipping(job.id, { enabled: relevant });
  if (!relevant) return null;
  return (
    <Card className="flex flex-col gap-5">
      <h2 className="text-xl font-bold tracking-tight">Shipping</h2>
      {shipping.isPending && <p className="text-ink-soft">Loading the shipping details …</p>}
      {shipping.isError && (
        <Notice tone="error" onRetry={() => void shipping.refetch()}>
          The shipping details could not be loaded: {shipping.error.message}
        </Notice>
      )}
      {shipping.data && (
        <>
          <ShopAddress shipping={shipping.data} viewer={viewer} />
          {viewer === 'builder' && SENDING.has(job.status) && <SentToShopForm jobId={job.id} />}
          {viewer === 'builder' && RETURN_OPEN.has(job.status) && !shipping.data.legs.some((leg) => leg.direction === 'to_builder') ? (
            <ReturnAddressForm jobId={job.id} current={shipping.data.returnAddress} />
          ) : shipping.data.returnAddress ? (
            <div className="flex flex-col gap-1">
              <h3 className="font-bold">{shipping.data.legs.some((leg) => leg.direction === 'to_builder') ? 'Shipped back to' : 'Ship the parts back to'}</h3>
              <PostalAddressBlock address={shipping.data.returnAddress} label="The builder’s return address" />
            </div>
          ) : (
            <p className="text-ink-soft">The builder has not given a return address yet; the parts can be shipped back once they do.</p>
          )}
        </>
      )}
    </Card>
  );
}
