/**
 * Throughput of the compute API with the worker pool against the same work on the event loop (issue 17,
 * "figures to report"). Run by `npm run bench` or `npm run bench -- compute`; uses the built app in dist/
 * (ARMILLA_DIST for another build). Writes tests/bench/results/compute.json.
 *
 * The built server is started twice on its own database: with the pool as configured by default
 * (`COMPUTE_THREADS` unset: cores − 1, at least 1) and with `COMPUTE_THREADS=0` (jobs run in the request's
 * own event loop, as before the pool). At each concurrency, that many clients post
 * `POST /api/sky/windows` back to back for a fixed time, while one more client polls `GET /api/health`
 * every 20 ms. Each request comes from its own client address (`TRUST_PROXY=loopback` and a fresh
 * `X-Forwarded-For`), as many users would, so the per-address limits (60 a minute, one at a time) do not
 * bite; the pool's queue limit (503 `busy`) does, and is counted.
 *
 * Reported per mode and concurrency: answered requests a second (200 only), p50 and p99 latency of those,
 * other statuses (a client refused with 503 waits its `Retry-After`, at most 2 s), the worst and p99
 * `/api/health` latency during the run, and the machine's load average when the run started.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import { execSync } from 'node:child_process';
import { resolve } from 'node:path';
import { startServer, type TestServer } from '../integration/helpers/server';
import { WINDOWS_BODY } from './windows-body';

const dist = resolve(process.env.ARMILLA_DIST ?? 'dist');
const SECONDS = Number(process.env.COMPUTE_BENCH_SECONDS ?? 8);
const CONCURRENCY = (process.env.COMPUTE_BENCH_CONCURRENCY ?? '1,4,16').split(',').map(Number);
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const pct = (xs: number[], p: number) => {
  if (!xs.length) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor((p / 100) * s.length))]!;
};
const r1 = (x: number) => Math.round(x * 10) / 10;

/**
 * A realistic request: an observatory's evening list of 200 targets over 12 h against a full envelope
 * (altitude band, two azimuth ranges, keyhole, Sun and Moon avoidance, a horizon mask, hour-angle and
 * declination limits) — the same body as `sky.bench.ts` (b). Site: an invented observatory.
 */
const BODY = JSON.stringify(WINDOWS_BODY);

let addrSeq = 0;
/** A fresh private address (RFC 1918, 10.0.0.0/8) for every request. */
const nextAddress = () => {
  const n = addrSeq++;
  return `10.${(n >> 16) & 255}.${(n >> 8) & 255}.${n & 255}`;
};

interface Run {
  mode: string;
  threads: number;
  concurrency: number;
  seconds: number;
  ok: number;
  statuses: Record<string, number>;
  reqPerSec: number;
  p50Ms: number;
  p99Ms: number;
  healthWorstMs: number;
  healthP99Ms: number;
  healthProbes: number;
  loadavg1AtStart: number;
}

async function post(s: TestServer): Promise<{ status: number; ms: number; retryAfter: number }> {
  const t0 = performance.now();
  const r = await fetch(`${s.url}/api/sky/windows`, { method: 'POST', headers: { 'content-type': 'application/json', 'x-forwarded-for': nextAddress() }, body: BODY });
  await r.arrayBuffer();
  return { status: r.status, ms: performance.now() - t0, retryAfter: Number(r.headers.get('retry-after') ?? 0) };
}

async function drive(s: TestServer, mode: string, threads: number, concurrency: number): Promise<Run> {
  const until = performance.now() + SECONDS * 1000;
  const lat: number[] = [];
  const statuses: Record<string, number> = {};
  const health: number[] = [];
  let stop = false;
  const probe = (async () => {
    while (!stop) {
      const t0 = performance.now();
      const r = await fetch(`${s.url}/api/health`);
      await r.arrayBuffer();
      health.push(performance.now() - t0);
      await sleep(20);
    }
  })();
  const load1 = loadavg()[0]!;
  const t0 = performance.now();
  await Promise.all(
    Array.from({ length: concurrency }, async () => {
      while (performance.now() < until) {
        const { status, ms, retryAfter } = await post(s);
        statuses[status] = (statuses[status] ?? 0) + 1;
        if (status === 200) lat.push(ms);
        // A refused request (503 busy): wait as a client honouring Retry-After would (at most 2 s, so the run ends).
        else await sleep(Math.min(2000, Math.max(50, retryAfter * 1000)));
      }
    }),
  );
  const seconds = (performance.now() - t0) / 1000;
  stop = true;
  await probe;
  return {
    mode,
    threads,
    concurrency,
    seconds: r1(seconds),
    ok: lat.length,
    statuses,
    reqPerSec: r1(lat.length / seconds),
    p50Ms: Math.round(pct(lat, 50)),
    p99Ms: Math.round(pct(lat, 99)),
    healthWorstMs: Math.round(Math.max(...health)),
    healthP99Ms: Math.round(pct(health, 99)),
    healthProbes: health.length,
    loadavg1AtStart: r1(load1),
  };
}

const uptime = () => {
  try {
    return execSync('uptime').toString().trim();
  } catch {
    return `load average ${loadavg().map((x) => x.toFixed(2)).join(', ')}`;
  }
};
const uptimeAtStart = uptime();
const runs: Run[] = [];
for (const [mode, env] of [
  ['worker pool', {}],
  ['in-process (COMPUTE_THREADS=0)', { COMPUTE_THREADS: '0' }],
] as const) {
  const s = await startServer({ seed: false, env: { ARMILLA_DIST: dist, TRUST_PROXY: 'loopback', ...env } });
  try {
    for (let i = 0; i < 10; i++) {
      const w = await post(s);
      if (w.status !== 200) throw new Error(`warm-up: HTTP ${w.status} (is the build current?)`);
    }
    const stats = (await (await fetch(`${s.url}/api/health`)).json()) as { compute: { mode: string; threads: number } };
    for (const c of CONCURRENCY) {
      const run = await drive(s, `${mode} [${stats.compute.mode}]`, stats.compute.threads, c);
      runs.push(run);
      console.log(`${run.mode.padEnd(44)} c=${String(c).padStart(2)}  ${String(run.reqPerSec).padStart(6)} req/s  p50 ${run.p50Ms} ms  p99 ${run.p99Ms} ms  health worst ${run.healthWorstMs} ms  ${JSON.stringify(run.statuses)}`);
    }
  } finally {
    await s.stop();
  }
}

const result = {
  date: new Date().toISOString(),
  machine: { cpus: cpus().length, uptimeAtStart, uptimeAtEnd: uptime(), note: 'shared 2-core machine; other people build and test on it' },
  request: 'POST /api/sky/windows, 200 targets × 12 h, full envelope (sky.bench.ts (b)); a fresh client address per request',
  secondsPerRun: SECONDS,
  runs,
};
console.log(`\nCompute API: worker pool vs in-process (start: ${uptimeAtStart}; end: ${result.machine.uptimeAtEnd})`);
console.log('| mode | clients | answered/s | p50 | p99 | other statuses | worst /api/health (p99) | load at start |');
console.log('| --- | --- | --- | --- | --- | --- | --- | --- |');
for (const r of runs) {
  const other = Object.entries(r.statuses).filter(([k]) => k !== '200').map(([k, v]) => `${v}×${k}`).join(', ') || '—';
  console.log(`| ${r.mode} | ${r.concurrency} | ${r.reqPerSec} | ${r.p50Ms} ms | ${r.p99Ms} ms | ${other} | ${r.healthWorstMs} ms (${r.healthP99Ms} ms) | ${r.loadavg1AtStart} |`);
}
mkdirSync('tests/bench/results', { recursive: true });
writeFileSync('tests/bench/results/compute.json', JSON.stringify(result, null, 2) + '\n');
console.log('written tests/bench/results/compute.json');
