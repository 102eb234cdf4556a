// `npm run bench -- night`: the night charts' numbers. Prints a table and writes tests/bench/results/night.json.
// Medians; nothing here passes or fails on speed.
//
// (a) nightData for 50 targets over a night at 5-minute steps, in process (what the compute job runs)
// (b) the same through GET /api/scenes/:id/night of the built server (sign-in, compute pool, JSON)
// (c) visibility windows for 1,000 targets over 24 h with the full envelope (sun/moon avoidance, mask,
//     azimuth ranges, keyhole, hour-angle and declination limits), in process, windows API grid step
// (d) drawing the altitude chart for 50 targets in the browser (headless Chromium, render to commit of
//     the chart component, `night-chart` performance entries), and the same render on the server (SVG)
import { mkdirSync, writeFileSync } from 'node:fs';
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { nightData, sceneNight } from '../../src/lib/sky/night';
import { visibilityWindows } from '../../src/lib/sky/windows';
import { windowsGridStepSec as windowsStepSec } from '../../src/lib/sky/night';
import { AltitudeChart } from '../../src/components/night/AltitudeChart';

/** Wall and CPU time (user + system) of f, ms: on the shared machine the CPU figure is the steadier one. */
function timed(f: () => void): { wall: number; cpu: number } {
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  f();
  const c = process.cpuUsage(c0);
  return { wall: performance.now() - t0, cpu: (c.user + c.system) / 1000 };
}
const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};
const rand = (() => {
  let a = 12345;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
})();
const SITE = { name: 'Bench site', lat: 37.2, lon: -3.6, height: 2800, timeZone: 'Europe/Madrid' };
const SITE_IN = { latDeg: 37.2, lonDeg: -3.6, heightM: 2800 };
const TIME = '2026-03-20T22:00:00Z';
const ENVELOPE = {
  name: 'Bench mount', minAltitude: 20, maxAltitude: 85, keyholeRadius: 4, sunAvoidance: 40, moonAvoidance: 15, azimuthRanges: [[20, 340]] as [number, number][],
  horizonMask: Array.from({ length: 72 }, (_, i) => [i * 5, 8 + 6 * Math.sin(i / 4)] as [number, number]), hourAngleLimits: [-5, 5] as [number, number], declinationLimits: [-35, 80] as [number, number],
};
const targets = (n: number) => Array.from({ length: n }, (_, i) => ({ name: `T${i + 1}`, raDeg: rand() * 360, decDeg: Math.asin(rand() * 1.6 - 0.7) * (180 / Math.PI) }));

// ---------- (a) ----------
const night = sceneNight(SITE, new Date(TIME));
const t50 = targets(50);
const input = { site: SITE, envelope: ENVELOPE, targets: t50, from: night.from, to: night.to, stepMin: 5 };
for (let i = 0; i < 3; i++) nightData(input);
const aTimes: number[] = [], aCpu: number[] = [];
for (let i = 0; i < 9; i++) {
  const r = timed(() => nightData(input));
  aTimes.push(r.wall);
  aCpu.push(r.cpu);
}
const data = nightData(input);
const a = { targets: 50, spanHours: (night.to - night.from) / 3600000, stepMin: 5, samplesPerTarget: data.targets[0].samples.length, inProcessMedianMs: median(aTimes), inProcessCpuMedianMs: median(aCpu), goal: '≤ 100 ms' };

// ---------- (c) ----------
const t1000 = targets(1000);
const from24 = new Date('2026-03-20T12:00:00Z'), to24 = new Date('2026-03-21T12:00:00Z');
const stepSec = windowsStepSec(86400000, 1000);
visibilityWindows(SITE_IN, ENVELOPE, t1000, from24, to24, { stepSec });
const cTimes: number[] = [], cCpu: number[] = [];
let nWin = 0;
for (let i = 0; i < 5; i++) {
  const r = timed(() => {
    nWin = visibilityWindows(SITE_IN, ENVELOPE, t1000, from24, to24, { stepSec }).reduce((s, x) => s + x.windows.length, 0);
  });
  cTimes.push(r.wall);
  cCpu.push(r.cpu);
}
const c = { targets: 1000, spanHours: 24, gridStepSec: stepSec, windowsFound: nWin, inProcessMedianMs: median(cTimes), inProcessCpuMedianMs: median(cCpu), goal: '≤ 300 ms' };

// ---------- (d, server side) ----------
const svgTimes: number[] = [], svgCpu: number[] = [];
for (let i = 0; i < 7; i++) {
  const r = timed(() => renderToStaticMarkup(createElement(AltitudeChart, { data, timeZone: SITE.timeZone, ink: 'print', fixedSize: true, width: 960, height: 440, cursor: Date.parse(TIME) })));
  svgTimes.push(r.wall);
  svgCpu.push(r.cpu);
}

// ---------- (b) and (d, browser) ----------
let http: { medianMs: number; runs: number } | { skipped: string } = { skipped: 'not run' };
let browser: { medianMs: number; draws: number } | { skipped: string } = { skipped: 'not run' };
try {
  const { startServer } = await import('../integration/helpers/server');
  const { ApiClient, DEMO } = await import('../integration/helpers/client');
  const s = await startServer();
  try {
    const c1 = new ApiClient(s.url);
    await c1.signIn(DEMO.editor);
    const me = await c1.get('/api/me');
    const teamId = me.data.teams.find((t: { name: string }) => t.name === 'Larkspur Ridge Observatory').id;
    const created = await c1.post('/api/scenes', {
      teamId, title: 'Night bench', site: SITE, time: TIME, envelope: ENVELOPE,
      targets: t50.map((t, i) => ({ id: `t${i + 1}`, kind: 'custom', name: t.name, ra: t.raDeg, dec: t.decDeg })),
    });
    const id = created.data.scene.id;
    for (let i = 0; i < 2; i++) await c1.get(`/api/scenes/${id}/night`);
    const times: number[] = [];
    for (let i = 0; i < 9; i++) {
      const t0 = performance.now();
      const r = await c1.get(`/api/scenes/${id}/night`);
      if (r.status !== 200) throw new Error(`night answered ${r.status}`);
      times.push(performance.now() - t0);
    }
    http = { medianMs: median(times), runs: times.length };

    try {
      const { chromium } = await import('playwright-core');
      const b = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--no-sandbox', '--use-gl=angle', '--use-angle=swiftshader', '--enable-unsafe-swiftshader'] });
      try {
        const context = await b.newContext({ baseURL: s.url, viewport: { width: 1440, height: 900 } });
        const page = await context.newPage();
        await context.request.post('/api/auth/sign-in', { data: { email: DEMO.editor, password: DEMO.password } });
        await page.goto(`/scenes/${id}`);
        // The night charts sit in the workspace's bottom sheet, closed until asked for.
        await page.getByTestId('sheet-toggle').click();
        await page.locator('[data-testid=altitude-chart] g.night-curve').first().waitFor({ timeout: 120_000 });
        // redraws: highlight each of the first 12 rows (each hover re-renders the chart with 50 curves)
        const rows = page.locator('[data-testid=night-figures] tbody tr');
        for (let i = 0; i < 12; i++) await rows.nth(i).hover();
        await page.mouse.move(0, 0);
        const entries = await page.evaluate(() => performance.getEntriesByName('night-chart').map((e) => e.duration));
        const big = entries.slice(1); // the first draw may come before the data (no curves)
        browser = { medianMs: median(big), draws: big.length };
      } finally {
        await b.close();
      }
    } catch (e) {
      browser = { skipped: `browser: ${(e as Error).message.split('\n')[0]}` };
    }
  } finally {
    await s.stop();
  }
} catch (e) {
  http = { skipped: `could not start the built server: ${(e as Error).message.split('\n')[0]}` };
}

const d = { targets: 50, browser, serverSvgMedianMs: median(svgTimes), serverSvgCpuMedianMs: median(svgCpu), goal: '≤ 150 ms in the browser' };
const rows: [string, string, string][] = [
  [`(a) night data, 50 targets, ${a.spanHours.toFixed(1)} h at 5 min, in process (median of 9)`, `${a.inProcessMedianMs.toFixed(1)} ms (CPU ${a.inProcessCpuMedianMs.toFixed(1)} ms)`, 'goal ≤ 100 ms'],
  ['(b) same through GET /api/scenes/:id/night', 'medianMs' in http ? `${http.medianMs.toFixed(1)} ms` : `skipped: ${http.skipped}`, 'goal ≤ 100 ms'],
  [`(c) windows, 1,000 targets × 24 h, full envelope, in process (median of 5)`, `${c.inProcessMedianMs.toFixed(1)} ms (CPU ${c.inProcessCpuMedianMs.toFixed(1)} ms)`, 'goal ≤ 300 ms'],
  ['(d) altitude chart, 50 targets, drawn in Chromium (render to commit, median)', 'medianMs' in browser ? `${browser.medianMs.toFixed(1)} ms` : `skipped: ${browser.skipped}`, 'goal ≤ 150 ms'],
  ['(d) same chart rendered to SVG on the server (median of 7)', `${d.serverSvgMedianMs.toFixed(1)} ms (CPU ${d.serverSvgCpuMedianMs.toFixed(1)} ms)`, ''],
];
const w0 = Math.max(...rows.map((r) => r[0].length)), w1 = Math.max(...rows.map((r) => r[1].length));
console.log('\nNight benchmarks');
for (const [k, v, g] of rows) console.log(`${k.padEnd(w0)}  ${v.padStart(w1)}  ${g}`);
mkdirSync('tests/bench/results', { recursive: true });
writeFileSync('tests/bench/results/night.json', JSON.stringify({ at: new Date().toISOString(), node: process.version, loadAverage: (await import('node:os')).loadavg(), nightData: a, nightApi: http, windows1000: c, chart: d }, null, 2) + '\n');
console.log('\nwrote tests/bench/results/night.json');
