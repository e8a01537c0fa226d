/**
 * Where to send someone after signing in: only a path of this site. Refuses
 * absolute URLs, protocol-relative `//host`, backslashes (browsers read `/\host`
 * as `//host`), control characters and whitespace (`/%09/host`), falling back
 * to the designs list.
 */
export const DEFAULT_AFTER_SIGNIN = '/designs';

export function safeCallbackUrl(raw: string | null | undefined, fallback = DEFAULT_AFTER_SIGNIN): string {
  if (typeof raw !== 'string' || raw.length === 0 || raw.length > 2000) return fallback;
  if (!raw.startsWith('/') || raw.startsWith('//')) return fallback;
  // Backslashes, control characters and spaces: browsers strip or rewrite them into an off-site URL.
  if (/[\\\u0000-\u0020\u007f]/.test(raw)) return fallback;
  let decoded = raw;
  try {
    decoded = decodeURIComponent(raw);
  } catch {
    return fallback;
  }
  if (decoded.startsWith('//') || /[\\\u0000-\u0020\u007f]/.test(decoded.slice(0, 2))) return fallback;
  const probe = new URL(raw, 'http://phasewright.invalid');
  if (probe.origin !== 'http://phasewright.invalid') return fallback;
  return probe.pathname + probe.search + probe.hash;
}
