import type { Locator } from 'playwright-core';

/**
 * Fills the job form ("Job details") as a builder posting an iron small-block V8
 * to bore, hone and deck, shipped from Columbus, Ohio, with piston, clearance,
 * crosshatch, taper and deck limits (and out-of-round when `maxOutOfRound` is
 * given). The date the parts are needed back is left to the test.
 */
export async function fillIronV8Job(form: Locator, job: { title: string; cylinders: string; maxOutOfRound?: string }) {
  await form.getByLabel('Job title').fill(job.title);
  await form.getByLabel('Engine', { exact: true }).fill('Small-block V8, late 1970s');
  await form.getByLabel('Layout').selectOption('v');
  await form.getByLabel('Cylinders', { exact: true }).fill(job.cylinders);
  await form.getByRole('radio', { name: 'Cast iron' }).check();
  // The bore and deck specification shows once the work on them is ticked.
  for (const work of ['Bore', 'Hone', 'Deck']) await form.getByRole('checkbox', { name: work, exact: true }).check();
  await form.getByLabel('Stock bore (in)').fill('4.000');
  await form.getByLabel('Stroke (in)').fill('3.48');
  await form.getByLabel('Piston diameter (in), optional').fill('4.028');
  await form.getByLabel('Smallest clearance (in), optional').fill('0.0025');
  await form.getByLabel('Largest clearance (in), optional').fill('0.0035');
  await form.getByLabel('Piston type').selectOption('forged');
  await form.getByLabel('Smallest crosshatch included angle (°), optional').fill('40');
  await form.getByLabel('Largest crosshatch included angle (°), optional').fill('50');
  await form.getByLabel('Maximum taper (in), optional').fill('0.0005');
  if (job.maxOutOfRound !== undefined) await form.getByLabel('Maximum out-of-round (in), optional').fill(job.maxOutOfRound);
  await form.getByLabel('Deck out-of-flat limit (in), optional').fill('0.002');
  await form.getByRole('radio', { name: 'I ship the parts to the shop' }).check();
  await form.getByLabel('Country').fill('United States');
  await form.getByLabel('State, province or county').fill('Ohio');
  await form.getByLabel('Town or city').fill('Columbus');
}
