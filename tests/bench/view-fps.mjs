#!/usr/bin/env node
/**
 * Benchmark of the sphere view (standalone): headless Chromium with SwiftShader (software WebGL, no GPU).
 *  1. time to first frame of /sky after navigation (goal ≤ 2 s), median of 3 fresh pages;
 *  2. frames per second while time plays, canvas 1280×720, all layers on, Observer and Sphere view
 *     (goal ≥ 30 fps), counted with requestAnimationFrame-driven renders exposed on window.__armillaStats.
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

const dist = resolve(process.env.ARMILLA_BENCH_DIST ?? 'dist');
if (!existsSync(join(dist, 'server/entry.mjs'))) {
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
const server = spawn(process.execPath, [join(dist, 'server/entry.mjs')], {
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

  // 2. Frames per second while time plays, all layers on, canvas 1280×720.
  const page = await browser.newPage({ viewport: { width: 1280, height: 720 } });
  const errors = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto(`${url}/sky?time=${TIME}&plan=1${QUERY}`);
  await page.waitForFunction(() => (window.__armillaStats?.frames ?? 0) >= 1, null, { timeout: 60_000 });
  await page.waitForTimeout(1000);
  await page.evaluate(() => document.querySelectorAll('[data-layer]').forEach((el) => !el.checked && el.click()));
  await page.evaluate(() => {
    const el = document.querySelector('[data-testid=sky-canvas]');
    Object.assign(el.style, { position: 'fixed', left: '0', top: '0', width: '1280px', height: '720px', zIndex: '50' });
  });
  await page.selectOption('[data-testid=rate]', '3600');
  await page.waitForFunction(() => document.querySelector('[data-testid=sky-canvas] canvas')?.clientWidth >= 1278, null, { timeout: 10_000 }).catch(() => {});
  await page.waitForTimeout(500);
  const size = await page.evaluate(() => {
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
  for (const view of ['observer', 'sphere', 'baseline']) {
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
  return { setup: setup.name, flags: setup.args, webglRenderer: renderer, canvas: size, timeToFirstFrameMs: { runs: ttff, median: median(ttff), goal: 2000 }, playing: runs, pageErrors: errors };
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
  for (const setup of SETUPS) setups.push(await measure(setup));

  const result = {
    date: new Date().toISOString(),
    machine: { cpus: cpus().length, loadavg1: loadavg()[0] },
    renderer: 'headless Chromium, SwiftShader (software WebGL)',
    goalsJudgedOn: SETUPS[0].name,
    setups,
  };
  const f1 = (x) => x.toFixed(1);
  console.log('\nSphere view benchmark (headless Chromium, WebGL on SwiftShader)');
  console.log(`machine: ${result.machine.cpus} cores, load ${f1(result.machine.loadavg1)}; canvas ${setups[0].canvas}; WebGL renderer: ${setups[0].webglRenderer}`);
  console.log('| browser set-up | measure | value | goal |');
  console.log('| --- | --- | --- | --- |');
  for (const s of setups) {
    const who = s.setup.split(' (')[0];
    if (s.timeToFirstFrameMs.runs.length) console.log(`| ${who} | time to first frame of /sky (median of 3: ${s.timeToFirstFrameMs.runs.map(Math.round).join(', ')} ms) | ${Math.round(s.timeToFirstFrameMs.median)} ms | ≤ 2000 ms |`);
    for (const r of s.playing) {
      const what = r.view === 'baseline' ? 'baseline: all layers off (environment floor)' : `${r.view} view, all layers`;
      console.log(`| ${who} | fps while time plays, ${what} | ${f1(r.fps)} fps (JS ${f1(r.jsUpdateMsPerFrame)} + render call ${f1(r.renderCallMsPerFrame)} + labels ${f1(r.overlayMsPerFrame)} ms/frame) | ${r.goal ? '≥ 30 fps' : '—'} |`);
    }
    if (s.pageErrors.length) console.log('page errors:', s.pageErrors);
  }
  mkdirSync('tests/bench/results', { recursive: true });
  writeFileSync('tests/bench/results/view.json', JSON.stringify(result, null, 2) + '\n');
  console.log('written tests/bench/results/view.json');
} finally {
  stop();
}
