import type { Page } from 'playwright-core';
import { beforeEach, describe, expect, it } from 'vitest';
import { demoAccounts } from '../../server/dev/seed';
import { browserSuite } from '../setup/e2e-suite';

const suite = browserSuite();
let page: Page;

beforeEach(async () => {
  page = await suite.newPage();
});

const builder = demoAccounts.find((a) => a.role === 'builder')!;
const shopEmail = 'desk@kessrow.test';

/** Sentences written to the builder that the shop must never read as its own. */
const builderSentences = ['Your payment is held', 'until you accept the inspection record', 'You accepted the results', 'You accepted a bid'];

async function expectNoBuilderSentences() {
  const text = await page.locator('main').innerText();
  for (const sentence of builderSentences) expect(text, `the shop reads “${sentence}”`).not.toContain(sentence);
}

describe('the shop reads its own sentences on a job', () => {
  it('when the shop opens a paid job and a finished one, then the status and payment say what it means to the shop, and the work queue lists the paid one', async () => {
    const funded = await suite.jobIn('funded', builder.email, shopEmail, { input: { title: 'Sentences check, paid and held' } });
    const done = await suite.jobIn('completed', builder.email, shopEmail, { input: { title: 'Sentences check, accepted' } });

    await suite.signIn(page, shopEmail, `/jobs/${funded.job.id}`);
    await expect
      .poll(() => page.getByTestId('job-status-sentence').textContent())
      .toBe('The builder paid and Tenthmark holds the money while you work. Log “parts received” when the parts arrive.');
    await expect.poll(() => page.getByTestId('shop-held').textContent()).toContain('When the builder accepts your inspection record');
    await expectNoBuilderSentences();

    await expect.poll(async () => (await done.shop<{ balance: { released: number } }>('GET', `/api/jobs/${done.job.id}/money`)).balance.released, { timeout: 10_000 }).toBeGreaterThan(0);
    await page.goto(suite.url(`/jobs/${done.job.id}`));
    await expect
      .poll(() => page.getByTestId('job-status-sentence').textContent())
      .toBe('The builder accepted your results; the payment was released to you, less the Tenthmark fee.');
    await page.getByTestId('shop-released').waitFor();
    await expect(page.getByTestId('shop-held').count()).resolves.toBe(0);
    await expectNoBuilderSentences();

    // The work queue: the paid job waits for its parts; the finished one is not there.
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Work queue' }).click();
    const queue = page.getByTestId('work-queue');
    const row = queue.locator('li', { hasText: 'Sentences check, paid and held' });
    await expect.poll(() => row.textContent()).toContain('Paid and held; waiting for the parts to arrive.');
    await expect(row.getByTestId('queue-due').textContent()).resolves.toMatch(/^Due .+ · \d+ days? left$/);
    await expect(queue.locator('li', { hasText: 'Sentences check, accepted' }).count()).resolves.toBe(0);
  });
});

describe('an administrator reads the job as neither party', () => {
  it('when an admin opens a paid job, then its status sentence is in the third person, not the builder’s or the shop’s', async () => {
    const adminEmail = demoAccounts.find((a) => a.role === 'admin')!.email;
    const funded = await suite.jobIn('funded', builder.email, shopEmail, { input: { title: 'Sentences check, read by staff' } });
    await suite.signIn(page, adminEmail, `/jobs/${funded.job.id}`);
    await expect
      .poll(() => page.getByTestId('job-status-sentence').textContent())
      .toBe('The builder paid; Tenthmark holds the money until the builder accepts the inspection record.');
    const text = await page.locator('main').innerText();
    for (const sentence of [...builderSentences, 'while you work']) expect(text, `the admin reads “${sentence}”`).not.toContain(sentence);
  });
});
