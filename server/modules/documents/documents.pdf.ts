import { feeRateWords } from '../../../shared/money';
import type { BidLine } from '../../../shared/schemas/bids';
import { money, stamp, startDocument, type PrintedDocument } from '../../lib/pdf/document';

/** Who and what a money document is about. */
export interface DocumentParties {
  jobId: string;
  jobTitle: string;
  builderName: string;
  builderEmail: string;
  shopName: string;
  shopPlace: string;
}

function partiesBlock(p: PrintedDocument, parties: DocumentParties) {
  p.line(`Job: ${parties.jobTitle}`);
  p.line(`Job number ${parties.jobId}`);
  p.line(`Builder: ${parties.builderName} (${parties.builderEmail})`);
  p.line(`Shop: ${[parties.shopName, parties.shopPlace].filter(Boolean).join(', ')}`);
}

function linesBlock(p: PrintedDocument, lines: BidLine[], currency: string) {
  for (const l of lines) p.row(`${l.description} — ${l.quantity} × ${money(l.unitPriceCents, currency)}`, money(l.amountCents, currency));
}

export interface ReceiptData extends DocumentParties {
  number: string;
  paidAt: Date;
  what: 'bid' | 'change_order';
  lines: BidLine[];
  totalCents: number;
  currency: string;
  /** What the job holds now (this payment and any other not yet paid out). */
  heldCents: number;
}

/** The builder's receipt for one payment: its number, what it paid for, and that Tenthmark holds it until the work is accepted. */
export function receiptPdf(r: ReceiptData): Promise<Buffer> {
  const p = startDocument({ title: `Receipt ${r.number}`, author: 'Tenthmark', heading: 'Tenthmark payment receipt' });
  p.line(`Receipt number ${r.number}`);
  p.line(`Paid ${stamp(r.paidAt)} by ${r.builderName}`);
  partiesBlock(p, r);
  p.heading(r.what === 'bid' ? 'For the accepted bid' : 'For extra work');
  linesBlock(p, r.lines, r.currency);
  p.row('Total paid', money(r.totalCents, r.currency), { bold: true });
  p.heading('Held until you accept the work');
  p.line(
    'Tenthmark holds this payment until you accept the shop’s inspection results (or the review window closes). Then it goes to the shop, less the Tenthmark fee; the fee is not added to what you pay.',
  );
  p.row('Held on this job now', money(r.heldCents, r.currency));
  p.footnote('A receipt for a payment made through Tenthmark. Keep it with the job’s inspection record.');
  return p.finish();
}

export interface InvoiceData extends DocumentParties {
  number: string;
  issuedAt: Date;
  finishedAt: Date;
  lines: BidLine[];
  totalPaidCents: number;
  refundedCents: number;
  currency: string;
  /** On the shop's copy (and an admin's): the fee rate, the fee and what the shop keeps. */
  shopCopy: { feeBps: number; feeCents: number; netCents: number } | null;
}

/** The shop's invoice to the builder for a finished job: the accepted bid's lines and paid extra work; on the shop's copy, the fee and the net payout. */
export function invoicePdf(i: InvoiceData): Promise<Buffer> {
  const p = startDocument({ title: `Invoice ${i.number}`, author: i.shopName, heading: `Invoice from ${i.shopName}` });
  p.line(`Invoice number ${i.number} · issued ${stamp(i.issuedAt)}`);
  p.line(`Work finished ${stamp(i.finishedAt)} · paid through Tenthmark`);
  partiesBlock(p, i);
  p.heading('Work');
  linesBlock(p, i.lines, i.currency);
  p.row('Total paid by the builder', money(i.totalPaidCents, i.currency), { bold: true });
  if (i.refundedCents > 0) p.row('Refunded to the builder', money(i.refundedCents, i.currency));
  if (i.shopCopy) {
    p.heading('The shop’s copy: fee and payout');
    p.row(`Tenthmark fee (${feeRateWords(i.shopCopy.feeBps)})`, money(i.shopCopy.feeCents, i.currency));
    p.row('Net payout to the shop', money(i.shopCopy.netCents, i.currency), { bold: true });
  }
  p.footnote('Issued by the shop through Tenthmark. Paid in full through Tenthmark; nothing is owed on this invoice.');
  return p.finish();
}

export interface QuoteData extends DocumentParties {
  version: number;
  status: string;
  createdAt: Date;
  lines: BidLine[];
  totalCents: number;
  turnaroundDays: number;
  validUntil: string;
  note: string;
}

/** The shop's quote: a bid's lines, total, turnaround and note, and how long it stands. */
export function quotePdf(q: QuoteData): Promise<Buffer> {
  const p = startDocument({ title: `Quote for ${q.jobTitle}`, author: q.shopName, heading: `Quote from ${q.shopName}` });
  p.line(`Version ${q.version} · written ${stamp(q.createdAt)}`);
  partiesBlock(p, q);
  p.heading('Price');
  linesBlock(p, q.lines, 'usd');
  p.row('Total', money(q.totalCents), { bold: true });
  p.heading('Terms');
  p.line(`Turnaround: ${q.turnaroundDays} working ${q.turnaroundDays === 1 ? 'day' : 'days'} from the parts’ arrival.`);
  p.line(q.status === 'active' ? `Valid until ${q.validUntil} while the bid stays open on Tenthmark.` : `This bid is ${q.status}; the quote no longer stands.`);
  if (q.note) p.line(`Note from the shop: ${q.note}`);
  p.footnote('A quote through Tenthmark. Payment is made through Tenthmark and held until the builder accepts the work.');
  return p.finish();
}
