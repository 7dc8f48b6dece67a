import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { allPagePaths, isPagePath, pagePaths } from '../../shared/page-paths';

const root = fileURLToPath(new URL('../..', import.meta.url));
const read = (file: string) => readFileSync(`${root}/${file}`, 'utf8');

/** The paths client/app/router.tsx declares, its catch-all aside. */
const routerPaths = () => [...read('client/app/router.tsx').matchAll(/path:\s*'([^']+)'/g)].map(([, path]) => path).filter((path) => path !== '*');

/** The Disallow lines of robots.txt, as RFC 9309 reads them: a path is refused when one of them is its prefix. */
const disallowed = () =>
  read('client/public/robots.txt')
    .split('\n')
    .map((line) => /^Disallow:\s*(\S+)/i.exec(line)?.[1])
    .filter((rule): rule is string => Boolean(rule));
/** A page pattern as a crawler would meet it: each `:param` filled in. */
const example = (pattern: string) => pattern.replace(/:\w+/g, 'x1');

describe('page paths', () => {
  it('when the router and shared/page-paths.ts are read, then they declare the same pages', () => {
    expect([...routerPaths()].sort()).toEqual([...allPagePaths].sort());
  });

  it('when the list is read, then no page is in it twice', () => {
    expect(new Set(allPagePaths).size).toBe(allPagePaths.length);
  });

  it.each([
    ['/', true],
    ['/board', true],
    ['/board/', true],
    ['/Board', true],
    ['/jobs/3f0c1a52-7a0e-4f7e-9d55-0d0f5b3c1e11', true],
    ['/jobs/3f0c1a52-7a0e-4f7e-9d55-0d0f5b3c1e11/inspection/2/certificate', true],
    ['/shops/any-shop', true],
    ['/no-such-page', false],
    ['/board/extra', false],
    ['/jobs/3f0c/unknown', false],
    ['/admin', false],
    ['/wp-login.php', false],
  ])('when the address is %s, then isPagePath says %s', (path, expected) => {
    expect(isPagePath(path)).toBe(expected);
  });

  it('when robots.txt is read, then every page behind a sign-in or an e-mailed link is refused and every public page is not', () => {
    const rules = disallowed();
    const refused = (path: string) => rules.some((rule) => path.startsWith(rule));
    for (const page of [...pagePaths.signedIn, ...pagePaths.link]) expect(refused(example(page)), page).toBe(true);
    for (const page of pagePaths.public) expect(refused(example(page)), page).toBe(false);
    expect(refused('/api/jobs')).toBe(true);
  });
});
