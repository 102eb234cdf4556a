/**
 * The compute pool: heavy, pure computations (jobs.ts) run on worker threads so the event loop stays free
 * for every other request. Design, limits and figures: README.md beside this file.
 *
 *   runCompute('windows', body, { budgetMs: 10_000 })
 *
 * - At most `threads` jobs run at once, one a thread; up to `maxQueue` more wait in a FIFO queue, each at
 *   most `queueWaitMs`. A full queue, or a wait that runs out, answers 503 `busy` with `Retry-After`.
 * - A job's time budget starts when a thread takes it; past it the thread is terminated (piscina respawns
 *   one) and the request answers 422 `compute_budget`.
 * - A job that runs a worker out of its heap (`memoryMb`) answers 413 `too_large`.
 * - The built server uses worker threads (dist/server/compute-worker.mjs, written by the build); a missing
 *   worker file there is a deployment error. Dev and unit tests (no file) run jobs in-process, and so does
 *   `COMPUTE_THREADS=0` (for measuring the pool against the event loop: no budget, no queue, see README).
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Piscina } from 'piscina';
import { HttpError } from '../http';
import type { ComputeInput, ComputeKind, ComputeOutput } from './jobs';

export type { ComputeInput, ComputeKind, ComputeOutput } from './jobs';

export const WORKER_FILE = 'compute-worker.mjs';

export interface ComputeConfig {
  /** Worker threads (`COMPUTE_THREADS`; default: cores − 1, at least 1, at most 4; 0 = in-process). */
  threads: number;
  /** Jobs that may wait for a thread (`COMPUTE_QUEUE`; default 8 a thread). */
  maxQueue: number;
  /** Longest wait for a thread before 503 (`COMPUTE_QUEUE_WAIT_MS`; default 5 s). */
  queueWaitMs: number;
  /** Default time budget of a job once running (`COMPUTE_BUDGET_MS`; default 10 s). */
  budgetMs: number;
  /** Heap limit of each worker (`COMPUTE_MEMORY_MB`; default 512). */
  memoryMb: number;
  /** Jobs one caller (`opts.caller`) may have running or queued at once (`COMPUTE_PER_CALLER`; default 1). */
  perCaller: number;
  /** The worker module; null runs jobs in-process (dev, unit tests and `COMPUTE_THREADS=0`). */
  workerFile: string | null;
}

export interface ComputeStats {
  mode: 'workers' | 'in-process';
  threads: number;
  running: number;
  queued: number;
  maxQueue: number;
  completed: number;
  failed: number;
  overBudget: number;
  busy: number;
  /** Mean and worst run time of completed jobs, ms. */
  meanRunMs: number;
  maxRunMs: number;
}

const envInt = (name: string, fallback: number, min: number, max: number): number => {
  const v = Number(process.env[name]);
  return Number.isFinite(v) && v >= min ? Math.min(max, Math.floor(v)) : fallback;
};

/** dist/server/compute-worker.mjs, found by walking up from this (bundled) module; `ARMILLA_COMPUTE_WORKER` overrides. */
export function findWorkerFile(from = import.meta.url): string | null {
  const override = process.env.ARMILLA_COMPUTE_WORKER;
  if (override) return existsSync(override) ? override : null;
  let dir = dirname(fileURLToPath(from));
  for (let i = 0; i < 5; i++) {
    const f = join(dir, WORKER_FILE);
    if (existsSync(f)) return f;
    const up = dirname(dir);
    if (up === dir) break;
    dir = up;
  }
  return null;
}

/** The file piscina starts a thread on: the CommonJS entry beside the bundle when there is one. */
export function workerEntry(bundle: string): string {
  const cjs = bundle.replace(/\.mjs$/, '') + '.cjs';
  return bundle.endsWith('.mjs') && existsSync(cjs) ? cjs : bundle;
}

export function computeConfig(): ComputeConfig {
  const threads = envInt('COMPUTE_THREADS', Math.max(1, Math.min(4, availableParallelism() - 1)), 0, 64);
  return {
    threads,
    maxQueue: envInt('COMPUTE_QUEUE', Math.max(1, threads) * 8, 0, 10_000),
    queueWaitMs: envInt('COMPUTE_QUEUE_WAIT_MS', 5_000, 1, 600_000),
    budgetMs: envInt('COMPUTE_BUDGET_MS', 10_000, 1, 600_000),
    memoryMb: envInt('COMPUTE_MEMORY_MB', 512, 32, 16_384),
    perCaller: envInt('COMPUTE_PER_CALLER', 1, 1, 1_000),
    workerFile: threads === 0 ? null : findWorkerFile(),
  };
}

const busyError = (retryAfterSec: number) =>
  new HttpError(503, 'busy', 'The server is busy computing for others; try again shortly.', undefined, undefined, { 'retry-after': String(retryAfterSec) });
const budgetError = (ms: number) =>
  new HttpError(422, 'compute_budget', `The computation ran past its budget of ${(ms / 1000).toFixed(ms % 1000 ? 1 : 0)} s; ask for fewer targets or a shorter span.`);

export interface ComputeOptions {
  /** Time budget once running, ms (default `COMPUTE_BUDGET_MS`). */
  budgetMs?: number;
  /** Who asks (`addr:…`, `user:…`): at most `perCaller` jobs of one caller at once, 429 past it. */
  caller?: string;
}

interface Waiter {
  go: () => void;
  fail: (e: unknown) => void;
  timer: NodeJS.Timeout;
}

export class ComputePool {
  private piscina: Piscina | null = null;
  private running = 0;
  private readonly queue: Waiter[] = [];
  private readonly callers = new Map<string, number>();
  private readonly s = { completed: 0, failed: 0, overBudget: 0, busy: 0, runMs: 0, maxRunMs: 0 };

  constructor(readonly config: ComputeConfig) {
    if (config.workerFile) {
      this.piscina = new Piscina({
        // The CommonJS entry beside the bundle (build.mjs, commonJsEntryOf): no require() of an ES module.
        filename: pathToFileURL(workerEntry(config.workerFile)).href,
        minThreads: config.threads,
        maxThreads: config.threads,
        // Our own queue (below) hands piscina a job only when a thread is free; this one only holds a job
        // while a terminated thread is replaced.
        maxQueue: Math.max(4, config.threads * 2),
        idleTimeout: 60_000,
        resourceLimits: { maxOldGenerationSizeMb: config.memoryMb },
      });
    }
  }

  stats(): ComputeStats {
    const n = this.s.completed;
    return {
      mode: this.piscina ? 'workers' : 'in-process',
      threads: this.piscina ? this.config.threads : 0,
      running: this.running,
      queued: this.queue.length,
      maxQueue: this.config.maxQueue,
      completed: n,
      failed: this.s.failed,
      overBudget: this.s.overBudget,
      busy: this.s.busy,
      meanRunMs: n ? Math.round((this.s.runMs / n) * 10) / 10 : 0,
      maxRunMs: Math.round(this.s.maxRunMs * 10) / 10,
    };
  }

  async run<K extends ComputeKind>(kind: K, input: ComputeInput<K>, opts: ComputeOptions = {}): Promise<ComputeOutput<K>> {
    if (opts.caller === undefined) return this.runQueued(kind, input, opts);
    return this.asCaller(opts.caller, () => this.runQueued(kind, input, opts));
  }

  /**
   * Runs `fn` counted as one of `caller`'s jobs: 429 at once when the caller has `perCaller` in progress.
   * A route wraps its whole handling in it (body read, validation, computation), so a burst of requests
   * from one caller is refused before any of them is parsed.
   */
  async asCaller<T>(caller: string, fn: () => Promise<T>): Promise<T> {
    const n = this.callers.get(caller) ?? 0;
    if (n >= this.config.perCaller) {
      this.s.busy++;
      throw new HttpError(429, 'rate_limited', 'Wait for your computation in progress to finish before asking for another.', undefined, undefined, {
        'retry-after': String(this.retryAfterSec()),
      });
    }
    this.callers.set(caller, n + 1);
    try {
      return await fn();
    } finally {
      const left = (this.callers.get(caller) ?? 1) - 1;
      if (left > 0) this.callers.set(caller, left);
      else this.callers.delete(caller);
    }
  }

  private async runQueued<K extends ComputeKind>(kind: K, input: ComputeInput<K>, opts: ComputeOptions): Promise<ComputeOutput<K>> {
    // COMPUTE_THREADS=0: a job runs on the event loop at once, as before the pool existed (no queue).
    if (this.config.threads === 0) this.running++;
    else await this.slot();
    const budgetMs = opts.budgetMs ?? this.config.budgetMs;
    const t0 = performance.now();
    try {
      const out = await this.exec(kind, input, budgetMs);
      const ms = performance.now() - t0;
      this.s.completed++;
      this.s.runMs += ms;
      if (ms > this.s.maxRunMs) this.s.maxRunMs = ms;
      return out;
    } catch (e) {
      if (e instanceof HttpError && e.code === 'compute_budget') this.s.overBudget++;
      else this.s.failed++;
      throw e;
    } finally {
      this.running--;
      this.next();
    }
  }

  async close(): Promise<void> {
    for (const w of this.queue.splice(0)) {
      clearTimeout(w.timer);
      w.fail(busyError(1));
    }
    await this.piscina?.destroy();
    this.piscina = null;
  }

  /** Resolves when this job may run (and counts it as running); 503 when the queue is full or the wait runs out. */
  private slot(): Promise<void> {
    if (this.running < this.config.threads && this.queue.length === 0) {
      this.running++;
      return Promise.resolve();
    }
    if (this.queue.length >= this.config.maxQueue) {
      this.s.busy++;
      return Promise.reject(busyError(this.retryAfterSec()));
    }
    return new Promise<void>((resolve, reject) => {
      const w: Waiter = {
        go: () => {
          clearTimeout(w.timer);
          this.running++;
          resolve();
        },
        fail: reject,
        timer: setTimeout(() => {
          const i = this.queue.indexOf(w);
          if (i >= 0) this.queue.splice(i, 1);
          this.s.busy++;
          reject(busyError(this.retryAfterSec()));
        }, this.config.queueWaitMs),
      };
      this.queue.push(w);
    });
  }

  private next(): void {
    while (this.running < this.config.threads && this.queue.length) this.queue.shift()!.go();
  }

  /** Seconds until a slot is likely free: the queue ahead times the mean run, at least 1. */
  private retryAfterSec(): number {
    const mean = this.s.completed ? this.s.runMs / this.s.completed : 1000;
    return Math.max(1, Math.min(60, Math.ceil(((this.queue.length + 1) * mean) / Math.max(1, this.config.threads) / 1000)));
  }

  private async exec<K extends ComputeKind>(kind: K, input: ComputeInput<K>, budgetMs: number): Promise<ComputeOutput<K>> {
    if (!this.piscina) {
      // Dev server and unit tests only (no worker file): no thread, so no budget either.
      const { runJob } = await import('./jobs');
      return runJob(kind, input);
    }
    const ac = new AbortController();
    const timer = setTimeout(() => ac.abort(), budgetMs);
    try {
      return (await this.piscina.run({ kind, input }, { signal: ac.signal })) as ComputeOutput<K>;
    } catch (e) {
      if (ac.signal.aborted) throw budgetError(budgetMs);
      if ((e as { code?: string })?.code === 'ERR_WORKER_OUT_OF_MEMORY') {
        throw new HttpError(413, 'too_large', 'The computation needs more memory than one request may use; ask for fewer targets or a shorter span.');
      }
      throw e;
    } finally {
      clearTimeout(timer);
    }
  }
}

const KEY = Symbol.for('armilla.computePool');
type G = typeof globalThis & { [KEY]?: ComputePool };

/** The process's pool, created on first use. */
export function computePool(): ComputePool {
  const g = globalThis as G;
  if (!g[KEY]) {
    const config = computeConfig();
    if (!config.workerFile && config.threads > 0 && import.meta.env.PROD) {
      throw new Error(`compute pool: ${WORKER_FILE} not found beside the server bundle; the build writes it (src/lib/server/compute/build.mjs)`);
    }
    g[KEY] = new ComputePool(config);
  }
  return g[KEY];
}

/** Runs a job of the registry (jobs.ts) on the pool. Throws HttpError 503 (busy), 422 (over budget), 413 (out of memory). */
export function runCompute<K extends ComputeKind>(kind: K, input: ComputeInput<K>, opts?: ComputeOptions): Promise<ComputeOutput<K>> {
  return computePool().run(kind, input, opts);
}

/** `ComputePool.asCaller` on the process's pool: one computation in progress per caller, refused before parsing. */
export function asCaller<T>(caller: string, fn: () => Promise<T>): Promise<T> {
  return computePool().asCaller(caller, fn);
}

/** For /api/health: the pool's figures, or null before its first use. */
export function computeStats(): ComputeStats | null {
  return (globalThis as G)[KEY]?.stats() ?? null;
}
