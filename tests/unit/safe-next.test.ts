/**
 * `?next=` after sign-in (issue 17 finding 7). The hostile values are those of the probe; how browsers
 * read them follows the WHATWG URL Standard (tabs and newlines removed, `\` read as `/` in special
 * schemes), which `new URL` in Node implements — checked here too so the test fails if that changes.
 */
import { describe, expect, it } from 'vitest';
import { safeNext } from '../../src/lib/safe-next';

describe('safeNext', () => {
  it('keeps paths of this site, normalised', () => {
    expect(safeNext('/scenes/abc?x=1#t')).toBe('/scenes/abc?x=1#t');
    expect(safeNext('/a/../b')).toBe('/b');
    expect(safeNext('/s/tok en')).toBe('/s/tok%20en');
  });
  it('the WHATWG URL parser turns these into another host (why they must be refused)', () => {
    expect(new URL('/\t/evil.example', 'http://armilla.invalid').host).toBe('evil.example');
    expect(new URL('/\\evil.example', 'http://armilla.invalid').host).toBe('evil.example');
  });
  it('refuses what leaves the site, and what a header cannot carry', () => {
    for (const bad of ['/\t/evil.example', '/\n/x', '/\r\n/x', '//evil.example', '/\\evil.example', '\\\\evil.example', 'https://evil.example', 'javascript:alert(1)', ' /x', '', null, undefined, `/${'a'.repeat(3000)}`]) {
      expect(safeNext(bad), JSON.stringify(bad)).toBe('/dashboard');
    }
  });
  it('uses the given fallback', () => {
    expect(safeNext('//x', '/home')).toBe('/home');
  });
});
