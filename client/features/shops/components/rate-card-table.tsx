import { formatCents } from '@shared/catalogue';
import type { PublicShop } from '@shared/schemas/shops';
import { inCatalogueOrder, operationName, operationPricedPer } from './operation-words';

/** A shop's usual prices, per kind of work, in catalogue order. */
export function RateCardTable({ shop }: { shop: PublicShop }) {
  const rows = inCatalogueOrder(shop.rateCard, (rate) => rate.operation);
  const unpriced = inCatalogueOrder(
    shop.capabilities.filter((code) => !shop.rateCard.some((rate) => rate.operation === code)),
    (code) => code,
  );
  if (rows.length === 0) {
    return <p className="text-ink-soft">This shop quotes each job on its own rather than from a price list.</p>;
  }
  return (
    <>
      <table className="w-full text-left">
        <caption className="sr-only">Usual prices</caption>
        <thead className="border-b border-slate-200 text-sm text-ink-soft">
          <tr>
            <th scope="col" className="py-2 pr-4 font-semibold">Work</th>
            <th scope="col" className="py-2 pr-4 text-right font-semibold">Price</th>
            <th scope="col" className="py-2 font-semibold">Charged</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((rate) => (
            <tr key={rate.operation} className="border-b border-slate-100">
              <th scope="row" className="py-2 pr-4 font-semibold">{operationName(rate.operation)}</th>
              <td className="py-2 pr-4 text-right tabular-nums">{formatCents(rate.priceCents)}</td>
              <td className="py-2 text-ink-soft">{operationPricedPer(rate.operation)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {unpriced.length > 0 && (
        <p className="mt-3 text-sm text-ink-soft">Quoted job by job: {unpriced.map(operationName).join(', ')}.</p>
      )}
      <p className="mt-3 text-sm text-ink-soft">Usual prices; each bid states the price for that job.</p>
    </>
  );
}
