import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import type { InspectionInput } from '../../shared/schemas/inspection';
import type { MoneyView } from '../../shared/schemas/payments';
import { formatCents } from '../../shared/catalogue';
import { demoAccounts } from '../../server/dev/seed';
import { uniformRecordInput } from '../factories';
import { artifactsDir } from '../setup/browser';
import { browserSuite } from '../setup/e2e-suite';

const suite = browserSuite();
const builderEmail = demoAccounts.find((a) => a.email === 'juno@builders.test')!.email;
const shopEmail = demoAccounts.find((a) => a.email === 'bench@lanternhill.test')!.email;
const adminEmail = demoAccounts.find((a) => a.role === 'admin')!.email;

/** An 8-cylinder record (invented demo readings) that the builder will dispute. */
const record: InspectionInput = uniformRecordInput();

const shot = (page: Page, name: string) => page.screenshot({ path: join(artifactsDir, `dispute-${name}.png`), fullPage: true });

/** The amount shown for one kind of entry on the money history page, for this job. */
async function historyAmount(page: Page, jobTitle: string, what: string) {
  const row = page.getByTestId('money-row').filter({ hasText: jobTitle }).filter({ hasText: what });
  await row.first().waitFor();
  return (await row.first().locator('td').last().textContent())?.trim();
}

describe('a dispute decided by a split, in a real browser', () => {
  it('when the builder disputes the record and the admin splits, then both sides see the outcome and the money in their history', async () => {
    const title = 'Disputed bore job for a browser test';
    const { job, shop, builder } = await suite.fundedJob(builderEmail, shopEmail, { title });
    await shop('POST', `/api/jobs/${job.id}/milestones`, { kind: 'block_received', note: 'On the bench.' });
    await shop('POST', `/api/jobs/${job.id}/inspection`, record);

    // The builder opens a dispute instead of accepting the record.
    const builderPage = await suite.pageFor(builderEmail, `/jobs/${job.id}`);
    await builderPage.getByRole('button', { name: 'Open a dispute' }).click();
    await builderPage.getByLabel('The inspection record shows sizes outside the agreed limits').check();
    await builderPage.getByLabel('Tell the administrator what happened').fill('My own bore gauge reads cylinder four well over the taper limit at the bottom of the stroke.');
    await builderPage.getByRole('button', { name: 'Review and open the dispute' }).click();
    await builderPage.getByRole('dialog', { name: 'Open this dispute?' }).getByRole('button', { name: 'Open the dispute' }).click();
    await builderPage.getByTestId('dispute-statement').waitFor();
    await shot(builderPage, 'builder-opened');

    // The shop sees it live on its open page and answers.
    const shopPage = await suite.pageFor(shopEmail, `/jobs/${job.id}`);
    await shopPage.getByLabel('Your side of it').fill('Our gauge was zeroed on a setting ring that morning; the readings stand as recorded.');
    await shopPage.getByRole('button', { name: 'Send your answer' }).click();
    await shopPage.getByTestId('dispute-response').waitFor();
    await builderPage.getByTestId('dispute-response').waitFor();

    // The admin finds it in the queue, reads the evidence and splits $300.00 to the shop, the rest back.
    const adminPage = await suite.pageFor(adminEmail, '/admin/disputes');
    await adminPage.getByRole('link', { name: title }).click();
    await adminPage.getByRole('heading', { name: `Dispute: ${title}` }).waitFor();
    const evidence = adminPage.getByRole('list', { name: 'Evidence, oldest first' });
    await expect(evidence.textContent()).resolves.toContain('Our gauge was zeroed on a setting ring');
    await adminPage.getByLabel('Split').check();
    await adminPage.getByLabel('Amount to the shop').fill('300.00');
    await adminPage.getByLabel('Written decision').fill('The record and the builder’s own readings disagree on one bore; the shop keeps most of the price and the rest is refunded.');
    await shot(adminPage, 'admin-case');
    await adminPage.getByRole('button', { name: 'Review the decision' }).click();
    await adminPage.getByRole('dialog', { name: 'Carry out this decision?' }).getByRole('button', { name: 'Carry out the decision' }).click();
    await adminPage.getByText('The decision is carried out and on its way to both sides by e-mail.').waitFor();

    // The money moved through the payment functions: $300 to the shop less the fee, $180 back.
    await expect.poll(async () => (await builder<MoneyView>('GET', `/api/jobs/${job.id}/money`)).balance.held, { timeout: 10_000 }).toBe(0);
    const money = await builder<MoneyView>('GET', `/api/jobs/${job.id}/money`);
    expect(money.balance).toMatchObject({ paidIn: 48_000, refunded: 18_000 });
    expect(money.balance.released + money.balance.fee).toBe(30_000);

    // Both sides see the outcome on the job page without reloading, and the money in their history.
    for (const page of [builderPage, shopPage]) {
      await expect.poll(() => page.getByTestId('dispute-decision').textContent().catch(() => ''), { timeout: 10_000 }).toContain('Split: $300.00 to the shop');
    }
    await shot(builderPage, 'builder-decided');
    await builderPage.getByRole('link', { name: 'Money', exact: true }).click();
    await expect(historyAmount(builderPage, title, 'Refunded to you')).resolves.toBe(formatCents(18_000));
    await expect(historyAmount(builderPage, title, 'You paid in')).resolves.toBe(formatCents(48_000));
    await shot(builderPage, 'builder-money');
    await shopPage.goto(suite.url('/money'));
    await expect(historyAmount(shopPage, title, 'Paid to you')).resolves.toBe(formatCents(money.balance.released));
    await expect(historyAmount(shopPage, title, 'Tenthmark fee')).resolves.toBe(formatCents(money.balance.fee));
    await shot(shopPage, 'shop-money');

    expect(suite.consoleErrors).toEqual([]);
  });
});
