/**
 * A return path after sign-in must be one of our own pages: a single leading
 * slash, no scheme, no protocol-relative "//host", no backslash tricks.
 */
export function safeReturnPath(value: unknown, fallback = '/dashboard'): string {
  if (typeof value !== 'string' || value.length > 500) return fallback;
  if (!value.startsWith('/') || value.startsWith('//') || value.includes('\\')) return fallback;
  if (/[\u0000-\u001f]/.test(value)) return fallback;
  return value;
}
