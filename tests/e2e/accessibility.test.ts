import AxeBuilder from '@axe-core/playwright';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import type { InspectionInput } from '../../shared/schemas/inspection';
import type { JobDetail } from '../../shared/schemas/jobs';
import { DEMO_PASSWORD, demoAccounts } from '../../server/dev/seed';
import { bidInput, inDays, jobInput, uniformRecordInput } from '../factories';
import { browserSuite } from '../setup/e2e-suite';
import { openJobStep, type JobFormStep } from '../setup/job-form';

const suite = browserSuite();
const builderEmail = demoAccounts.find((a) => a.email === 'juno@builders.test')!.email;
const shopEmail = demoAccounts.find((a) => a.email === 'bench@lanternhill.test')!.email;
const adminEmail = demoAccounts.find((a) => a.role === 'admin')!.email;

/** WCAG 2.0 and 2.1, levels A and AA: what the product promises. */
const WCAG_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];

/** An 8-cylinder record (invented demo readings), valid for the job `jobInput()` makes. */
const record: InspectionInput = uniformRecordInput();

/** The page has drawn what it shows: its main heading is there and nothing is still loading. */
async function settled(page: Page) {
  await page.locator('main h1').first().waitFor();
  await page.waitForFunction(() => !/Loading/.test(document.querySelector('main')?.textContent ?? 'Loading'));
  // Fonts change text metrics and so the colours axe samples behind text.
  await page.evaluate(() => document.fonts.ready);
}

/** A page to check in a state reached after it opens, e.g. a form sent empty so its error messages show. */
interface Stop {
  path: string;
  then?: (page: Page) => Promise<void>;
  label?: string;
}

/** Sends the page's form empty and waits for its messages: error colours are checked too. */
const sentEmpty = (button: string): Stop['then'] => async (page) => {
  await page.getByRole('button', { name: button }).click();
  await page.locator('[aria-invalid="true"]').first().waitFor();
};

/** Sends the job form with a block and a rotating assembly, the work on them ticked and one limit mistyped: the limits fieldsets, their defaults and their messages are checked too. */
const jobWithLimitsSent: Stop['then'] = async (page) => {
  const form = page.getByRole('form', { name: 'Job details' });
  await form.getByRole('checkbox', { name: 'Rotating assembly (crankshaft, rods and pistons)' }).check();
  for (const work of ['Deck', 'Line hone', 'Crank grind', 'Balance']) await form.getByRole('checkbox', { name: work, exact: true }).check();
  await openJobStep(form, 'Sizes and limits');
  await form.getByLabel('Largest main housing bore (in), optional').fill('wide');
  // Next checks the step's fields: the limits' messages show.
  await form.getByRole('button', { name: 'Next' }).click();
  await page.locator('[aria-invalid="true"]').first().waitFor();
};

/** The job form's summary step, before anything is typed: it names the steps still to answer. */
const jobSummaryShown: Stop['then'] = async (page) => {
  await openJobStep(page.getByRole('form', { name: 'Job details' }), 'Check and save');
};

/**
 * Opens each path and runs axe over it; returns one readable line per serious
 * or critical violation (page, rule, help text, the elements it found), so a
 * failing run names every problem on every page at once.
 */
async function audit(page: Page, stops: Array<string | Stop>): Promise<string[]> {
  const problems: string[] = [];
  // A form left with typed changes asks before the next stop's page opens: the audit leaves.
  page.on('dialog', (dialog) => void (dialog.type() === 'beforeunload' ? dialog.accept() : dialog.dismiss()));
  for (const stop of stops) {
    const { path, then, label = path } = typeof stop === 'string' ? { path: stop, then: undefined, label: undefined } : stop;
    await page.goto(suite.url(path));
    await settled(page);
    await then?.(page);
    // Legacy mode runs axe in the page itself instead of finishing in a new blank page: half the time, and the app has no iframes.
    const { violations } = await new AxeBuilder({ page }).withTags(WCAG_TAGS).setLegacyMode().options({ resultTypes: ['violations'] }).analyze();
    for (const violation of violations) {
      if (violation.impact !== 'serious' && violation.impact !== 'critical') continue;
      const targets = violation.nodes
        .slice(0, 6)
        .map((node) => `      ${node.target.join(' ')}${node.failureSummary ? ` — ${node.failureSummary.replace(/\s+/g, ' ').trim()}` : ''}`)
        .join('\n');
      const more = violation.nodes.length > 6 ? `\n      … and ${violation.nodes.length - 6} more` : '';
      problems.push(`${label}: [${violation.impact}] ${violation.id}: ${violation.help} (${violation.helpUrl})\n${targets}${more}`);
    }
  }
  return problems;
}

/**
 * An audit opens seven to nine pages and runs axe on each: about 5 s a page on a quiet machine,
 * up to 10 s on a loaded one (the public pages once went past a 60 s limit that way). The limit
 * is there to catch a hang, not to time the pages.
 */
const AUDIT_TIMEOUT_MS = 120_000;

const report = (problems: string[]) => `\n${problems.join('\n')}\n`;

/** What shows that the focused element has focus: an outline or a ring (box-shadow) that is not nothing. */
const focusIndicator = (page: Page) =>
  page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body) return { tag: 'body', outline: 'none', boxShadow: 'none' };
    const style = getComputedStyle(el);
    const outline = style.outlineStyle === 'none' || parseFloat(style.outlineWidth) === 0 ? 'none' : `${style.outlineStyle} ${style.outlineWidth} ${style.outlineColor}`;
    return { tag: `${el.tagName.toLowerCase()} ${el.textContent?.trim().slice(0, 40) ?? ''}`.trim(), outline, boxShadow: style.boxShadow };
  });

/** The focused element's name as this app gives it: aria-label, the text of its <label>, or its own text. */
const focusedName = (page: Page) =>
  page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body) return '';
    const label = el.id ? document.querySelector(`label[for="${CSS.escape(el.id)}"]`) : el.closest('label');
    return (el.getAttribute('aria-label') ?? label?.textContent ?? el.textContent ?? '').replace(/\s+/g, ' ').trim();
  });

/** Presses Tab (only the keyboard) until the focused element's name is `name`; fails after `max` presses. */
async function tabTo(page: Page, name: string | RegExp, max = 80) {
  const seen: string[] = [];
  for (let i = 0; i < max; i++) {
    await page.keyboard.press('Tab');
    const current = await focusedName(page);
    if (typeof name === 'string' ? current === name : name.test(current)) return;
    seen.push(current);
  }
  throw new Error(`Tab never reached “${name}” in ${max} presses; it passed: ${seen.join(' | ')}`);
}

/** Signs out with the header's button: the session ends on the server, so no cookie still in flight brings it back. */
async function signOut(page: Page) {
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.getByRole('banner').getByRole('link', { name: 'Sign in' }).waitFor();
}

/** A page in a context of its own with nobody signed in (the suite's pages start signed in). */
async function signedOutPage() {
  const page = await suite.pageFor(builderEmail, '/dashboard');
  await signOut(page);
  return page;
}

describe('accessibility (WCAG 2.1 A and AA) of every main page, in a real browser', () => {
  it('when a visitor is signed out, then no public page has a serious or critical violation', async () => {
    const { shops } = (await (await fetch(suite.url('/api/shops'))).json()) as { shops: Array<{ id: string }> };
    const page = await signedOutPage();
    const problems = await audit(page, [
      '/',
      '/signin',
      '/signup',
      { path: '/signup', then: sentEmpty('Create my account'), label: '/signup (sent empty)' },
      '/forgot-password',
      '/shops',
      `/shops/${shops[0].id}`,
      '/calculator',
      '/help',
      '/terms',
      '/privacy',
    ]);
    expect(problems, report(problems)).toEqual([]);
  }, AUDIT_TIMEOUT_MS);

  it('when a builder has a paid job, an open job with a bid and a conversation, then none of their pages has a serious or critical violation', async () => {
    const { job: funded, builder, shop } = await suite.fundedJob(builderEmail, shopEmail, { title: 'Paid bore job for the accessibility check' });
    const { job: open } = await builder<{ job: JobDetail }>('POST', '/api/jobs', jobInput({ title: 'Open hone job for the accessibility check' }));
    await builder('POST', `/api/jobs/${open.id}/publish`);
    const { job: balance } = await builder<{ job: JobDetail }>(
      'POST',
      '/api/jobs',
      jobInput({
        title: 'Bore and balance job for the accessibility check',
        parts: ['block', 'rotating-assembly'],
        operations: [{ code: 'bore', quantity: 8 }, { code: 'balance', quantity: 1 }],
        limits: { balance: { grade: 2.5, serviceRpm: 6500 } },
      }),
    );
    await shop('POST', `/api/jobs/${open.id}/bids`, bidInput({ note: 'Torque plate honing included.' }));
    const { thread } = await shop<{ thread: { id: string } }>('POST', `/api/jobs/${funded.id}/threads`);
    await shop('POST', `/api/threads/${thread.id}/messages`, { clientId: 'a11y-check-0001', body: 'The block is booked in for next Tuesday.' });

    const page = await suite.pageFor(builderEmail, '/dashboard');
    const problems = await audit(page, [
      '/dashboard',
      '/jobs',
      '/jobs/new',
      { path: '/jobs/new', then: sentEmpty('Next'), label: '/jobs/new (first step sent empty)' },
      { path: '/jobs/new', then: jobSummaryShown, label: '/jobs/new (the summary step, answers still missing)' },
      { path: '/jobs/new', then: jobWithLimitsSent, label: '/jobs/new (limits for each kind of work, one mistyped)' },
      `/jobs/${balance.id}`,
      `/jobs/${funded.id}?thread=${thread.id}`,
      `/jobs/${open.id}`,
      '/messages',
      '/money',
      '/settings',
      { path: '/settings', then: sentEmpty('Change password'), label: '/settings (sent empty)' },
      '/notifications',
      '/settings/notifications',
    ]);
    expect(problems, report(problems)).toEqual([]);
  }, AUDIT_TIMEOUT_MS);

  it('when a shop has a job in work, then none of its pages, the inspection entry included, has a serious or critical violation', async () => {
    const { job, shop } = await suite.fundedJob(builderEmail, shopEmail, { title: 'Block in the shop for the accessibility check' });
    await shop('POST', `/api/jobs/${job.id}/milestones`, { kind: 'block_received', note: 'On the bench.' });

    const page = await suite.pageFor(shopEmail, '/dashboard');
    const problems = await audit(page, ['/dashboard', '/board', '/bids', '/queue', '/shop/profile', `/jobs/${job.id}`, `/jobs/${job.id}/inspection/new`]);
    expect(problems, report(problems)).toEqual([]);
  }, AUDIT_TIMEOUT_MS);

  it('when a dispute is open, then none of the admin pages, the case included, has a serious or critical violation', async () => {
    const { job, shop, builder } = await suite.fundedJob(builderEmail, shopEmail, { title: 'Disputed job for the accessibility check' });
    await shop('POST', `/api/jobs/${job.id}/milestones`, { kind: 'block_received', note: 'On the bench.' });
    await shop('POST', `/api/jobs/${job.id}/inspection`, record);
    const { dispute } = await builder<{ dispute: { id: string } }>('POST', `/api/jobs/${job.id}/dispute`, {
      reason: 'record_outside_limits',
      statement: 'My own bore gauge reads cylinder four over the taper limit.',
    });

    const page = await suite.pageFor(adminEmail, '/dashboard');
    const problems = await audit(page, [
      '/dashboard',
      '/admin/disputes',
      `/admin/disputes/${dispute.id}`,
      '/admin/people',
      '/admin/shops',
      '/admin/ledger',
      '/admin/settings',
      '/admin/audit',
    ]);
    expect(problems, report(problems)).toEqual([]);
  }, AUDIT_TIMEOUT_MS);
});

describe('keyboard use, in a real browser', () => {
  it('when a person moves by Tab, then the focused link, button, input, list, radio or checkbox shows a visible focus indicator', async () => {
    const signedIn: Array<{ path: string; name: string | RegExp; step?: JobFormStep }> = [
      { path: '/jobs/new', name: 'Job title' },
      { path: '/jobs/new', name: 'Layout' },
      { path: '/jobs/new', name: 'Cast iron' },
      { path: '/jobs/new', name: 'Inches', step: 'Sizes and limits' },
      { path: '/jobs/new', name: 'Next' },
      { path: '/jobs/new', name: /^2\. Sizes and limits$/ },
      { path: '/jobs/new', name: 'Bore' },
      { path: '/jobs/new', name: 'Cancel' },
    ];
    const signedOut: typeof signedIn = [
      { path: '/', name: 'Skip to the content' },
      { path: '/', name: 'Shops' },
      { path: '/signin', name: 'E-mail' },
      { path: '/signin', name: 'Sign in' },
      { path: '/shops', name: 'Name or town' },
      { path: '/calculator', name: /^Bore/ },
    ];
    const page = await suite.pageFor(builderEmail, '/jobs/new');
    const missing: string[] = [];
    for (const stop of [...signedIn, null, ...signedOut]) {
      if (!stop) {
        await signOut(page);
        continue;
      }
      await page.goto(suite.url(stop.path));
      await settled(page);
      if ('step' in stop && stop.step) await openJobStep(page.getByRole('form', { name: 'Job details' }), stop.step);
      await tabTo(page, stop.name);
      const shown = await focusIndicator(page);
      if (shown.outline === 'none' && shown.boxShadow === 'none') missing.push(`${stop.path}: ${shown.tag} has no outline and no ring when focused`);
    }
    expect(missing, report(missing)).toEqual([]);
  }, 60_000);

  it('when a builder signs in with the keyboard alone, then the workbench opens', async () => {
    const page = await signedOutPage();
    await page.goto(suite.url('/signin'));
    await settled(page);
    await tabTo(page, 'E-mail');
    await page.keyboard.type(builderEmail);
    await tabTo(page, 'Password');
    await page.keyboard.type(DEMO_PASSWORD);
    await page.keyboard.press('Enter');
    await page.waitForURL(suite.url('/dashboard'));
    await page.getByTestId('signed-in-as').waitFor();
  }, 60_000);

  it('when a builder fills the new job form with the keyboard alone, then the draft is saved and its page opens', async () => {
    const page = await suite.pageFor(builderEmail, '/jobs/new');
    await settled(page);
    const typeInto = async (name: string, text: string) => {
      await tabTo(page, name);
      await page.keyboard.type(text);
    };
    const nextStep = async (heading: string) => {
      await tabTo(page, 'Next');
      await page.keyboard.press('Enter');
      await expect.poll(() => focusedName(page)).toBe(heading);
    };
    await typeInto('Job title', 'Keyboard-only bore job for an inline four');
    await typeInto('Engine', 'Inline four, 1990s');
    // A closed drop-down list takes typed letters to choose its option.
    await tabTo(page, 'Layout');
    await page.keyboard.type('Inline');
    await typeInto('Cylinders', '4');
    // A radio group is one Tab stop; Space chooses the focused radio.
    await tabTo(page, 'Cast iron');
    await page.keyboard.press('Space');
    // The bore specification follows the work: tick the bore work first.
    await tabTo(page, 'Bore');
    await page.keyboard.press('Space');
    await tabTo(page, 'Hone');
    await page.keyboard.press('Space');
    // Next checks the step and moves focus to the next step's heading.
    await nextStep('Step 2 of 5: Sizes and limits');
    await typeInto('Stock bore (in)', '3.500');
    await typeInto('Stroke (in)', '3.25');
    await typeInto('Target bore (in), optional', '3.530');
    await tabTo(page, 'Piston type');
    await page.keyboard.type('Forged');
    await nextStep('Step 3 of 5: Getting there, place and date');
    await tabTo(page, 'I ship the parts to the shop');
    await page.keyboard.press('Space');
    await typeInto('Country', 'United States');
    await typeInto('State, province or county', 'Ohio');
    await typeInto('Town or city', 'Columbus');
    // A date input takes its parts typed in the browser's order (month, day, year here).
    const [year, month, day] = inDays(30).split('-');
    await typeInto('Date you need the parts back', `${month}${day}${year}`);
    await nextStep('Step 4 of 5: Notes and photos');
    await nextStep('Step 5 of 5: Check and save');
    await page.getByTestId('job-form-summary').getByText('Keyboard-only bore job for an inline four').waitFor();
    await tabTo(page, 'Save draft');
    await page.keyboard.press('Enter');

    await page.waitForURL(/\/jobs\/[0-9a-f-]{36}$/).catch(async (error) => {
      const marked = await page.locator('[aria-invalid="true"]').evaluateAll((els) => els.map((el) => `${(el as HTMLInputElement).labels?.[0]?.textContent ?? el.id} = “${(el as HTMLInputElement).value}”`));
      throw new Error(`the draft was not saved; fields marked: ${marked.join(', ')}\n${error}`);
    });
    await page.getByRole('heading', { level: 1, name: 'Keyboard-only bore job for an inline four' }).waitFor();
    const jobId = new URL(page.url()).pathname.split('/').pop()!;
    const builder = await suite.apiAs(builderEmail);
    const { job } = await builder<{ job: JobDetail }>('GET', `/api/jobs/${jobId}`);
    expect(job.spec).toMatchObject({ layout: 'inline', cylinders: 4, blockMaterial: 'cast-iron', stockBore: 3.5, stroke: 3.25, targetBore: 3.53, pistonType: 'forged', logistics: 'ship', neededBy: inDays(30) });
    expect(job.spec.operations.map((op) => [op.code, op.quantity])).toEqual([
      ['bore', 4],
      ['hone', 4],
    ]);
    expect(suite.consoleErrors).toEqual([]);
  }, 60_000);
});
