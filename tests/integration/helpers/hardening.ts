/**
 * Shared by the hardening tests (authz audit, property, durability, scale-out) and tests/bench/load.ts:
 * signing in the demo cast, reading the database for a checksum, a small concurrency pool.
 */
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { createClient } from '@libsql/client';
import { ApiClient, DEMO } from './client';

export const ROLES = ['viewer', 'reviewer', 'editor', 'owner'] as const;
export type TeamRole = (typeof ROLES)[number];
export type Caller = 'anonymous' | TeamRole | 'outsider';
export const CALLERS: Caller[] = ['anonymous', 'viewer', 'reviewer', 'editor', 'owner', 'outsider'];

export interface Cast {
  clients: Record<Caller, ApiClient>;
  /** The demo team "Larkspur Ridge Observatory". */
  teamId: string;
  /** The outsider's own team. */
  otherTeamId: string;
  userIds: Record<Exclude<Caller, 'anonymous'>, string>;
}

/** Signs in the five demo accounts (one client each) and reads their teams from GET /api/me. */
export async function signInCast(base: string): Promise<Cast> {
  const clients = { anonymous: new ApiClient(base) } as Record<Caller, ApiClient>;
  const userIds = {} as Cast['userIds'];
  let teamId = '';
  let otherTeamId = '';
  for (const who of ['viewer', 'reviewer', 'editor', 'owner', 'outsider'] as const) {
    const c = new ApiClient(base);
    await c.signIn(DEMO[who]);
    const me = await c.get('/api/me');
    if (me.status !== 200) throw new Error(`GET /api/me as ${who} → ${me.status}`);
    userIds[who] = me.data.user.id;
    const team = me.data.teams?.[0];
    if (who === 'owner') teamId = team?.id;
    if (who === 'outsider') otherTeamId = team?.id;
    clients[who] = c;
  }
  if (!teamId || !otherTeamId) throw new Error('demo teams not found through GET /api/me (is the demo seeded?)');
  return { clients, teamId, otherTeamId, userIds };
}

/** A fresh client that shares `c`'s session cookie (so a request can end that session without touching `c`). */
export function cloneClient(c: ApiClient): ApiClient {
  const d = new ApiClient(c.base);
  for (const [k, v] of c.cookies) d.cookies.set(k, v);
  return d;
}

/** Tables whose rows may change on a refused request: sessions (lucia extends them), counters, the log. */
export const VOLATILE_TABLES = new Set(['sessions', 'rate_limits', 'audit_log', '__drizzle_migrations']);

function canonical(v: unknown): unknown {
  if (v instanceof ArrayBuffer) return `blob:${Buffer.from(v).toString('hex')}`;
  if (ArrayBuffer.isView(v)) return `blob:${Buffer.from(v.buffer, v.byteOffset, v.byteLength).toString('hex')}`;
  if (typeof v === 'bigint') return `int:${v}`;
  return v;
}

/** Rows of every user table of the SQLite file, sorted, as `{table: [row-as-JSON]}` (volatile tables left out). */
export async function dumpTables(
  dbUrl: string,
  exclude: Set<string> = VOLATILE_TABLES,
  /** Columns blanked before comparing, e.g. `{share_links: ['last_used_at']}` (bookkeeping a read may touch). */
  ignoreColumns: Record<string, string[]> = {},
): Promise<Record<string, string[]>> {
  const client = createClient({ url: dbUrl });
  try {
    await client.execute('PRAGMA busy_timeout = 5000');
    const t = await client.execute("select name from sqlite_master where type = 'table' and name not like 'sqlite_%' order by name");
    const out: Record<string, string[]> = {};
    for (const r of t.rows) {
      const name = String(r[0]);
      if (exclude.has(name)) continue;
      const rows = await client.execute(`select * from "${name.replace(/"/g, '""')}"`);
      const blank = new Set((ignoreColumns[name] ?? []).map((c) => rows.columns.indexOf(c)).filter((i) => i >= 0));
      out[name] = rows.rows
        .map((row) => JSON.stringify(Array.from(row as ArrayLike<unknown>, (v, i) => (blank.has(i) ? null : canonical(v)))))
        .sort();
    }
    return out;
  } finally {
    client.close();
  }
}

/** SHA-256 over dumpTables(): equal checksums ⇔ the same rows in every non-volatile table. */
export async function dbChecksum(dbUrl: string, exclude?: Set<string>, ignoreColumns?: Record<string, string[]>): Promise<string> {
  const dump = await dumpTables(dbUrl, exclude, ignoreColumns);
  const h = createHash('sha256');
  for (const name of Object.keys(dump).sort()) {
    h.update(`${name}\n`);
    for (const row of dump[name]) h.update(`${row}\n`);
  }
  return h.digest('hex');
}

/** Runs `tasks` with at most `n` in flight; resolves with their settled results in order. */
export async function pool<T>(n: number, tasks: Array<() => Promise<T>>): Promise<PromiseSettledResult<T>[]> {
  const results: PromiseSettledResult<T>[] = new Array(tasks.length);
  let next = 0;
  const worker = async () => {
    while (next < tasks.length) {
      const i = next++;
      try {
        results[i] = { status: 'fulfilled', value: await tasks[i]() };
      } catch (reason) {
        results[i] = { status: 'rejected', reason };
      }
    }
  };
  await Promise.all(Array.from({ length: Math.min(n, tasks.length) }, worker));
  return results;
}

/** A valid scene body for POST /api/scenes (the contract's required fields). */
export function sceneBody(teamId: string, title = 'Hardening fixture') {
  return {
    teamId,
    title,
    site: { name: 'Fixture site', lat: 40.5, lon: -3.7, height: 650, timeZone: 'Europe/Madrid' },
    time: '2026-03-20T19:30:00Z',
  };
}

// ---------- the API's route files ----------

export const API_METHODS = ['GET', 'POST', 'PATCH', 'PUT', 'DELETE'] as const;
export type ApiMethod = (typeof API_METHODS)[number];
export interface ApiRoute {
  /** `POST /api/scenes/[id]/links` */
  key: string;
  method: ApiMethod;
  /** `/api/scenes/[id]/links` */
  pattern: string;
  file: string;
}

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = join(dir, f);
    return statSync(p).isDirectory() ? walk(p) : /\.(ts|js|mjs)$/.test(f) ? [p] : [];
  });
}

/** `src/pages/api/scenes/[id]/index.ts` → `/api/scenes/[id]`; `export.csv.ts` → `…/export.csv`. */
export function patternOf(file: string): string {
  const rel = relative(join('src', 'pages'), file).split(sep).join('/');
  return `/${rel.replace(/\.(ts|js|mjs)$/, '').replace(/\/index$/, '')}`;
}

/** The HTTP methods a route file exports (`export const GET`, `export async function POST`, `export { X as PUT }`). */
export function exportedMethods(source: string): ApiMethod[] {
  const found = new Set<string>();
  for (const m of source.matchAll(/export\s+(?:const|let|var|async\s+function|function)\s+(GET|POST|PATCH|PUT|DELETE)\b/g)) found.add(m[1]);
  for (const m of source.matchAll(/export\s*\{([^}]*)\}/g)) {
    for (const part of m[1].split(',')) {
      const name = part.trim().split(/\s+as\s+/).pop()?.trim();
      if (name && (API_METHODS as readonly string[]).includes(name)) found.add(name);
    }
  }
  return API_METHODS.filter((m) => found.has(m));
}

/** Every (route, method) under src/pages/api, read from the files themselves. */
export function discoverRoutes(dir = join('src', 'pages', 'api')): ApiRoute[] {
  return walk(dir).flatMap((file) =>
    exportedMethods(readFileSync(file, 'utf8')).map((method) => ({ key: `${method} ${patternOf(file)}`, method, pattern: patternOf(file), file })),
  );
}
