/**
 * Each page's path and the module its `lazy` route imports, read from the
 * source text of client/app/router.tsx (the caller reads the file). Used where
 * the built chunks are matched to pages: the build's page-chunks list (which the
 * server turns into preload links) and `npm run bench:client`.
 */
/** Where a build lists, for each page path, the chunks that page loads beside the entry (written by vite.config.ts's pageChunks, read by the server). */
export const PAGE_CHUNKS_FILE = '.vite/page-chunks.json';

export function lazyPageModules(routerSource: string): Array<{ path: string; module: string }> {
  const routes = [...routerSource.matchAll(/path:\s*'([^']+)',\s*lazy:\s*\(\)\s*=>\s*import\('\.\/routes\/([^']+)'\)/g)].map(([, path, module]) => ({
    path,
    module: `client/app/routes/${module}.tsx`,
  }));
  if (routes.length === 0) throw new Error('found no lazy routes in client/app/router.tsx; has its shape changed?');
  return routes;
}
