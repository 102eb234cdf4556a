/**
 * The Content-Security-Policy of every response (the middleware sets it; decision note: README.md beside
 * this file). Scripts: our origin, plus the SHA-256 of each inline script **our build** produces — the
 * island bootstrap and directive scripts Astro writes, Astro's inlined page scripts, and our own
 * `is:inline` scripts listed in astro.config.mjs. Astro (experimental.csp) computes those hashes at build
 * time and puts them on each page it renders; we take the script hashes from that header and nothing
 * from the HTML, so a script that reached a page some other way (an injection) is not allowed.
 */
import { createHash } from 'node:crypto';

/** A CSP hash source for an inline script's text (`'sha256-…'`, base64 of the UTF-8 text's digest). */
export const sha256Source = (text: string): string => `'sha256-${createHash('sha256').update(text, 'utf8').digest('base64')}'`;

const HASH_SOURCE = /^'sha(256|384|512)-[A-Za-z0-9+/]+={0,2}'$/;

/**
 * The hash sources of the `script-src` directive of a policy: the one Astro sets on a page it renders,
 * from hashes fixed at build time. Anything but a hash (keywords, hosts) is dropped.
 */
export function scriptHashesOf(policy: string | null | undefined): string[] {
  if (!policy) return [];
  const directive = policy
    .split(';')
    .map((d) => d.trim())
    .find((d) => /^script-src\s/i.test(d));
  if (!directive) return [];
  return [...new Set(directive.split(/\s+/).slice(1).filter((t) => HASH_SOURCE.test(t)))];
}

export const isEmbed = (pathname: string): boolean => pathname === '/embed' || pathname.startsWith('/embed/');

/**
 * Our policy. Styles keep `'unsafe-inline'`: server-rendered React writes `style` attributes, which a
 * hash list would block (CSP hashes do not cover attributes); scripts never get it.
 */
export function buildCsp(embed: boolean, scriptHashes: readonly string[]): string {
  return [
    "default-src 'self'",
    `script-src 'self'${scriptHashes.length ? ' ' + scriptHashes.join(' ') : ''}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self' data:",
    "connect-src 'self'",
    "worker-src 'self' blob:",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    embed ? 'frame-ancestors *' : "frame-ancestors 'none'",
  ].join('; ');
}

const NO_SCRIPTS = buildCsp(false, []);
const EMBED_NO_SCRIPTS = buildCsp(true, []);
/** Policies by (embed, Astro's header): a handful of distinct values (one per route at most). */
const memo = new Map<string, string>();
const MEMO_MAX = 512;

/**
 * The policy of a response to `pathname`. `astroPolicy` is the `content-security-policy` header Astro put
 * on a page it rendered (null for API answers and other responses: they allow no inline script).
 */
export function policyFor(pathname: string, astroPolicy: string | null | undefined): string {
  const embed = isEmbed(pathname);
  if (!astroPolicy) return embed ? EMBED_NO_SCRIPTS : NO_SCRIPTS;
  const key = `${embed ? 1 : 0}${astroPolicy}`;
  let p = memo.get(key);
  if (p === undefined) {
    p = buildCsp(embed, scriptHashesOf(astroPolicy));
    if (memo.size >= MEMO_MAX) memo.clear();
    memo.set(key, p);
  }
  return p;
}

const INLINE_SCRIPT_RE = /<script\b([^>]*)>([\s\S]*?)<\/script>/gi;

/**
 * `astro dev` only (it computes no CSP): the hash of every inline script in the HTML. Never used by the
 * built app — it is exactly the behaviour that let an injected script through (issue 17, finding 10).
 */
export function devInlineScriptHashes(html: string): string[] {
  const out = new Set<string>();
  for (const m of html.matchAll(INLINE_SCRIPT_RE)) {
    const attrs = m[1] ?? '';
    const body = m[2] ?? '';
    if (/\ssrc\s*=/i.test(attrs) || body.length === 0) continue;
    if (/type\s*=\s*["']?application\/(ld\+)?json/i.test(attrs)) continue;
    out.add(sha256Source(body));
  }
  return [...out];
}

/** The inline scripts of an HTML document (text of each `<script>` without `src`), for checks and tests. */
export function inlineScriptsOf(html: string): string[] {
  const out: string[] = [];
  for (const m of html.matchAll(INLINE_SCRIPT_RE)) {
    if (/\ssrc\s*=/i.test(m[1] ?? '') || !(m[2] ?? '').length) continue;
    if (/type\s*=\s*["']?application\/(ld\+)?json/i.test(m[1] ?? '')) continue;
    out.push(m[2]!);
  }
  return out;
}
