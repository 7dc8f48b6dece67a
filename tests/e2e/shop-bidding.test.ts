import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { beforeEach, describe, expect, it } from 'vitest';
import type { JobInput } from '../../shared/schemas/jobs';
import { DEMO_PASSWORD, demoAccounts } from '../../server/dev/seed';
import { inDays, shopProfileInput, uniqueEmail } from '../factories';
import { confirmationLink } from '../setup/mail-links';
import { completeOnboardingPage } from '../setup/payments';
import { artifactsDir } from '../setup/browser';
import { browserSuite } from '../setup/e2e-suite';
import { jobInState } from '../setup/job-states';

// 404 from /api/shop-profile marks a shop without a profile yet.
const suite = browserSuite({ ignoreConsole: (msg) => /404/.test(msg.text()) && msg.location().url.includes('/api/shop-profile') });
const { url, consoleErrors } = suite;
let page: Page;

beforeEach(async () => {
  page = await suite.newPage();
  consoleErrors.length = 0;
});

const demo = (email: string) => demoAccounts.find((a) => a.email === email)!;
const builder = demoAccounts.find((a) => a.role === 'builder')!;
const kessrow = demo('desk@kessrow.test');

/** A signed-in API session (tests/setup/api-session.ts): the session cookie and the CSRF token travel with every call. */
async function apiSession(email: string) {
  const api = await suite.apiAs(email);
  return {
    api,
    get: <T>(path: string) => api<T>('GET', path),
    post: <T>(path: string, body: unknown = {}) => api<T>('POST', path, body),
    put: <T>(path: string, body: unknown) => api<T>('PUT', path, body),
  };
}

/** An open job on the board, posted and published by the demo builder through the API. */
async function publishJob(session: Awaited<ReturnType<typeof apiSession>>, overrides: Partial<JobInput>) {
  return (await jobInState('open', { builder: session.api }, { input: overrides })).job;
}

const signIn = (account: { email: string }, returnTo: string) => suite.signIn(page, account.email, returnTo);

const rowTitles = () => page.locator('table tbody tr th[scope="row"]').allTextContents();

/** Lets the builder-side job page (built in parallel) settle; fails with a clear reason if it is still a placeholder. */
async function waitForBidPanel() {
  const panel = page.getByRole('heading', { name: 'Bid on this job', level: 2 });
  const placeholder = page.getByText('Not built yet.');
  await panel
    .or(placeholder)
    .first()
    .waitFor()
    .catch(async (error: Error) => {
      await page.screenshot({ path: join(artifactsDir, 'bid-panel-missing.png'), fullPage: true });
      throw new Error(`${error.message}\nconsole errors: ${consoleErrors.join(' | ')}`);
    });
  if (await placeholder.isVisible()) throw new Error('the job detail page (client/app/routes/job-detail.tsx) is still a placeholder; the bid panel cannot be reached');
}

describe('a shop in a real browser', () => {
  it('when a shop sets up its profile, finds a job on the board and bids, then the bid, its revision and My bids show it', async () => {
    const builderApi = await apiSession(builder.email);
    const soon = await publishJob(builderApi, {
      title: 'Torque-plate hone, due soon',
      neededBy: inDays(12),
      operations: [
        { code: 'bore', quantity: 8 },
        { code: 'hone', quantity: 8 },
        { code: 'torque-plate-hone', quantity: 8 },
      ],
    });
    const later = await publishJob(builderApi, {
      title: 'Torque-plate hone, due later',
      neededBy: inDays(45),
      operations: [{ code: 'torque-plate-hone', quantity: 8 }],
    });
    const middle = await publishJob(builderApi, {
      title: 'Torque-plate hone, due mid-month',
      neededBy: inDays(25),
      cylinders: 6,
      operations: [{ code: 'torque-plate-hone', quantity: 6 }],
    });
    const other = await publishJob(builderApi, { title: 'Deck only, no honing', neededBy: inDays(5), operations: [{ code: 'deck', quantity: 1 }] });

    // A shop that has just signed up (the demo shops come with profiles) has none yet: the board says one is needed to bid.
    const newShop = { email: uniqueEmail('new-shop') };
    const csrf = await fetch(url('/api/auth/csrf'));
    const signUp = await fetch(url('/api/auth/signup'), {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', Cookie: csrf.headers.getSetCookie()[0].split(';')[0], 'X-CSRF-Token': (await csrf.json()).csrfToken },
      body: JSON.stringify({ displayName: 'Lantern Hill Machine Works', email: newShop.email, password: DEMO_PASSWORD, role: 'shop', acceptTerms: true }),
    });
    expect(signUp.status).toBe(201);
    await signIn(newShop, '/board');
    await page.getByText('Set up your shop profile to bid').waitFor();
    // Bidding needs a confirmed address: the shop follows the link from its sign-up mail.
    await page.goto(url((await confirmationLink(newShop.email)).path));
    await page.getByText('Confirmed').waitFor();
    await page.goto(url('/board'));
    await page.getByText('Set up your shop profile to bid').waitFor();

    // The profile form: a price with three decimals is refused beside its field, with what was typed kept.
    await page.getByRole('link', { name: 'Set up your shop profile' }).click();
    await page.waitForURL(url('/shop/profile'));
    await page.getByText('A shop needs a profile before it can bid').waitFor();
    await page.getByLabel('Shop name').fill('Lantern Hill Machine Works');
    // Where the shop is (its receiving address, further down, has fields of the same names).
    const about = page.getByRole('region', { name: 'Your shop' });
    await about.getByLabel('Country').fill('United States');
    await about.getByLabel('State, province or county').fill('Ohio');
    await about.getByLabel('Town or city').fill('Akron');
    for (const work of ['Bore', 'Hone', 'Torque-plate hone', 'Deck']) await page.getByRole('checkbox', { name: work, exact: true }).check();
    const borePrice = page.getByRole('textbox', { name: 'Bore', exact: true });
    await borePrice.fill('12.345');
    await page.getByRole('textbox', { name: 'Hone', exact: true }).fill('25.5');
    await page.getByRole('textbox', { name: 'Deck', exact: true }).fill('$1,250');
    await page.getByLabel('Typical turnaround (working days)').fill('7');
    await expect(page.getByRole('textbox', { name: 'Deck', exact: true }).inputValue()).resolves.toBe('1250.00');
    await page.getByLabel('Equipment notes').fill('Boring bar, power hone with torque plates, deck surfacer.');
    await page.getByRole('button', { name: 'Create my shop profile' }).click();
    await page.getByText('Use at most 2 decimal places (whole cents), like 12.35.').waitFor();
    await expect(borePrice.getAttribute('aria-invalid')).resolves.toBe('true');
    await expect(borePrice.inputValue()).resolves.toBe('12.345');
    const describedBy = (await borePrice.getAttribute('aria-describedby'))!.split(' ');
    await expect(page.locator(`[id="${describedBy.at(-1)}"]`).textContent()).resolves.toBe('Use at most 2 decimal places (whole cents), like 12.35.');

    await borePrice.fill('35');
    await page.getByRole('button', { name: 'Create my shop profile' }).click();
    await page.getByText('Shop profile saved. You can bid on open jobs now.').waitFor();
    await page.getByRole('button', { name: 'Save changes' }).waitFor();
    await page.screenshot({ path: join(artifactsDir, 'shop-profile.png'), fullPage: true });
    await page.setViewportSize({ width: 768, height: 1024 });
    await page.screenshot({ path: join(artifactsDir, 'shop-profile-768.png'), fullPage: true });
    await page.setViewportSize({ width: 1280, height: 900 });

    // The server kept exact cents: 25.5 → 2550, $1,250 → 125000; torque-plate hone was left blank (quoted job by job).
    const shopApi = await apiSession(newShop.email);
    const { shop } = await shopApi.get<{ shop: { rateCard: Array<{ operation: string; priceCents: number }> } }>('/api/shop-profile');
    expect(shop.rateCard).toEqual([
      { operation: 'bore', priceCents: 3500 },
      { operation: 'deck', priceCents: 125000 },
      { operation: 'hone', priceCents: 2550 },
    ]);

    // The board: filter by work, sort by Needed by; both live in the address bar.
    await page.getByRole('link', { name: 'Job board' }).click();
    await page.waitForURL(url('/board'));
    await expect(page.getByText('Set up your shop profile to bid').count()).resolves.toBe(0);
    await page.getByLabel('Work', { exact: true }).selectOption('torque-plate-hone');
    await page.waitForURL(/operation=torque-plate-hone/);
    await page.getByText(/^3 jobs match these filters$/).waitFor();
    const postedHeader = page.getByRole('columnheader', { name: /Posted/ });
    const neededHeader = page.getByRole('columnheader', { name: /Needed by/ });
    await expect(postedHeader.getAttribute('aria-sort')).resolves.toBe('descending');
    await expect(neededHeader.getAttribute('aria-sort')).resolves.toBe('none');
    // Newest first: the three were published in this order.
    expect(await rowTitles()).toEqual([middle.title, later.title, soon.title]);
    expect(await rowTitles()).not.toContain(other.title);

    await neededHeader.getByRole('button').click();
    await page.waitForURL(/sort=needed-soonest/);
    await expect.poll(() => neededHeader.getAttribute('aria-sort')).toBe('ascending');
    await expect.poll(() => postedHeader.getAttribute('aria-sort')).toBe('none');
    await expect.poll(rowTitles).toEqual([soon.title, middle.title, later.title]);

    // The header buttons work from the keyboard too.
    await page.getByRole('columnheader', { name: /Bids/ }).getByRole('button').focus();
    await page.keyboard.press('Enter');
    await page.waitForURL(/sort=fewest-bids/);
    await expect.poll(() => page.getByRole('columnheader', { name: /Bids/ }).getAttribute('aria-sort')).toBe('ascending');
    await expect.poll(() => neededHeader.getAttribute('aria-sort')).toBe('none');
    await page.goBack();
    await page.waitForURL(/sort=needed-soonest/);
    await expect.poll(() => neededHeader.getAttribute('aria-sort')).toBe('ascending');
    await expect.poll(rowTitles).toEqual([soon.title, middle.title, later.title]);

    // A filter nothing matches shows a clear empty state.
    await page.getByLabel('Cylinders').selectOption('16');
    await page.getByText('No open jobs match these filters').waitFor();
    await page.getByLabel('Cylinders').selectOption('');
    await expect.poll(rowTitles).toEqual([soon.title, middle.title, later.title]);
    await page.screenshot({ path: join(artifactsDir, 'board.png'), fullPage: true });
    await page.setViewportSize({ width: 768, height: 1024 });
    await page.screenshot({ path: join(artifactsDir, 'board-768.png'), fullPage: true });
    await page.setViewportSize({ width: 1280, height: 900 });

    // The job page: the bid form is prefilled from the job's work and the rate card, with a running total.
    await page.getByRole('link', { name: soon.title }).click();
    await page.waitForURL(url(`/jobs/${soon.id}`));
    await waitForBidPanel();
    const form = page.getByRole('form', { name: 'Your bid', exact: true });
    await expect(form.getByLabel('Line 1: description').inputValue()).resolves.toBe('Bore');
    await expect(form.getByLabel('Line 2: description').inputValue()).resolves.toBe('Hone');
    await expect(form.getByLabel('Line 3: description').inputValue()).resolves.toBe('Torque-plate hone');
    await expect(form.getByLabel('Line 1: quantity').inputValue()).resolves.toBe('8');
    await expect(form.getByLabel('Line 1: unit price in dollars').inputValue()).resolves.toBe('35.00');
    await expect(form.getByLabel('Line 2: unit price in dollars').inputValue()).resolves.toBe('25.50');
    await expect(form.getByLabel('Line 3: unit price in dollars').inputValue()).resolves.toBe('0.00');
    await page.getByText('Your rate card has no price for Torque-plate hone, so that line starts at $0.00.').waitFor();
    await expect(form.getByLabel('Turnaround (working days)').inputValue()).resolves.toBe('7');
    await expect(form.getByLabel('Price valid until').inputValue()).resolves.toMatch(/^\d{4}-\d{2}-\d{2}$/);
    const total = form.getByTestId('bid-running-total');
    // 8 × $35.00 + 8 × $25.50 + 8 × $0.00
    await expect(total.textContent()).resolves.toBe('$484.00');

    await form.getByLabel('Line 3: unit price in dollars').fill('12.3');
    await expect.poll(() => total.textContent()).toBe('$582.40');
    await form.getByLabel('Line 2: unit price in dollars').fill('1.234');
    await expect.poll(() => total.textContent()).toBe('$378.40');
    await form.getByRole('button', { name: 'Send my bid' }).click();
    await form.getByText('Use at most 2 decimal places (whole cents), like 12.35.').waitFor();
    await form.getByLabel('Line 2: unit price in dollars').fill('25.50');
    await expect.poll(() => total.textContent()).toBe('$582.40');
    await form.getByLabel('Note to the builder (optional)').fill('Price assumes the block arrives clean.');
    await page.screenshot({ path: join(artifactsDir, 'bid-form.png'), fullPage: true });
    await page.setViewportSize({ width: 768, height: 1024 });
    await page.screenshot({ path: join(artifactsDir, 'bid-form-768.png'), fullPage: true });
    await page.setViewportSize({ width: 1280, height: 900 });
    await form.getByRole('button', { name: 'Send my bid' }).click();
    await page.getByText('Bid sent. The builder has been told.').waitFor();

    // The active bid, as the server priced it.
    await page.getByRole('heading', { name: 'Your bid', level: 2 }).waitFor();
    await page.getByRole('button', { name: 'Revise bid' }).waitFor();
    await expect(page.getByRole('table', { name: 'Your bid, version 1' }).getByRole('row').last().textContent()).resolves.toContain('$582.40');

    // Revise: the form starts from the bid; the earlier version stays listed.
    await page.getByRole('button', { name: 'Revise bid' }).click();
    const revise = page.getByRole('form', { name: 'Revise your bid' });
    await expect(revise.getByLabel('Line 3: unit price in dollars').inputValue()).resolves.toBe('12.30');
    await revise.getByLabel('Line 1: unit price in dollars').fill('38');
    await revise.getByRole('button', { name: 'Add a line' }).click();
    await revise.getByLabel('Line 4: description').fill('Chamfer the bore tops');
    await revise.getByLabel('Line 4: unit price in dollars').fill('40');
    // 8 × 38 + 8 × 25.50 + 8 × 12.30 + 1 × 40
    await expect.poll(() => revise.getByTestId('bid-running-total').textContent()).toBe('$646.40');
    await revise.getByRole('button', { name: 'Send the revised bid' }).click();
    await page.getByText('Bid revised. The builder now sees version 2.').waitFor();
    await expect(page.getByRole('table', { name: 'Your bid, version 2' }).getByRole('row').last().textContent()).resolves.toContain('$646.40');
    const earlier = page.getByRole('region', { name: 'Earlier versions' });
    await page.screenshot({ path: join(artifactsDir, 'bid-active.png'), fullPage: true });
    const version1 = earlier.locator('summary', { hasText: 'Version 1' });
    await expect(version1.textContent()).resolves.toMatch(/Version 1\$582\.407 working days/);
    await version1.click();
    await expect(earlier.getByRole('table', { name: 'Version 1' }).getByRole('row', { name: /Bore/ }).textContent()).resolves.toBe('Bore8$35.00$280.00');

    // My bids lists it with its job, status, total and turnaround.
    await page.getByRole('link', { name: 'My bids' }).click();
    await page.waitForURL(url('/bids'));
    const row = page.getByRole('row', { name: new RegExp(soon.title) });
    await row.waitFor();
    await expect(row.textContent()).resolves.toMatch(/Active.*version 2.*\$646\.40.*7 working days/);
    await page.screenshot({ path: join(artifactsDir, 'my-bids.png'), fullPage: true });
    await row.getByRole('link', { name: soon.title }).click();
    await page.waitForURL(url(`/jobs/${soon.id}`));
    expect(consoleErrors).toEqual([]);
  });

  it('when a shop withdraws its bid after confirming, then the job page offers a new bid again', async () => {
    const builderApi = await apiSession(builder.email);
    const job = await publishJob(builderApi, { title: 'Line hone a four-cylinder block', cylinders: 4, operations: [{ code: 'line-hone', quantity: 1 }] });
    const shopApi = await apiSession(kessrow.email);
    await shopApi.put('/api/shop-profile', shopProfileInput({ name: 'Kessrow Bore & Deck', capabilities: ['line-hone', 'deck'], rateCard: [{ operation: 'line-hone', priceCents: 45000 }] }));
    await shopApi.post(`/api/jobs/${job.id}/bids`, { lineItems: [{ operation: 'line-hone', description: 'Line hone', quantity: 1, unitPriceCents: 45000 }], turnaroundDays: 6, validUntil: inDays(10), note: '' });

    await signIn(kessrow, `/jobs/${job.id}`);
    await page.getByRole('heading', { name: 'Your bid', level: 2 }).waitFor();
    await page.getByRole('button', { name: 'Withdraw bid' }).click();
    const dialog = page.getByRole('dialog', { name: 'Withdraw your bid?' });
    await dialog.getByRole('button', { name: 'Keep my bid' }).click();
    await expect(dialog.isVisible()).resolves.toBe(false);
    await page.getByRole('button', { name: 'Withdraw bid' }).click();
    await dialog.getByRole('button', { name: 'Withdraw my bid' }).click();
    await page.getByText('Bid withdrawn. The builder no longer sees it.').waitFor();
    await page.getByText('You withdrew your bid').waitFor();
    await page.getByRole('form', { name: 'Your bid', exact: true }).waitFor();
    await expect(page.getByRole('form', { name: 'Your bid', exact: true }).getByTestId('bid-running-total').textContent()).resolves.toBe('$450.00');
    expect(consoleErrors).toEqual([]);
  });

  it('when the builder accepts a shop’s bid, then the shop’s job page says to wait for payment and My bids shows it accepted', async () => {
    const builderApi = await apiSession(builder.email);
    const job = await publishJob(builderApi, { title: 'Deck an inline-six block', cylinders: 6, layout: 'inline', operations: [{ code: 'deck', quantity: 1 }] });
    const shopApi = await apiSession(kessrow.email);
    await shopApi.put('/api/shop-profile', shopProfileInput({ name: 'Kessrow Bore & Deck', capabilities: ['deck'], rateCard: [{ operation: 'deck', priceCents: 17550 }] }));
    // A bid can be accepted only once the shop can be paid: its payout account goes through the stand-in's onboarding page.
    const { url: onboarding } = await shopApi.post<{ url: string }>('/api/shop-profile/payouts');
    await completeOnboardingPage(onboarding);
    await expect.poll(async () => (await shopApi.get<{ shop: { payouts: string } }>('/api/shop-profile')).shop.payouts, { timeout: 8_000 }).toBe('ready');
    const { bid } = await shopApi.post<{ bid: { id: string } }>(`/api/jobs/${job.id}/bids`, {
      lineItems: [{ operation: 'deck', description: 'Deck', quantity: 1, unitPriceCents: 17550 }],
      turnaroundDays: 4,
      validUntil: inDays(10),
      note: '',
    });
    await builderApi.post(`/api/bids/${bid.id}/accept`);

    await signIn(kessrow, `/jobs/${job.id}`);
    await page.getByText('Accepted — wait for the builder’s payment before starting').waitFor();
    await expect(page.getByRole('table', { name: 'Your accepted bid' }).getByRole('row').last().textContent()).resolves.toContain('$175.50');
    await expect(page.getByRole('button', { name: 'Revise bid' }).count()).resolves.toBe(0);
    await expect(page.getByRole('form', { name: 'Your bid', exact: true }).count()).resolves.toBe(0);

    await page.getByRole('link', { name: 'My bids' }).click();
    const row = page.getByRole('row', { name: /Deck an inline-six block/ });
    await expect(row.textContent()).resolves.toMatch(/Job awarded.*Accepted.*\$175\.50.*4 working days/);
    expect(consoleErrors).toEqual([]);
  });

  it('when anyone opens the shop directory, then filters kept in the address bar narrow it and a shop page shows its rate card', async () => {
    const shopApi = await apiSession(kessrow.email);
    await shopApi.put(
      '/api/shop-profile',
      shopProfileInput({
        name: 'Kessrow Bore & Deck',
        country: 'Canada',
        region: 'Ontario',
        city: 'Hamilton',
        takesShipped: false,
        capabilities: ['line-hone', 'deck', 'crank-grind'],
        rateCard: [
          { operation: 'line-hone', priceCents: 45000 },
          { operation: 'deck', priceCents: 17550 },
        ],
        turnaroundDays: 9,
      }),
    );

    await page.goto(url('/shops'));
    await page.getByRole('heading', { name: 'Machine shops', level: 1 }).waitFor();
    await page.getByLabel('Name or town').fill('kessrow');
    await page.waitForURL(/q=kessrow/);
    await page.getByText(/^1 shop matches these filters$/).waitFor();
    await page.getByLabel('Work', { exact: true }).selectOption('line-hone');
    await page.waitForURL(/operation=line-hone/);
    await page.getByLabel('Shipped parts').selectOption('false');
    await page.waitForURL(/takesShipped=false/);
    const card = page.getByRole('article').filter({ hasText: 'Kessrow Bore & Deck' });
    await card.waitFor();
    await expect(card.textContent()).resolves.toMatch(/Hamilton, Ontario, Canada.*drop-off only.*Line hone.*usually 9 working days.*No reviews yet/);
    await page.screenshot({ path: join(artifactsDir, 'shop-directory.png'), fullPage: true });
    await page.setViewportSize({ width: 768, height: 1024 });
    await page.screenshot({ path: join(artifactsDir, 'shop-directory-768.png'), fullPage: true });
    await page.setViewportSize({ width: 1280, height: 900 });

    // The filters survive a reload, because they live in the address.
    await page.reload();
    await expect(page.getByLabel('Work', { exact: true }).inputValue()).resolves.toBe('line-hone');
    await expect(page.getByLabel('Name or town').inputValue()).resolves.toBe('kessrow');

    await page.getByLabel('Work', { exact: true }).selectOption('valve-job');
    await page.getByText('No shops match these filters').waitFor();
    await page.getByRole('button', { name: 'Clear filters' }).first().click();
    await page.waitForURL(url('/shops'));

    await page.getByRole('link', { name: 'Kessrow Bore & Deck' }).click();
    await page.getByRole('heading', { name: 'Kessrow Bore & Deck', level: 1 }).waitFor();
    const rates = page.getByRole('table', { name: 'Usual prices' });
    await expect(rates.getByRole('row', { name: /Line hone/ }).textContent()).resolves.toMatch(/Line hone\$450\.00per part/);
    await expect(rates.getByRole('row', { name: /Deck/ }).textContent()).resolves.toMatch(/Deck\$175\.50per part/);
    await page.getByText('Quoted job by job: Crank grind.').waitFor();
    await page.screenshot({ path: join(artifactsDir, 'shop-page.png'), fullPage: true });
    expect(consoleErrors).toEqual([]);
  });
});
