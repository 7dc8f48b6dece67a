import { join } from 'node:path';
import sharp from 'sharp';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import type { InspectionInput, InspectionVersion } from '../../shared/schemas/inspection';
import type { JobDetail } from '../../shared/schemas/jobs';
import type { MoneyView } from '../../shared/schemas/payments';
import { demoAccounts } from '../../server/dev/seed';
import { bidInput, jobInput, shopProfileInput } from '../factories';
import { completeOnboardingPage, payOnPage } from '../setup/payments';
import { artifactsDir } from '../setup/browser';
import { browserSuite, type Api } from '../setup/e2e-suite';

const suite = browserSuite();
const { url, apiAs, pageFor, consoleErrors } = suite;

const builder = demoAccounts.find((a) => a.email === 'juno@builders.test')!;
const lanternHill = demoAccounts.find((a) => a.email === 'bench@lanternhill.test')!;

/**
 * Lantern Hill (a demo shop with a profile) sets up payouts on the stand-in's page, waits
 * for them to be ready and bids on `jobId`; the builder accepts. Lantern Hill's API session.
 */
async function lanternHillAwarded(juno: Api, jobId: string) {
  const lantern = await apiAs(lanternHill.email);
  await lantern('PUT', '/api/shop-profile', shopProfileInput({ name: 'Lantern Hill Machine Works', city: 'Dayton', capabilities: ['clean', 'bore', 'hone', 'deck'] }));
  const { url: onboarding } = await lantern<{ url: string }>('POST', '/api/shop-profile/payouts');
  await completeOnboardingPage(onboarding);
  await expect.poll(async () => (await lantern<{ shop: { payouts: string } }>('GET', '/api/shop-profile')).shop.payouts, { timeout: 8_000 }).toBe('ready');
  const { bid } = await lantern<{ bid: { id: string } }>('POST', `/api/jobs/${jobId}/bids`, bidInput());
  await juno('POST', `/api/bids/${bid.id}/accept`);
  return lantern;
}

/** The focused element's accessible name as this app gives it: aria-label, else the text of its <label>. */
const focusedName = (page: Page) =>
  page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el) return null;
    return el.getAttribute('aria-label') ?? (el.id ? document.querySelector(`label[for="${el.id}"]`)?.textContent?.trim() : null) ?? el.textContent?.trim() ?? null;
  });

/** Presses Tab (only the keyboard) until the focused element matches, failing after `max` presses. */
async function tabUntil(page: Page, matches: (state: { id: string; name: string; group: string }) => boolean, max = 120) {
  for (let i = 0; i < max; i++) {
    await page.keyboard.press('Tab');
    const state = await page.evaluate(() => {
      const el = document.activeElement as HTMLElement | null;
      const name = el?.getAttribute('aria-label') ?? (el?.id ? document.querySelector(`label[for="${el.id}"]`)?.textContent?.trim() : null) ?? el?.textContent?.trim() ?? '';
      return { id: el?.id ?? '', name, group: el?.closest('[role="radiogroup"]')?.getAttribute('aria-label') ?? '' };
    });
    if (matches(state)) return;
  }
  throw new Error(`Tab never reached the wanted element in ${max} presses`);
}

/**
 * The readings of the record, in inches: a +0.031 in rebuild with 0.0002 in of
 * taper and 0.0001 in of out-of-round per cylinder, cylinders 2, 5 and 8 a tenth
 * larger throughout. Order: top thrust, top axial, middle thrust, middle axial,
 * bottom thrust, bottom axial.
 */
const readings = Array.from({ length: 8 }, (_, i) => [4.0312, 4.0311, 4.0311, 4.031, 4.031, 4.0309].map((value) => (value + (i % 3) * 0.0001).toFixed(4)));
/** Cylinder 5's bottom thrust reading mistyped: 4.0313 − 4.0306 = 0.0007 in of taper against a 0.0005 in limit. */
const BAD_READING = '4.0306';
const FIXED_READING = readings[4][4]; // 4.0311
const PISTON = '4.0280';

describe('the inspection record, from block received to payment released, in a real browser', () => {
  it('when the shop logs the block, fills an 8-cylinder record by keyboard and the builder accepts it, then the shop is paid and the job is completed', async () => {
    // The builder posts and publishes an 8-cylinder job with taper, out-of-round and clearance limits.
    const juno = await apiAs(builder.email);
    const { job } = await juno<{ job: JobDetail }>(
      'POST',
      '/api/jobs',
      jobInput({
        title: 'Bore and hone an iron V8 for an inspection record',
        cylinders: 8,
        unit: 'in',
        pistonDiameter: 4.028,
        clearanceMin: 0.0025,
        clearanceMax: 0.0035,
        maxTaper: 0.0005,
        maxOutOfRound: 0.0005,
        finishRaMaxUm: 0.6,
        crosshatchMinDeg: 40,
        crosshatchMaxDeg: 50,
      }),
    );
    await juno('POST', `/api/jobs/${job.id}/publish`);

    // A demo shop with a profile sets up payouts and bids; the builder accepts.
    const lantern = await lanternHillAwarded(juno, job.id);

    // The builder pays on the payment page ($480.00 held).
    const builderPage = await pageFor(builder.email, `/jobs/${job.id}`);
    await builderPage.getByRole('button', { name: 'Pay and hold for the work' }).click();
    await builderPage.waitForURL((target) => target.toString().startsWith(suite.app.payments.url));
    await builderPage.getByLabel('Card number').fill('4242 4242 4242 4242');
    await builderPage.getByRole('button', { name: /^Pay / }).click();
    await builderPage.waitForURL((target) => target.toString().startsWith(url(`/jobs/${job.id}`)));
    await expect.poll(() => builderPage.getByTestId('money-held').textContent(), { timeout: 10_000 }).toBe('$480.00');
    await builderPage.getByText('Status: Paid and held', { exact: true }).waitFor();
    const builderProgress = builderPage.getByRole('list', { name: 'Progress on this job' });

    // Paid: the builder now sees where to send the parts (the address the shop's profile gives), and logs them sent with the tracking number.
    await builderPage.getByLabel('The shop’s receiving address').getByText('1180 Foundry Row').waitFor();
    const sent = builderPage.getByRole('form', { name: 'Sent to the shop' });
    await sent.getByLabel('Carrier').fill('Ridgeline Freight');
    await sent.getByRole('button', { name: 'Log “sent to the shop”' }).click();
    await sent.getByText('Enter the tracking number.').waitFor();
    await sent.getByLabel('Tracking number').fill('RF 2200 1180');
    await sent.getByRole('button', { name: 'Log “sent to the shop”' }).click();
    await builderProgress.getByText('Sent to the shop by Ridgeline Freight, tracking RF 2200 1180').waitFor();

    // The shop logs the block as received; the builder's open page shows it without a reload.
    const shopPage = await pageFor(lanternHill.email, `/jobs/${job.id}`);
    const log = shopPage.getByRole('form', { name: 'Log progress' });
    await expect(log.getByLabel('What happened').inputValue()).resolves.toBe('block_received');
    await log.getByLabel('Note (optional)').fill('Block in on a pallet, all caps marked.');
    await log.getByRole('button', { name: 'Log it' }).click();
    await shopPage.getByRole('list', { name: 'Progress on this job' }).getByText('Parts received').waitFor();
    await shopPage.getByText('Status: In the shop', { exact: true }).waitFor();
    await builderProgress.getByText('Parts received').waitFor();
    await expect(builderProgress.textContent()).resolves.toContain('Lantern Hill Machine Works');
    await expect(builderProgress.textContent()).resolves.toContain('Block in on a pallet, all caps marked.');
    await builderPage.getByText('Status: In the shop', { exact: true }).waitFor();

    // The shop opens the entry page from the job page.
    await shopPage.getByRole('link', { name: 'Enter the inspection record' }).click();
    await shopPage.waitForURL(url(`/jobs/${job.id}/inspection/new`));
    const record = shopPage.getByRole('form', { name: 'Inspection record' });
    const results = shopPage.getByRole('complementary', { name: 'Results as you type' });
    await record.waitFor();
    await expect(results.getByTestId('guidance-caution').textContent()).resolves.toContain(
      "Engine and piston makers' specifications, calibrated instruments, local codes and licensed practice govern.",
    );

    // A block pasted from a spreadsheet fills the grid from the cell it lands in (made-up figures, typed over below).
    const pasted = await shopPage.evaluate(() => {
      const cell = document.querySelector<HTMLInputElement>('input[aria-label="Cylinder 2 top thrust"]')!;
      const data = new DataTransfer();
      data.setData('text/plain', '4.0400\t4.0401\t4.0402\t4.0403\t4.0404\t4.0405\t4.0281\n4.0410, 4.0411, 4.0412, 4.0413, 4.0414, 4.0415\n');
      cell.dispatchEvent(new ClipboardEvent('paste', { clipboardData: data, bubbles: true, cancelable: true }));
      return true;
    });
    expect(pasted).toBe(true);
    await expect(record.getByLabel('Cylinder 2 piston diameter').inputValue()).resolves.toBe('4.0281');
    await expect(record.getByLabel('Cylinder 3 bottom axial').inputValue()).resolves.toBe('4.0415');
    await expect(record.getByLabel('Cylinder 3 piston diameter').inputValue()).resolves.toBe('');
    await expect(shopPage.getByTestId('paste-note').textContent()).resolves.toBe('Pasted 13 readings from cylinder 2.');

    // From here on, only the keyboard: conditions, then into the grid with Tab.
    await record.getByLabel('Gauge resolution (in)').click();
    await shopPage.keyboard.type('0.0001');
    await shopPage.keyboard.press('Tab');
    await shopPage.keyboard.type('21');
    await shopPage.keyboard.press('Tab');
    // The temperature's scale (°C chosen), then the optional uncertainty, then the torque plate.
    await expect(focusedName(shopPage)).resolves.toBe('°C');
    await shopPage.keyboard.press('Tab');
    await expect(focusedName(shopPage)).resolves.toMatch(/^Measurement uncertainty U \(in\), optional/);
    await shopPage.keyboard.press('Tab');
    await expect(focusedName(shopPage)).resolves.toBe('Torque plate fitted while measuring');
    await shopPage.keyboard.press('Space');
    await shopPage.keyboard.press('Tab');
    await expect(focusedName(shopPage)).resolves.toBe('Cylinder 1 top thrust');

    // Row by row: six readings with Tab between (top, middle, bottom; thrust then axial), the piston left for later.
    const expectedOrder = ['Cylinder 1 top axial', 'Cylinder 1 middle thrust', 'Cylinder 1 middle axial', 'Cylinder 1 bottom thrust', 'Cylinder 1 bottom axial', 'Cylinder 1 piston diameter'];
    for (let cylinder = 0; cylinder < 8; cylinder++) {
      for (let column = 0; column < 6; column++) {
        const value = cylinder === 4 && column === 4 ? BAD_READING : readings[cylinder][column];
        await shopPage.keyboard.type(value);
        await shopPage.keyboard.press('Tab');
        if (cylinder === 0) await expect(focusedName(shopPage)).resolves.toBe(expectedOrder[column]);
      }
      await shopPage.keyboard.press('Tab'); // past the piston
      if (cylinder < 7) await expect(focusedName(shopPage)).resolves.toBe(`Cylinder ${cylinder + 2} top thrust`);
    }
    // Tab leaves the grid for the deck.
    await expect(shopPage.evaluate(() => document.activeElement?.id)).resolves.toBe('field-deck-readings');

    // The live results flag cylinder 5's taper with the reason.
    // (the taper is judged at 20 °C; 0.0007 in read at 21 °C is 0.00070 in to five places)
    await results.getByText('0.00070 in; allowed ≤ 0.0005 in').waitFor();
    await expect(results.getByTestId('result-cylinder-5').textContent()).resolves.toContain('Fail');
    await expect(results.getByTestId('inspection-verdict').textContent()).resolves.toContain('1 check fails so far');

    // Pistons down the column with Enter: back into the grid, up to cylinder 1 with the arrow key.
    await shopPage.keyboard.press('Shift+Tab');
    await expect(focusedName(shopPage)).resolves.toBe('Cylinder 8 piston diameter');
    for (let i = 0; i < 7; i++) await shopPage.keyboard.press('ArrowUp');
    await expect(focusedName(shopPage)).resolves.toBe('Cylinder 1 piston diameter');
    for (let cylinder = 0; cylinder < 8; cylinder++) {
      await shopPage.keyboard.type(PISTON);
      await shopPage.keyboard.press('Enter');
      if (cylinder === 0) await expect(focusedName(shopPage)).resolves.toBe('Cylinder 2 piston diameter');
    }
    // Enter never sends the record: still on the entry page.
    expect(shopPage.url()).toBe(url(`/jobs/${job.id}/inspection/new`));

    // The bad reading is measured again and corrected.
    await shopPage.keyboard.press('Shift+Tab');
    await shopPage.keyboard.press('Shift+Tab');
    await expect(focusedName(shopPage)).resolves.toBe('Cylinder 8 bottom thrust');
    for (let i = 0; i < 3; i++) await shopPage.keyboard.press('ArrowUp');
    await expect(focusedName(shopPage)).resolves.toBe('Cylinder 5 bottom thrust');
    await shopPage.keyboard.type(FIXED_READING);
    await shopPage.keyboard.press('Enter');
    await expect(focusedName(shopPage)).resolves.toBe('Cylinder 6 bottom thrust');
    await results.getByText('0.00070 in; allowed ≤ 0.0005 in').waitFor({ state: 'detached' });
    await expect(results.getByTestId('result-cylinder-5').textContent()).resolves.toContain('Conforms');
    await expect(record.getByLabel('Cylinder 2 top thrust').inputValue()).resolves.toBe(readings[1][0]);

    // Deck, finish, crosshatch and sign-off, still by keyboard.
    await tabUntil(shopPage, (s) => s.id === 'field-deck-readings');
    await shopPage.keyboard.type('0.0008 0.0010 0.0006 0.0012 0.0009 0.0007');
    await shopPage.keyboard.press('Tab');
    await shopPage.keyboard.type('0.9');
    await tabUntil(shopPage, (s) => s.group === 'Bore finish');
    await shopPage.keyboard.press('ArrowRight');
    await shopPage.keyboard.press('Tab');
    await expect(focusedName(shopPage)).resolves.toBe('Ra (µm)');
    await shopPage.keyboard.type('0.45');
    await tabUntil(shopPage, (s) => s.group === 'Crosshatch');
    await shopPage.keyboard.press('ArrowRight');
    await shopPage.keyboard.press('Tab');
    await expect(focusedName(shopPage)).resolves.toBe('Included angle (°)');
    await shopPage.keyboard.type('45');
    await tabUntil(shopPage, (s) => s.id === 'field-signedOffBy');
    await shopPage.keyboard.type('Rosa Okafor');
    await results.getByText('Pass: every limit judged').waitFor();
    await expect(results.getByTestId('surface-figures').textContent()).resolves.toContain('45.0°');

    // The draft saves itself and comes back after a reload.
    await expect.poll(() => shopPage.getByTestId('draft-status').textContent(), { timeout: 8_000 }).toMatch(/^Saved at \d\d:\d\d \S+$/);
    // "Saved at" may still show an earlier save: wait until the kept draft holds the last thing typed (the sign-off).
    await expect.poll(async () => JSON.stringify((await lantern<{ draft: unknown }>('GET', `/api/jobs/${job.id}/inspection`)).draft), { timeout: 15_000 }).toContain('Rosa Okafor');
    await shopPage.reload();
    await shopPage.getByText(/Your draft is restored/).waitFor();
    await expect(record.getByLabel('Cylinder 5 bottom thrust').inputValue()).resolves.toBe(FIXED_READING);
    await expect(record.getByLabel('Cylinder 8 piston diameter').inputValue()).resolves.toBe(PISTON);
    await expect(record.getByLabel('Signed off by (your name)').inputValue()).resolves.toBe('Rosa Okafor');
    await results.getByText('Pass: every limit judged').waitFor();
    await shopPage.screenshot({ path: join(artifactsDir, 'inspection-entry.png'), fullPage: true });

    // Submit with the keyboard.
    await tabUntil(shopPage, (s) => s.name === 'Submit the record', 200);
    await shopPage.keyboard.press('Enter');
    await shopPage.waitForURL(url(`/jobs/${job.id}`));
    await shopPage.getByText('Status: Results to review', { exact: true }).waitFor();

    // The server kept the typed readings and found the same result.
    const { versions } = await lantern<{ versions: InspectionVersion[] }>('GET', `/api/jobs/${job.id}/inspection`);
    expect(versions).toHaveLength(1);
    expect(versions[0].input.cylinders).toHaveLength(8);
    expect(versions[0].input.cylinders![4].bottom.thrust).toBe(Number(FIXED_READING));
    expect(versions[0].input.cylinders![1].top.thrust).toBe(Number(readings[1][0]));
    expect(versions[0].input.cylinders!.every((c) => c.piston === Number(PISTON))).toBe(true);
    expect(versions[0].input.conditions).toEqual({ unit: 'in', gaugeResolution: 0.0001, temperatureC: 21, torquePlate: true });
    expect(versions[0].results.pass).toBe(true);

    // The builder's open page turns to the review by itself.
    const review = builderPage.getByTestId('inspection-review');
    await review.waitFor();
    await builderPage.getByText('Status: Results to review', { exact: true }).waitFor();
    await expect(review.getByTestId('inspection-verdict').textContent()).resolves.toContain('Pass: every limit judged');
    await expect(review.getByTestId('review-due').textContent()).resolves.toMatch(/accepted automatically on /);
    await expect(review.getByTestId('inspection-conditions').textContent()).resolves.toContain('Rosa Okafor');
    await review.getByTestId('bore-size-chart').locator('svg.recharts-surface').first().waitFor();
    await review.getByLabel('Cylinder to chart').selectOption('5');
    await expect(review.locator('figcaption').first().textContent()).resolves.toContain('Cylinder 5');
    await builderPage.screenshot({ path: join(artifactsDir, 'inspection-review.png'), fullPage: true });

    // Accept: the confirm step says the held payment goes to the shop.
    await review.getByRole('button', { name: 'Accept the record' }).click();
    const confirm = builderPage.getByRole('dialog', { name: 'Accept version 1 of the inspection record?' });
    await expect(confirm.textContent()).resolves.toContain('The held payment goes to the shop');
    await confirm.getByRole('button', { name: 'Accept and pay the shop' }).click();
    await confirm.waitFor({ state: 'hidden' });
    await builderPage.getByText('Status: Completed', { exact: true }).waitFor();

    // The money panel shows the payout: paid in = paid to the shop + the fee, nothing held.
    await expect.poll(async () => (await juno<MoneyView>('GET', `/api/jobs/${job.id}/money`)).balance.released, { timeout: 10_000 }).toBeGreaterThan(0);
    const money = await juno<MoneyView>('GET', `/api/jobs/${job.id}/money`);
    expect(money.balance.released + money.balance.fee).toBe(48_000);
    expect(money.balance.held).toBe(0);
    const dollars = (cents: number) => `$${(cents / 100).toLocaleString('en-US', { minimumFractionDigits: 2 })}`;
    await expect.poll(() => builderPage.getByTestId('money-released').textContent(), { timeout: 10_000 }).toBe(dollars(money.balance.released));
    await expect(builderPage.getByTestId('money-held').textContent()).resolves.toBe('$0.00');
    await shopPage.getByText('Status: Completed', { exact: true }).waitFor();
    await expect.poll(() => shopPage.getByTestId('money-released').textContent(), { timeout: 10_000 }).toBe(dollars(money.balance.released));

    // The certificate: a printable page with every reading, and the PDF behind its download link.
    await builderPage.getByRole('link', { name: 'Certificate (print or PDF)' }).click();
    await builderPage.getByRole('heading', { name: 'Tenthmark inspection record' }).waitFor();
    await expect(builderPage.getByTestId('certificate-result').textContent()).resolves.toMatch(/^PASS/);
    // The bore table: a header row and one per cylinder (each operation's own block has tables of its own below it).
    await expect(builderPage.getByRole('table', { name: 'Readings and figures per cylinder' }).getByRole('row').count()).resolves.toBe(9);
    await builderPage.getByText('Figures are guidance.', { exact: false }).waitFor();
    const pdfHref = await builderPage.getByRole('link', { name: 'Download the PDF' }).getAttribute('href');
    const pdf = await builderPage.request.get(url(pdfHref!));
    expect(pdf.status()).toBe(200);
    expect(pdf.headers()['content-type']).toBe('application/pdf');
    expect((await pdf.body()).subarray(0, 5).toString()).toBe('%PDF-');
    await builderPage.screenshot({ path: join(artifactsDir, 'inspection-certificate.png'), fullPage: true });
    expect(consoleErrors, consoleErrors.join('\n')).toEqual([]);
  });
  it('when the builder rejects a version with reasons, then the shop sees them, starts the new version from its old readings, and the builder sees what changed', async () => {
    const juno = await apiAs(builder.email);
    const { job } = await juno<{ job: JobDetail }>('POST', '/api/jobs', jobInput({ title: 'Bore and hone an iron V8, second look', cylinders: 8, maxTaper: 0.0005, maxOutOfRound: 0.0005 }));
    await juno('POST', `/api/jobs/${job.id}/publish`);
    const lantern = await lanternHillAwarded(juno, job.id);
    // Paid through the API and the payment page's own form.
    const { url: checkout } = await juno<{ url: string }>('POST', `/api/jobs/${job.id}/checkout`);
    expect((await payOnPage(checkout, '4242424242424242')).status).toBeLessThan(400);
    await expect.poll(async () => (await juno<{ job: JobDetail }>('GET', `/api/jobs/${job.id}`)).job.status, { timeout: 10_000 }).toBe('funded');
    await lantern('POST', `/api/jobs/${job.id}/milestones`, { kind: 'block_received', note: '' });

    // Version 1 through the API: cylinder 3's bottom thrust is 0.0008 in under its top.
    const cylinders = readings.map((row) => ({
      top: { thrust: Number(row[0]), axial: Number(row[1]) },
      middle: { thrust: Number(row[2]), axial: Number(row[3]) },
      bottom: { thrust: Number(row[4]), axial: Number(row[5]) },
      piston: 4.028,
    }));
    cylinders[2] = { ...cylinders[2], bottom: { thrust: 4.0306, axial: 4.031 } };
    const first: InspectionInput = {
      conditions: { unit: 'in', gaugeResolution: 0.0001, temperatureC: 20, torquePlate: false },
      cylinders,
      // The job limits the crosshatch angle: without it the record would be "not fully judged".
      crosshatch: { mode: 'measured', includedAngleDeg: 45 },
      signedOffBy: 'Rosa Okafor',
      notes: '',
    };
    await lantern('POST', `/api/jobs/${job.id}/inspection`, first);

    // The builder sees the failure and rejects, with a reason the schema accepts only once it says something.
    const builderPage = await pageFor(builder.email, `/jobs/${job.id}`);
    const review = builderPage.getByTestId('inspection-review');
    await expect(review.getByTestId('inspection-verdict').textContent()).resolves.toContain('1 check fails');
    await review.getByText('0.00080 in; allowed ≤ 0.0005 in').waitFor();
    await review.getByRole('button', { name: 'Ask for changes' }).click();
    const dialog = builderPage.getByRole('dialog', { name: 'Ask for changes to version 1?' });
    await dialog.getByRole('button', { name: 'Send the changes asked' }).click();
    await dialog.getByText('Say what needs redoing.').waitFor();
    await dialog.getByLabel('What needs redoing, and why').fill('Cylinder 3 tapers 0.0008 in; hone it straight and measure again.');
    await dialog.getByRole('button', { name: 'Send the changes asked' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await builderPage.getByText('Status: In the shop', { exact: true }).waitFor();
    await review.getByText('You asked for changes to this version').waitFor();

    // The shop reads the reasons and enters version 2, which starts from version 1's readings.
    const shopPage = await pageFor(lanternHill.email, `/jobs/${job.id}`);
    await shopPage.getByTestId('reject-reasons').getByText('Cylinder 3 tapers 0.0008 in; hone it straight and measure again.').waitFor();
    // Progress while redoing it: the schema's messages sit beside the fields.
    const log = shopPage.getByRole('form', { name: 'Log progress' });
    await log.getByLabel('What happened').selectOption('operation_started');
    await log.getByRole('button', { name: 'Log it' }).click();
    await log.getByText('Say which operation.').waitFor();
    await expect(log.getByLabel('Operation').getAttribute('aria-invalid')).resolves.toBe('true');
    await log.getByLabel('Operation').selectOption('hone');
    // A photo with the milestone: uploaded at once, then shown in the timeline.
    const photo = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#6b7280' } }).jpeg().toBuffer();
    await log.getByTestId('milestone-photo-input').setInputFiles({ name: 'cylinder-3.jpg', mimeType: 'image/jpeg', buffer: photo });
    await log.getByTestId('milestone-upload-photos').getByRole('img').first().waitFor();
    await log.getByRole('button', { name: 'Log it' }).click();
    const progress = shopPage.getByRole('list', { name: 'Progress on this job' });
    await progress.getByText('Hone started').waitFor();
    await progress.getByRole('button', { name: 'Open photo 1 of 1 full size' }).waitFor();
    // The shop ships back only to an address the builder gave.
    const returnForm = builderPage.getByRole('form', { name: 'Return address' });
    await returnForm.getByLabel('Street address', { exact: true }).fill('42 Camshaft Lane');
    await returnForm.getByLabel('Town or city').fill('Fort Wayne');
    await returnForm.getByLabel('State, province or county').fill('Indiana');
    await returnForm.getByLabel('Postal code').fill('46802');
    await returnForm.getByLabel('Country').fill('United States');
    await returnForm.getByRole('button', { name: 'Give the return address' }).click();
    await shopPage.getByLabel('The builder’s return address').getByText('42 Camshaft Lane').waitFor();
    await log.getByLabel('What happened').selectOption('shipped');
    await log.getByLabel('Carrier').fill('Ridgeline Freight');
    await log.getByRole('button', { name: 'Log it' }).click();
    await log.getByText('Give the carrier and the tracking number.').waitFor();
    await log.getByLabel('Tracking number').fill('RF 4471 0093');
    await log.getByRole('button', { name: 'Log it' }).click();
    await progress.getByText('RF 4471 0093').waitFor();
    // Parts received, version 1 submitted (logged by the server), hone started, shipped.
    await expect(progress.getByTestId('milestone').count()).resolves.toBe(4);
    await builderPage.getByRole('list', { name: 'Progress on this job' }).getByText('Shipped back by Ridgeline Freight, tracking RF 4471 0093').waitFor();
    await shopPage.getByRole('link', { name: 'Enter the inspection record' }).click();
    await shopPage.getByRole('heading', { level: 1, name: 'Inspection record, version 2' }).waitFor();
    await shopPage.getByText('The builder asked for changes to version 1').waitFor();
    const record = shopPage.getByRole('form', { name: 'Inspection record' });
    await expect(record.getByLabel('Cylinder 3 bottom thrust').inputValue()).resolves.toBe('4.0306');
    await expect(record.getByLabel('Cylinder 8 piston diameter').inputValue()).resolves.toBe('4.0280');
    await record.getByLabel('Cylinder 3 bottom thrust').fill('4.0312');
    await record.getByLabel('Cylinder 3 bottom axial').fill('4.0311');
    await shopPage.getByRole('complementary', { name: 'Results as you type' }).getByText('Pass: every limit judged').waitFor();
    await shopPage.setViewportSize({ width: 768, height: 1024 });
    await record.getByText('Every check so far passes.').waitFor();
    await shopPage.screenshot({ path: join(artifactsDir, 'inspection-entry-768.png'), fullPage: true });
    await record.getByRole('button', { name: 'Submit the record' }).click();
    await shopPage.waitForURL(url(`/jobs/${job.id}`));

    // The builder's page shows version 2 and what changed since version 1; version 1 stays readable.
    await review.getByRole('heading', { name: 'Version 2' }).waitFor();
    const changes = review.getByTestId('version-changes').first();
    await expect(changes.getByRole('row', { name: /Cylinder 3 bottom thrust/ }).textContent()).resolves.toBe('Cylinder 3 bottom thrust4.0306 in4.0312 in');
    await expect(changes.getByRole('row', { name: /Cylinder 3 taper \(worked out\)/ }).textContent()).resolves.toContain('0.0008 in');
    await expect(changes.getByRole('row', { name: /Overall result/ }).textContent()).resolves.toBe('Overall resultFail: at least one check failsPass: every limit judged, every check conforms');
    await expect(changes.getByRole('row').count()).resolves.toBeLessThan(10);
    const older = review.getByTestId('older-version');
    await expect(older.count()).resolves.toBe(1);
    await older.locator('summary').first().click();
    await older.getByText('Cylinder 3 tapers 0.0008 in; hone it straight and measure again.').waitFor();
    await expect(older.locator('summary').first().textContent()).resolves.toMatch(/^Version 1 · changes asked · replaced by version 2 · submitted /);
    // Version 1's web certificate says what replaced it, as its PDF does.
    const certificate = await pageFor(builder.email, `/jobs/${job.id}/inspection/1/certificate`);
    await expect.poll(() => certificate.getByTestId('certificate-status').textContent()).toBe('Status: Changes asked; replaced by version 2');
    await builderPage.screenshot({ path: join(artifactsDir, 'inspection-review-v2.png'), fullPage: true });
    expect(consoleErrors, consoleErrors.join('\n')).toEqual([]);
  });
});
