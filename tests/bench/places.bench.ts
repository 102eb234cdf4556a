// `npm run bench -- places`: place search and time-zone lookup. Prints a table and writes
// tests/bench/results/places.json. Figures, not a test.
//
// (a) in this process: gazetteer load + index time and the heap it keeps (after a full GC); zone lookup
//     per call over 20,000 town coordinates, warm (shapes cached) and cold (first touch of a quadtree
//     cell, read from disk), and the shape cache's estimated size afterwards.
// (b) through the built server: GET /api/places at 20 concurrent connections for BENCH_SECONDS (default
//     10) over queries drawn from the whole gazetteer (1–6 leading characters of random town names);
//     latency p50/p95/p99 and the server process's resident memory before and after the gazetteer loads.
//     Requests come from 200 client addresses in turn (X-Forwarded-For with TRUST_PROXY=1) so that the
//     per-address rate limit (600 a minute) measures users, not one; the load generator is autocannon.
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { gazetteer } from '../../src/lib/server/places/gazetteer';
import { zoneAt, zoneCacheBytes } from '../../src/lib/server/places/zone';
import { startServer } from '../integration/helpers/server';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const autocannon = createRequire(import.meta.url)('autocannon') as (o: Record<string, unknown>) => any;

setFlagsFromString('--expose-gc');
const gc = runInNewContext('gc') as () => void;
const MB = 1024 * 1024;
const quantile = (xs: number[], q: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor(q * s.length))]!;
};
const round = (x: number, d = 2) => Math.round(x * 10 ** d) / 10 ** d;

// ---------- (a) in process ----------
gc();
const heap0 = process.memoryUsage().heapUsed;
const t0 = performance.now();
const g = gazetteer();
const loadMs = performance.now() - t0;
gc();
gc();
const gazetteerHeapMB = (process.memoryUsage().heapUsed - heap0) / MB;

// towns to look up: every 7th of a sample of searches over the alphabet
const towns: Array<{ name: string; lat: number; lon: number }> = [];
for (const a of 'abcdefghijklmnopqrstuvwyz') for (const b of 'aeiou') for (const p of g.search(a + b, 50)) towns.push(p);
let seed = 7;
const rnd = () => ((seed = (seed * 16807) % 2147483647) / 2147483647);
const pickTown = () => towns[Math.floor(rnd() * towns.length)]!;

const cold: number[] = [];
const warm: number[] = [];
const N_ZONE = 20_000;
const points = Array.from({ length: N_ZONE }, pickTown);
for (const p of points) {
  const t = performance.now();
  zoneAt(p.lat, p.lon);
  cold.push(performance.now() - t);
}
for (const p of points) {
  const t = performance.now();
  zoneAt(p.lat, p.lon);
  warm.push(performance.now() - t);
}
const zoneCacheMB = zoneCacheBytes() / MB;

// ---------- (b) over HTTP ----------
const SECONDS = Number(process.env.BENCH_SECONDS ?? 10);
const CONNECTIONS = 20;
const s = await startServer({ seed: false, env: { TRUST_PROXY: '1' } });
const rssMB = () => {
  const status = readFileSync(`/proc/${s.proc.pid}/status`, 'utf8');
  return Number(/VmRSS:\s+(\d+)/.exec(status)![1]) / 1024;
};
let http: Record<string, number> = {};
try {
  await fetch(`${s.url}/api/health`).then((r) => r.text());
  const rssBefore = rssMB();
  const first = performance.now();
  await fetch(`${s.url}/api/places?q=a&limit=1`, { headers: { 'x-forwarded-for': '198.51.100.250' } }).then((r) => r.text());
  const firstMs = performance.now() - first;
  await new Promise((r) => setTimeout(r, 500));
  const rssAfter = rssMB();

  const queries = Array.from({ length: 5000 }, () => {
    const n = pickTown().name;
    return n.slice(0, 1 + Math.floor(rnd() * Math.min(6, n.length)));
  });
  // autocannon (the load generator of `npm run load`) rather than fetch() in a loop: undici's fetch
  // costs this process more CPU per request than the server spends answering, on the same 2 cores.
  const lat: number[] = [];
  const status = new Map<number, number>();
  let qi = 0;
  const instance = autocannon({
    url: s.url,
    connections: CONNECTIONS,
    duration: SECONDS,
    requests: [
      {
        setupRequest: (req: Record<string, unknown>) => {
          const i = qi++;
          return {
            ...req,
            method: 'GET',
            path: `/api/places?q=${encodeURIComponent(queries[i % queries.length]!)}&limit=10`,
            // 200 TEST-NET-2 addresses (RFC 5737: documentation only, never routed), one a request in
            // turn, so the per-address limit (600 a minute) meets users, not this bench.
            headers: { 'x-forwarded-for': `198.51.100.${(i % 200) + 1}`, 'accept-encoding': 'gzip, deflate, br' },
          };
        },
      },
    ],
  });
  instance.on('response', (_client: unknown, statusCode: number, _bytes: number, responseTime: number) => {
    lat.push(responseTime);
    status.set(statusCode, (status.get(statusCode) ?? 0) + 1);
  });
  await instance;
  http = {
    requests: lat.length,
    ok: status.get(200) ?? 0,
    rateLimited: status.get(429) ?? 0,
    p50Ms: round(quantile(lat, 0.5)),
    p95Ms: round(quantile(lat, 0.95)),
    p99Ms: round(quantile(lat, 0.99)),
    maxMs: round(Math.max(...lat)),
    firstRequestMs: round(firstMs),
    serverRssBeforeMB: round(rssBefore, 1),
    serverRssAfterMB: round(rssAfter, 1),
    serverRssDeltaMB: round(rssAfter - rssBefore, 1),
  };
} finally {
  await s.stop();
}

const result = {
  at: new Date().toISOString(),
  gazetteer: { towns: g.size, loadMs: round(loadMs, 0), heapMB: round(gazetteerHeapMB, 1) },
  zone: {
    lookups: N_ZONE,
    coldMedianMs: round(quantile(cold, 0.5), 4),
    coldP95Ms: round(quantile(cold, 0.95), 3),
    coldMaxMs: round(Math.max(...cold), 1),
    warmMedianMs: round(quantile(warm, 0.5), 4),
    warmP95Ms: round(quantile(warm, 0.95), 4),
    warmP99Ms: round(quantile(warm, 0.99), 4),
    shapeCacheMB: round(zoneCacheMB, 1),
  },
  http: { connections: CONNECTIONS, seconds: SECONDS, client: 'autocannon', ...http },
  goals: { searchP95Ms: 30, gazetteerMB: 60, zoneMs: 1 },
};
console.table({
  'gazetteer towns': g.size,
  'gazetteer load + index (ms)': result.gazetteer.loadMs,
  'gazetteer heap kept (MB)': result.gazetteer.heapMB,
  'server RSS before → after first search (MB)': `${http.serverRssBeforeMB} → ${http.serverRssAfterMB}`,
  'zone lookup warm median / p95 / p99 (ms)': `${result.zone.warmMedianMs} / ${result.zone.warmP95Ms} / ${result.zone.warmP99Ms}`,
  'zone lookup cold median / p95 / max (ms)': `${result.zone.coldMedianMs} / ${result.zone.coldP95Ms} / ${result.zone.coldMaxMs}`,
  'zone shape cache (MB, estimate)': result.zone.shapeCacheMB,
  'GET /api/places, 20 connections: requests (200 / 429)': `${http.requests} (${http.ok} / ${http.rateLimited})`,
  'GET /api/places p50 / p95 / p99 (ms)': `${http.p50Ms} / ${http.p95Ms} / ${http.p99Ms}`,
});
mkdirSync('tests/bench/results', { recursive: true });
writeFileSync('tests/bench/results/places.json', JSON.stringify(result, null, 2));
