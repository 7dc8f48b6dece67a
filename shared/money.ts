/**
 * The platform's fee on an amount, in whole cents, rounded half up: the one
 * rule for the fee. The payout at release, the shop's bid form, its bid list,
 * its job page and its invoice all take the fee from here.
 */
export function feeFor(amountCents: number, feeBps: number): number {
  return Math.floor((amountCents * feeBps + 5_000) / 10_000);
}

/** What the shop keeps of an amount once the platform's fee is taken: the amount less `feeFor`. */
export function netOf(amountCents: number, feeBps: number): { feeCents: number; netCents: number } {
  const feeCents = feeFor(amountCents, feeBps);
  return { feeCents, netCents: amountCents - feeCents };
}

/** A fee rate in basis points as people read it: 800 → "8%", 750 → "7.5%". */
export function feeRateWords(feeBps: number): string {
  return `${Number((feeBps / 100).toFixed(2))}%`;
}
