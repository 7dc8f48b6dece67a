import { join } from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { formatCents } from '../../shared/catalogue';
import type { JobDetail } from '../../shared/schemas/jobs';
import type { MoneyView } from '../../shared/schemas/payments';
import { demoAccounts } from '../../server/dev/seed';
import { bidInput, inDays, jobInput } from '../factories';
import { artifactsDir } from '../setup/browser';
import { deckPhotos } from '../setup/deck-photos';
import { browserSuite } from '../setup/e2e-suite';
import { fillIronV8Job, saveJobForm } from '../setup/job-form';
import { completeOnboardingPage } from '../setup/payments';

/*
 * Whole journeys through the marketplace, each person in a browser context of
 * their own: the builder posts and pays, the shop bids, works and is paid, the
 * admin reads the ledger. (The dispute journey is in dispute.test.ts.)
 */

const suite = browserSuite();
const builder = demoAccounts.find((a) => a.email === 'juno@builders.test')!;
const shop = demoAccounts.find((a) => a.email === 'bench@lanternhill.test')!;
const admin = demoAccounts.find((a) => a.role === 'admin')!;
const SHOP_NAME = 'Lantern Hill Machine Works';

const photos = deckPhotos('tenthmark-journey-photos-');

const shot = (page: Page, name: string) => page.screenshot({ path: join(artifactsDir, `journey-${name}.png`), fullPage: true });
const poll = <T>(read: () => Promise<T>) => expect.poll(read, { timeout: 10_000, interval: 100 });
const text = (locator: Locator) => locator.textContent().then((t) => t?.trim() ?? '');
const status = (page: Page, words: string) => page.getByText(`Status: ${words}`, { exact: true }).waitFor();
const messagesWith = (page: Page, body: string) => page.getByTestId('message').filter({ has: page.getByTestId('message-body').getByText(body, { exact: true }) });
const onStandIn = (target: URL) => target.toString().startsWith(suite.app.payments.url);

/** The amount of one kind of entry for one job on the Money page. */
async function historyAmount(page: Page, jobTitle: string, what: string) {
  const row = page.getByTestId('money-row').filter({ hasText: jobTitle }).filter({ hasText: what });
  await row.first().waitFor();
  return text(row.first().locator('td').last());
}

/**
 * The readings of a passing record, in inches, for a 4.028 in piston: 0.0002 in
 * of taper and 0.0001 in of out-of-round per cylinder, some cylinders a tenth
 * larger. Per row: top, middle, bottom (thrust then axial), then the piston.
 */
const readings = Array.from({ length: 8 }, (_, i) => [...[4.0312, 4.0311, 4.0311, 4.031, 4.031, 4.0309].map((value) => (value + (i % 3) * 0.0001).toFixed(4)), '4.0280']);

describe('whole journeys through the marketplace, one browser per person', () => {
  it(
    'when a builder posts a job with photos, a shop bids, they talk, the builder pays, the shop works and records, and the builder accepts, then the shop is paid and the admin ledger shows the payout and the fee',
    async () => {
      const title = 'Journey: bore, hone and deck an iron V8';

      // ── The builder posts the job through the form. ──
      const b = await suite.pageFor(builder.email, '/jobs/new');
      await b.getByRole('heading', { level: 1, name: 'Post a job' }).waitFor();
      const form = b.getByRole('form', { name: 'Job details' });
      await fillIronV8Job(form, { title, cylinders: '8', maxOutOfRound: '0.0005' });
      await form.getByLabel('Date you need the parts back').fill(inDays(30));
      await saveJobForm(form);
      await b.waitForURL(/\/jobs\/[0-9a-f-]{36}$/);
      const jobId = new URL(b.url()).pathname.split('/').pop()!;
      const jobPath = `/jobs/${jobId}`;
      await b.getByRole('heading', { level: 1, name: title }).waitFor();
      await status(b, 'Draft');

      // Two photos, then two loaded thumbnails.
      await b.getByLabel('Choose photos').setInputFiles([photos.left, photos.right]);
      await b.getByRole('button', { name: 'Open photo 2 of 2 full size' }).waitFor();
      await poll(() => b.getByTestId('job-photo-thumb').count()).toBe(2);
      await b.waitForFunction(() => [...document.querySelectorAll<HTMLImageElement>('[data-testid="job-photo-thumb"]')].every((img) => img.complete && img.naturalWidth > 0));
      await b.getByRole('button', { name: 'Publish', exact: true }).click();
      await status(b, 'Open for bids');
      await shot(b, 'job-posted');

      // ── The shop sets up its payout account on the payment provider's page (the stand-in). ──
      const s = await suite.pageFor(shop.email, '/shop/profile');
      await s.getByRole('button', { name: 'Set up payouts' }).click();
      await s.waitForURL(onStandIn);
      await s.getByRole('button', { name: 'Send my details' }).click();
      await s.waitForURL(suite.url('/shop/profile?payouts=return'));
      await s.getByText('Ready to be paid').waitFor({ timeout: 15_000 });

      // ── It finds the job on the board and bids, prefilled from its rate card. ──
      await s.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Job board' }).click();
      await s.waitForURL(suite.url('/board'));
      const boardLink = s.getByRole('link', { name: title });
      await boardLink.waitFor();
      await shot(s, 'board');
      await boardLink.click();
      await s.waitForURL(suite.url(jobPath));
      const bidForm = s.getByRole('form', { name: 'Your bid', exact: true });
      // 8 × $35.00 bore + 8 × $25.00 hone + 1 × $180.00 deck, from Lantern Hill's rate card.
      await poll(() => text(bidForm.getByTestId('bid-running-total'))).toBe('$660.00');
      await bidForm.getByLabel('Turnaround (working days)').fill('9');
      await bidForm.getByLabel('Note to the builder (optional)').fill('Torque plate on hand for the final hone.');
      await bidForm.getByRole('button', { name: 'Send my bid' }).click();
      await s.getByText('Bid sent. The builder has been told.').waitFor();

      // The builder's open page shows the bid without a reload.
      const comparison = b.getByRole('table', { name: 'Bids on this job, side by side' });
      const row = comparison.getByTestId('bid-row').filter({ hasText: SHOP_NAME });
      await poll(() => text(row.getByTestId('bid-total'))).toBe('$660.00');
      await shot(b, 'bid-comparison');

      // ── A live message each way: neither side reloads. ──
      await s.getByRole('button', { name: 'Ask the builder a question' }).click();
      const shopComposer = s.getByLabel(`Message to ${builder.displayName}`);
      const question = 'Is the head coming too, or only the block? We hold the deck within 0.002 in.';
      await shopComposer.fill(question);
      await shopComposer.press('Enter');
      await poll(() => messagesWith(s, question).getAttribute('data-state')).toBe('sent');
      const conversationRow = b.getByTestId('conversation-panel').getByTestId('conversation-row').filter({ hasText: SHOP_NAME });
      await poll(() => text(conversationRow.getByTestId('latest-message'))).toBe(question);
      await conversationRow.getByRole('button').first().click();
      await messagesWith(b, question).waitFor();
      const reply = 'Block only; the heads are done. 0.002 in over the deck is what I need.';
      const builderComposer = b.getByLabel(`Message to ${SHOP_NAME}`);
      await builderComposer.fill(reply);
      await builderComposer.press('Enter');
      await messagesWith(s, reply).waitFor();
      await expect(messagesWith(s, reply).getAttribute('data-own')).resolves.toBeNull();
      await shot(b, 'conversation-builder');
      await shot(s, 'conversation-shop');

      // ── The builder accepts the bid and pays on the payment page with the success card. ──
      await b.getByRole('button', { name: `Accept the bid from ${SHOP_NAME}` }).click();
      const acceptDialog = b.getByRole('dialog', { name: `Accept the bid from ${SHOP_NAME}?` });
      await acceptDialog.getByRole('button', { name: 'Accept this bid' }).click();
      await acceptDialog.waitFor({ state: 'hidden' });
      await status(b, 'Awarded, payment due');
      await b.getByRole('button', { name: 'Pay and hold for the work' }).click();
      await b.waitForURL(onStandIn);
      await b.getByRole('heading', { name: 'Pay $660.00' }).waitFor();
      await b.getByLabel('Card number').fill('4242 4242 4242 4242');
      await shot(b, 'payment-page');
      await b.getByRole('button', { name: /^Pay / }).click();
      await b.waitForURL((target) => target.toString().startsWith(suite.url(jobPath)));
      await poll(() => text(b.getByTestId('money-held'))).toBe('$660.00');
      await status(b, 'Paid and held');
      await shot(b, 'job-paid');

      // ── The shop's open page turns to the work by itself; it logs its progress. ──
      await status(s, 'Paid and held');
      const log = s.getByRole('form', { name: 'Log progress' });
      const progress = s.getByRole('list', { name: 'Progress on this job' });
      await expect(log.getByLabel('What happened').inputValue()).resolves.toBe('block_received');
      await log.getByLabel('Note (optional)').fill('Block in on a pallet, all caps marked.');
      await log.getByRole('button', { name: 'Log it' }).click();
      await progress.getByText('Parts received').waitFor();
      await status(s, 'In the shop');
      for (const [kind, words] of [
        ['operation_started', 'Bore started'],
        ['operation_finished', 'Bore finished'],
      ] as const) {
        await log.getByLabel('What happened').selectOption(kind);
        await log.getByLabel('Operation').selectOption('bore');
        await log.getByRole('button', { name: 'Log it' }).click();
        await progress.getByText(words).waitFor();
      }
      // The builder sees every step live.
      const builderProgress = b.getByRole('list', { name: 'Progress on this job' });
      for (const words of ['Parts received', 'Bore started', 'Bore finished']) await builderProgress.getByText(words).waitFor();
      await status(b, 'In the shop');

      // ── The inspection record: the grid pasted from a spreadsheet, the rest typed. ──
      await s.getByRole('link', { name: 'Enter the inspection record' }).click();
      await s.waitForURL(suite.url(`${jobPath}/inspection/new`));
      const record = s.getByRole('form', { name: 'Inspection record' });
      const results = s.getByRole('complementary', { name: 'Results as you type' });
      await record.getByLabel('Cylinder 1 top thrust').waitFor();
      await s.evaluate((block) => {
        const cell = document.querySelector<HTMLInputElement>('input[aria-label="Cylinder 1 top thrust"]')!;
        const data = new DataTransfer();
        data.setData('text/plain', block);
        cell.dispatchEvent(new ClipboardEvent('paste', { clipboardData: data, bubbles: true, cancelable: true }));
      }, readings.map((r) => r.join('\t')).join('\n'));
      await expect(text(s.getByTestId('paste-note'))).resolves.toBe('Pasted 56 readings from cylinder 1.');
      await expect(record.getByLabel('Cylinder 8 bottom axial').inputValue()).resolves.toBe(readings[7][5]);
      await expect(record.getByLabel('Cylinder 8 piston diameter').inputValue()).resolves.toBe('4.0280');
      await record.getByLabel('Gauge resolution (in)').fill('0.0001');
      await record.getByLabel('Temperature at measurement (°C)').fill('21');
      await record.getByLabel('Torque plate fitted while measuring').check();
      await record.getByLabel('Straightedge readings (in), separated by spaces or commas').fill('0.0008 0.0010 0.0006 0.0012');
      await record.getByLabel('Deck finish Ra (µm), optional').fill('0.9');
      await record.getByRole('radiogroup', { name: 'Bore finish' }).getByRole('radio', { name: 'Enter values' }).click();
      await record.getByLabel('Ra (µm)', { exact: true }).fill('0.45');
      await record.getByRole('radiogroup', { name: 'Crosshatch' }).getByRole('radio', { name: 'Measured angle' }).click();
      await record.getByLabel('Included angle (°)').fill('45');
      await record.getByLabel('Signed off by (your name)').fill('Rosa Okafor');
      await results.getByText('Pass: every limit judged').waitFor();
      await shot(s, 'inspection-entry');
      await record.getByRole('button', { name: 'Submit the record' }).click();
      await s.waitForURL(suite.url(jobPath));
      await status(s, 'Results to review');

      // ── The builder's page turns to the review by itself; the builder accepts. ──
      const review = b.getByTestId('inspection-review');
      await review.waitFor();
      await status(b, 'Results to review');
      await expect(text(review.getByTestId('inspection-verdict'))).resolves.toContain('Pass: every limit judged, every check conforms');
      await shot(b, 'review');
      await review.getByRole('button', { name: 'Accept the record' }).click();
      const confirm = b.getByRole('dialog', { name: 'Accept version 1 of the inspection record?' });
      await confirm.getByRole('button', { name: 'Accept and pay the shop' }).click();
      await confirm.waitFor({ state: 'hidden' });
      await status(b, 'Completed');

      // The payout went through the payment functions: paid in = paid to the shop + the fee, nothing held.
      const juno = await suite.apiAs(builder.email);
      await expect.poll(async () => (await juno<MoneyView>('GET', `/api/jobs/${jobId}/money`)).balance.released, { timeout: 10_000 }).toBeGreaterThan(0);
      const { balance } = await juno<MoneyView>('GET', `/api/jobs/${jobId}/money`);
      expect(balance).toMatchObject({ paidIn: 66_000, held: 0, refunded: 0 });
      expect(balance.fee).toBeGreaterThan(0);
      expect(balance.released + balance.fee).toBe(66_000);
      await poll(() => text(b.getByTestId('money-released'))).toBe(formatCents(balance.released));
      await status(s, 'Completed');

      // ── The shop sees the payout in its money history. ──
      await s.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Money', exact: true }).click();
      await s.waitForURL(suite.url('/money'));
      await expect(historyAmount(s, title, 'Paid to you')).resolves.toBe(formatCents(balance.released));
      await expect(historyAmount(s, title, 'Tenthmark fee')).resolves.toBe(formatCents(balance.fee));
      await expect(historyAmount(s, title, 'Builder paid in (held)')).resolves.toBe('$660.00');
      await shot(s, 'money-shop');

      // ── The admin finds the job's entries in the ledger. ──
      const a = await suite.pageFor(admin.email, '/admin/ledger');
      await a.getByRole('search', { name: 'Filter the ledger' }).getByLabel('Job id').fill(jobId);
      await a.waitForURL((target) => target.searchParams.get('jobId') === jobId);
      const entries = a.getByRole('region', { name: 'Ledger entries' }).locator('tbody tr');
      await poll(() => entries.count()).toBe(3);
      await expect(entries.allTextContents()).resolves.toEqual(expect.arrayContaining([expect.stringContaining(title)]));
      await expect(text(a.getByTestId('ledger-total-released'))).resolves.toBe(formatCents(balance.released));
      await expect(text(a.getByTestId('ledger-total-fee'))).resolves.toBe(formatCents(balance.fee));
      await expect(text(a.getByTestId('ledger-total-paid_in'))).resolves.toBe('$660.00');
      await expect(text(a.getByTestId('ledger-total-refunded'))).resolves.toBe('$0.00');
      await shot(a, 'admin-ledger');

      expect(suite.consoleErrors, suite.consoleErrors.join('\n')).toEqual([]);
    },
    150_000,
  );

  it('when the builder pays with a card that is declined, then the decline is shown, and paying again with the success card holds the payment', async () => {
    // Set up through the API: a job of the builder's with Lantern Hill's bid accepted (payouts ready).
    const juno = await suite.apiAs(builder.email);
    const lantern = await suite.apiAs(shop.email);
    const { job } = await juno<{ job: JobDetail }>('POST', '/api/jobs', jobInput({ title: 'Journey: a card declined, then paid' }));
    await juno('POST', `/api/jobs/${job.id}/publish`);
    if ((await lantern<{ shop: { payouts: string } }>('GET', '/api/shop-profile')).shop.payouts !== 'ready') {
      await completeOnboardingPage((await lantern<{ url: string }>('POST', '/api/shop-profile/payouts')).url);
      await expect.poll(async () => (await lantern<{ shop: { payouts: string } }>('GET', '/api/shop-profile')).shop.payouts, { timeout: 8_000 }).toBe('ready');
    }
    const { bid } = await lantern<{ bid: { id: string; totalCents: number } }>('POST', `/api/jobs/${job.id}/bids`, bidInput());
    await juno('POST', `/api/bids/${bid.id}/accept`);
    const total = formatCents(bid.totalCents);

    // The declining card: the payment page says so.
    const b = await suite.pageFor(builder.email, `/jobs/${job.id}`);
    await b.getByRole('button', { name: 'Pay and hold for the work' }).click();
    await b.waitForURL(onStandIn);
    await b.getByLabel('Card number').fill('4000 0000 0000 0002');
    await b.getByRole('button', { name: /^Pay / }).click();
    await expect(text(b.getByRole('alert'))).resolves.toMatch(/declined/i);
    await shot(b, 'payment-declined');

    // Back on the job page the builder reads why, once the provider has reported it, and tries again.
    await expect.poll(async () => (await juno<MoneyView>('GET', `/api/jobs/${job.id}/money`)).payments.at(-1)?.failureMessage ?? '', { timeout: 10_000 }).toMatch(/declined/i);
    await b.getByRole('link', { name: 'Cancel and go back' }).click();
    await b.waitForURL(suite.url(`/jobs/${job.id}?payment=cancelled`));
    await status(b, 'Awarded, payment due');
    await b.getByText('The last payment did not go through').waitFor();
    await shot(b, 'job-declined');
    await b.getByRole('button', { name: 'Try the payment again' }).click();
    await b.waitForURL(onStandIn);
    await b.getByLabel('Card number').fill('4242 4242 4242 4242');
    await b.getByRole('button', { name: /^Pay / }).click();
    await b.waitForURL((target) => target.toString().startsWith(suite.url(`/jobs/${job.id}`)));
    await status(b, 'Paid and held');
    await poll(() => text(b.getByTestId('money-held'))).toBe(total);
    await expect(b.getByText('The last payment did not go through').count()).resolves.toBe(0);
    await shot(b, 'job-paid-after-decline');

    expect(suite.consoleErrors, suite.consoleErrors.join('\n')).toEqual([]);
  }, 60_000);
});
