#!/usr/bin/env node
/**
 * Benchmark of the sphere view (standalone): headless Chromium with SwiftShader (software WebGL, no GPU).
 *  1. time to first frame of /sky after navigation (goal ≤ 2 s), median of 3 fresh pages;
 *  2. frames per second while time plays, all layers on, Observer and Sphere view (goal ≥ 30 fps), counted
 *     with requestAnimationFrame-driven renders exposed on window.__armillaStats: the canvas alone at
 *     1280×720, and whole /sky pages at 1440×900 and 1920×1080 (the sky-filling layout's canvas); plus the
 *     Observer view with the flat background of before the sky dome (`?sky=flat`), for before/after.
 * Both are measured in two browser set-ups, each WebGL on SwiftShader:
 *  - "no-GPU browser": the page composited in software (--disable-gpu-compositing). This is what Chrome
 *    does on a machine without a usable GPU: WebGL falls back to SwiftShader and the display compositor
 *    works on the CPU. The goals are judged here.
 *  - "all on SwiftShader": headless Chromium's default with --use-angle=swiftshader, where SwiftShader
 *    also composites the page and rasterises 2D canvases on one GPU thread (a testing set-up). Reported.
 * Prints a table and writes tests/bench/results/view.json. Uses the built app in dist/ (builds it when
 * missing; ARMILLA_BENCH_DIST=/path/to/dist to use another build). Usage: node tests/bench/view-fps.mjs
 */
import { spawn, execSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir, cpus, loadavg } from 'node:os';
import { join, resolve } from 'node:path';
import { chromium } from 'playwright-core';

const CHROMIUM = '/usr/bin/chromium';
const EXTRA = (process.env.ARMILLA_BENCH_CHROMIUM_ARGS ?? '').split(' ').filter(Boolean);
const QUERY = process.env.ARMILLA_BENCH_QUERY ? `&${process.env.ARMILLA_BENCH_QUERY}` : '';
const ARGS = [...EXTRA, '--use-gl=angle', '--use-angle=swiftshader', '--enable-unsafe-swiftshader', '--no-sandbox', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'];
const TIME = '2026-03-21T04:00:00Z';
const PLAY_S = 5;
// `ARMILLA_BENCH_SIZES=1440x900,1920x1080` to measure a subset; 1280x720 pins the canvas alone, larger
// sizes are whole pages at that viewport.
const SIZES = (process.env.ARMILLA_BENCH_SIZES ?? '1280x720,1440x900,1920x1080').split(',').map((x) => {
  const [width, height] = x.split('x').map(Number);
  return { width, height, page: !(width === 1280 && height === 720) };
});

const dist = resolve(process.env.ARMILLA_BENCH_DIST ?? 'dist');
if (!existsSync(join(dist, 'server/armilla.mjs'))) {
  console.log('building the app…');
  execSync('npx astro build', { stdio: 'inherit' });
}

const freePort = () =>
  new Promise((res, rej) => {
    const s = createServer();
    s.on('error', rej);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address();
      s.close(() => res(port));
    });
  });

const port = await freePort();
const dir = mkdtempSync(join(tmpdir(), 'armilla-bench-view-'));
const url = `http://127.0.0.1:${port}`;
const server = spawn(process.execPath, [join(dist, 'server/armilla.mjs')], {
  env: { ...process.env, HOST: '127.0.0.1', PORT: String(port), DATABASE_URL: `file:${join(dir, 'bench.db')}`, PUBLIC_ORIGIN: url },
  stdio: 'ignore',
});
const stop = () => {
  if (server.exitCode === null) server.kill();
  rmSync(dir, { recursive: true, force: true });
};

async function waitUp() {
  const deadline = Date.now() + 30_000;
  while (Date.now() < deadline) {
    try {
      const r = await fetch(`${url}/sky?time=${TIME}`);
      if (r.ok) return;
    } catch {
      /* not yet */
    }
    await new Promise((r) => setTimeout(r, 150));
  }
  throw new Error('server did not start');
}

const median = (xs) => (xs.length ? [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)] : null);

/** Plays time for PLAY_S seconds in each view at one size; returns fps and the per-frame split. */
async function playAt(browser, size, extraQuery, views = ['observer', 'sphere', 'baseline']) {
  const page = await browser.newPage({ viewport: { width: size.width, height: size.height } });
  const errors = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto(`${url}/sky?time=${TIME}&plan=1${QUERY}${extraQuery}`);
  await page.waitForFunction(() => (window.__armillaStats?.frames ?? 0) >= 1, null, { timeout: 60_000 });
  await page.waitForTimeout(1000);
  await page.evaluate(() => document.querySelectorAll('[data-layer]').forEach((el) => !el.checked && el.click()));
  if (!size.page) {
    await page.evaluate(({ w, h }) => {
      const el = document.querySelector('[data-testid=sky-canvas]');
      Object.assign(el.style, { position: 'fixed', left: '0', top: '0', width: `${w}px`, height: `${h}px`, zIndex: '50' });
    }, { w: size.width, h: size.height });
    await page.waitForFunction((w) => document.querySelector('[data-testid=sky-canvas] canvas')?.clientWidth >= w - 2, size.width, { timeout: 10_000 }).catch(() => {});
  }
  await page.selectOption('[data-testid=rate]', '3600');
  await page.waitForTimeout(500);
  const canvas = await page.evaluate(() => {
    const c = document.querySelector('[data-testid=sky-canvas] canvas');
    // CSS size on the page; under a software renderer the WebGL backing store is smaller (see SkyCanvas.tsx).
    return `${c.clientWidth}×${c.clientHeight} CSS px (WebGL backing store ${c.width}×${c.height})`;
  });
  const renderer = await page.evaluate(() => {
    const g = document.createElement('canvas').getContext('webgl');
    const ext = g?.getExtension('WEBGL_debug_renderer_info');
    return g && ext ? String(g.getParameter(ext.UNMASKED_RENDERER_WEBGL)) : 'unknown';
  });
  const runs = [];
  for (const view of views) {
    if (view === 'baseline') {
      // Environment floor: the same canvas with every layer off (what the machine gives an almost empty scene).
      await page.evaluate(() => document.querySelectorAll('[data-layer]').forEach((el) => el.checked && el.click()));
      await page.waitForTimeout(300);
    }
    if (view === 'sphere') {
      await page.evaluate(() => document.querySelector('[data-testid=mode-sphere]').click());
      await page.waitForTimeout(2500);
    }
    await page.evaluate(() => document.querySelector('[data-testid=play]').click());
    await page.waitForTimeout(800);
    const a = await page.evaluate(() => ({ ...window.__armillaStats, t: performance.now() }));
    await page.waitForTimeout(PLAY_S * 1000);
    const b = await page.evaluate(() => ({ ...window.__armillaStats, t: performance.now() }));
    await page.evaluate(() => document.querySelector('[data-testid=play]').click());
    const n = b.frames - a.frames;
    const secs = (b.t - a.t) / 1000;
    runs.push({
      view,
      fps: n / secs,
      frames: n,
      seconds: secs,
      jsUpdateMsPerFrame: (b.updateMs - a.updateMs) / n,
      renderCallMsPerFrame: (b.renderMs - a.renderMs) / n,
      overlayMsPerFrame: (b.overlayMs - a.overlayMs) / n,
      goal: view === 'baseline' ? null : 30,
    });
    await page.waitForTimeout(300);
  }
  await page.close();
  return { size: `${size.width}×${size.height}${size.page ? ' page' : ' canvas'}`, sky: extraQuery ? 'flat (before)' : 'dome', canvas, webglRenderer: renderer, playing: runs, pageErrors: errors };
}

async function measure(setup) {
  const browser = await chromium.launch({ executablePath: CHROMIUM, headless: true, args: [...setup.args, ...ARGS] });
  try {
  // 1. Time to first frame.
  const ttff = [];
  for (let i = 0; i < (process.env.ARMILLA_BENCH_SKIP_TTFF ? 0 : 3); i++) {
    const ctx = await browser.newContext({ viewport: { width: 1280, height: 720 } });
    const page = await ctx.newPage();
    await page.goto(`${url}/sky?time=${TIME}`);
    await page.waitForFunction(() => window.__armillaStats?.firstFrameAt != null, null, { timeout: 60_000 });
    // performance.now() counts from the navigation start.
    ttff.push(await page.evaluate(() => window.__armillaStats.firstFrameAt));
    await ctx.close();
  }

  // 2. Frames per second while time plays, all layers on, at each size: 1280×720 is the canvas alone
  // pinned over the page (the figure of earlier rounds); the larger sizes are whole pages of /sky at that
  // viewport, the canvas as large as the page lays it out (sky-filling layout).
  const sizes = [];
  for (const size of SIZES) sizes.push(await playAt(browser, size, ''));
  // Before/after of the sky dome (sky-colour.ts): the Observer view with the flat background it replaced.
  const flat = [];
  if (!process.env.ARMILLA_BENCH_SKIP_FLAT) for (const size of SIZES.filter((x) => x.page)) flat.push(await playAt(browser, size, '&sky=flat', ['observer']));
  return { setup: setup.name, flags: setup.args, timeToFirstFrameMs: { runs: ttff, median: median(ttff), goal: 2000 }, sizes, flatSkyBefore: flat };
  } finally {
    await browser.close();
  }
}

const SETUPS = [
  { name: 'no-GPU browser (SwiftShader WebGL, software compositor)', args: ['--disable-gpu-compositing'] },
  { name: 'all on SwiftShader (headless default: WebGL, compositor and 2D canvas)', args: [] },
];

try {
  await waitUp();
  const setups = [];
  // `ARMILLA_BENCH_SETUPS=1` measures only the first set-up (the one the goals are judged on).
  for (const setup of SETUPS.slice(0, Number(process.env.ARMILLA_BENCH_SETUPS) || SETUPS.length)) setups.push(await measure(setup));

  const result = {
    date: new Date().toISOString(),
    machine: { cpus: cpus().length, loadavg1: loadavg()[0] },
    renderer: 'headless Chromium, SwiftShader (software WebGL)',
    goalsJudgedOn: SETUPS[0].name,
    setups,
  };
  const f1 = (x) => x.toFixed(1);
  console.log('\nSphere view benchmark (headless Chromium, WebGL on SwiftShader)');
  console.log(`machine: ${result.machine.cpus} cores, load ${f1(result.machine.loadavg1)}; WebGL renderer: ${setups[0].sizes[0]?.webglRenderer}`);
  console.log('| browser set-up | measure | value | goal |');
  console.log('| --- | --- | --- | --- |');
  for (const s of setups) {
    const who = s.setup.split(' (')[0];
    if (s.timeToFirstFrameMs.runs.length) console.log(`| ${who} | time to first frame of /sky (median of 3: ${s.timeToFirstFrameMs.runs.map(Math.round).join(', ')} ms) | ${Math.round(s.timeToFirstFrameMs.median)} ms | ≤ 2000 ms |`);
    for (const z of [...s.sizes, ...s.flatSkyBefore]) {
      for (const r of z.playing) {
        const what = r.view === 'baseline' ? 'baseline: all layers off (environment floor)' : `${r.view} view, all layers${z.sky === 'dome' ? '' : ', flat background (before the sky dome)'}`;
        console.log(`| ${who} | ${z.size} (canvas ${z.canvas.split(' (')[0]}): fps while time plays, ${what} | ${f1(r.fps)} fps (JS ${f1(r.jsUpdateMsPerFrame)} + render call ${f1(r.renderCallMsPerFrame)} + labels ${f1(r.overlayMsPerFrame)} ms/frame) | ${r.goal ? '≥ 30 fps' : '—'} |`);
      }
      if (z.pageErrors.length) console.log('page errors:', z.pageErrors);
    }
  }
  mkdirSync('tests/bench/results', { recursive: true });
  writeFileSync('tests/bench/results/view.json', JSON.stringify(result, null, 2) + '\n');
  console.log('written tests/bench/results/view.json');
} finally {
  stop();
}
