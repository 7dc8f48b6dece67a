import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addWorkingDays } from '../../shared/due-day';
import { startMoneyApp } from '../setup/money-app';
import { payOnPage } from '../setup/payments';
import { expectStoredCopyServed, pdfText, storedDocuments } from '../setup/pdf';
import { createUser } from '../factories';
import { signedIn } from '../setup/test-env';

let m: Awaited<ReturnType<typeof startMoneyApp>>;
beforeAll(async () => {
  m = await startMoneyApp();
}, 120_000);
afterAll(() => m?.close());

type Payment = { id: string; kind: string; receiptNumber: string | null; amountCents: number };
const moneyOf = async (who: Awaited<ReturnType<typeof signedIn>>, jobId: string) => (await who.get(`/api/jobs/${jobId}/money`)).body as { payments: Payment[]; feeBps: number };
const serial = (number: string) => Number(number.slice(-6));
/** pdf.js splits text into runs; spaces between them are not the document's. */
const flat = (text: string) => text.replace(/\s+/g, ' ');

describe('receipts', () => {
  it('when the builder pays the bid and then extra work, then each payment has its own receipt number, in order, the same on every download, and only the builder and admins get it', async () => {
    const { job, builder, shop } = await m.jobIn('inWork', { totalCents: 50_000 });
    const proposed = await shop.post(`/api/jobs/${job.id}/change-orders`, { description: 'Sleeve cylinder 3 (cracked)', amountCents: 18_000 });
    expect(proposed.status).toBe(201);
    const approve = await builder.post(`/api/change-orders/${proposed.body.changeOrder.id}/approve`);
    expect((await payOnPage(approve.body.url, '4242424242424242')).status).toBeLessThan(400);
    const payments = await m.until('both paid', async () => {
      const view = await moneyOf(builder, job.id);
      return view.payments.filter((p) => p.receiptNumber).length === 2 && view.payments;
    });
    const [bidPayment, orderPayment] = payments;
    expect(bidPayment.receiptNumber).toMatch(/^R-\d{4}-\d{6}$/);
    expect(orderPayment.receiptNumber).toMatch(/^R-\d{4}-\d{6}$/);
    // Sequential: the extra work was paid after the bid.
    expect(serial(orderPayment.receiptNumber!)).toBeGreaterThan(serial(bidPayment.receiptNumber!));

    const first = flat(await pdfText(builder, `/api/payments/${bidPayment.id}/receipt.pdf`));
    const again = flat(await pdfText(builder, `/api/payments/${bidPayment.id}/receipt.pdf`));
    expect(first).toContain(`Receipt number ${bidPayment.receiptNumber}`);
    expect(again).toContain(`Receipt number ${bidPayment.receiptNumber}`);
    expect(first).toContain(job.title);
    expect(first).toContain('$500.00');
    // Held: both payments wait for the builder's acceptance (500 + 180).
    expect(first).toContain('$680.00');
    const order = flat(await pdfText(builder, `/api/payments/${orderPayment.id}/receipt.pdf`));
    expect(order).toContain('Sleeve cylinder 3 (cracked)');
    expect(order).toContain('$180.00');
    expect((await moneyOf(builder, job.id)).payments.map((p) => p.receiptNumber)).toEqual([bidPayment.receiptNumber, orderPayment.receiptNumber]);

    // The shop was paid through it but the receipt is the builder's: to the shop it does not exist.
    expect((await shop.get(`/api/payments/${bidPayment.id}/receipt.pdf`)).status).toBe(404);
    const stranger = await signedIn(m.server.app, await createUser(m.db));
    expect((await stranger.get(`/api/payments/${bidPayment.id}/receipt.pdf`)).status).toBe(404);
    const admin = await signedIn(m.server.app, await createUser(m.db, { role: 'admin' }));
    expect(flat(await pdfText(admin, `/api/payments/${bidPayment.id}/receipt.pdf`))).toContain(bidPayment.receiptNumber!);
  });

  it('when a receipt is downloaded again, then the stored copy is sent, not a new print; when the money it shows changes, then a new receipt is printed and kept', async () => {
    const { job, builder, shop } = await m.jobIn('inWork', { totalCents: 50_000 });
    const [bidPayment] = (await moneyOf(builder, job.id)).payments;
    const path = `/api/payments/${bidPayment.id}/receipt.pdf`;
    const stored = { config: m.config, storage: m.server.app.storage };
    await expectStoredCopyServed(builder, path, stored, 'receipts', bidPayment.id);

    // Paid extra work raises what is held, which the bid's receipt prints: another document, under another key.
    const proposed = await shop.post(`/api/jobs/${job.id}/change-orders`, { description: 'Align hone the mains', amountCents: 12_000 });
    const approve = await builder.post(`/api/change-orders/${proposed.body.changeOrder.id}/approve`);
    expect((await payOnPage(approve.body.url, '4242424242424242')).status).toBeLessThan(400);
    await m.until('extra work paid', async () => (await moneyOf(builder, job.id)).payments.filter((p) => p.receiptNumber).length === 2);
    expect(flat(await pdfText(builder, path))).toContain('$620.00');
    expect(await storedDocuments(m.config.storage, 'receipts', bidPayment.id)).toHaveLength(2);
  });
});

describe('invoices', () => {
  it('when the job is not finished, then there is no invoice yet (409); once completed, the shop’s copy shows the fee and its net, the builder’s does not, and the number stays', async () => {
    const { job, builder, shop } = await m.jobIn('submitted', { totalCents: 50_000 });
    const early = await shop.get(`/api/jobs/${job.id}/invoice.pdf`);
    expect(early.status).toBe(409);
    expect(early.body.error.code).toBe('job_not_finished');
    expect((await builder.post(`/api/jobs/${job.id}/inspection/accept`, { version: 1 })).status).toBe(200);
    await m.until('completed', async () => (await builder.get(`/api/jobs/${job.id}`)).body.job.status === 'completed', 15_000);

    const shopCopy = flat(await pdfText(shop, `/api/jobs/${job.id}/invoice.pdf`));
    const number = /Invoice number (I-\d{4}-\d{6})/.exec(shopCopy)?.[1];
    expect(number).toBeDefined();
    expect(shopCopy).toContain('The work');
    expect(shopCopy).toContain('Total paid by the builder $500.00');
    // derived: the test app's fee is 800 basis points; 8 % of $500.00 is $40.00, rounded half up to the cent (common practice), leaving $460.00
    expect(shopCopy).toContain('Tenthmark fee (8%) $40.00');
    expect(shopCopy).toContain('Net payout to the shop $460.00');
    const builderCopy = flat(await pdfText(builder, `/api/jobs/${job.id}/invoice.pdf`));
    expect(builderCopy).toContain(`Invoice number ${number}`);
    expect(builderCopy).not.toContain('Net payout');
    expect(builderCopy).not.toContain('$460.00');
    // Each copy is printed once and kept under its own key.
    expect(await storedDocuments(m.config.storage, 'invoices', job.id)).toHaveLength(2);
    const stranger = await signedIn(m.server.app, await createUser(m.db));
    expect((await stranger.get(`/api/jobs/${job.id}/invoice.pdf`)).status).toBe(403);
  });
});

describe('quotes', () => {
  it('when the builder or the bidding shop asks for a bid’s quote, then it lists the lines, the total, the turnaround and until when it stands', async () => {
    const { builder, shop, bid, job } = await m.jobIn('bid', { bid: { lineItems: [{ description: 'Bore and hone eight cylinders', quantity: 8, unitPriceCents: 4_500 }], turnaroundDays: 6, note: 'Torque plate included.' } });
    for (const who of [builder, shop]) {
      const text = flat(await pdfText(who, `/api/bids/${bid!.id}/quote.pdf`));
      expect(text).toContain('Bore and hone eight cylinders — 8 × $45.00 $360.00');
      expect(text).toContain('Total $360.00');
      expect(text).toContain('Turnaround: 6 working days');
      expect(text).toContain('Valid until');
      expect(text).toContain('Torque plate included.');
      expect(text).toContain(job.title);
    }
    const otherBuilder = await signedIn(m.server.app, await createUser(m.db));
    expect((await otherBuilder.get(`/api/bids/${bid!.id}/quote.pdf`)).status).toBe(404);
  });
});

describe('money page', () => {
  it('when a builder exports a period, then the CSV has the same rows as the page and a line per total, with formula-like text made inert', async () => {
    const { job, builder, shop } = await m.jobIn('funded', { totalCents: 12_300, input: { title: '=HYPERLINK("x") block' } });
    const today = new Date().toISOString().slice(0, 10);
    const page = await builder.get(`/api/me/money?from=${today}&to=${today}`);
    expect(page.status).toBe(200);
    expect(page.body.rows.map((r: { jobId: string }) => r.jobId)).toEqual([job.id]);
    // The builder's payment in links its receipt; the shop's page lists the same payment without it.
    const [money] = (await builder.get(`/api/jobs/${job.id}/money`)).body.payments;
    expect(page.body.rows[0].receipt).toEqual({ paymentId: money.id, number: money.receiptNumber });
    expect((await shop.get('/api/me/money')).body.rows.find((r: { jobId: string }) => r.jobId === job.id).receipt).toBeNull();
    expect(page.body.totals).toEqual({ paidIn: 12_300, released: 0, fee: 0, refunded: 0, held: 12_300, net: 0 });

    const csv = await builder.get(`/api/me/money.csv?from=${today}&to=${today}`);
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toMatch(/^text\/csv/);
    const lines = csv.text.trim().split('\n');
    expect(lines[0]).toBe('date,job_id,job_title,kind,amount_cents,amount');
    expect(lines[1]).toContain(`${job.id},"'=HYPERLINK(""x"") block",paid_in,12300,123.00`);
    expect(lines).toContain(',,Total paid in,total,12300,123.00');
    expect(lines).toContain(',,Held at the end of the period,total,12300,123.00');
    expect(lines.some((l) => l.includes('Net to the shop'))).toBe(false);
    const shopCsv = (await shop.get('/api/me/money.csv')).text;
    expect(shopCsv).toContain(',,Net to the shop,total,0,0.00');

    // A period after today has none of it: nothing came in then, though the money is still held at its end.
    const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
    const later = await builder.get(`/api/me/money?from=${tomorrow}`);
    expect(later.body.rows).toEqual([]);
    expect(later.body.totals).toMatchObject({ paidIn: 0, held: 12_300 });
  });

  it('when the last day comes before the first, then 400 says so beside the field, for the page and the CSV', async () => {
    const { builder } = await m.jobIn('open');
    for (const path of ['/api/me/money', '/api/me/money.csv']) {
      const res = await builder.get(`${path}?from=2026-03-02&to=2026-03-01`);
      expect(res.status).toBe(400);
      expect(res.body.error.fields.to).toBe('The last day cannot come before the first day.');
      const bad = await builder.get(`${path}?from=March`);
      expect(bad.status).toBe(400);
      expect(bad.body.error.fields.from).toBe('Give the first day as a date like 2027-03-31.');
    }
  });
});

describe('the shop’s fee and net', () => {
  it('when a shop lists its bids, then each shows the fee and what the shop keeps, and an accepted one its due day', async () => {
    const { shop } = await m.jobIn('inWork', { totalCents: 50_000, bid: { lineItems: [{ description: 'The work', quantity: 1, unitPriceCents: 50_000 }], turnaroundDays: 10 } });
    expect((await shop.get('/api/bids/fee-rate')).body).toEqual({ feeBps: 800 });
    const [bid] = (await shop.get('/api/bids/mine')).body.bids;
    // derived: 8 % of $500.00 (rounded half up to the cent, common practice)
    expect(bid).toMatchObject({ status: 'accepted', feeBps: 800, feeCents: 4_000, netCents: 46_000 });
    // The parts arrived today (the inWork state logs it), so the work is due ten days on.
    // Ten working days from the parts' arrival today (shared/due-day.ts, unit-tested there).
    expect(bid.dueOn).toBe(addWorkingDays(new Date(), 10));
  });
});
