import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { beforeEach, describe, expect, it } from 'vitest';
import { CC_PER_CUBIC_INCH } from '../../shared/calc';
import type { JobDetail, JobInput } from '../../shared/schemas/jobs';
import { demoAccounts } from '../../server/dev/seed';
import { bidInput, inDays, shopProfileInput, uniqueEmail } from '../factories';
import { completeOnboardingPage } from '../setup/payments';
import { artifactsDir } from '../setup/browser';
import { deckPhotos } from '../setup/deck-photos';
import { browserSuite } from '../setup/e2e-suite';
import { fillIronV8Job, openJobStep, saveJobForm } from '../setup/job-form';
import { jobInState } from '../setup/job-states';

const suite = browserSuite();
const { url, consoleErrors } = suite;
let page: Page;
const builder = demoAccounts.find((a) => a.email === 'juno@builders.test')!;
const otherBuilder = demoAccounts.find((a) => a.email === 'teodor@builders.test')!;
const lanternHill = demoAccounts.find((a) => a.email === 'bench@lanternhill.test')!;
const kessrow = demoAccounts.find((a) => a.email === 'desk@kessrow.test')!;

const photos = deckPhotos('tenthmark-e2e-photos-');
beforeEach(async () => {
  page = await suite.newTabletPage();
});

/** The number in a figure such as "5,733 cc". */
const numberIn = async (locator: Locator) => Number(/-?[\d,]+(?:\.\d+)?/.exec((await locator.textContent()) ?? '')![0].replace(/,/g, ''));

const signIn = (email: string, returnTo: string) => suite.signIn(page, email, returnTo);

/**
 * A signed-in API session outside the browser, for the other side of the
 * marketplace (shops bidding) and for setting up jobs; it sends the CSRF token.
 */
async function apiAs(account: { email: string; password?: string } | { signUp: { displayName: string; email: string; role: 'shop' | 'builder' } }) {
  const api = await suite.apiAs('signUp' in account ? account : { email: account.email, password: account.password });
  const send = (method: 'GET' | 'POST' | 'PUT', path: string, data: unknown = {}) => api<any>(method, path, data);
  return { send, api };
}

/** A shop with a profile places a bid on the job, through the API. */
async function shopBids(shop: Awaited<ReturnType<typeof apiAs>>, jobId: string, profile: Parameters<typeof shopProfileInput>[0], bid: Parameters<typeof bidInput>[0]) {
  await shop.send('PUT', '/api/shop-profile', shopProfileInput(profile));
  return shop.send('POST', `/api/jobs/${jobId}/bids`, bidInput(bid));
}

/** A job of the demo builder's, made through the API, optionally published. */
async function builderJob(input: Partial<JobInput>, publish: boolean, photo?: string): Promise<JobDetail> {
  const juno = await apiAs(builder);
  const { job } = await jobInState('draft', { builder: juno.api }, { input });
  if (photo) await juno.api.upload(`/api/jobs/${job.id}/photos`, 'photos', [{ name: 'deck.jpg', mimeType: 'image/jpeg', buffer: readFileSync(photo) }]);
  if (publish) await juno.send('POST', `/api/jobs/${job.id}/publish`);
  return job;
}

describe('a builder posting a job and choosing a shop, in a real browser', () => {
  it('when the builder posts a job with two photos, a shop finds it on the board and bids, and the builder accepts, then every step shows and the job ends awarded', async () => {
    await signIn(builder.email, '/jobs/new');
    await page.getByRole('heading', { level: 1, name: 'Post a job' }).waitFor();
    const form = page.getByRole('form', { name: 'Job details' });
    const figures = page.getByRole('complementary', { name: 'Live figures' });
    await expect(figures.getByTestId('guidance-caution').textContent()).resolves.toContain(
      "Engine and piston makers' specifications, calibrated instruments, local codes and licensed practice govern.",
    );

    // The block, with a cylinder count the schema refuses.
    await fillIronV8Job(form, { title: 'Bore, hone and deck an iron V8 block', cylinders: '20' });
    // Three years out is further ahead than the form takes.
    const neededBy = form.getByLabel('Date you need the parts back');
    await neededBy.fill(inDays(3 * 365));
    // 20 cylinders is no engine the form accepts, so no displacement yet.
    await expect(figures.getByText(/Still to enter: the number of cylinders/).isVisible()).resolves.toBe(true);

    // Saving from the summary finds both, and opens the first step holding one at its field.
    await saveJobForm(form);
    const cylinders = form.getByLabel('Cylinders', { exact: true });
    await form.getByText('At most 16 cylinders.').waitFor();
    await form.getByRole('heading', { level: 2, name: 'Step 1 of 5: What you send and the work' }).waitFor();
    await expect(form.getByRole('button', { name: '1. What you send and the work' }).getAttribute('aria-current')).resolves.toBe('step');
    await expect(page.evaluate(() => (document.activeElement as HTMLInputElement | null)?.name)).resolves.toBe('cylinders');
    await expect(cylinders.getAttribute('aria-invalid')).resolves.toBe('true');
    const describedBy = (await cylinders.getAttribute('aria-describedby'))!;
    await expect(page.locator(`[id="${describedBy}"]`).textContent()).resolves.toBe('At most 16 cylinders.');
    await expect(form.getByLabel('Job title').inputValue()).resolves.toBe('Bore, hone and deck an iron V8 block');
    expect(page.url()).toBe(url('/jobs/new'));
    await expect(neededBy.getAttribute('aria-invalid')).resolves.toBe('true');
    await expect(page.locator(`[id="${(await neededBy.getAttribute('aria-describedby'))!.split(' ').at(-1)}"]`).textContent()).resolves.toBe(
      'Pick a date within two years from today.',
    );
    await openJobStep(form, 'Getting there, place and date');
    await neededBy.fill(inDays(30));

    // Fixing the count brings the figures, and per-cylinder work follows it.
    await openJobStep(form, 'What you send and the work');
    await cylinders.fill('8');
    await form.getByText('At most 16 cylinders.').waitFor({ state: 'detached' });
    // derived: π/4 · 4² · 3.48 · 8 in³ × 16.387064 = 5,733.0 cc
    const expectedCc = (Math.PI / 4) * 4 ** 2 * 3.48 * 8 * CC_PER_CUBIC_INCH;
    expect(expectedCc).toBeCloseTo(5733, 0);
    await expect(numberIn(figures.getByTestId('job-displacement-cc'))).resolves.toBeCloseTo(expectedCc, 0);
    // derived: finished = piston 4.028 + mean clearance (0.0025 + 0.0035)/2 = 4.0310 in; oversize 4.031 − 4.000 = +0.0310 in
    await expect(figures.getByTestId('job-finished-bore').textContent()).resolves.toBe('4.031 in');
    // common practice: 0.0025 in left for the hone, so bore to 4.0310 − 0.0025 = 4.0285 in
    await expect(figures.getByTestId('job-bore-to').textContent()).resolves.toBe('4.0285 in');
    await expect(figures.getByTestId('job-oversize').textContent()).resolves.toBe('+0.0310 in');
    await expect(form.getByLabel('Cylinders for Bore').inputValue()).resolves.toBe('8');
    await expect(form.getByLabel('Cylinders for Hone').inputValue()).resolves.toBe('8');
    await expect(form.getByLabel('Blocks for Deck').inputValue()).resolves.toBe('1');
    await page.screenshot({ path: join(artifactsDir, 'job-form.png'), fullPage: true });

    // Millimetres convert what is typed (1 in = 25.4 mm exactly), and back.
    await openJobStep(form, 'Sizes and limits');
    await form.getByRole('radio', { name: 'Millimetres' }).click();
    await expect(form.getByLabel('Stock bore (mm)').inputValue()).resolves.toBe('101.6');
    await expect(numberIn(figures.getByTestId('job-displacement-cc'))).resolves.toBeCloseTo(expectedCc, 0);
    await form.getByRole('radio', { name: 'Inches' }).click();
    await expect(form.getByLabel('Stock bore (in)').inputValue()).resolves.toBe('4');

    await page.setViewportSize({ width: 1280, height: 900 });
    await page.screenshot({ path: join(artifactsDir, 'job-form-1280.png'), fullPage: true });
    await page.setViewportSize({ width: 768, height: 1024 });

    // The summary lists what was entered, each part with a way back to its step.
    await openJobStep(form, 'Check and save');
    const summary = form.getByTestId('job-form-summary');
    await summary.waitFor();
    await summary.getByText('Bore, hone and deck an iron V8 block', { exact: true }).waitFor();
    const summaryText = (await summary.textContent())!;
    for (const shown of ['Bore8 cylinders', 'Hone8 cylinders', 'Deck1 block', 'Small-block V8, late 1970s', 'Cast iron', 'Forged', '4.000 in', '0.0025 in – 0.0035 in', 'Columbus, Ohio, United States', 'I ship the parts to the shop']) {
      expect(summaryText, shown).toContain(shown);
    }
    await page.screenshot({ path: join(artifactsDir, 'job-form-summary.png'), fullPage: true });
    await summary.getByRole('button', { name: 'Edit getting there, place and date' }).click();
    await form.getByRole('heading', { level: 2, name: 'Step 3 of 5: Getting there, place and date' }).waitFor();
    await expect(page.evaluate(() => document.activeElement?.textContent)).resolves.toBe('Step 3 of 5: Getting there, place and date');

    await saveJobForm(form);
    await page.waitForURL(/\/jobs\/[0-9a-f-]{36}$/);
    const jobId = new URL(page.url()).pathname.split('/').pop()!;
    await page.getByRole('heading', { level: 1, name: 'Bore, hone and deck an iron V8 block' }).waitFor();
    await page.getByText('Status: Draft', { exact: true }).waitFor();
    await expect(page.getByText('4.000 in', { exact: true }).first().isVisible()).resolves.toBe(true);
    await expect(page.getByText('0.0025 in – 0.0035 in').isVisible()).resolves.toBe(true);

    // A file that is not a photo is refused before it is sent.
    const chooser = page.getByLabel('Choose photos');
    await chooser.setInputFiles({ name: 'notes.txt', mimeType: 'text/plain', buffer: Buffer.from('not a photo') });
    await page.getByText('“notes.txt” is not a JPEG, PNG or WebP photo.').waitFor();

    // Two photos, each with its own progress bar, then two thumbnails.
    await chooser.setInputFiles([photos.left, photos.right]);
    await page.getByRole('progressbar', { name: 'Upload of deck-left.jpg' }).waitFor();
    await page.getByRole('progressbar', { name: 'Upload of deck-right.jpg' }).waitFor();
    await expect(page.locator('progress').count()).resolves.toBe(2);
    await page.getByRole('button', { name: 'Open photo 2 of 2 full size' }).waitFor();
    await expect(page.getByText('Uploaded', { exact: true }).count()).resolves.toBe(2);
    const thumbs = page.getByTestId('job-photo-thumb');
    await expect(thumbs.count()).resolves.toBe(2);
    await page.waitForFunction(() => [...document.querySelectorAll<HTMLImageElement>('[data-testid="job-photo-thumb"]')].every((img) => img.complete && img.naturalWidth > 0));

    // The full-size view: a dialog; arrows step, Tab stays inside, Escape closes and focus comes back.
    const first = page.getByRole('button', { name: 'Open photo 1 of 2 full size' });
    await first.click();
    const viewer = page.getByRole('dialog', { name: 'Photo 1 of 2' });
    await viewer.waitFor();
    await page.waitForFunction(() => {
      const img = document.querySelector<HTMLImageElement>('dialog[open] img');
      return Boolean(img?.complete && img.naturalWidth > 0);
    });
    await page.screenshot({ path: join(artifactsDir, 'job-photo-viewer.png') });
    await page.keyboard.press('ArrowRight');
    await page.getByRole('dialog', { name: 'Photo 2 of 2' }).waitFor();
    for (let i = 0; i < 5; i += 1) await page.keyboard.press('Tab');
    await expect(page.evaluate(() => Boolean(document.activeElement?.closest('dialog[open]')))).resolves.toBe(true);
    await page.keyboard.press('ArrowLeft');
    await viewer.waitFor();
    await page.keyboard.press('Escape');
    await viewer.waitFor({ state: 'hidden' });
    await expect(page.evaluate(() => document.activeElement?.getAttribute('aria-label'))).resolves.toBe('Open photo 1 of 2 full size');
    await page.screenshot({ path: join(artifactsDir, 'job-detail-owner.png'), fullPage: true });

    await page.getByRole('button', { name: 'Publish' }).click();
    await page.getByText('Status: Open for bids', { exact: true }).waitFor();

    // Lantern Hill finds the job on the board and bids through its own browser; two more shops bid through the API.
    const [lantern, kess, quarry] = await Promise.all([
      apiAs(lanternHill),
      apiAs(kessrow),
      apiAs({ signUp: { displayName: 'Quarry Bend Machining', email: uniqueEmail('quarry-bend'), role: 'shop' } }),
    ]);
    await lantern.send('PUT', '/api/shop-profile', shopProfileInput({ name: 'Lantern Hill Machine Works', city: 'Dayton', capabilities: ['clean', 'bore', 'hone', 'deck'] }));
    // The shop that will be chosen sets up its payout account through the stand-in's onboarding page.
    const { url: onboarding } = await lantern.send('POST', '/api/shop-profile/payouts');
    await completeOnboardingPage(onboarding);
    await expect.poll(async () => (await lantern.send('GET', '/api/shop-profile')).shop.payouts, { timeout: 8_000 }).toBe('ready');
    const shopContext = await suite.browser.newContext({ viewport: { width: 1280, height: 900 } });
    shopContext.setDefaultTimeout(10_000);
    const shopPage = await shopContext.newPage();
    try {
      await suite.signIn(shopPage, lanternHill.email, '/board');
      await shopPage.getByRole('link', { name: 'Bore, hone and deck an iron V8 block' }).first().click();
      await shopPage.waitForURL(url(`/jobs/${jobId}`));
      const bidForm = shopPage.getByRole('form', { name: 'Your bid', exact: true });
      await bidForm.waitFor();
      // Prefilled from the job's work and the rate card: 8 × $35.00 + 8 × $25.00 + 1 × $180.00.
      await expect.poll(() => bidForm.getByTestId('bid-running-total').textContent()).toBe('$660.00');
      await bidForm.getByLabel('Turnaround (working days)').fill('9');
      await bidForm.getByLabel('Note to the builder (optional)').fill('Torque plate on hand for the final hone.');
      await bidForm.getByRole('button', { name: 'Send my bid' }).click();
      await shopPage.getByText('Bid sent. The builder has been told.').waitFor();
    } finally {
      await shopContext.close();
    }
    await shopBids(kess, jobId, { name: 'Kessrow Bore & Deck', region: 'Indiana', city: 'Muncie', capabilities: ['bore', 'hone'], rateCard: [] }, {
      lineItems: [
        { operation: 'bore', description: 'Bore and hone', quantity: 8, unitPriceCents: 7000 },
        { operation: 'deck', description: 'Deck (sent out)', quantity: 1, unitPriceCents: 22000 },
      ],
      turnaroundDays: 6,
    });
    await shopBids(quarry, jobId, { name: 'Quarry Bend Machining', region: 'Kentucky', city: 'Lexington' }, { turnaroundDays: 25 });

    await page.reload();
    const bids = page.getByRole('list', { name: 'Bids on this job' });
    await bids.waitFor();
    await expect(page.getByTestId('bid-card').count()).resolves.toBe(3);
    const card = (shop: string) => page.getByTestId('bid-card').filter({ hasText: shop });
    // $280 + $200 + $180 = $660.00 for Lantern Hill.
    await expect(card('Lantern Hill Machine Works').getByTestId('bid-total').textContent()).resolves.toBe('$660.00');
    await expect(card('Lantern Hill Machine Works').getByText('100%').isVisible()).resolves.toBe(true);
    await expect(card('Kessrow Bore & Deck').getByText('67%').isVisible()).resolves.toBe(true);
    await expect(card('Kessrow Bore & Deck').getByText('Quickest').isVisible()).resolves.toBe(true);
    await expect(card('Quarry Bend Machining').getByText('No reviews yet').isVisible()).resolves.toBe(true);
    // Each bid carries the shop's record on Tenthmark; a new shop has too little history for any figure.
    await expect(card('Quarry Bend Machining').getByText('No record on Tenthmark yet: too few finished jobs for a figure.').isVisible()).resolves.toBe(true);
    await card('Lantern Hill Machine Works').locator('summary').click();
    await expect(card('Lantern Hill Machine Works').getByRole('cell', { name: '$180.00' }).first().isVisible()).resolves.toBe(true);

    // Decline one with a reason.
    await page.getByRole('button', { name: 'Decline the bid from Quarry Bend Machining' }).click();
    const declineDialog = page.getByRole('dialog', { name: 'Decline the bid from Quarry Bend Machining?' });
    await declineDialog.getByLabel('Reason, optional').fill('Five weeks is too long for my build.');
    await declineDialog.getByRole('button', { name: 'Decline bid' }).click();
    await declineDialog.waitFor({ state: 'hidden' });
    await card('Quarry Bend Machining').getByText('Declined').waitFor();
    await page.screenshot({ path: join(artifactsDir, 'bid-comparison.png'), fullPage: true });

    await page.setViewportSize({ width: 1280, height: 900 });
    const table = page.getByRole('table', { name: 'Bids on this job, side by side' });
    await table.waitFor();
    await expect(table.getByTestId('bid-row').count()).resolves.toBe(3);
    await page.screenshot({ path: join(artifactsDir, 'bid-comparison-1280.png'), fullPage: true });
    await page.setViewportSize({ width: 768, height: 1024 });

    // Accept: the confirm step says the other open bid will be declined.
    await page.getByRole('button', { name: 'Accept the bid from Lantern Hill Machine Works' }).click();
    const acceptDialog = page.getByRole('dialog', { name: 'Accept the bid from Lantern Hill Machine Works?' });
    await expect(acceptDialog.textContent()).resolves.toContain('The other open bid will be declined and its shop told.');
    await acceptDialog.getByRole('button', { name: 'Accept this bid' }).click();
    await acceptDialog.waitFor({ state: 'hidden' });
    await page.getByText('Status: Awarded, payment due', { exact: true }).waitFor();

    // Paying: the builder leaves for the payment page (the local stand-in), is declined once, then pays.
    await page.getByText('held by Tenthmark until you accept the shop’s inspection record', { exact: false }).first().waitFor();
    await page.getByRole('button', { name: 'Pay and hold for the work' }).click();
    await page.waitForURL((target) => target.toString().startsWith(suite.app.payments.url));
    await page.getByLabel('Card number').fill('4000 0000 0000 0002');
    await page.getByRole('button', { name: /^Pay / }).click();
    await expect(page.getByRole('alert').textContent()).resolves.toMatch(/declined/i);
    await page.getByLabel('Card number').fill('4242 4242 4242 4242');
    await page.getByRole('button', { name: /^Pay / }).click();
    await page.waitForURL((target) => target.toString().startsWith(url(`/jobs/${jobId}`)));
    await expect.poll(() => page.getByTestId('money-held').textContent(), { timeout: 10_000 }).toBe('$660.00');
    await page.getByText('Status: Paid and held', { exact: true }).waitFor();
    await page.screenshot({ path: join(artifactsDir, 'job-funded.png'), fullPage: true });
    await page.getByText('You accepted the bid from Lantern Hill Machine Works', { exact: true }).waitFor();
    await card('Lantern Hill Machine Works').getByText('Accepted').waitFor();
    await card('Kessrow Bore & Deck').getByText('Declined').waitFor();
    await expect(page.getByRole('button', { name: /^Accept the bid/ }).count()).resolves.toBe(0);
    await expect(page.getByLabel('Choose photos').count()).resolves.toBe(0);

    // My jobs lists it as awarded; an unused filter shows the empty state.
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'My jobs' }).click();
    const row = page.getByTestId('my-job').filter({ hasText: 'Bore, hone and deck an iron V8 block' });
    await row.getByText('Status: Paid and held', { exact: true }).waitFor();
    await page.screenshot({ path: join(artifactsDir, 'my-jobs.png'), fullPage: true });
    await page.getByLabel('Show').selectOption('in_work');
    await page.getByText('No jobs with the status “In the shop”').waitFor();
    expect(page.url()).toBe(url('/jobs?status=in_work'));
    expect(consoleErrors, consoleErrors.join("\n")).toEqual([]);
  });

  it('when the builder posts a crank-only grind with limits, then no block or bore spec is asked, and the job page lists the limits with the defaults that apply and their source', async () => {
    await signIn(builder.email, '/jobs/new');
    const form = page.getByRole('form', { name: 'Job details' });
    const figures = page.getByRole('complementary', { name: 'Live figures' });
    await form.getByLabel('Job title').fill('Grind an inline-six crank ten under');
    await form.getByLabel('Engine', { exact: true }).fill('Inline six, 1960s');
    await form.getByLabel('Layout').selectOption('inline');
    await form.getByLabel('Cylinders', { exact: true }).fill('6');

    // Only the crankshaft is sent: no material is asked, and block work cannot be ticked.
    const sent = form.getByRole('group', { name: 'What you send' });
    await sent.getByRole('checkbox', { name: 'Block', exact: true }).uncheck();
    await sent.getByRole('checkbox', { name: 'Crankshaft', exact: true }).check();
    await expect(form.getByRole('radio', { name: 'Cast iron' }).count()).resolves.toBe(0);
    const bore = form.getByRole('checkbox', { name: 'Bore', exact: true });
    await expect(bore.isDisabled()).resolves.toBe(true);
    const boreNotes = (await bore.getAttribute('aria-describedby'))!.split(' ');
    await expect(page.locator(`[id="${boreNotes[1]}"]`).textContent()).resolves.toBe('Add the block to what you send to choose this.');
    await form.getByRole('checkbox', { name: 'Crank grind', exact: true }).check();
    await expect(form.getByLabel('Stock bore (in)').count()).resolves.toBe(0);
    await figures.getByText('Displacement and bore sizes show for work on the cylinder bores.').waitFor();

    // The limits come from their declaration, each default shown under its field with its source.
    await openJobStep(form, 'Sizes and limits');
    const limits = form.getByRole('group', { name: 'Limits for crank grind' });
    const tolerance = limits.getByLabel('Journal size tolerance (below the finished size) (in), optional');
    const toleranceNotes = (await tolerance.getAttribute('aria-describedby'))!.split(' ');
    await expect(page.locator(`[id="${toleranceNotes[0]}"]`).textContent()).resolves.toBe('Empty: 0.0005 in — common practice, from memory; the maker’s figure governs');
    // The caution stands under the limits as well as beside the live figures.
    await expect(form.getByTestId('guidance-caution').count()).resolves.toBe(2);
    await limits.getByLabel('Main journal standard diameter (in), optional').fill('2.4995');
    await limits.getByLabel('Largest journal taper (in), optional').fill('0.0002');
    // Millimetres convert the limits typed (1 in = 25.4 mm exactly: 2.4995 in = 63.4873 mm) and show the millimetre defaults, and back.
    await form.getByRole('radio', { name: 'Millimetres' }).click();
    await expect(limits.getByLabel('Main journal standard diameter (mm), optional').inputValue()).resolves.toBe('63.4873');
    await limits.getByText('Empty: 0.013 mm — common practice, from memory; the maker’s figure governs').first().waitFor();
    await form.getByRole('radio', { name: 'Inches' }).click();
    await expect(limits.getByLabel('Main journal standard diameter (in), optional').inputValue()).resolves.toBe('2.4995');
    const ra = limits.getByLabel('Largest journal Ra (µm), optional');
    await ra.fill('smooth');

    await openJobStep(form, 'Getting there, place and date');
    await form.getByRole('radio', { name: 'I ship the parts to the shop' }).check();
    await form.getByLabel('Country').fill('United States');
    await form.getByLabel('State, province or county').fill('Ohio');
    await form.getByLabel('Town or city').fill('Columbus');
    await form.getByLabel('Date you need the parts back').fill(inDays(21));

    // A limit that is not a number is marked beside it, by its nested path, on the step that holds it.
    await saveJobForm(form);
    await form.getByText('Largest journal Ra (µm) must be a number.').waitFor();
    await form.getByRole('heading', { level: 2, name: 'Step 2 of 5: Sizes and limits' }).waitFor();
    await expect(ra.getAttribute('aria-invalid')).resolves.toBe('true');
    await expect(page.locator(`[id="${(await ra.getAttribute('aria-describedby'))!.split(' ').at(-1)}"]`).textContent()).resolves.toBe('Largest journal Ra (µm) must be a number.');
    await page.screenshot({ path: join(artifactsDir, 'job-form-crank-grind.png'), fullPage: true });
    await ra.fill('');
    // Next checks this step's fields alone, and moves on once they pass.
    for (const after of ['Step 3 of 5: Getting there, place and date', 'Step 4 of 5: Notes and photos', 'Step 5 of 5: Check and save']) {
      await form.getByRole('button', { name: 'Next' }).click();
      await form.getByRole('heading', { level: 2, name: after }).waitFor();
    }
    await form.getByRole('button', { name: 'Save draft' }).click();

    await page.waitForURL(/\/jobs\/[0-9a-f-]{36}$/);
    await page.getByRole('heading', { level: 1, name: 'Grind an inline-six crank ten under' }).waitFor();
    await page.getByRole('heading', { name: 'Limits for crank grind' }).waitFor();
    await expect(page.getByText('Crankshaft', { exact: true }).isVisible()).resolves.toBe(true);
    await expect(page.getByText('2.4995 in', { exact: true }).isVisible()).resolves.toBe(true);
    await expect(page.getByText('0.0002 in', { exact: true }).isVisible()).resolves.toBe(true);
    await expect(page.getByText('0.0005 in (default) — common practice, from memory; the maker’s figure governs', { exact: true }).isVisible()).resolves.toBe(true);
    await expect(page.getByText('0.25 µm (default) — common practice, from memory; the maker’s figure governs', { exact: true }).isVisible()).resolves.toBe(true);
    await expect(page.getByText('Stock bore', { exact: true }).count()).resolves.toBe(0);
    await page.screenshot({ path: join(artifactsDir, 'job-crank-grind-limits.png'), fullPage: true });

    const jobId = new URL(page.url()).pathname.split('/').pop()!;
    const juno = await apiAs(builder);
    const { job } = await juno.send('GET', `/api/jobs/${jobId}`);
    expect(job.spec).toMatchObject({ parts: ['crankshaft'], operations: [{ code: 'crank-grind', quantity: 1 }], limits: { crankGrind: { mainStandard: 2.4995, maxTaper: 0.0002 } } });
    expect(job.spec.limits.crankGrind).not.toHaveProperty('journalRaMaxUm');
    expect(job.blockMaterial).toBeNull();
    expect(consoleErrors, consoleErrors.join("\n")).toEqual([]);
  });

  it('when the builder edits an open job that has a bid, then the page warns that the bidder will be told; cancelling asks first', async () => {
    const job = await builderJob({ title: 'Line hone an aluminium block' }, true);
    await shopBids(await apiAs(lanternHill), job.id, {}, {});

    await signIn(builder.email, `/jobs/${job.id}/edit`);
    await page.getByText('When you save, the 1 shop that bid will be told by e-mail').waitFor();
    await page.screenshot({ path: join(artifactsDir, 'job-edit-open.png') });
    await expect(page.getByLabel('Job title').inputValue()).resolves.toBe('Line hone an aluminium block');
    await expect(page.getByLabel('Stock bore (in)').inputValue()).resolves.toBe('4');
    await page.getByLabel('Job title').fill('Line hone and deck an aluminium block');
    // Unsaved changes to this job are kept on this device: a reload offers them back.
    await page.getByRole('button', { name: '2. Sizes and limits' }).click();
    page.once('dialog', (dialog) => void dialog.accept());
    await page.reload();
    await page.getByRole('button', { name: 'Continue with my changes' }).click();
    await expect(page.getByLabel('Job title').inputValue()).resolves.toBe('Line hone and deck an aluminium block');
    await page.getByRole('heading', { level: 2, name: 'Step 2 of 5: Sizes and limits' }).waitFor();
    await saveJobForm(page.getByRole('form', { name: 'Job details' }), 'Save changes');
    await page.getByRole('heading', { level: 1, name: 'Line hone and deck an aluminium block' }).waitFor();

    await page.getByRole('button', { name: 'Cancel job' }).click();
    const confirm = page.getByRole('dialog', { name: 'Cancel this job?' });
    await expect(confirm.textContent()).resolves.toContain('Shops that bid are told');
    await confirm.getByRole('button', { name: 'Keep the job' }).click();
    await confirm.waitFor({ state: 'hidden' });
    await expect(page.getByText('Status: Open for bids', { exact: true }).isVisible()).resolves.toBe(true);
    await page.getByRole('button', { name: 'Cancel job' }).click();
    await confirm.getByRole('button', { name: 'Cancel the job' }).click();
    await page.getByText('Status: Cancelled', { exact: true }).waitFor();
    await expect(page.getByRole('link', { name: 'Edit' }).count()).resolves.toBe(0);
    expect(consoleErrors, consoleErrors.join("\n")).toEqual([]);
  });

  it('the job form warns before losing typed text: a header link asks first, Stay keeps the text, and a reload offers it back', async () => {
    await signIn(otherBuilder.email, '/jobs/new');
    const form = page.getByRole('form', { name: 'Job details' });
    const title = form.getByLabel('Job title');
    await title.fill('Hot-tank and magnaflux a flathead block');

    // A link in the header asks before leaving; Stay keeps the page and what was typed.
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'My jobs' }).click();
    const leave = page.getByRole('dialog', { name: 'Leave this page?' });
    await leave.waitFor();
    await expect(leave.textContent()).resolves.toContain('kept on this device');
    await page.screenshot({ path: join(artifactsDir, 'job-form-leave.png') });
    await leave.getByRole('button', { name: 'Stay' }).click();
    await leave.waitFor({ state: 'hidden' });
    expect(page.url()).toBe(url('/jobs/new'));
    await expect(title.inputValue()).resolves.toBe('Hot-tank and magnaflux a flathead block');

    // Reloading: the browser asks too, and the page that comes back offers what was typed.
    const asked = new Promise<string>((resolve) => {
      page.once('dialog', (dialog) => {
        resolve(dialog.type());
        void dialog.accept();
      });
    });
    await page.reload();
    await expect(asked).resolves.toBe('beforeunload');
    const offer = page.getByRole('status').filter({ hasText: 'You started a job here before' });
    await offer.getByText('“Hot-tank and magnaflux a flathead block” kept on this device', { exact: false }).waitFor();
    await expect(title.inputValue()).resolves.toBe('');
    await offer.getByRole('button', { name: 'Continue that job' }).click();
    await expect(title.inputValue()).resolves.toBe('Hot-tank and magnaflux a flathead block');

    // Leaving after all, then starting fresh, forgets it.
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'My jobs' }).click();
    await leave.getByRole('button', { name: 'Leave' }).click();
    await page.waitForURL(url('/jobs'));
    await page.goto(url('/jobs/new'));
    await offer.getByRole('button', { name: 'Start fresh' }).click();
    await offer.waitFor({ state: 'detached' });
    await page.reload();
    await form.getByLabel('Job title').waitFor();
    await expect(offer.count()).resolves.toBe(0);
    expect(consoleErrors, consoleErrors.join("\n")).toEqual([]);
  });

  it('when the server refuses a field on saving, then the form opens the step that holds it, at the field', async () => {
    // The browser's clock a year ahead: its own check lets a date 2½ years out pass, the server's (two years from its today) does not.
    await page.clock.setFixedTime(new Date(Date.now() + 365 * 24 * 3600 * 1000));
    await signIn(otherBuilder.email, '/jobs/new');
    const form = page.getByRole('form', { name: 'Job details' });
    await fillIronV8Job(form, { title: 'Bore and hone a V8 for next year', cylinders: '8' });
    const neededBy = form.getByLabel('Date you need the parts back');
    await neededBy.fill(inDays(910));
    await openJobStep(form, 'Notes and photos');
    await form.getByLabel('Anything else the shop should know, optional').fill('No rush.');
    await saveJobForm(form);

    await form.getByRole('heading', { level: 2, name: 'Step 3 of 5: Getting there, place and date' }).waitFor();
    await form.getByText('Pick a date within two years from today.').waitFor();
    await expect(neededBy.getAttribute('aria-invalid')).resolves.toBe('true');
    await expect(page.evaluate(() => (document.activeElement as HTMLInputElement | null)?.name)).resolves.toBe('neededBy');
    await expect(page.getByRole('alert').first().textContent()).resolves.toContain('Please correct the marked fields.');
    expect(page.url()).toBe(url('/jobs/new'));
  });

  it('when the builder saves and publishes from the summary, then the job opens already on the board and nothing is kept to offer back', async () => {
    await signIn(otherBuilder.email, '/jobs/new');
    const form = page.getByRole('form', { name: 'Job details' });
    await fillIronV8Job(form, { title: 'Publish straight from the summary', cylinders: '8' });
    await form.getByLabel('Date you need the parts back').fill(inDays(30));
    await saveJobForm(form, 'Save and publish');
    await page.waitForURL(/\/jobs\/[0-9a-f-]{36}$/);
    await page.getByRole('heading', { level: 1, name: 'Publish straight from the summary' }).waitFor();
    await page.getByText('Status: Open for bids', { exact: true }).waitFor();
    await page.goto(url('/jobs/new'));
    await form.getByLabel('Job title').waitFor();
    await expect(page.getByText('You started a job here before').count()).resolves.toBe(0);
    expect(consoleErrors, consoleErrors.join("\n")).toEqual([]);
  });

  it('when a job has a photo, then My jobs shows it as the thumbnail beside the title', async () => {
    const job = await builderJob({ title: 'A job with a photo of its deck' }, false, photos.left);
    await signIn(builder.email, '/jobs');
    const row = page.getByTestId('my-job').filter({ hasText: job.title });
    await row.waitFor();
    await expect(row.locator('img').count()).resolves.toBe(1);
    await page.waitForFunction((title) => {
      const item = [...document.querySelectorAll('[data-testid="my-job"]')].find((li) => li.textContent?.includes(title));
      const img = item?.querySelector('img');
      return Boolean(img?.complete && img.naturalWidth > 0);
    }, job.title);
  });

  it("when another builder opens someone else's job, then a clear message says why instead of the job", async () => {
    const [draft, open] = await Promise.all([builderJob({ title: 'A draft nobody else sees' }, false), builderJob({ title: 'An open job of Juno’s' }, true)]);
    await signIn(otherBuilder.email, '/dashboard');

    await page.goto(url(`/jobs/${draft.id}`));
    await page.getByText('No such job').waitFor();
    await expect(page.getByText('A draft nobody else sees').count()).resolves.toBe(0);

    // A malformed id names no job either: the same clear page, not an invitation to try again.
    await page.goto(url('/jobs/not-a-uuid'));
    await page.getByText('No such job').waitFor();
    await expect(page.getByRole('button', { name: 'Retry' }).count()).resolves.toBe(0);

    await page.goto(url(`/jobs/${open.id}`));
    await page.getByText('You cannot open this job', { exact: true }).waitFor();
    await expect(page.getByRole('alert').textContent()).resolves.toContain('This job is not yours to see.');
    await page.screenshot({ path: join(artifactsDir, 'job-not-yours.png') });
    await expect(page.getByText('An open job of Juno’s').count()).resolves.toBe(0);
  });
});
