/**
 * The sky view's lighter VSOP87B cut (planets/vsop87b-view.json, browser only) against the full cut the
 * server uses (planets/vsop87b.json, itself within 0.1″ of the complete VSOP87B series and checked
 * against JPL DE405 in bodies-de405.test.ts): geocentric directions within 3″ over 1900–2100.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';

type S = { L: number[][]; B: number[][]; R: number[][] };
const load = (f: string) => (JSON.parse(readFileSync(`src/lib/sky/planets/${f}`, 'utf8')) as { bodies: Record<string, S> }).bodies;
const full = load('vsop87b.json');
const view = load('vsop87b-view.json');
const sum = (rows: number[][], t: number) => rows.reduce((o, r, n) => { let s = 0; for (let i = 0; i < r.length; i += 3) s += r[i]! * Math.cos(r[i + 1]! + r[i + 2]! * t); return o + s * t ** n; }, 0);
const xyz = (s: S, t: number) => { const l = sum(s.L, t), b = sum(s.B, t), r = sum(s.R, t); return [r * Math.cos(b) * Math.cos(l), r * Math.cos(b) * Math.sin(l), r * Math.sin(b)]; };
const ARCSEC = 180 / Math.PI * 3600;

describe('view series', () => {
  it('is smaller by at least half and keeps every body', () => {
    expect(readFileSync('src/lib/sky/planets/vsop87b-view.json').length).toBeLessThan(readFileSync('src/lib/sky/planets/vsop87b.json').length / 2);
    expect(Object.keys(view).sort()).toEqual(Object.keys(full).sort());
  });
  it('puts the Sun and the planets within 3″ of the full cut, as seen from the Earth, 1900–2100', () => {
    let worst = 0, sun = 0;
    for (let y = 1900; y <= 2100; y += 0.73) {
      const t = (y - 2000) / 1000;
      const ef = xyz(full.earth!, t), ev = xyz(view.earth!, t);
      for (const p of ['sun', 'mercury', 'venus', 'mars', 'jupiter', 'saturn', 'uranus', 'neptune']) {
        const pf = p === 'sun' ? [0, 0, 0] : xyz(full[p]!, t), pv = p === 'sun' ? [0, 0, 0] : xyz(view[p]!, t);
        const gf = pf.map((v, i) => v - ef[i]!), gv = pv.map((v, i) => v - ev[i]!);
        const nf = Math.hypot(...gf), nv = Math.hypot(...gv);
        const d = Math.hypot(...gf.map((v, i) => v / nf - gv[i]! / nv)) * ARCSEC;
        worst = Math.max(worst, d);
        if (p === 'sun') sun = Math.max(sun, d);
      }
    }
    expect(worst).toBeLessThan(3);
    expect(worst).toBeGreaterThan(0.1); // it is a different cut, not the same file
    expect(sun).toBeLessThan(0.5);
  });
});
