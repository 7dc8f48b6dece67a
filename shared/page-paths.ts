/**
 * Every address the browser app has a page for, as React Router path patterns
 * (`:name` stands for one segment). The server answers the app's HTML with 200
 * for these and with 404 for any other address (the app then shows its
 * not-found page); `robots.txt` lets crawlers into the public ones only.
 * client/app/router.tsx declares the same paths; tests/unit/page-paths.test.ts
 * keeps the two in step.
 */
export const pagePaths = {
  /** Anyone may read these; crawlers are welcome. */
  public: ['/', '/calculator', '/shops', '/shops/:shopId', '/help', '/terms', '/privacy', '/signin', '/signup'],
  /** Pages reached from an e-mailed link or a sign-in hand-off: no use to a crawler. */
  link: ['/forgot-password', '/reset-password', '/verify-email', '/confirm-new-email', '/welcome/github'],
  /** Pages of a signed-in person. */
  signedIn: [
    '/dashboard',
    '/settings',
    '/settings/notifications',
    '/account',
    '/notifications',
    '/messages',
    '/money',
    '/jobs',
    '/jobs/new',
    '/jobs/:jobId',
    '/jobs/:jobId/edit',
    '/jobs/:jobId/inspection/new',
    '/jobs/:jobId/inspection/:version/certificate',
    '/board',
    '/bids',
    '/queue',
    '/shop/profile',
    '/admin/people',
    '/admin/disputes',
    '/admin/disputes/:disputeId',
    '/admin/shops',
    '/admin/ledger',
    '/admin/settings',
    '/admin/audit',
  ],
} as const;

export const allPagePaths: readonly string[] = [...pagePaths.public, ...pagePaths.link, ...pagePaths.signedIn];

const segments = (path: string) => path.split('/').filter(Boolean);

/** Whether `pattern` matches `pathname` as React Router matches it: whole segments, any case, a trailing slash allowed. */
export function matchesPagePath(pattern: string, pathname: string): boolean {
  const want = segments(pattern);
  const have = segments(pathname);
  if (want.length !== have.length) return false;
  return want.every((part, i) => (part.startsWith(':') ? have[i].length > 0 : part.toLowerCase() === have[i].toLowerCase()));
}

/** Whether the browser app has a page at this address (the path only, without query or hash). */
export function isPagePath(pathname: string): boolean {
  return allPagePaths.some((pattern) => matchesPagePath(pattern, pathname));
}
