/**
 * Filling in the stand-in's own hosted pages (payment, onboarding) without a
 * browser, as the demo scenario and tests do. The pages are plain HTML forms
 * of our own making, so reading the first form is enough.
 */

/** A form's action and its fields' current values, from a plain HTML page. */
export function readForm(html: string, index = 0): { action: string; fields: Record<string, string> } {
  const forms = [...html.matchAll(/<form[^>]*action="([^"]*)"[^>]*>([\s\S]*?)<\/form>/g)];
  const form = forms[index];
  if (!form) throw new Error(`no form #${index} on the page`);
  const fields: Record<string, string> = {};
  for (const input of form[2].matchAll(/<input([^>]*)>/g)) {
    const name = /name="([^"]*)"/.exec(input[1])?.[1];
    if (name) fields[name] = /value="([^"]*)"/.exec(input[1])?.[1] ?? '';
  }
  return { action: form[1].replaceAll('&amp;', '&'), fields };
}

export async function postForm(url: string, fields: Record<string, string>) {
  return fetch(url, {
    method: 'POST',
    headers: { 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams(fields).toString(),
    redirect: 'manual',
  });
}

/** Opens a hosted page, fills its first form with `changes` over the values it carries, and submits it (redirects not followed). */
export async function submitHostedPage(pageUrl: string, changes: Record<string, string> = {}) {
  const page = await fetch(pageUrl);
  if (page.status !== 200) throw new Error(`the page at ${pageUrl} answered ${page.status}`);
  const form = readForm(await page.text());
  return postForm(new URL(form.action, pageUrl).toString(), { ...form.fields, ...changes });
}
