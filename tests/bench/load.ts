/**
 * `npm run load`: a bounded load test of the built server (dist/) on loopback, against a temp SQLite
 * file seeded with the demo. Three phases, 10 s each by default:
 *   1. a static asset of the same server (a built /_astro/*.css), 50 connections: the yardstick;
 *   2. the shared-scene read path, GET /api/shared/:token for a viewer link, 50 connections;
 *   3. 20 editors saving at once, each its own scene, PATCH /api/scenes/:id with its version
 *      (a 409 makes that editor re-read the scene and go on).
 * Goals: 0 errors, shared reads ≥ 50 % of the static rate, p99 ≤ 100 ms. Results go to
 * tests/bench/results/load.json (and so into `npm run bench`). Figures, not a test: the exit code is 0
 * when the run completed, whether or not the goals were met. `LOAD_SECONDS=5` shortens each phase.
 */
import { createRequire } from 'node:module';
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { cpus, totalmem } from 'node:os';
import { join } from 'node:path';
import { startServer } from '../integration/helpers/server';
import { ApiClient, DEMO } from '../integration/helpers/client';

interface CannonResult {
  requests: { average: number; total: number };
  latency: { p50: number; p99: number; average: number; max: number };
  errors: number;
  timeouts: number;
  non2xx: number;
  duration: number;
  statusCodeStats?: Record<string, { count: number }>;
}
type Cannon = (opts: Record<string, unknown>) => Promise<CannonResult>;
const autocannon = createRequire(import.meta.url)('autocannon') as Cannon;

const SECONDS = Number(process.env.LOAD_SECONDS ?? 10);
const READ_CONNECTIONS = 50;
const EDITORS = 20;
/** A save without an answer after this long counts as an error (keeps the phase bounded in time). */
const REQUEST_TIMEOUT_MS = 10_000;
const ACCEPT_ENCODING = process.env.LOAD_ACCEPT_ENCODING ?? 'gzip, deflate, br';
const GOALS = { errors: 0, sharedToStaticRatio: 0.5, p99Ms: 100 } as const;

export interface PhaseResult {
  what: string;
  connections: number;
  seconds: number;
  requestsPerSecond: number;
  requests: number;
  p50Ms: number;
  p99Ms: number;
  maxMs: number;
  errors: number;
  detail?: Record<string, number>;
  /** Server CPU time per request, ms (see cpuMs). */
  cpuMsPerRequest?: number | null;
}

function fromCannon(what: string, connections: number, r: CannonResult): PhaseResult {
  return {
    what,
    connections,
    seconds: r.duration,
    requestsPerSecond: Math.round(r.requests.average),
    requests: r.requests.total,
    p50Ms: r.latency.p50,
    p99Ms: r.latency.p99,
    maxMs: r.latency.max,
    errors: r.errors + r.timeouts + r.non2xx,
    detail: { connectionErrors: r.errors, timeouts: r.timeouts, non2xx: r.non2xx },
  };
}

/**
 * CPU time the server process has used, ms (Linux /proc; user + system, all threads): per request it
 * moves far less with the machine's load than latency does. null where /proc is missing.
 */
function cpuMs(pid: number | undefined): number | null {
  try {
    const f = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
    return ((Number(f[11]) + Number(f[12])) * 1000) / 100; // utime + stime, in clock ticks (USER_HZ = 100)
  } catch {
    return null;
  }
}

const perRequest = (c0: number | null, c1: number | null, n: number) => (c0 === null || c1 === null || !n ? null : Math.round(((c1 - c0) / n) * 100) / 100);

function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return 0;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

/** 20 editors, each in a loop for `seconds`: PATCH its own scene with the version it holds. */
async function editorsPhase(base: string, seconds: number, cpu: () => number | null = () => null): Promise<PhaseResult> {
  const editors: Array<{ c: ApiClient; sceneId: string; version: number }> = [];
  const stamp = Date.now().toString(36);
  for (let i = 0; i < EDITORS; i++) {
    const c = new ApiClient(base);
    const up = await c.post('/api/auth/sign-up', { email: `load-editor-${i}-${stamp}@load.example`, password: 'load-test-password', name: `Load editor ${i}` });
    if (up.status !== 201) throw new Error(`sign-up → ${up.status} ${JSON.stringify(up.data)}`);
    const teamId = up.data.teams?.[0]?.id ?? (await c.get('/api/me')).data.teams[0].id;
    const s = await c.post('/api/scenes', {
      teamId,
      title: `Load scene ${i}`,
      site: { name: 'Load site', lat: 40.5, lon: -3.7, height: 650, timeZone: 'Europe/Madrid' },
      time: '2026-03-20T19:30:00Z',
    });
    if (s.status !== 201) throw new Error(`POST /api/scenes → ${s.status} ${JSON.stringify(s.data)}`);
    editors.push({ c, sceneId: s.data.scene.id, version: s.data.scene.version });
  }
  // the writer's batches (group commit) before and after, from /api/health
  const writes = async () => (await new ApiClient(base).get('/api/health')).data.writes as { batches: number; jobs: number } | undefined;
  const w0 = await writes();
  const cpuStart = cpu();
  const latencies: number[] = [];
  let saves = 0;
  let conflicts = 0;
  let errors = 0;
  const statuses: Record<string, number> = {};
  const t0 = performance.now();
  const deadline = t0 + seconds * 1000;
  await Promise.all(
    editors.map(async (e, i) => {
      let n = 0;
      while (performance.now() < deadline) {
        const started = performance.now();
        try {
          const r = await Promise.race([
            e.c.patch(`/api/scenes/${e.sceneId}`, {
              version: e.version,
              title: `Load scene ${i}, save ${n++}`,
              camera: { mode: 'observer', azDeg: (n * 7) % 360, altDeg: 30, fovDeg: 90 },
            }),
            new Promise<never>((_, reject) => setTimeout(() => reject(new Error('timeout')), REQUEST_TIMEOUT_MS).unref()),
          ]);
          latencies.push(performance.now() - started);
          if (r.status === 200) {
            saves++;
            e.version = r.data.scene.version;
          } else if (r.status === 409) {
            conflicts++;
            const fresh = await e.c.get(`/api/scenes/${e.sceneId}`);
            if (fresh.status !== 200) errors++;
            else e.version = fresh.data.scene.version;
          } else {
            errors++;
            statuses[r.status] = (statuses[r.status] ?? 0) + 1;
          }
        } catch {
          // no answer within REQUEST_TIMEOUT_MS (or a connection error)
          errors++;
          statuses.timeout = (statuses.timeout ?? 0) + 1;
          latencies.push(performance.now() - started);
        }
      }
    }),
  );
  const elapsed = (performance.now() - t0) / 1000;
  const cpuEnd = cpu();
  const w1 = await writes();
  const batches = w0 && w1 ? w1.batches - w0.batches : 0;
  const jobsPerCommit = w0 && w1 && batches ? Math.round(((w1.jobs - w0.jobs) / batches) * 10) / 10 : 0;
  latencies.sort((x, y) => x - y);
  const round = (x: number) => Math.round(x * 10) / 10;
  return {
    what: 'PATCH /api/scenes/:id (20 editors, own scene each)',
    connections: EDITORS,
    seconds: round(elapsed),
    requestsPerSecond: Math.round(latencies.length / elapsed),
    requests: latencies.length,
    p50Ms: round(percentile(latencies, 50)),
    p99Ms: round(percentile(latencies, 99)),
    maxMs: round(latencies[latencies.length - 1] ?? 0),
    errors,
    detail: { saves, conflicts, commits: batches, jobsPerCommit, ...statuses },
    cpuMsPerRequest: perRequest(cpuStart, cpuEnd, latencies.length),
  };
}

export async function runLoad(): Promise<Record<string, unknown>> {
  const dist = process.env.ARMILLA_DIST ?? 'dist';
  if (!existsSync(`${dist}/server/armilla.mjs`)) throw new Error('no build: run `npx astro build` first');
  const css = readdirSync(`${dist}/client/_astro`).find((f) => f.endsWith('.css'));
  if (!css) throw new Error('no /_astro/*.css in dist/client');
  const staticPath = `/_astro/${css}`;

  // loopback only (startServer binds 127.0.0.1); a throwaway database seeded with the demo
  const server = await startServer();
  try {
    const editor = new ApiClient(server.url);
    await editor.signIn(DEMO.editor);
    const scenes = await editor.get('/api/scenes');
    const sceneId = scenes.data.scenes[0]?.id;
    if (!sceneId) throw new Error('no demo scene');
    const link = await editor.post(`/api/scenes/${sceneId}/links`, { role: 'viewer' });
    if (link.status !== 201) throw new Error(`POST links → ${link.status} ${JSON.stringify(link.data)}`);
    const sharedPath = `/api/shared/${link.data.token}`;
    const check = await new ApiClient(server.url).get(sharedPath);
    if (check.status !== 200) throw new Error(`GET ${sharedPath} → ${check.status}`);

    // Both read phases ask as a browser does (Accept-Encoding: br, gzip): the static asset goes out in its
    // brotli form made at build time, the shared scene in the brotli form kept beside its cached answer.
    const cannon = (path: string) =>
      autocannon({ url: server.url + path, connections: READ_CONNECTIONS, duration: SECONDS, timeout: 10, headers: { 'accept-encoding': ACCEPT_ENCODING } });
    // warm-up (JIT, SQLite page cache), not recorded
    await autocannon({ url: server.url + sharedPath, connections: 10, duration: 1, headers: { 'accept-encoding': ACCEPT_ENCODING } });
    const cpu = () => cpuMs(server.proc.pid);
    const measured = async (run: () => Promise<CannonResult>, what: string) => {
      const c0 = cpu();
      const r = fromCannon(what, READ_CONNECTIONS, await run());
      r.cpuMsPerRequest = perRequest(c0, cpu(), r.requests);
      return r;
    };
    const staticRes = await measured(() => cannon(staticPath), `GET ${staticPath} (static asset)`);
    const sharedRes = await measured(() => cannon(sharedPath), 'GET /api/shared/:token (viewer link)');
    const editorsRes = await editorsPhase(server.url, SECONDS, cpu);

    const ratio = Math.round((sharedRes.requestsPerSecond / Math.max(1, staticRes.requestsPerSecond)) * 100) / 100;
    const goals = {
      noErrors: staticRes.errors + sharedRes.errors + editorsRes.errors === GOALS.errors,
      sharedAtLeastHalfOfStatic: ratio >= GOALS.sharedToStaticRatio,
      sharedP99Within100ms: sharedRes.p99Ms <= GOALS.p99Ms,
      editorsP99Within100ms: editorsRes.p99Ms <= GOALS.p99Ms,
    };
    const result = {
      at: new Date().toISOString(),
      machine: { cpu: cpus()[0]?.model, cores: cpus().length, memoryGiB: Math.round(totalmem() / 2 ** 30), node: process.version },
      secondsPerPhase: SECONDS,
      phases: { static: staticRes, shared: sharedRes, editors: editorsRes },
      sharedToStaticRatio: ratio,
      goals,
      goalsMet: Object.values(goals).every(Boolean),
    };

    const rows = [staticRes, sharedRes, editorsRes];
    console.log('\n| phase | conns | req/s | p50 ms | p99 ms | errors | server CPU ms/req |');
    console.log('| --- | ---: | ---: | ---: | ---: | ---: | ---: |');
    for (const r of rows) console.log(`| ${r.what} | ${r.connections} | ${r.requestsPerSecond} | ${r.p50Ms} | ${r.p99Ms} | ${r.errors} | ${r.cpuMsPerRequest ?? '–'} |`);
    console.log(`\neditors: ${editorsRes.detail?.saves} saves, ${editorsRes.detail?.commits} commits (${editorsRes.detail?.jobsPerCommit} writes a commit)`);
    console.log(`\nshared / static = ${ratio} (goal ≥ ${GOALS.sharedToStaticRatio})`);
    for (const [k, v] of Object.entries(goals)) console.log(`${v ? 'met   ' : 'MISSED'} ${k}`);

    mkdirSync('tests/bench/results', { recursive: true });
    writeFileSync(join('tests/bench/results', 'load.json'), JSON.stringify(result, null, 2));
    console.log('\nwritten tests/bench/results/load.json');
    return result;
  } finally {
    await server.stop();
  }
}

const isMain = process.argv[1] && /bench[\\/]load\.ts$/.test(process.argv[1]);
if (isMain) {
  runLoad().catch((e) => {
    console.error(e);
    process.exit(1);
  });
}
