import type { Page } from 'playwright-core';
import { beforeEach, describe, expect, it } from 'vitest';
import { demoAccounts } from '../../server/dev/seed';
import { inDays } from '../factories';
import { browserSuite } from '../setup/e2e-suite';
import { jobInState } from '../setup/job-states';

const suite = browserSuite();
const { url } = suite;
let page: Page;

beforeEach(async () => {
  page = await suite.newPage();
});

const builder = demoAccounts.find((a) => a.role === 'builder')!;
const shopEmail = 'desk@kessrow.test';

describe('the shop’s fee and net before it bids', () => {
  it('when a shop types its line prices, then the bid form shows the Tenthmark fee and what the shop receives, and My bids shows the same after sending', async () => {
    const builderApi = await suite.apiAs(builder.email);
    const { job } = await jobInState('open', { builder: builderApi }, { input: { title: 'Deck a small-block, fee shown', neededBy: inDays(20), operations: [{ code: 'deck', quantity: 1 }] } });
    const shopApi = await suite.apiAs(shopEmail);
    // The platform's rate for this app: the configured default, 800 basis points.
    expect(await shopApi('GET', '/api/bids/fee-rate')).toEqual({ feeBps: 800 });

    await suite.signIn(page, shopEmail, `/jobs/${job.id}`);
    const form = page.getByRole('form', { name: 'Your bid', exact: true });
    await form.getByLabel('Line 1: description').waitFor();
    await form.getByLabel('Line 1: quantity').fill('1');
    await form.getByLabel('Line 1: unit price in dollars').fill('1000');
    // derived: 8 % of $1,000.00 is $80.00 (rounded half up to the cent, common practice); the shop keeps $920.00
    await expect.poll(() => form.getByTestId('bid-fee').textContent()).toBe('$80.00');
    await expect.poll(() => form.getByTestId('bid-net').textContent()).toBe('$920.00');
    await form.getByText('Tenthmark fee (8%)').waitFor();
    // Live as the shop types: $123.45 → fee $9.876 rounds to $9.88, net $113.57.
    await form.getByLabel('Line 1: unit price in dollars').fill('123.45');
    await expect.poll(() => form.getByTestId('bid-net').textContent()).toBe('$113.57');
    await expect.poll(() => form.getByTestId('bid-fee').textContent()).toBe('$9.88');

    await form.getByRole('button', { name: 'Send my bid' }).click();
    await expect.poll(async () => (await shopApi<{ bids: Array<{ jobId: string }> }>('GET', '/api/bids/mine')).bids.some((b) => b.jobId === job.id)).toBe(true);
    await page.goto(url('/bids'));
    const row = page.locator('tr', { hasText: 'Deck a small-block, fee shown' });
    await expect.poll(() => row.getByTestId('my-bid-net').textContent()).toContain('$113.57');
    await expect(row.getByTestId('my-bid-net').textContent()).resolves.toContain('after $9.88 fee (8%)');
  });

  it('when the builder has accepted and the money is released, then the shop’s payment box says it was released, with the fee, and offers the invoice', async () => {
    const { job, shop } = await suite.jobIn('completed', builder.email, shopEmail, { bid: { lineItems: [{ description: 'Deck the block', quantity: 1, unitPriceCents: 50_000 }] } });
    await expect.poll(async () => (await shop<{ balance: { held: number; released: number } }>('GET', `/api/jobs/${job.id}/money`)).balance.released, { timeout: 10_000 }).toBeGreaterThan(0);
    await suite.signIn(page, shopEmail, `/jobs/${job.id}`);
    // derived: 8 % of $500.00 is $40.00 kept as the fee; $460.00 goes to the shop
    await expect.poll(() => page.getByTestId('shop-released').textContent()).toBe('Released: $460.00 was sent to your payout account, after the Tenthmark fee of $40.00.');
    await expect(page.getByText('when the builder accepts your inspection record').count()).resolves.toBe(0);
    await page.getByRole('link', { name: 'Invoice with your fee and net payout (PDF)' }).waitFor();
  });
});
