import { join } from 'node:path';
import type { Page } from 'playwright-core';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import type { OperationCode } from '../../shared/catalogue';
import type { InspectionView } from '../../shared/schemas/inspection';
import type { JobInput } from '../../shared/schemas/jobs';
import { demoAccounts } from '../../server/dev/seed';
import { artifactsDir } from '../setup/browser';
import { browserSuite } from '../setup/e2e-suite';

const suite = browserSuite();
const { pageFor, consoleErrors } = suite;

const builder = demoAccounts.find((a) => a.email === 'juno@builders.test')!;
const lanternHill = demoAccounts.find((a) => a.email === 'bench@lanternhill.test')!;

/** A bid line per ordered operation (prices invented). */
const linesFor = (codes: OperationCode[]) => codes.map((operation) => ({ operation, description: operation, quantity: 1, unitPriceCents: 9000 }));

/** An eight-cylinder block sent with its rotating assembly: bored, decked, line honed and balanced (all limits invented for the test). */
const SECTIONS_JOB: Partial<JobInput> = {
  title: 'Bore, deck, line hone and balance an iron V8',
  parts: ['block', 'rotating-assembly'],
  operations: [
    { code: 'bore', quantity: 8 },
    { code: 'deck', quantity: 1 },
    { code: 'line-hone', quantity: 1 },
    { code: 'balance', quantity: 1 },
  ],
  crosshatchMinDeg: undefined,
  crosshatchMaxDeg: undefined,
  limits: { lineHone: { housingMin: 2.6406, housingMax: 2.6416 }, balance: { serviceRpm: 6500 } },
};

/** Fills an input found by its accessible name. */
const fill = (page: Page, name: string, value: string) => page.getByRole('form', { name: 'Inspection record' }).getByLabel(name, { exact: true }).fill(value);

describe('an inspection record with a section per ordered operation, in a real browser', () => {
  it('when the shop fills the bore grid, the deck by position, the line hone and the balance and submits, then the builder’s review shows every section judged', async () => {
    const { job } = await suite.jobIn('inWork', builder.email, lanternHill.email, { input: SECTIONS_JOB, bid: { lineItems: linesFor(['bore', 'deck', 'line-hone', 'balance']) } });
    const shopPage = await pageFor(lanternHill.email, `/jobs/${job.id}/inspection/new`);
    const record = shopPage.getByRole('form', { name: 'Inspection record' });
    await record.waitFor();
    // No clean or crack test ordered, so no such sections.
    expect(await shopPage.getByTestId('entry-section-crack-test').count()).toBe(0);

    await fill(shopPage, 'Gauge resolution (in)', '0.0001');
    await fill(shopPage, 'Temperature at measurement (°C)', '20');

    // The bore grid by paste: eight round, straight 4.0310 in bores with 4.0280 in pistons.
    await shopPage.evaluate(() => {
      const cell = document.querySelector<HTMLInputElement>('input[aria-label="Cylinder 1 top thrust"]')!;
      const data = new DataTransfer();
      data.setData('text/plain', Array.from({ length: 8 }, () => ['4.0310', '4.0310', '4.0310', '4.0310', '4.0310', '4.0310', '4.0280'].join('\t')).join('\n'));
      cell.dispatchEvent(new ClipboardEvent('paste', { clipboardData: data, bubbles: true, cancelable: true }));
    });
    await expect(record.getByLabel('Cylinder 8 piston diameter').inputValue()).resolves.toBe('4.0280');

    // The deck: a straightedge reading at every position (rows generated from the eight cylinders) and the four heights.
    const positions = ['Lengthwise, left edge', 'Lengthwise, centre', 'Lengthwise, right edge', ...Array.from({ length: 8 }, (_, i) => `Across cylinder ${i + 1}`), 'Diagonal A', 'Diagonal B'];
    for (const [i, position] of positions.entries()) await fill(shopPage, `${position}, Thickest feeler`, i === 3 ? '0.0012' : '0.0008');
    await fill(shopPage, 'Front, Left', '9.0250');
    await fill(shopPage, 'Front, Right', '9.0255');
    await fill(shopPage, 'Rear, Left', '9.0245');
    await fill(shopPage, 'Rear, Right', '9.0250');
    await expect.poll(() => record.getByTestId('record-section-deck').getAttribute('data-verdict')).toBe('conforms');

    // Line hone: four of the five rows, then the fifth, each with its centre on the bar.
    await record.getByLabel('Second direction').selectOption('45');
    const housing = ['2.6410', '2.6411', '2.6410', '2.6411'];
    for (let bore = 1; bore <= 5; bore++) {
      for (const [k, column] of ['Vertical, front', 'Vertical, rear', 'Second, front', 'Second, rear'].entries()) await fill(shopPage, `Bore ${bore}, ${column}`, housing[k]);
      await fill(shopPage, `Bore ${bore}, Centre on the bar (optional)`, bore === 3 ? '0.0002' : '0');
      if (bore === 4) {
        // Four bores are a whole section already: judged live.
        await expect.poll(() => record.getByTestId('record-section-line-hone').getAttribute('data-verdict')).toBe('conforms');
      }
    }

    // Balance: the weighed parts, the bob weight fitted, the grade and the residual in each plane.
    await fill(shopPage, 'Rotating mass per throw (g)', '1580');
    await fill(shopPage, 'Reciprocating mass per throw (g)', '1260');
    await fill(shopPage, 'Bob weight fitted (g)', '2210');
    await fill(shopPage, 'Crankshaft mass (kg)', '23');
    await record.getByLabel('Balance grade (ISO 21940-11)').selectOption('6.3');
    await fill(shopPage, 'Service speed (rev/min)', '6500');
    await fill(shopPage, 'Residual unbalance, front plane (g·mm)', '60');
    await fill(shopPage, 'Residual unbalance, rear plane (g·mm)', '55');
    await expect.poll(() => record.getByTestId('record-section-balance').getAttribute('data-verdict')).toBe('conforms');

    // The draft keeps the sections: reload and find them as typed.
    await expect.poll(() => shopPage.getByTestId('draft-status').textContent(), { timeout: 8_000 }).toMatch(/^Saved at/);
    await shopPage.reload();
    await record.waitFor();
    await expect(record.getByLabel('Bore 5, Second, rear').inputValue()).resolves.toBe('2.6411');
    await expect(record.getByLabel('Lengthwise, right edge, Thickest feeler').inputValue()).resolves.toBe('0.0008');
    await expect(record.getByLabel('Residual unbalance, rear plane (g·mm)').inputValue()).resolves.toBe('55');

    await fill(shopPage, 'Signed off by (your name)', 'Bench Lead');
    await shopPage.screenshot({ path: join(artifactsDir, 'inspection-sections-entry.png'), fullPage: true });
    await record.getByRole('button', { name: 'Submit the record' }).click();
    await shopPage.waitForURL(suite.url(`/jobs/${job.id}`));

    // The builder's review: one block per ordered operation, each judged.
    const builderPage = await pageFor(builder.email, `/jobs/${job.id}`);
    const review = builderPage.getByTestId('inspection-review');
    await review.getByTestId('record-sections').waitFor();
    for (const operation of ['bore', 'deck', 'line-hone', 'balance']) {
      const block = review.getByTestId(`record-section-${operation}`);
      const verdict = await block.getAttribute('data-verdict');
      expect(verdict, operation).not.toBe('not-judged');
      expect(verdict, operation).toBe('conforms');
    }
    await expect(review.getByTestId('record-section-line-hone').textContent()).resolves.toContain('Main bore alignment');
    await expect(review.getByTestId('record-section-balance').textContent()).resolves.toContain('Permissible per plane');
    await review.getByTestId('record-sections').scrollIntoViewIfNeeded();
    await builderPage.screenshot({ path: join(artifactsDir, 'inspection-sections-review.png'), fullPage: true });

    // The certificate page prints every section too.
    const certificate = await pageFor(builder.email, `/jobs/${job.id}/inspection/1/certificate`);
    await certificate.getByTestId('certificate-sections').waitFor();
    expect(await certificate.getByTestId('certificate-sections').getByTestId(/^record-section-/).count()).toBe(4);
    expect(consoleErrors, consoleErrors.join('\n')).toEqual([]);
  });

  it('when the crack test finds a crack, then the rest of the record is hidden, submitting is disabled and the extra-work form carries the findings', async () => {
    const { job, shop } = await suite.jobIn('inWork', builder.email, lanternHill.email, {
      input: { title: 'Crack test and bore an iron V8', operations: [{ code: 'crack-test', quantity: 1 }, { code: 'bore', quantity: 8 }] },
      bid: { lineItems: linesFor(['crack-test', 'bore']) },
    });
    const shopPage = await pageFor(lanternHill.email, `/jobs/${job.id}/inspection/new`);
    const record = shopPage.getByRole('form', { name: 'Inspection record' });
    await record.waitFor();
    const firstCell = record.getByLabel('Cylinder 1 top thrust');
    expect(await firstCell.isVisible()).toBe(true);

    await record.getByLabel('Method').selectOption('magnetic-particle');
    await record.getByLabel('Result').selectOption('crack-found');
    await fill(shopPage, 'Findings: where and how long any indication is', 'Crack 20 mm long between cylinders 3 and 5 water jacket');
    // A photo of the indication: uploaded at once through the milestone photo upload; its id goes in the section (kept in the draft).
    const photo = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#7a6f66' } }).jpeg().toBuffer();
    await record.getByTestId('milestone-photo-input').setInputFiles({ name: 'crack.jpg', mimeType: 'image/jpeg', buffer: photo });
    await record.getByTestId('milestone-upload-photos').getByRole('img').first().waitFor();
    await expect
      .poll(async () => ((await shop<InspectionView>('GET', `/api/jobs/${job.id}/inspection`)).draft as { form?: { fields?: Record<string, string> } } | null)?.form?.fields?.['sections.crackTest.photoIds'], { timeout: 8_000 })
      .toMatch(/^[0-9a-f-]{36}$/);
    await shopPage.getByTestId('crack-stop').waitFor();
    await expect.poll(() => firstCell.isVisible()).toBe(false);
    expect(await record.getByRole('button', { name: 'Submit the record' }).isDisabled()).toBe(true);
    const extra = shopPage.getByRole('form', { name: 'Propose extra work' });
    await expect(extra.getByLabel('What needs doing, and why').inputValue()).resolves.toContain('Crack 20 mm long between cylinders 3 and 5');

    // Nothing went to the builder.
    expect((await shop<InspectionView>('GET', `/api/jobs/${job.id}/inspection`)).versions).toEqual([]);
    expect(consoleErrors, consoleErrors.join('\n')).toEqual([]);
  });

  it('when an aluminium block is to be cleaned, then the clean section offers no caustic hot tank; an iron one does', async () => {
    // Common practice: caustic hot-tank solutions attack aluminium.
    const methodsFor = async (blockMaterial: 'aluminium' | 'cast-iron') => {
      const { job } = await suite.jobIn('inWork', builder.email, lanternHill.email, {
        input: { title: `Clean and bore a V8 (${blockMaterial})`, blockMaterial, operations: [{ code: 'clean', quantity: 1 }, { code: 'bore', quantity: 8 }] },
        bid: { lineItems: linesFor(['clean', 'bore']) },
      });
      const shopPage = await pageFor(lanternHill.email, `/jobs/${job.id}/inspection/new`);
      const section = shopPage.getByTestId('entry-section-clean');
      await section.waitFor();
      return section.getByLabel('Method').locator('option').evaluateAll((options) => options.map((o) => (o as HTMLOptionElement).value).filter(Boolean));
    };
    await expect(methodsFor('aluminium')).resolves.toEqual(['thermal-oven', 'spray-wash', 'other']);
    await expect(methodsFor('cast-iron')).resolves.toEqual(['hot-tank', 'thermal-oven', 'spray-wash', 'other']);
    expect(consoleErrors, consoleErrors.join('\n')).toEqual([]);
  });
});
