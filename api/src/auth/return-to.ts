/**
 * The page to open after sign-in, when it is a path inside Ebbline: starts with one `/`, no
 * scheme, host or backslash (browsers read `/\evil.example` as another host), no control
 * characters. Anything else is refused, so the sign-in cannot be used to send people off-site.
 * @example safeReturnTo('/planner?week=12') // '/planner?week=12'
 * @example safeReturnTo('//evil.example')  // null
 */
export function safeReturnTo(value: unknown): string | null {
  if (value === undefined || value === '') return '/';
  if (typeof value !== 'string' || value.length > 2000) return null;
  if (!value.startsWith('/') || value.startsWith('//') || value.includes('\\')) return null;
  // eslint-disable-next-line no-control-regex
  if (/[\u0000-\u001f\u007f]/.test(value)) return null;
  // the auth routes themselves would loop
  if (/^\/auth(\/|$)/.test(value)) return '/';
  const parsed = new URL(value, 'http://ebbline.invalid');
  if (parsed.origin !== 'http://ebbline.invalid') return null;
  return parsed.pathname + parsed.search + parsed.hash;
}
