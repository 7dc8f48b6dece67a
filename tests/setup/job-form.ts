import type { Locator } from 'playwright-core';

/** The job form's steps, as its step indicator names them. */
export type JobFormStep = 'What you send and the work' | 'Sizes and limits' | 'Getting there, place and date' | 'Notes and photos' | 'Check and save';

/** Opens a step of the job form from its step indicator (which moves freely; Next checks the step first). */
export async function openJobStep(form: Locator, step: JobFormStep) {
  await form.getByRole('navigation', { name: 'Steps of the job form' }).getByRole('button', { name: step }).click();
  await form.getByRole('heading', { level: 2, name: new RegExp(`^Step \\d of \\d: ${step}$`) }).waitFor();
}

/** Opens the summary step and presses its save button ("Save draft", "Save changes"). */
export async function saveJobForm(form: Locator, button = 'Save draft') {
  await openJobStep(form, 'Check and save');
  await form.getByRole('button', { name: button }).click();
}

/**
 * Fills the job form ("Job details") as a builder posting an iron small-block V8
 * to bore, hone and deck, shipped from Columbus, Ohio, with piston, clearance,
 * crosshatch, taper and deck limits (and out-of-round when `maxOutOfRound` is
 * given), step by step. The date the parts are needed back is left to the
 * test; the form is left on the step that asks for it.
 */
export async function fillIronV8Job(form: Locator, job: { title: string; cylinders: string; maxOutOfRound?: string }) {
  await form.getByLabel('Job title').fill(job.title);
  await form.getByLabel('Engine', { exact: true }).fill('Small-block V8, late 1970s');
  await form.getByLabel('Layout').selectOption('v');
  await form.getByLabel('Cylinders', { exact: true }).fill(job.cylinders);
  await form.getByRole('radio', { name: 'Cast iron' }).check();
  // The bore and deck specification shows once the work on them is ticked.
  for (const work of ['Bore', 'Hone', 'Deck']) await form.getByRole('checkbox', { name: work, exact: true }).check();
  await openJobStep(form, 'Sizes and limits');
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
  await openJobStep(form, 'Getting there, place and date');
  await form.getByRole('radio', { name: 'I ship the parts to the shop' }).check();
  await form.getByLabel('Country').fill('United States');
  await form.getByLabel('State, province or county').fill('Ohio');
  await form.getByLabel('Town or city').fill('Columbus');
}
