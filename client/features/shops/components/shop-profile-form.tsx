import { POSTAL_CODE_NOT_FOUND } from '@shared/distance';
import { useId, useMemo, useState } from 'react';
import { useFieldArray, useForm, type Path } from 'react-hook-form';
import { toast } from '@client/lib/toast';
import { findOperation, type OperationCode } from '@shared/catalogue';
import { type ShopProfileInput } from '@shared/schemas/shops';
import { addressError, addressFormValues, blankAddress, PostalAddressFields, type AddressFormValues } from '@client/components/postal-address';
import { Button } from '@client/components/ui/button';
import { Card } from '@client/components/ui/card';
import { CheckboxField } from '@client/components/ui/checkbox-field';
import { MoneyField } from '@client/components/ui/money-field';
import { Notice } from '@client/components/ui/notice';
import { TextAreaField } from '@client/components/ui/text-area-field';
import { TextField } from '@client/components/ui/text-field';
import { applyServerErrors } from '@client/lib/form-errors';
import { centsToDollars, dollarsFormResolver, parseDollars, tidyDollars, withFormPaths, type PreparedInput } from '@client/lib/money';
import { useSaveShopProfile, type OwnShop } from '../api/shops';
import { catalogueIndex, inCatalogueOrder, operationsByPart, pricedPerWords } from './operation-words';

interface RateRow {
  operation: OperationCode;
  /** Dollars as typed; blank means the shop prices this work job by job. */
  price: string;
}

export interface ShopProfileFormValues {
  name: string;
  country: string;
  region: string;
  city: string;
  postalCode: string;
  takesShipped: boolean;
  capabilities: OperationCode[];
  equipmentNotes: string;
  turnaroundDays: number;
  rateCard: RateRow[];
  notifyMatchingJobs: boolean;
  /** All blank means no receiving address. */
  receivingAddress: AddressFormValues;
}

function toFormValues(shop: OwnShop | null): ShopProfileFormValues {
  if (!shop) {
    return {
      name: '',
      country: '',
      region: '',
      city: '',
      postalCode: '',
      takesShipped: true,
      capabilities: [],
      equipmentNotes: '',
      turnaroundDays: undefined as unknown as number, // blank until the shop says
      rateCard: [],
      notifyMatchingJobs: true,
      receivingAddress: blankAddress(),
    };
  }
  const capabilities = inCatalogueOrder(shop.capabilities, (code) => code) as OperationCode[];
  const prices = new Map(shop.rateCard.map((rate) => [rate.operation, rate.priceCents]));
  return {
    name: shop.name,
    country: shop.country,
    region: shop.region,
    city: shop.city,
    postalCode: shop.postalCode ?? '',
    takesShipped: shop.takesShipped,
    capabilities,
    equipmentNotes: shop.equipmentNotes,
    turnaroundDays: shop.turnaroundDays,
    rateCard: capabilities.map((operation) => {
      const cents = prices.get(operation);
      return { operation, price: cents === undefined ? '' : centsToDollars(cents) };
    }),
    notifyMatchingJobs: shop.notifyMatchingJobs,
    receivingAddress: addressFormValues(shop.receivingAddress),
  };
}

/** The form's values as the shared schema's input: typed dollars read into cents, blank prices left off the card. */
function prepare(values: ShopProfileFormValues): PreparedInput {
  const moneyErrors: Record<string, string> = {};
  const formRowOf: number[] = [];
  const rateCard: Array<{ operation: string; priceCents: number }> = [];
  (values.rateCard ?? []).forEach((row, index) => {
    if (row.price.trim() === '') return;
    const parsed = parseDollars(row.price);
    if (!parsed.ok) moneyErrors[`rateCard.${index}.price`] = parsed.message;
    formRowOf.push(index);
    rateCard.push({ operation: row.operation, priceCents: parsed.ok ? parsed.cents : Number.NaN });
  });
  // A wholly blank address means the shop gives none; a partly filled one is checked field by field.
  const address = values.receivingAddress;
  const blank = [...address.lines, address.city, address.region, address.postalCode, address.country].every((part) => part.trim() === '');
  return {
    input: { ...values, rateCard, receivingAddress: blank ? null : address },
    moneyErrors,
    // A rate-card message (price or operation) goes beside that row's price input.
    formPath: (path) =>
      path === 'receivingAddress.lines' ? 'receivingAddress.lines.0' : path.replace(/^rateCard\.(\d+)\.(priceCents|operation)$/, (_, row: string) => `rateCard.${formRowOf[Number(row)]}.price`),
  };
}

const resolver = dollarsFormResolver<ShopProfileFormValues, ShopProfileInput>(() => import('@shared/schemas/shops').then((m) => m.shopProfileSchema), prepare);

const plainFields: Array<Path<ShopProfileFormValues>> = [
  'name',
  'country',
  'region',
  'city',
  'postalCode',
  'takesShipped',
  'capabilities',
  'equipmentNotes',
  'turnaroundDays',
  'rateCard',
  'notifyMatchingJobs',
  'receivingAddress.lines.0',
  'receivingAddress.city',
  'receivingAddress.region',
  'receivingAddress.postalCode',
  'receivingAddress.country',
];

export function ShopProfileForm({ shop }: { shop: OwnShop | null }) {
  const [formError, setFormError] = useState<string>();
  const defaultValues = useMemo(() => toFormValues(shop), [shop]);
  const form = useForm<ShopProfileFormValues, unknown, ShopProfileInput>({ resolver, defaultValues });
  const rates = useFieldArray({ control: form.control, name: 'rateCard' });
  const { errors } = form.formState;
  const capabilitiesErrorId = useId();
  const isNew = shop === null;

  const save = useSaveShopProfile({
    mutationConfig: {
      onSuccess: (saved) => {
        form.reset(toFormValues(saved));
        toast.success(isNew ? 'Shop profile saved. You can bid on open jobs now.' : 'Shop profile saved.');
      },
    },
  });

  const capabilitiesField = form.register('capabilities', {
    // Each checked kind of work gets a rate-card row, in catalogue order; unchecking removes it.
    onChange: (event: { target: HTMLInputElement }) => {
      const code = event.target.value as OperationCode;
      const rows = form.getValues('rateCard');
      const index = rows.findIndex((row) => row.operation === code);
      if (event.target.checked && index === -1) {
        rates.insert(rows.filter((row) => catalogueIndex(row.operation) < catalogueIndex(code)).length, { operation: code, price: '' }, { shouldFocus: false });
      } else if (!event.target.checked && index !== -1) {
        rates.remove(index);
      }
    },
  });

  const onSubmit = form.handleSubmit((input) => {
    setFormError(undefined);
    const values = form.getValues();
    const { formPath } = prepare(values);
    const fields: Array<Path<ShopProfileFormValues>> = [...plainFields, ...values.rateCard.map((_, index) => `rateCard.${index}.price` as const)];
    save.mutate(input, {
      onError: (error) => {
        const message = applyServerErrors(withFormPaths(error, formPath), form.setError, fields);
        setFormError(message);
        toast.error(message);
      },
    });
  });

  const capabilitiesError = errors.capabilities?.message;

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Shop profile" className="flex flex-col gap-6">
      {formError && <Notice tone="error">{formError}</Notice>}

      <Card aria-labelledby="shop-profile-about" className="flex flex-col gap-4">
        <h2 id="shop-profile-about" className="text-xl font-bold">Your shop</h2>
        <TextField label="Shop name" autoComplete="organization" error={errors.name?.message} {...form.register('name')} />
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          <TextField label="Country" autoComplete="country-name" error={errors.country?.message} {...form.register('country')} />
          <TextField
            label="State, province or county"
            autoComplete="address-level1"
            error={errors.region?.message}
            {...form.register('region')}
          />
          <TextField label="Town or city" autoComplete="address-level2" error={errors.city?.message} {...form.register('city')} />
          <TextField
            label="Postal code"
            autoComplete="postal-code"
            hint="For distances to jobs (United States and Canada)."
            error={errors.postalCode?.message}
            {...form.register('postalCode')}
          />
        </div>
        {shop && shop.postalCode && !shop.placeFound && (
          <Notice tone="caution">
            {shop.postalCode}: {POSTAL_CODE_NOT_FOUND}.
          </Notice>
        )}
      </Card>

      <Card className="flex flex-col gap-4">
        <fieldset aria-describedby={capabilitiesError ? capabilitiesErrorId : undefined} className="flex flex-col gap-4">
          <legend className="mb-1 text-xl font-bold">Work you do</legend>
          <p className="text-sm text-ink-soft">
            Jobs asking for this work are the ones we show and e-mail to you. Each kind you tick gets a line on your rate card below.
          </p>
          {capabilitiesError && (
            <p id={capabilitiesErrorId} className="text-sm font-semibold text-fail">
              {capabilitiesError}
            </p>
          )}
          <div className="grid gap-6 md:grid-cols-2">
            {operationsByPart.map((group) => (
              <fieldset key={group.part} className="flex flex-col gap-3">
                <legend className="mb-2 text-sm font-bold uppercase tracking-wider text-brass-700">{group.heading}</legend>
                {group.operations.map((op) => (
                  <CheckboxField key={op.code} value={op.code} label={op.name} hint={op.description} {...capabilitiesField} />
                ))}
              </fieldset>
            ))}
          </div>
        </fieldset>
      </Card>

      <Card className="flex flex-col gap-4">
        <div>
          <h2 className="text-xl font-bold">Rate card</h2>
          <p className="mt-1 text-sm text-ink-soft">
            Your usual price for each kind of work, in dollars. Your bids start from these prices and you can change every line before you
            send one. Leave a price blank to quote that work job by job.
          </p>
        </div>
        {rates.fields.length === 0 ? (
          <p className="rounded-lg bg-paper-sunk px-4 py-3 text-sm text-ink-soft">Tick the work you do above, and a price line appears here for each.</p>
        ) : (
          <ul className="grid gap-x-6 gap-y-4 sm:grid-cols-2">
            {rates.fields.map((row, index) => {
              const op = findOperation(row.operation);
              return (
                <li key={row.id}>
                  <MoneyField
                    label={op?.name ?? row.operation}
                    suffix={op ? pricedPerWords[op.pricedPer] : undefined}
                    error={errors.rateCard?.[index]?.price?.message}
                    {...form.register(`rateCard.${index}.price`, { onBlur: (event) => tidyDollars(event, (text) => form.setValue(`rateCard.${index}.price`, text)) })}
                  />
                </li>
              );
            })}
          </ul>
        )}
      </Card>

      <Card className="flex flex-col gap-4">
        <h2 className="text-xl font-bold">How you work</h2>
        <TextField
          label="Typical turnaround (working days)"
          type="number"
          inputMode="numeric"
          min={1}
          max={365}
          step={1}
          className="max-w-xs"
          hint="From the day the part arrives to the day it is ready. Your bids start from this."
          error={errors.turnaroundDays?.message}
          {...form.register('turnaroundDays', { valueAsNumber: true })}
        />
        <CheckboxField
          label="We take blocks and parts shipped to us"
          hint="Leave this off if builders must drop parts off at the shop."
          {...form.register('takesShipped')}
        />
        <TextAreaField
          label="Equipment notes"
          rows={4}
          hint="Machines and gauges builders care about: boring bar, hone, deck surfacer, torque plates, bore gauges, profilometer."
          error={errors.equipmentNotes?.message}
          className="[&_textarea]:font-sans [&_textarea]:text-base"
          {...form.register('equipmentNotes')}
        />
      </Card>

      <Card aria-labelledby="shop-profile-receiving" className="flex flex-col gap-4">
        <div>
          <h2 id="shop-profile-receiving" className="text-xl font-bold">Receiving address</h2>
          <p className="mt-1 text-sm text-ink-soft">
            Where builders send parts. Only the builder of a job you won sees it, once that job is paid for. Leave it blank if you take drop-offs only.
          </p>
        </div>
        <PostalAddressFields register={(part) => form.register(`receivingAddress.${part}`)} error={(part) => addressError(errors.receivingAddress, part)} />
      </Card>

      <Card className="flex flex-col gap-4">
        <h2 className="text-xl font-bold">E-mail</h2>
        <CheckboxField
          label="E-mail me new jobs that match my work"
          hint="One message when a builder publishes a job asking for work you ticked above."
          {...form.register('notifyMatchingJobs')}
        />
      </Card>

      <div className="flex flex-wrap items-center gap-4">
        <Button type="submit" busy={save.isPending}>
          {isNew ? 'Create my shop profile' : 'Save changes'}
        </Button>
        {form.formState.isDirty && !save.isPending && <p className="text-sm text-ink-soft">You have changes that are not saved yet.</p>}
      </div>
    </form>
  );
}
