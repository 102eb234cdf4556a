#!/usr/bin/env node
/**
 * Builds vsop87b.json: the VSOP87B series (Bretagnon & Francou 1988; heliocentric spherical
 * coordinates, ecliptic and equinox J2000) of Mercury … Neptune and the Earth, truncated so that no
 * geocentric direction moves by more than TARGET_ARCSEC from the full series' over 1900–2100.
 *
 * Source of the full series: the astronomia npm package (MIT licence, data/vsop87B*.js, a transcription
 * of the IMCCE files). Run by hand after changing the target:  node src/lib/sky/planets/build-series.mjs
 * The sky view in the browser uses a lighter cut (vsop87b-view.json, see planets/README.md):
 *   TARGET=1 TARGET_EARTH=0.5 OUT=vsop87b-view.json node src/lib/sky/planets/build-series.mjs
 * Prints, per body, the terms kept and the worst difference found.
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { dirname, join } from 'node:path';
import { createRequire } from 'node:module';

const here = dirname(fileURLToPath(import.meta.url));
const require = createRequire(import.meta.url);
const dataDir = join(dirname(require.resolve('astronomia/package.json')), 'data');
const PLANETS = ['mercury', 'venus', 'earth', 'mars', 'jupiter', 'saturn', 'uranus', 'neptune'];
const TARGET_ARCSEC = { planet: Number(process.env.TARGET ?? 0.1), earth: Number(process.env.TARGET_EARTH ?? 0.04) };
const AS = 180 / Math.PI * 3600;
/** Significant digits kept of each coefficient (11 = the source's own; the view's 1″ cut needs 8). */
const DIGITS = Number(process.env.DIGITS ?? 11);

const full = {};
for (const p of PLANETS) full[p] = (await import(pathToFileURL(join(dataDir, `vsop87B${p}.js`)).href)).default;

/** Series as {L: [[A, B, C, …] per power of τ], B: …, R: …}. */
const asArrays = (m) => Object.fromEntries(['L', 'B', 'R'].map((k) => {
  const powers = Object.keys(m[k]).map(Number).sort((a, b) => a - b);
  return [k, powers.map((n) => m[k][String(n)].flat())];
}));

function sum(series, tau) {
  let out = 0, tp = 1;
  for (const row of series) {
    let s = 0;
    for (let i = 0; i < row.length; i += 3) s += row[i] * Math.cos(row[i + 1] + row[i + 2] * tau);
    out += s * tp;
    tp *= tau;
  }
  return out;
}
function xyz(s, tau) {
  const l = sum(s.L, tau), b = sum(s.B, tau), r = sum(s.R, tau);
  return [r * Math.cos(b) * Math.cos(l), r * Math.cos(b) * Math.sin(l), r * Math.sin(b)];
}
const sub = (a, b) => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
const angle = (a, b) => {
  const c = [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
  return Math.atan2(Math.hypot(...c), a[0] * b[0] + a[1] * b[1] + a[2] * b[2]) * AS;
};
/** Keeps a term when A · |τ|max^power ≥ eps (|τ| ≤ 0.1 millennium from J2000). */
const truncate = (s, eps) => Object.fromEntries(Object.entries(s).map(([k, rows]) => [k, rows.map((row, n) => {
  const out = [];
  for (let i = 0; i < row.length; i += 3) if (row[i] * 0.1 ** n >= eps || i === 0) out.push(row[i], row[i + 1], row[i + 2]);
  return out;
})]));
const count = (s) => Object.values(s).reduce((a, rows) => a + rows.reduce((b, r) => b + r.length / 3, 0), 0);

const FULL = Object.fromEntries(PLANETS.map((p) => [p, asArrays(full[p])]));
const TAUS = Array.from({ length: 401 }, (_, i) => -0.1 + (0.2 * i) / 400 + 0.00037 * Math.sin(i * 7.1));
const earthFull = TAUS.map((t) => xyz(FULL.earth, t));
const fullPos = Object.fromEntries(PLANETS.map((p) => [p, TAUS.map((t) => xyz(FULL[p], t))]));

function worst(p, s) {
  let w = 0;
  TAUS.forEach((t, i) => {
    const pos = xyz(s, t);
    if (p === 'earth') {
      // The Earth's error seen in the Sun's direction and in each planet's.
      w = Math.max(w, angle(pos.map((x) => -x), earthFull[i].map((x) => -x)));
      for (const q of PLANETS) if (q !== 'earth') w = Math.max(w, angle(sub(fullPos[q][i], pos), sub(fullPos[q][i], earthFull[i])));
    } else {
      w = Math.max(w, angle(sub(pos, earthFull[i]), sub(fullPos[p][i], earthFull[i])));
    }
  });
  return w;
}

const out = { source: 'VSOP87B (Bretagnon & Francou 1988) from the astronomia npm package (MIT), truncated by build-series.mjs', targetArcsec: TARGET_ARCSEC, bodies: {} };
for (const p of PLANETS) {
  const target = p === 'earth' ? TARGET_ARCSEC.earth : TARGET_ARCSEC.planet;
  // Largest threshold (fewest terms) still within the target: bisection on log10(eps).
  let lo = -12, hi = -4;
  for (let k = 0; k < 18; k++) {
    const mid = (lo + hi) / 2;
    if (worst(p, truncate(FULL[p], 10 ** mid)) <= target) lo = mid; else hi = mid;
  }
  const s = truncate(FULL[p], 10 ** lo);
  const w = worst(p, s);
  // 10 significant digits are kept of every coefficient (their own precision is 11).
  out.bodies[p] = Object.fromEntries(Object.entries(s).map(([k, rows]) => [k, rows.map((r) => r.map((x) => Number(x.toPrecision(DIGITS))))]));
  console.log(`${p}: ${count(s)} of ${count(FULL[p])} terms, eps 1e${lo.toFixed(2)}, worst ${w.toFixed(3)}″`);
}
// OUT names another file (the sky view's lighter series: TARGET=1 TARGET_EARTH=0.5 OUT=vsop87b-view.json).
const file = join(here, process.env.OUT ?? 'vsop87b.json');
writeFileSync(file, JSON.stringify(out));
console.log('wrote', file);
