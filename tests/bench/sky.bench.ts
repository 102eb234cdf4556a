// `npm run bench` (or `npm run bench -- sky`): sky-engine benchmarks. Prints a table and writes
// tests/bench/results/sky.json. Timings are medians; nothing here is a test (no pass/fail on speed).
//
// (a) every catalogue star to apparent alt/az for one instant: the batched pass (starsToHorizontal)
//     versus one astronomy-engine call chain per star (DefineStar → Equator(of date, aberration) →
//     Horizon), ≥ 20 runs each; ratio; largest deviation between them and between the batched pass
//     and this engine's own per-star chain (arcseconds, no refraction).
// (b) windows for 200 targets over 12 h with a full envelope: in-process (parse + compute, what the
//     route calls) and through the HTTP API of the built server (POST /api/sky/windows).
import { mkdirSync, writeFileSync } from 'node:fs';
import * as Astronomy from 'astronomy-engine';
import { loadCatalogue } from '../../src/lib/sky/catalogue';
import { observeIcrs, skyFrame } from '../../src/lib/sky/apparent';
import { starsToHorizontal } from '../../src/lib/sky/stars';
import { windowsBodySchema, windowsResponse } from '../../src/lib/server/sky-api';
import { WINDOWS_BODY } from './windows-body';

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};
const dAz = (a: number, b: number) => Math.abs(((a - b + 540) % 360) - 180);

// ---------- (a) batched transform ----------
const cat = loadCatalogue();
const site = { latDeg: 51.4769, lonDeg: 0, heightM: 0 };
const date = new Date('2024-01-15T22:00:00Z');
const alt = new Float64Array(cat.count), az = new Float64Array(cat.count);
const RUNS_A = 25;

// The frame (≈ 50 µs) is computed once per instant and shared by everything drawn at that instant;
// it is timed separately and the batched figure below includes it.
const frameTimes: number[] = [];
let f = skyFrame(site, date);
for (let i = 0; i < 200; i++) skyFrame(site, date); // warm-up
for (let i = 0; i < RUNS_A; i++) {
  const t0 = performance.now();
  f = skyFrame(site, date);
  frameTimes.push(performance.now() - t0);
}
for (let i = 0; i < 50; i++) starsToHorizontal(cat, f, alt, az, { refraction: 'none' }); // warm-up (JIT)
const batchTimes: number[] = [];
for (let i = 0; i < RUNS_A; i++) {
  const t0 = performance.now();
  const fr = skyFrame(site, date);
  starsToHorizontal(cat, fr, alt, az, { refraction: 'none' });
  batchTimes.push(performance.now() - t0);
}
const batchRefrTimes: number[] = [];
for (let i = 0; i < RUNS_A; i++) {
  const t0 = performance.now();
  starsToHorizontal(cat, f, alt, az, { refraction: 'standard' });
  batchRefrTimes.push(performance.now() - t0);
}
starsToHorizontal(cat, f, alt, az, { refraction: 'none' });

const obs = new Astronomy.Observer(site.latDeg, site.lonDeg, site.heightM);
const aeAlt = new Float64Array(cat.count), aeAz = new Float64Array(cat.count);
const chainOnce = () => {
  const time = Astronomy.MakeTime(date);
  for (let i = 0; i < cat.count; i++) {
    Astronomy.DefineStar(Astronomy.Body.Star1, cat.raDeg[i] / 15, cat.decDeg[i], 1000);
    const eq = Astronomy.Equator(Astronomy.Body.Star1, time, obs, true, true);
    const h = Astronomy.Horizon(time, obs, eq.ra, eq.dec);
    aeAlt[i] = h.altitude;
    aeAz[i] = h.azimuth;
  }
};
chainOnce(); chainOnce(); // warm-up
const chainTimes: number[] = [];
for (let i = 0; i < RUNS_A; i++) {
  const t0 = performance.now();
  chainOnce();
  chainTimes.push(performance.now() - t0);
}
let devAe = 0, devOwn = 0;
for (let i = 0; i < cat.count; i++) {
  const c = Math.cos((alt[i] * Math.PI) / 180);
  devAe = Math.max(devAe, Math.abs(alt[i] - aeAlt[i]), dAz(az[i], aeAz[i]) * c);
  const p = observeIcrs(f, cat.raDeg[i], cat.decDeg[i], 'none');
  devOwn = Math.max(devOwn, Math.abs(alt[i] - p.altDeg), dAz(az[i], p.azDeg) * c);
}
const a = {
  stars: cat.count,
  runs: RUNS_A,
  frameMedianMs: median(frameTimes),
  batchedMedianMs: median(batchTimes),
  batchedRefractedMedianMs: median(batchRefrTimes),
  perStarAstronomyEngineMedianMs: median(chainTimes),
  speedup: median(chainTimes) / median(batchTimes),
  maxDeviationVsAstronomyEngineArcsec: devAe * 3600,
  maxDeviationVsOwnPerStarChainArcsec: devOwn * 3600,
  goal: 'batched ≤ 1 ms and ≥ 50× faster',
};

// ---------- (b) windows ----------
const body = WINDOWS_BODY;
const RUNS_B = 20;
for (let i = 0; i < 3; i++) windowsResponse(windowsBodySchema.parse(body)); // warm-up
const inProc: number[] = [];
let nWindows = 0;
for (let i = 0; i < RUNS_B; i++) {
  const t0 = performance.now();
  const r = windowsResponse(windowsBodySchema.parse(JSON.parse(JSON.stringify(body))));
  inProc.push(performance.now() - t0);
  nWindows = r.targets.reduce((n, t) => n + t.windows.length, 0);
}

let http: { medianMs: number; runs: number } | { skipped: string } = { skipped: 'server not started' };
try {
  const { startServer } = await import('../integration/helpers/server');
  const s = await startServer({ seed: false });
  try {
    const post = () => fetch(`${s.url}/api/sky/windows`, { method: 'POST', headers: { 'content-type': 'application/json', origin: s.url }, body: JSON.stringify(body) });
    const first = await post();
    if (first.status !== 200) http = { skipped: `HTTP ${first.status} (is the build current?)` };
    else {
      await first.text();
      for (let i = 0; i < 2; i++) await (await post()).text();
      const times: number[] = [];
      for (let i = 0; i < RUNS_B; i++) {
        const t0 = performance.now();
        const r = await post();
        await r.text();
        times.push(performance.now() - t0);
      }
      http = { medianMs: median(times), runs: RUNS_B };
    }
  } finally {
    await s.stop();
  }
} catch (e) {
  http = { skipped: `could not start the built server: ${(e as Error).message.split('\n')[0]}` };
}
const b = {
  targets: 200,
  spanHours: 12,
  windowsFound: nWindows,
  inProcessMedianMs: median(inProc),
  http,
  goal: '≤ 300 ms',
};

const rows: [string, string, string][] = [
  ['(a) frame for one instant (median)', `${a.frameMedianMs.toFixed(3)} ms`, ''],
  [`(a) batched, ${a.stars} stars incl. frame (median of ${RUNS_A})`, `${a.batchedMedianMs.toFixed(3)} ms`, 'goal ≤ 1 ms'],
  ['(a) batched with refraction, frame reused', `${a.batchedRefractedMedianMs.toFixed(3)} ms`, ''],
  [`(a) astronomy-engine chain per star (median of ${RUNS_A})`, `${a.perStarAstronomyEngineMedianMs.toFixed(1)} ms`, ''],
  ['(a) speed-up', `${a.speedup.toFixed(0)}×`, 'goal ≥ 50×'],
  ['(a) max deviation vs astronomy-engine chain', `${a.maxDeviationVsAstronomyEngineArcsec.toFixed(3)}″`, 'it omits deflection, diurnal aberration'],
  ['(a) max deviation vs own per-star chain', `${a.maxDeviationVsOwnPerStarChainArcsec.toExponential(2)}″`, 'goal < 1″'],
  [`(b) windows, 200 targets × 12 h, in process (median of ${RUNS_B})`, `${b.inProcessMedianMs.toFixed(1)} ms`, 'goal ≤ 300 ms'],
  ['(b) same through POST /api/sky/windows', 'medianMs' in http ? `${http.medianMs.toFixed(1)} ms` : `skipped: ${http.skipped}`, 'goal ≤ 300 ms'],
];
const w0 = Math.max(...rows.map((r) => r[0].length)), w1 = Math.max(...rows.map((r) => r[1].length));
console.log('\nSky engine benchmarks');
for (const [k, v, g] of rows) console.log(`${k.padEnd(w0)}  ${v.padStart(w1)}  ${g}`);

mkdirSync('tests/bench/results', { recursive: true });
writeFileSync('tests/bench/results/sky.json', JSON.stringify({ at: new Date().toISOString(), node: process.version, batched: a, windows: b }, null, 2) + '\n');
console.log('\nwrote tests/bench/results/sky.json');
