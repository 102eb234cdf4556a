import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { openDb } from '../../../src/lib/server/db/client';
import { migrateDb } from '../../../src/lib/server/db/migrate';

export async function freePort(): Promise<number> {
  return new Promise((res, rej) => {
    const s = createServer();
    s.unref();
    s.on('error', rej);
    s.listen(0, '127.0.0.1', () => {
      const a = s.address();
      s.close(() => (typeof a === 'object' && a ? res(a.port) : rej(new Error('no port'))));
    });
  });
}

export interface TestServer {
  url: string;
  port: number;
  dbUrl: string;
  dir: string;
  proc: ChildProcess;
  /** Server output so far (for debugging a failing test). */
  log: () => string;
  stop: () => Promise<void>;
  /** Stops only the process (e.g. SIGKILL) and keeps the database. */
  kill: (signal?: NodeJS.Signals) => Promise<void>;
  /** Starts a new process on the same database and port. */
  restart: () => Promise<void>;
}

export interface StartOptions {
  /** Seed the demo data (default true). */
  seed?: boolean;
  env?: Record<string, string>;
  /** Reuse an existing database URL (e.g. a second instance on the same file). */
  dbUrl?: string;
}

async function waitHealthy(url: string, proc: ChildProcess, log: () => string): Promise<void> {
  const deadline = Date.now() + 30_000;
  while (Date.now() < deadline) {
    if (proc.exitCode !== null) throw new Error(`server exited (${proc.exitCode}):\n${log()}`);
    try {
      const r = await fetch(`${url}/api/health`);
      if (r.ok) return;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`server did not start:\n${log()}`);
}

/** Starts the built app (dist/server/armilla.mjs) on a free port with its own temp-file SQLite database. */
export async function startServer(opts: StartOptions = {}): Promise<TestServer> {
  const dir = mkdtempSync(join(tmpdir(), 'armilla-test-'));
  const dbUrl = opts.dbUrl ?? `file:${join(dir, 'test.db')}`;
  if (!opts.dbUrl) {
    const db = await openDb(dbUrl);
    await migrateDb(db);
    if (opts.seed !== false) {
      const { seedDemo } = await import('../../../src/lib/server/seed');
      await seedDemo(db);
    }
    db.close();
  }
  const port = await freePort();
  const url = `http://127.0.0.1:${port}`;
  let out = '';
  const launch = () => {
    // ARMILLA_SERVER_NODE_ARGS: extra node flags for the server, e.g. `--cpu-prof --cpu-prof-dir=/tmp/prof` to profile a load run
    const nodeArgs = (process.env.ARMILLA_SERVER_NODE_ARGS ?? '').split(' ').filter(Boolean);
    const proc = spawn(process.execPath, [...nodeArgs, resolve(process.env.ARMILLA_DIST ?? 'dist', 'server/armilla.mjs')], {
      env: {
        ...process.env,
        HOST: '127.0.0.1',
        PORT: String(port),
        DATABASE_URL: dbUrl,
        PUBLIC_ORIGIN: url,
        ARMILLA_TEST: '1',
        ...opts.env,
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    proc.stdout?.on('data', (d) => (out += d));
    proc.stderr?.on('data', (d) => (out += d));
    return proc;
  };
  const server: TestServer = {
    url,
    port,
    dbUrl,
    dir,
    proc: launch(),
    log: () => out,
    kill: async (signal = 'SIGTERM') => {
      const p = server.proc;
      if (p.exitCode !== null || p.signalCode !== null) return;
      await new Promise<void>((r) => {
        p.once('exit', () => r());
        p.kill(signal);
      });
    },
    restart: async () => {
      await server.kill();
      server.proc = launch();
      await waitHealthy(url, server.proc, server.log);
    },
    stop: async () => {
      await server.kill();
      if (!opts.dbUrl) rmSync(dir, { recursive: true, force: true });
    },
  };
  await waitHealthy(url, server.proc, server.log);
  return server;
}
