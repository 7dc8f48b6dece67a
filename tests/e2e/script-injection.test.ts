/**
 * HTML and script that people type are shown as text and never run: job text,
 * a bid note, messages, a shop's name and people's display names, made through
 * the API with classic injection payloads, then opened in Chromium on the job
 * page, the board, the messages list, the conversation and the shop directory.
 *
 * The Content Security Policy would stop an inline handler even if one got
 * into the page, so `window.__pwned` staying unset is not enough on its own:
 * the test also looks for the elements themselves in the DOM, and for any CSP
 * violation (which would mean markup got through and only the policy saved us).
 */
import { request, type APIRequestContext, type Page } from 'playwright-core';
import { afterAll, describe, expect, it } from 'vitest';
import type { JobDetail } from '../../shared/schemas/jobs';
import { DEMO_PASSWORD } from '../../server/dev/seed';
import { bidInput, jobInput, shopProfileInput, uniqueEmail } from '../factories';
import { browserSuite } from '../setup/e2e-suite';
import { confirmationLink } from '../setup/mail-links';

const suite = browserSuite();

const IMG = '<img src=x onerror="window.__pwned=1">';
const SCRIPT = '<script>window.__pwned=1</script>';
const SVG = '"><svg onload=window.__pwned=1>';

const signUps: APIRequestContext[] = [];
afterAll(async () => {
  await Promise.all(signUps.map((session) => session.dispose()));
});

/** A new account made through the API (password: the demo one, so the suite's helpers can sign in as it). */
async function signUp(role: 'builder' | 'shop', displayName: string): Promise<string> {
  const session = await request.newContext({ baseURL: suite.url('') });
  signUps.push(session);
  const { csrfToken } = await (await session.get('/api/auth/csrf')).json();
  const email = uniqueEmail(`inject-${role}`);
  const res = await session.post('/api/auth/signup', { data: { displayName, email, password: DEMO_PASSWORD, role, acceptTerms: true }, headers: { 'X-CSRF-Token': csrfToken } });
  if (res.status() !== 201) throw new Error(`sign-up answered ${res.status()}: ${await res.text()}`);
  // Publishing and bidding need a confirmed address: follow the link from the real sign-up mail.
  const confirmed = await session.post('/api/auth/verify-email', {
    data: { token: (await confirmationLink(email)).token },
    headers: { 'X-CSRF-Token': (await res.json()).csrfToken },
  });
  if (!confirmed.ok()) throw new Error(`confirming answered ${confirmed.status()}: ${await confirmed.text()}`);
  return email;
}

/** Records CSP violations from the first script of every document the page opens next. */
async function watchViolations(page: Page) {
  await page.context().addInitScript(() => {
    const seen: string[] = [];
    (window as unknown as { __cspViolations: string[] }).__cspViolations = seen;
    document.addEventListener('securitypolicyviolation', (event) => {
      // zod's feature probe (`new Function("")` in a try/catch, shared/ schemas in the bundle) is refused and reported as "eval": not markup from the data.
      if (event.blockedURI === 'eval') return;
      seen.push(`${event.effectiveDirective}: ${event.blockedURI} ${event.sample}`);
    });
  });
}

/** What would show that markup from the data became elements, or ran. */
async function injectionTraces(page: Page): Promise<{ pwned: unknown; elements: string[]; violations: string[] }> {
  return page.evaluate(() => {
    const elements: string[] = [];
    for (const el of Array.from(document.querySelectorAll('*'))) {
      for (const attr of Array.from(el.attributes)) {
        if (/^on/i.test(attr.name)) elements.push(`<${el.tagName.toLowerCase()} ${attr.name}="${attr.value}">`);
      }
      if (el.tagName.toLowerCase() === 'script' && (el.textContent ?? '').includes('__pwned')) elements.push(`<script>${el.textContent}</script>`);
    }
    for (const el of Array.from(document.querySelectorAll('img[src="x"], svg[onload]'))) elements.push(el.outerHTML);
    const w = window as unknown as { __pwned?: unknown; __cspViolations?: string[] };
    return { pwned: w.__pwned, elements, violations: w.__cspViolations ?? [] };
  });
}

/** Opens `path`, waits until each text is on screen as text, gives any handler time to fire, and finds no trace of it. */
async function expectShownAsText(page: Page, path: string, texts: string[]) {
  await page.goto(suite.url(path));
  for (const text of texts) await page.getByText(text).filter({ visible: true }).first().waitFor();
  // A broken <img src=x> fires onerror within a moment of being added; wait for the network to settle and a little more.
  await page.waitForLoadState('networkidle');
  await page.waitForTimeout(300);
  const traces = await injectionTraces(page);
  expect(traces.elements, path).toEqual([]);
  expect(traces.violations, path).toEqual([]);
  expect(traces.pwned, path).toBeUndefined();
}

describe('HTML and script in what people type is shown as text, never run', () => {
  it(
    'when a job, a bid, a conversation, a shop name and display names carry injection payloads, then every page shows them literally and nothing runs',
    { timeout: 180_000 },
    async () => {
      const builderName = `${SVG} Builder`;
      const shopPerson = `${IMG} Person`;
      const shopName = `${SCRIPT} Bore`;
      const title = `${IMG} bore the block`;
      const notes = `Please keep ${SCRIPT} and ${SVG} exactly as typed.\n${IMG}`;
      const builderEmail = await signUp('builder', builderName);
      const shopEmail = await signUp('shop', shopPerson);
      const builder = await suite.apiAs(builderEmail);
      const shop = await suite.apiAs(shopEmail);

      const { job } = await builder<{ job: JobDetail }>('POST', '/api/jobs', jobInput({ title, engineFamily: SVG, notes }));
      await builder('POST', `/api/jobs/${job.id}/publish`);
      const { shop: profile } = await shop<{ shop: { id: string } }>('PUT', '/api/shop-profile', shopProfileInput({ name: shopName, equipmentNotes: `${IMG} boring bar` }));
      await shop('POST', `/api/jobs/${job.id}/bids`, bidInput({ note: `Our note: ${SVG} ${SCRIPT}` }));
      const { thread } = await shop<{ thread: { id: string } }>('POST', `/api/jobs/${job.id}/threads`, {});
      const fromShop = `Question: ${IMG}`;
      const fromBuilder = `Answer: ${SCRIPT} ${SVG}`;
      await shop('POST', `/api/threads/${thread.id}/messages`, { clientId: 'inject-shop-1', body: fromShop });
      await builder('POST', `/api/threads/${thread.id}/messages`, { clientId: 'inject-builder-1', body: fromBuilder });

      // The builder: their own name, the job with its notes and spec, the shop's bid, and the conversation.
      const builderPage = await suite.pageFor(builderEmail, '/dashboard');
      await watchViolations(builderPage);
      await expectShownAsText(builderPage, '/dashboard', [builderName]);
      await expectShownAsText(builderPage, `/jobs/${job.id}?thread=${thread.id}`, [title, SVG, SCRIPT, shopName, fromShop, fromBuilder]);
      await expectShownAsText(builderPage, '/messages', [shopName]);

      // The shop: the board, the job as a bidder sees it (with the builder's name), its conversation.
      const shopPage = await suite.pageFor(shopEmail, '/board');
      await watchViolations(shopPage);
      await expectShownAsText(shopPage, '/board', [title]);
      await expectShownAsText(shopPage, `/jobs/${job.id}?thread=${thread.id}`, [title, builderName, fromShop, fromBuilder]);
      await expectShownAsText(shopPage, '/messages', [title]);

      // Anyone: the shop directory, a search for the payload itself (echoed into the search box), and the shop's page.
      await expectShownAsText(shopPage, '/shops', [shopName]);
      await expectShownAsText(shopPage, `/shops?q=${encodeURIComponent(SCRIPT)}`, [shopName]);
      expect(await shopPage.getByLabel('Name or town').inputValue()).toBe(SCRIPT);
      await expectShownAsText(shopPage, `/shops/${profile.id}`, [shopName]);

      expect(suite.consoleErrors.filter((line) => /Content Security Policy|Refused to/i.test(line))).toEqual([]);

      // The checks can fail: the same markup put into the page as HTML is found, and the policy refuses its handler.
      await shopPage.evaluate((html) => document.body.insertAdjacentHTML('beforeend', html), IMG);
      await shopPage.waitForTimeout(300);
      const planted = await injectionTraces(shopPage);
      expect(planted.elements).toEqual(expect.arrayContaining([expect.stringContaining('onerror="window.__pwned=1"')]));
      expect(planted.violations).toEqual(expect.arrayContaining([expect.stringMatching(/^script-src-attr: inline/)]));
      expect(planted.pwned).toBeUndefined();
    },
  );

  it('when the sign-in page is given a script or another site as its return path, then signing in lands on our dashboard and nothing runs', { timeout: 90_000 }, async () => {
    const email = await signUp('builder', 'Return Path Tester');
    const page = await suite.pageFor(email, '/dashboard');
    await watchViolations(page);
    for (const returnTo of ['javascript:window.__pwned=1', '//evil.test/steal', '/\\evil.test']) {
      // Sign out through the API once the page is quiet (clearing cookies races the dashboard's own requests, which renew the cookie).
      await page.waitForLoadState('networkidle');
      await page.evaluate(async () => {
        const { csrfToken } = (await (await fetch('/api/auth/csrf')).json()) as { csrfToken: string };
        await fetch('/api/auth/logout', { method: 'POST', headers: { 'X-CSRF-Token': csrfToken } });
      });
      await page.goto(suite.url(`/signin?returnTo=${encodeURIComponent(returnTo)}`));
      await page.getByLabel('E-mail').fill(email);
      await page.getByLabel('Password').fill(DEMO_PASSWORD);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.waitForURL(suite.url('/dashboard'));
      await page.getByRole('heading', { level: 1 }).first().waitFor();
      const traces = await injectionTraces(page);
      expect(traces, returnTo).toEqual({ pwned: undefined, elements: [], violations: [] });
    }
  });
});
