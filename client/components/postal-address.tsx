import type { FieldErrors, UseFormRegisterReturn } from 'react-hook-form';
import type { PostalAddress } from '@shared/schemas/shipping';
import { TextField } from '@client/components/ui/text-field';

/** The parts of an address form, as react-hook-form paths below the address. */
export type AddressPart = 'lines.0' | 'lines.1' | 'city' | 'region' | 'postalCode' | 'country';

/** An address in a form: two street lines, town, region, postal code and country, each with its message. */
export function PostalAddressFields({ register, error }: { register: (part: AddressPart) => UseFormRegisterReturn; error: (part: AddressPart) => string | undefined }) {
  return (
    <>
      <TextField label="Street address" autoComplete="address-line1" error={error('lines.0')} {...register('lines.0')} />
      <TextField label="Street address, second line (optional)" autoComplete="address-line2" error={error('lines.1')} {...register('lines.1')} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Town or city" autoComplete="address-level2" error={error('city')} {...register('city')} />
        <TextField label="State, province or county" autoComplete="address-level1" error={error('region')} {...register('region')} />
        <TextField label="Postal code" autoComplete="postal-code" className="max-w-xs" error={error('postalCode')} {...register('postalCode')} />
        <TextField label="Country" autoComplete="country-name" error={error('country')} {...register('country')} />
      </div>
    </>
  );
}

/** An address as it goes on a parcel, one line each. */
export function PostalAddressBlock({ address, label }: { address: PostalAddress; label: string }) {
  return (
    <address aria-label={label} className="not-italic leading-relaxed text-ink">
      {address.lines.map((line, index) => (
        <span key={index} className="block">
          {line}
        </span>
      ))}
      <span className="block">
        {address.city}, {address.region} {address.postalCode}
      </span>
      <span className="block">{address.country}</span>
    </address>
  );
}

/** Form values for an address: always two street lines, so both inputs have a value. */
export type AddressFormValues = { lines: string[]; city: string; region: string; postalCode: string; country: string };

export const blankAddress = (): AddressFormValues => ({ lines: ['', ''], city: '', region: '', postalCode: '', country: '' });

/** A stored address into the form's two street lines (any third line joins the second). */
export const addressFormValues = (address: PostalAddress | null): AddressFormValues =>
  address ? { ...address, lines: [address.lines[0] ?? '', address.lines.slice(1).join(', ')] } : blankAddress();

/** The message for one part of an address, from the form's errors below it (the street lines' own message goes on the first). */
export function addressError(errors: FieldErrors<AddressFormValues> | undefined, part: AddressPart): string | undefined {
  if (!errors) return undefined;
  if (part === 'lines.0') return errors.lines?.message ?? errors.lines?.[0]?.message;
  if (part === 'lines.1') return errors.lines?.[1]?.message;
  return errors[part]?.message;
}
