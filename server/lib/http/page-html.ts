import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { PAGE_CHUNKS_FILE } from '../../../shared/page-modules';
import { allPagePaths, matchesPagePath } from '../../../shared/page-paths';

/**
 * The built app's HTML for an address: index.html with, in its head, a module
 * preload of each chunk that address's page loads beside the entry (from the
 * build's page-chunks list), so the browser fetches the page's code while it
 * fetches the entry instead of after running it. Built once per page pattern.
 * A build without the list, or an address with no page, gets index.html as it is.
 */
export function builtPageHtml(dir: string): (pathname: string) => string {
  const index = readFileSync(join(dir, 'index.html'), 'utf8');
  const listFile = join(dir, PAGE_CHUNKS_FILE);
  const chunks = existsSync(listFile) ? (JSON.parse(readFileSync(listFile, 'utf8')) as Record<string, string[]>) : {};
  const withPreloads = new Map<string, string>();
  for (const [pattern, files] of Object.entries(chunks)) {
    const links = files.map((file) => `<link rel="modulepreload" crossorigin href="${file}">`).join('');
    withPreloads.set(pattern, index.replace('</head>', `${links}</head>`));
  }
  // A fixed segment beats a parameter, as in the router: /jobs/new is not /jobs/:jobId.
  const patterns = [...allPagePaths].sort((a, b) => Number(a.includes(':')) - Number(b.includes(':')));
  return (pathname) => {
    const pattern = patterns.find((p) => matchesPagePath(p, pathname));
    return (pattern && withPreloads.get(pattern)) ?? index;
  };
}
