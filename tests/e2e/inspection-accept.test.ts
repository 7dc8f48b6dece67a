import { describe, expect, it } from 'vitest';
import type { InspectionInput } from '../../shared/schemas/inspection';
import type { JobDetail } from '../../shared/schemas/jobs';
import { demoAccounts } from '../../server/dev/seed';
import { browserSuite } from '../setup/e2e-suite';

const suite = browserSuite();
const { pageFor, consoleErrors } = suite;

const builder = demoAccounts.find((a) => a.email === 'juno@builders.test')!;
const lanternHill = demoAccounts.find((a) => a.email === 'bench@lanternhill.test')!;

/** Eight round, straight bores of 4.0310 in with 4.0280 in pistons; cylinder 3 has 0.0009 in of taper (demo numbers). */
function failingRecord(): InspectionInput {
  const round = (size: number) => ({ thrust: size, axial: size });
  return {
    conditions: { unit: 'in', gaugeResolution: 0.0001, temperatureC: 20, torquePlate: true },
    cylinders: Array.from({ length: 8 }, (_, i) => ({ top: round(4.031), middle: round(4.031), bottom: round(i === 2 ? 4.0301 : 4.031), piston: 4.028 })),
    crosshatch: { mode: 'measured', includedAngleDeg: 45 },
    signedOffBy: 'Bench Lead',
    notes: '',
  };
}

describe('accepting a record that does not conform', () => {
  it('when the builder accepts a record with a failing check, then the dialog names the check and Accept works only once it is ticked', async () => {
    const { job, shop } = await suite.fundedJob(builder.email, lanternHill.email, { maxTaper: 0.0005, maxOutOfRound: 0.0005, crosshatchMinDeg: 40, crosshatchMaxDeg: 50 });
    await shop('POST', `/api/jobs/${job.id}/milestones`, { kind: 'block_received', note: 'Arrived on a pallet.' });
    await shop('POST', `/api/jobs/${job.id}/inspection`, failingRecord());

    // The web certificate holds what the PDF holds: job number, status in words, builder and shop.
    const certificate = await pageFor(builder.email, `/jobs/${job.id}/inspection/1/certificate`);
    await expect.poll(() => certificate.getByTestId('certificate-job').textContent()).toContain(`Job number ${job.id}`);
    expect(await certificate.getByTestId('certificate-status').textContent()).toBe('Status: Waiting for the builder’s answer');
    expect(await certificate.getByTestId('certificate-parties').textContent()).toMatch(/^Builder: Juno Brackenridge · Shop: Lantern Hill Machine Works, .+/);
    expect(await certificate.getByTestId('certificate-result').textContent()).toMatch(/^FAIL/);
    expect(await certificate.getByTestId('certificate-checks').textContent()).toContain('cylinder 3 taper');
    expect(await certificate.getByTestId('certificate-checks').textContent()).toContain('≤ 0.0005 in');

    const page = await pageFor(builder.email, `/jobs/${job.id}`);
    const review = page.getByTestId('inspection-review');
    await expect.poll(() => review.getByTestId('review-due').textContent()).toMatch(/never accepted without you/);
    await review.getByRole('button', { name: 'Accept the record' }).click();
    const dialog = page.getByRole('dialog', { name: 'Accept version 1 of the inspection record?' });
    const failing = dialog.getByTestId('accept-failing-checks');
    await expect.poll(() => failing.textContent()).toMatch(/Cylinder 3 taper/);
    const acceptButton = dialog.getByRole('button', { name: 'Accept and pay the shop' });
    expect(await acceptButton.isDisabled()).toBe(true);
    // Clicking the disabled button does nothing: the job still waits.
    await acceptButton.click({ force: true });
    expect(await dialog.isVisible()).toBe(true);

    // One box per check that does not conform (the taper, and whatever else the bottom reading moves, such as the clearance there); every one must be ticked.
    expect(await dialog.getByRole('checkbox', { name: /Cylinder 3 taper/ }).count()).toBe(1);
    const boxes = dialog.getByRole('checkbox');
    const count = await boxes.count();
    expect(await dialog.getByRole('checkbox', { name: /Cylinder (1|2|4|5|6|7|8) / }).count()).toBe(0);
    for (let i = 0; i < count; i++) {
      expect(await acceptButton.isDisabled()).toBe(true);
      await boxes.nth(i).check();
    }
    expect(await acceptButton.isDisabled()).toBe(false);
    await acceptButton.click();
    await expect.poll(() => dialog.isVisible()).toBe(false);
    const juno = await suite.apiAs(builder.email);
    await expect.poll(async () => (await juno<{ job: JobDetail }>('GET', `/api/jobs/${job.id}`)).job.status, { timeout: 10_000 }).toBe('completed');
    expect(consoleErrors).toEqual([]);
  });
});
