/**
 * Where to go after signing in or up (`?next=`): only a path of this site, after the normalisation a
 * browser applies. Browsers drop tabs and line breaks from URLs and read `\` as `/`, so `/\t/evil.example`
 * becomes `//evil.example` (another host); such values, control characters and anything that resolves to
 * another origin fall back. The answer is the normalised path + query + fragment. Pure.
 */
const BASE = 'http://armilla.invalid';

export function safeNext(next: string | null | undefined, fallback = '/dashboard'): string {
  if (typeof next !== 'string' || next.length === 0 || next.length > 2048) return fallback;
  // eslint-disable-next-line no-control-regex
  if (/[\u0000-\u001f\u007f\\]/.test(next)) return fallback;
  if (!next.startsWith('/') || next.startsWith('//')) return fallback;
  let u: URL;
  try {
    u = new URL(next, BASE);
  } catch {
    return fallback;
  }
  if (u.origin !== BASE || u.pathname.startsWith('//')) return fallback;
  return `${u.pathname}${u.search}${u.hash}`;
}
