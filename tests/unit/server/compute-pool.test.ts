/**
 * The compute pool on real worker threads: the worker module is bundled into a temp folder the way the
 * build does it, then the pool's contract is checked — answers equal to the job run in this thread,
 * a job past its time budget ends in 422 and the thread is replaced, a full queue answers 503 with
 * Retry-After, and the event loop of this thread stays free while a worker computes.
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildComputeWorker } from '../../../src/lib/server/compute/build.mjs';
import { ComputePool, workerEntry, type ComputeConfig } from '../../../src/lib/server/compute';
import { runJob } from '../../../src/lib/server/compute/jobs';
import { HttpError } from '../../../src/lib/server/http';
import { windowsBodySchema } from '../../../src/lib/server/sky-api';

let dir = '';
let workerFile = '';
const pools: ComputePool[] = [];
const pool = (c: Partial<ComputeConfig>) => {
  const p = new ComputePool({ threads: 1, maxQueue: 4, queueWaitMs: 30_000, budgetMs: 30_000, memoryMb: 256, perCaller: 1, workerFile, ...c });
  pools.push(p);
  return p;
};

const body = (nTargets: number, days: number) =>
  windowsBodySchema.parse({
    site: { lat: 52.5, lon: 13.4, height: 40 },
    envelope: { minAltitude: 20 },
    targets: Array.from({ length: nTargets }, (_, i) => ({ name: `t${i}`, ra: (i * 7.3) % 360, dec: -30 + ((i * 3.1) % 110) })),
    from: '2026-03-20T00:00:00Z',
    to: new Date(Date.parse('2026-03-20T00:00:00Z') + days * 86400000).toISOString(),
  });

beforeAll(async () => {
  // Inside the repository, so the bundle's packages resolve from node_modules as they do in dist/.
  const cache = join(process.cwd(), 'node_modules', '.cache');
  mkdirSync(cache, { recursive: true });
  dir = mkdtempSync(join(cache, 'armilla-compute-'));
  workerFile = join(dir, 'compute-worker.mjs');
  await buildComputeWorker(workerFile);
}, 60_000);

afterAll(async () => {
  await Promise.all(pools.map((p) => p.close()));
  rmSync(dir, { recursive: true, force: true });
});

describe('compute pool (worker threads)', () => {
  it('answers what the job answers in this thread', async () => {
    const p = pool({});
    const input = body(3, 1);
    const out = await p.run('windows', input);
    expect(out).toEqual(runJob('windows', input));
    expect(out.targets).toHaveLength(3);
    expect(p.stats()).toMatchObject({ mode: 'workers', threads: 1, completed: 1, failed: 0 });
  }, 30_000);

  it('ends a job past its time budget with 422 and keeps serving', async () => {
    const p = pool({});
    const err = await p.run('windows', body(2000, 31), { budgetMs: 50 }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(HttpError);
    expect(err).toMatchObject({ status: 422, code: 'compute_budget' });
    expect(p.stats().overBudget).toBe(1);
    // The terminated thread is replaced: the next job runs.
    const out = await p.run('windows', body(1, 1));
    expect(out.targets).toHaveLength(1);
  }, 60_000);

  it('answers 503 with Retry-After when the queue is full, and keeps this event loop free', async () => {
    const p = pool({ maxQueue: 1, budgetMs: 400 });
    const heavy = body(2000, 31);
    const first = p.run('windows', heavy).catch((e: unknown) => e);
    const second = p.run('windows', heavy).catch((e: unknown) => e);
    const third = await p.run('windows', heavy).catch((e: unknown) => e);
    expect(third).toMatchObject({ status: 503, code: 'busy' });
    expect(Number((third as HttpError).headers?.['retry-after'])).toBeGreaterThanOrEqual(1);
    // While the worker computes, timers of this thread still fire (a blocked loop would delay this one by the job's length).
    const lag = await new Promise<number>((resolve) => {
      const t0 = performance.now();
      setTimeout(() => resolve(performance.now() - t0 - 20), 20);
    });
    expect(lag).toBeLessThan(300);
    expect(await first).toMatchObject({ status: 422 });
    expect(await second).toMatchObject({ status: 422 });
  }, 60_000);

  it('lets one caller have one job at a time (429), others still queue', async () => {
    const p = pool({ budgetMs: 300 });
    const heavy = body(2000, 31);
    const first = p.run('windows', heavy, { caller: 'addr:a' }).catch((e: unknown) => e);
    const again = await p.run('windows', heavy, { caller: 'addr:a' }).catch((e: unknown) => e);
    expect(again).toMatchObject({ status: 429, code: 'rate_limited' });
    const other = p.run('windows', body(1, 1), { caller: 'addr:b', budgetMs: 30_000 });
    expect(await first).toMatchObject({ status: 422 });
    expect((await other).targets).toHaveLength(1);
    // Once the first has ended, the caller may ask again.
    expect((await p.run('windows', body(1, 1), { caller: 'addr:a', budgetMs: 30_000 })).targets).toHaveLength(1);
  }, 60_000);

  it('refuses an unknown job', () => {
    expect(() => runJob('nope' as never, {} as never)).toThrow(/unknown compute job/);
  });
});

describe('the thread entry', () => {
  it('is a CommonJS file that loads the ES bundle with import(), so piscina never require()s an ES module', () => {
    const entry = workerEntry(workerFile);
    expect(entry).toBe(workerFile.replace(/\.mjs$/, '.cjs'));
    const text = readFileSync(entry, 'utf8');
    expect(text).toContain("import('./compute-worker.mjs')");
    expect(text).not.toMatch(/require\(/);
  });
});
