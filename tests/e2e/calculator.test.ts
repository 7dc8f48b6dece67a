import { join } from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { beforeEach, describe, expect, it } from 'vitest';
import { CC_PER_CUBIC_INCH, roughness } from '../../shared/calc';
import { syntheticPlateauProfile } from '../../client/features/calculations/lib/synthetic-profile';
import { artifactsDir } from '../setup/browser';
import { browserSuite } from '../setup/e2e-suite';

const suite = browserSuite();
const { url, consoleErrors } = suite;
let page: Page;

beforeEach(async () => {
  page = await suite.newTabletPage();
});

const card = (name: string) => page.getByRole('region', { name, exact: true });
/** The number in a figure such as "5,733.0 cc" or "9.01 : 1". */
const numberIn = async (locator: Locator) => Number(/-?[\d,]+(?:\.\d+)?/.exec((await locator.textContent()) ?? '')![0].replace(/,/g, ''));

async function openCalculator() {
  await page.goto(url('/calculator'));
  await page.getByRole('heading', { level: 1, name: 'Machining calculator' }).waitFor();
}

describe('the calculator page, as a signed-out visitor', () => {
  it('when the nav link is followed, then the page opens with the guidance caution in view', async () => {
    await page.goto(url('/'));
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Calculator' }).click();
    await page.waitForURL(url('/calculator'));
    await page.getByRole('heading', { level: 1, name: 'Machining calculator' }).waitFor();
    const caution = page.getByTestId('guidance-caution');
    await expect(caution.isVisible()).resolves.toBe(true);
    await expect(caution.textContent()).resolves.toContain(
      "Engine and piston makers' specifications, calibrated instruments, local codes and licensed practice govern.",
    );
    // Said once, not twice over.
    expect((await caution.textContent())!.match(/guidance/gi)).toHaveLength(1);
    const inPage = page.getByRole('navigation', { name: 'Calculators on this page' });
    await expect(inPage.getByRole('link').count()).resolves.toBe(13);
    await page.screenshot({ path: join(artifactsDir, 'calculator-top-768.png') });

    // The in-page list jumps to a calculator without leaving the page.
    await inPage.getByRole('link', { name: /Ring end gap/ }).click();
    await page.waitForURL(url('/calculator#ring-gap'));
    await expect(card('Ring end gap').getByLabel('Bore (in)', { exact: true }).isVisible()).resolves.toBe(true);
    await expect(page.getByRole('heading', { level: 1, name: 'Machining calculator' }).count()).resolves.toBe(1);
    expect(consoleErrors).toEqual([]);
  });

  it('when bore, stroke and cylinders are typed, then the displacement shows at once; a negative bore shows its message and no result', async () => {
    await openCalculator();
    const displacement = card('Displacement');
    await expect(displacement.getByTestId('missing-hint').textContent()).resolves.toContain('Still to enter: the bore, the stroke and the number of cylinders');
    await displacement.getByLabel('Bore (in)', { exact: true }).fill('4');
    await displacement.getByLabel('Stroke (in)', { exact: true }).fill('3.48');
    await displacement.getByLabel('Cylinders', { exact: true }).fill('8');
    // derived: π/4 · 4² · 3.48 · 8 in³ × 16.387064 cc/in³ = 5,733.0 cc
    const expectedCc = (Math.PI / 4) * 4 ** 2 * 3.48 * 8 * CC_PER_CUBIC_INCH;
    expect(expectedCc).toBeCloseTo(5733, 0);
    await expect(numberIn(displacement.getByTestId('displacement-cc'))).resolves.toBeCloseTo(expectedCc, 1);
    await expect(displacement.getByTestId('displacement-cc').textContent()).resolves.toBe('5,733.0 cc');

    await displacement.getByLabel('Bore (in)', { exact: true }).fill('-4');
    await displacement.getByText('Bore must be greater than zero.').waitFor();
    await expect(displacement.getByLabel('Bore (in)', { exact: true }).getAttribute('aria-invalid')).resolves.toBe('true');
    await expect(displacement.getByTestId('displacement-result').count()).resolves.toBe(0);
    await expect(displacement.getByTestId('missing-hint').textContent()).resolves.toContain('Correct the field marked in red');
    await displacement.screenshot({ path: join(artifactsDir, 'calculator-displacement-error.png') });
    expect(consoleErrors).toEqual([]);
  });

  it('when the compression example is typed, then the ratio reads 9.01; an overbore and deck cut show their effect', async () => {
    await openCalculator();
    const compression = card('Compression ratio');
    await compression.getByLabel('Bore (in)', { exact: true }).fill('4.000');
    await compression.getByLabel('Stroke (in)', { exact: true }).fill('3.48');
    await compression.getByLabel('Chamber volume (cc)', { exact: true }).fill('70');
    await compression.getByLabel('Piston volume (cc)', { exact: true }).fill('5');
    await compression.getByLabel('Deck clearance (in)', { exact: true }).fill('0.050');
    await compression.getByLabel('Gasket bore (in)', { exact: true }).fill('4.000');
    await compression.getByLabel('Gasket thickness (in)', { exact: true }).fill('0.020');
    // source: Circle Track, "Compression Ratio Rules" (worked example: 9.01 for these figures)
    await expect(compression.getByTestId('compression-ratio').textContent()).resolves.toBe('9.01 : 1');

    // derived: a 0.010 in deck cut takes π/4 · 4² · 0.010 in³ = 2.059 cc off the clearance volume, so the ratio rises
    await compression.getByLabel('Deck cut (in)', { exact: true }).fill('0.010');
    await compression.getByLabel('Cylinders', { exact: true }).fill('8');
    const effect = compression.getByTestId('machining-effect');
    await effect.waitFor();
    const after = await numberIn(effect.getByRole('row', { name: /Compression ratio/ }).getByRole('cell').nth(1));
    const clearanceBefore = 70 + 5 + ((Math.PI / 4) * 16 * 0.07) * CC_PER_CUBIC_INCH;
    const swept = (Math.PI / 4) * 16 * 3.48 * CC_PER_CUBIC_INCH;
    const clearanceAfter = clearanceBefore - (Math.PI / 4) * 16 * 0.01 * CC_PER_CUBIC_INCH;
    expect(after).toBeCloseTo((swept + clearanceAfter) / clearanceAfter, 2);
    await compression.screenshot({ path: join(artifactsDir, 'calculator-compression.png') });
    expect(consoleErrors).toEqual([]);
  });

  it('when a piston stack is typed, then the deck clearance and the quench show with the guidance note', async () => {
    await openCalculator();
    const deck = card('Deck clearance and quench');
    await deck.getByLabel('Deck height (in)', { exact: true }).fill('9.025');
    await deck.getByLabel('Stroke (in)', { exact: true }).fill('3.48');
    await deck.getByLabel('Rod length (in)', { exact: true }).fill('5.7');
    await deck.getByLabel('Compression height (in)', { exact: true }).fill('1.56');
    // derived: 9.025 − (3.48/2 + 5.7 + 1.56) = 0.025 in below the deck (references.md "Stack-up and bearings")
    await expect(deck.getByTestId('piston-deck-clearance').textContent()).resolves.toBe('0.0250 in');
    await expect(deck.getByTestId('quench').count()).resolves.toBe(0);
    await deck.getByLabel('Gasket thickness (in)', { exact: true }).fill('0.015');
    // derived: quench = 0.025 + 0.015 in compressed gasket
    await expect(deck.getByTestId('quench').textContent()).resolves.toBe('0.0400 in');
    await expect(deck.getByRole('region', { name: 'Results: Deck clearance and quench' }).getByText('Guidance only.').isVisible()).resolves.toBe(true);
    expect(consoleErrors).toEqual([]);
  });

  it('when the unit switch is moved to millimetres, then a typed 4 in bore reads 101.600 mm and the result stays the same', async () => {
    await openCalculator();
    const displacement = card('Displacement');
    await displacement.getByLabel('Bore (in)', { exact: true }).fill('4');
    await displacement.getByLabel('Stroke (in)', { exact: true }).fill('3.48');
    await displacement.getByLabel('Cylinders', { exact: true }).fill('8');
    const cc = await numberIn(displacement.getByTestId('displacement-cc'));

    const unitSwitch = page.getByRole('radiogroup', { name: 'Length unit' });
    await unitSwitch.getByRole('radio', { name: 'Millimetres' }).click();
    await expect(unitSwitch.getByRole('radio', { name: 'Millimetres' }).getAttribute('aria-checked')).resolves.toBe('true');
    // derived: 4 in × 25.4 mm/in = 101.6 mm exactly (NIST, 1 in = 25.4 mm); 3.48 in = 88.392 mm
    await expect(displacement.getByLabel('Bore (mm)', { exact: true }).inputValue()).resolves.toBe('101.600');
    await expect(displacement.getByLabel('Stroke (mm)', { exact: true }).inputValue()).resolves.toBe('88.392');
    await expect(displacement.getByLabel('Cylinders', { exact: true }).inputValue()).resolves.toBe('8');
    await expect(numberIn(displacement.getByTestId('displacement-cc'))).resolves.toBe(cc);

    // The arrow keys move the choice back, as in any radio group.
    await unitSwitch.getByRole('radio', { name: 'Millimetres' }).press('ArrowLeft');
    await expect(displacement.getByLabel('Bore (in)', { exact: true }).inputValue()).resolves.toBe('4.0000');
    expect(consoleErrors).toEqual([]);
  });

  it('when readings are typed with Tab through the grid, then a cylinder whose taper is over the limit fails with the reason and is charted', async () => {
    await openCalculator();
    const boreCheck = card('Bore check');
    await boreCheck.getByLabel('Cylinders', { exact: true }).selectOption('2');
    await boreCheck.getByLabel('Most taper (in)', { exact: true }).fill('0.0005');

    // Cylinder 1 wider at the top: 4.0320, 4.0310, 4.0300 in both directions; cylinder 2 straight at 4.0300.
    const rows = [
      ['4.0320', '4.0320', '4.0310', '4.0310', '4.0300', '4.0300'],
      ['4.0300', '4.0300', '4.0300', '4.0300', '4.0300', '4.0300'],
    ];
    const order = ['top thrust', 'top axial', 'middle thrust', 'middle axial', 'bottom thrust', 'bottom axial', 'piston diameter'];
    await boreCheck.getByLabel('Cylinder 1 top thrust', { exact: true }).focus();
    for (const [c, readings] of rows.entries()) {
      for (const [i, reading] of readings.entries()) {
        const focused = await page.evaluate(() => document.activeElement?.getAttribute('aria-label'));
        expect(focused).toBe(`Cylinder ${c + 1} ${order[i]}`);
        await page.keyboard.type(reading);
        await page.keyboard.press('Tab');
      }
      // The piston diameter is optional: Tab past it to the next cylinder.
      expect(await page.evaluate(() => document.activeElement?.getAttribute('aria-label'))).toBe(`Cylinder ${c + 1} piston diameter`);
      await page.keyboard.press('Tab');
    }

    const first = boreCheck.getByTestId('bore-row-1');
    // derived: taper = largest − smallest over the depths = 4.0320 − 4.0300 = 0.0020 in, over the 0.0005 in limit
    await first.getByText('Taper 0.0020 in is over the 0.0005 in limit.').waitFor();
    await expect(first.getByText('Fail', { exact: true }).isVisible()).resolves.toBe(true);
    await expect(boreCheck.getByTestId('bore-row-2').getByText('Pass', { exact: true }).isVisible()).resolves.toBe(true);
    await expect(boreCheck.getByText('1 of 2 outside limits').isVisible()).resolves.toBe(true);
    // The plot loads with the charting library after the figures: wait for it to be drawn.
    await boreCheck.getByTestId('bore-depth-chart').locator('svg.recharts-surface').first().waitFor();
    await expect(boreCheck.getByTestId('bore-depth-chart').locator('.recharts-line').count()).resolves.toBe(2);

    // A reading of zero is refused with the schema's message, named by its cell, and the results go away.
    await boreCheck.getByLabel('Cylinder 2 middle axial', { exact: true }).fill('0');
    await boreCheck.getByText('Cylinder 2 middle axial: Axial reading must be greater than zero.').waitFor();
    await expect(boreCheck.getByTestId('bore-check-result').count()).resolves.toBe(0);
    await boreCheck.getByLabel('Cylinder 2 middle axial', { exact: true }).fill('4.0300');
    await boreCheck.getByTestId('bore-check-result').waitFor();
    await boreCheck.screenshot({ path: join(artifactsDir, 'calculator-bore-check-768.png') });
    expect(consoleErrors).toEqual([]);
  });

  it('when the synthetic example profile is loaded, then the roughness figures and the material-ratio chart appear', async () => {
    await openCalculator();
    const rough = card('Surface roughness');
    await rough.getByRole('button', { name: 'Load the synthetic example' }).click();
    await expect(rough.getByTestId('loaded-profile').textContent()).resolves.toContain('Synthetic example');
    await rough.getByTestId('roughness-result').waitFor();
    const chart = rough.getByTestId('material-ratio-chart');
    await chart.locator('svg.recharts-surface').first().waitFor();
    await expect(chart.locator('.recharts-line').count()).resolves.toBe(5);
    await expect(chart.locator('.recharts-reference-area').count()).resolves.toBe(1);

    // derived: the shared library on the same seeded heights; the page must show what the library computes
    const expected = roughness(syntheticPlateauProfile());
    for (const key of ['ra', 'rq', 'rz', 'rk', 'rpk', 'rvk'] as const) {
      await expect(numberIn(rough.getByTestId(`roughness-${key}`))).resolves.toBeCloseTo(expected[key], 3);
    }
    await expect(numberIn(rough.getByTestId('roughness-mr1'))).resolves.toBeCloseTo(expected.mr1, 1);
    await expect(numberIn(rough.getByTestId('roughness-mr2'))).resolves.toBeCloseTo(expected.mr2, 1);
    // A plateau-honed-like surface: valleys deeper than the peaks are high.
    expect(expected.rvk).toBeGreaterThan(expected.rpk);
    await rough.screenshot({ path: join(artifactsDir, 'calculator-roughness-768.png') });
    expect(consoleErrors).toEqual([]);
  });

  it('when the Gaussian filter is chosen, then the figures are the filtered ones and the filter is named; a cut-off too long for the trace is refused beside the choice', async () => {
    await openCalculator();
    const rough = card('Surface roughness');
    await rough.getByRole('button', { name: 'Load the synthetic example' }).click();
    await rough.getByTestId('roughness-result').waitFor();
    await expect(rough.getByTestId('roughness-filter').textContent()).resolves.toContain('None');

    await rough.getByLabel('Filter', { exact: true }).selectOption('0.8');
    await rough.getByTestId('roughness-evaluation').waitFor();
    // derived: the shared library with the same filter on the same seeded heights (8,000 at 0.5 µm: 4 mm, so 4 cut-offs of 0.8 mm evaluated)
    const expected = roughness(syntheticPlateauProfile(), 0.5, { kind: 'gaussian', cutoffMm: 0.8 });
    for (const key of ['ra', 'rq', 'rz', 'rk', 'rpk', 'rvk'] as const) {
      await expect(numberIn(rough.getByTestId(`roughness-${key}`))).resolves.toBeCloseTo(expected[key], 3);
    }
    await expect(rough.getByTestId('roughness-filter').textContent()).resolves.toContain('Gaussian, cut-off 0.8 mm');
    await expect(rough.getByTestId('roughness-evaluation').textContent()).resolves.toContain('3.200 mm (4 × 0.8 mm)');
    await expect(rough.getByTestId('roughness-filter-method').textContent()).resolves.toContain('ISO 13565-1');

    // derived: an 8 mm cut-off needs half a cut-off at each end and one whole one, 16 mm; the example is 4 mm
    await rough.getByLabel('Filter', { exact: true }).selectOption('8');
    await rough.getByText('A cut-off of 8 mm needs a trace of at least', { exact: false }).waitFor();
    await expect(rough.getByTestId('roughness-result').count()).resolves.toBe(0);
    expect(consoleErrors).toEqual([]);
  });

  it('when a CSV with a header is uploaded, then it is read; a file with a word among the heights shows where', async () => {
    await openCalculator();
    const rough = card('Surface roughness');
    // A triangle wave of amplitude 1 µm sampled at its peaks and troughs, 20 whole periods.
    const period = [0, 0.5, 1, 0.5, 0, -0.5, -1, -0.5];
    const heights = Array.from({ length: 20 }, () => period).flat();
    const csv = `height_um\n${heights.join('\n')}\n`;
    await rough.getByLabel('Or read a CSV or text file', { exact: true }).setInputFiles({ name: 'trace.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
    await expect(rough.getByTestId('loaded-profile').textContent()).resolves.toContain('header line skipped');
    await rough.getByLabel('Sample spacing (µm)', { exact: true }).fill('0.5');
    await rough.getByTestId('roughness-result').waitFor();
    // derived: the mean of |z| over these samples is (0 + 0.5 + 1 + 0.5) / 4 = 0.5 µm (a triangle wave has Ra = A/2)
    await expect(numberIn(rough.getByTestId('roughness-ra'))).resolves.toBeCloseTo(0.5, 3);

    await rough.getByRole('button', { name: 'Clear' }).click();
    await rough
      .getByLabel('Or read a CSV or text file', { exact: true })
      .setInputFiles({ name: 'bad.csv', mimeType: 'text/csv', buffer: Buffer.from('height\n0.5\n0.7\nabc\n') });
    await rough.getByText('bad.csv: Line 4: “abc” is not a number.', { exact: false }).waitFor();
    await expect(rough.getByTestId('roughness-result').count()).resolves.toBe(0);
    expect(consoleErrors).toEqual([]);
  });

  it('when every calculator is filled in on a wide screen, then the page lays out results beside the inputs', async () => {
    const wide = await suite.browser.newContext({ viewport: { width: 1280, height: 900 } });
    wide.setDefaultTimeout(10_000);
    page = await wide.newPage();
    page.on('pageerror', (err) => consoleErrors.push(err.message));
    try {
      await openCalculator();
      const displacement = card('Displacement');
      await displacement.getByLabel('Bore (in)', { exact: true }).fill('4');
      await displacement.getByLabel('Stroke (in)', { exact: true }).fill('3.48');
      await displacement.getByLabel('Cylinders', { exact: true }).fill('8');
      const compression = card('Compression ratio');
      for (const [label, value] of [
        ['Bore (in)', '4.000'],
        ['Stroke (in)', '3.48'],
        ['Chamber volume (cc)', '70'],
        ['Piston volume (cc)', '5'],
        ['Deck clearance (in)', '0.050'],
        ['Gasket bore (in)', '4.000'],
        ['Gasket thickness (in)', '0.020'],
      ]) {
        await compression.getByLabel(label, { exact: true }).fill(value);
      }
      const boreCheck = card('Bore check');
      await boreCheck.getByLabel('Cylinders', { exact: true }).selectOption('8');
      await boreCheck.getByRole('button', { name: 'Fill in example readings' }).click();
      await boreCheck.getByTestId('bore-check-result').waitFor();
      const boreSize = card('Bore size');
      await boreSize.getByLabel('Piston diameter (in)', { exact: true }).fill('4.0270');
      await boreSize.getByLabel('Least clearance (in)', { exact: true }).fill('0.0025');
      await boreSize.getByLabel('Most clearance (in)', { exact: true }).fill('0.0035');
      await boreSize.getByLabel('Standard bore (in)', { exact: true }).fill('4.000');
      await boreSize.getByLabel('Largest reading, worst cylinder (in)', { exact: true }).fill('4.0185');
      await boreSize.getByLabel('Clean-up beyond it (in)', { exact: true }).fill('0.005');
      // common practice (no published source): the smallest of the +0.010/+0.020/+0.030 in steps that reaches 4.0235 in is +0.030 in
      await expect(boreSize.getByTestId('oversize-step').textContent()).resolves.toBe('+0.030 in');
      const crosshatch = card('Crosshatch');
      await crosshatch.getByLabel('Bore (in)', { exact: true }).fill('4.030');
      await crosshatch.getByLabel('Spindle speed (rev/min)', { exact: true }).fill('150');
      await crosshatch.getByLabel('Stroke length of the hone (in)', { exact: true }).fill('4');
      await crosshatch.getByLabel('Cycles per minute', { exact: true }).fill('70');
      await crosshatch.getByTestId('crosshatch-angle-result').waitFor();
      const deck = card('Deck flatness');
      await deck.getByLabel('Straightedge readings (in)', { exact: true }).fill('0.0010, 0.0015 0.0005\n0.0025');
      await deck.getByText('Over the limit').waitFor();
      await card('Surface roughness').getByRole('button', { name: 'Load the synthetic example' }).click();
      await card('Ring end gap').getByLabel('Bore (in)', { exact: true }).fill('4.030');
      await card('Surface roughness').getByTestId('material-ratio-chart').locator('svg').first().waitFor();
      // Full-page shots from the top, so the sticky unit switch sits in its place under the calculator list.
      await page.evaluate(() => window.scrollTo(0, 0));
      await page.screenshot({ path: join(artifactsDir, 'calculator-full-1280.png'), fullPage: true });

      await page.setViewportSize({ width: 768, height: 1024 });
      await page.evaluate(() => window.scrollTo(0, 0));
      await page.screenshot({ path: join(artifactsDir, 'calculator-full-768.png'), fullPage: true });
    } finally {
      await wide.close();
    }
    expect(consoleErrors).toEqual([]);
  });
});
