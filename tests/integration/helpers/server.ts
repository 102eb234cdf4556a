import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { openDb } from '../../../src/lib/server/db/client';
import { migrateDb } from '../../../src/lib/server/db/migrate';

/** Ports handed out by this process, so two calls never return the same one. */
const handedOut = new Set<number>();

/**
 * The range free ports are drawn from: below the kernel's ephemeral range (Linux default 32768–60999,
 * /proc/sys/net/ipv4/ip_local_port_range). listen(0) picks from the ephemeral range, where an outgoing
 * connection of any test can take the port as its local end between the check and the child's own bind
 * (CI failed once so: maildev's EADDRINUSE). Outgoing connections never use a port below that range.
 */
function portRange(): [number, number] {
  try {
    const lo = Number(readFileSync('/proc/sys/net/ipv4/ip_local_port_range', 'utf8').trim().split(/\s+/)[0]);
    if (Number.isFinite(lo) && lo > 12_000) return [10_000, lo];
  } catch {
    /* not Linux: fall back to a range under the IANA dynamic ports */
  }
  return [20_000, 32_768];
}

function canBind(port: number): Promise<boolean> {
  return new Promise((res) => {
    const s = createServer();
    s.unref();
    s.once('error', () => res(false));
    s.listen(port, '127.0.0.1', () => s.close(() => res(true)));
  });
}

/** A free TCP port on 127.0.0.1, at random below the ephemeral range, never the same twice in one process. */
export async function freePort(): Promise<number> {
  const [lo, hi] = portRange();
  for (let i = 0; i < 500; i++) {
    const port = lo + Math.floor(Math.random() * (hi - lo));
    if (handedOut.has(port)) continue;
    if (await canBind(port)) {
      handedOut.add(port);
      return port;
    }
  }
  throw new Error(`no free port in ${lo}–${hi}`);
}

/**
 * Runs `start` (which takes its ports from freePort) again, up to 3 times in all, when it fails because a
 * port was taken between freePort's check and the child's bind (another test file's random pick): the
 * error names EADDRINUSE, as the child's output it carries does.
 */
export async function onFreshPorts<T>(start: () => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await start();
    } catch (e) {
      if (attempt >= 3 || !/EADDRINUSE/.test(String(e))) throw e;
    }
  }
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

/**
 * Waits until this process says it listens on `url` (its own line in the log after `since`), then until health
 * answers. The line first: a health answer alone could come from another process that took the port.
 */
async function waitHealthy(url: string, proc: ChildProcess, log: () => string, since = 0): Promise<void> {
  const deadline = Date.now() + 30_000;
  while (Date.now() < deadline) {
    if (proc.exitCode !== null) throw new Error(`server exited (${proc.exitCode}):\n${log()}`);
    if (log().slice(since).includes(`listening on ${url}`)) {
      try {
        const r = await fetch(`${url}/api/health`);
        if (r.ok) return;
      } catch {
        /* not up yet */
      }
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
  let port = 0;
  let url = '';
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
  const proc = await onFreshPorts(async () => {
    port = await freePort();
    url = `http://127.0.0.1:${port}`;
    out = '';
    const p = launch();
    await waitHealthy(url, p, () => out);
    return p;
  });
  const server: TestServer = {
    url,
    port,
    dbUrl,
    dir,
    proc,
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
      const since = out.length;
      server.proc = launch();
      await waitHealthy(url, server.proc, server.log, since);
    },
    stop: async () => {
      await server.kill();
      if (!opts.dbUrl) rmSync(dir, { recursive: true, force: true });
    },
  };
  return server;
}
