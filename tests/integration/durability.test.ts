/**
 * Durability: every write the server acknowledged (201) is still there after the process is killed
 * with SIGKILL mid-burst and started again on the same SQLite file; `npm run backup` makes a readable
 * copy with the same rows. No timing assertions: the burst is stopped by a count, not a clock.
 */
import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createClient } from '@libsql/client';
import { openDb } from '../../src/lib/server/db/client';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient, DEMO } from './helpers/client';
import { dumpTables, pool, sceneBody } from './helpers/hardening';

let s: TestServer;
let editor: ApiClient;
let teamId: string;

beforeAll(async () => {
  s = await startServer();
  editor = new ApiClient(s.url);
  await editor.signIn(DEMO.editor);
  const me = await editor.get('/api/me');
  teamId = me.data.teams.find((t: { role: string }) => t.role === 'editor')?.id ?? me.data.teams[0].id;
});
afterAll(() => s?.stop());

describe('SQLite settings', () => {
  test('the database client opens files in WAL mode; commits are synced off the event loop, or by SQLite (FULL)', async () => {
    // SQLite docs (pragma.html#pragma_synchronous): NORMAL = 1, FULL = 2; journal_mode=WAL persists in
    // the file. By default the module fsyncs the WAL itself before acknowledging (write-queue.test.ts
    // checks that no job is answered before that fsync), so SQLite's own commit runs with NORMAL.
    for (const [sync, expected] of [[undefined, 1], ['full', 2]] as const) {
      const db = await openDb(`file:${join(s.dir, 'pragma-check.db')}`, sync ? { sync } : {});
      try {
        // the writer's connection, where every write runs
        const pragma = (name: string) => db.exclusive(async (_raw, client) => (await client.execute(`PRAGMA ${name}`)).rows[0][0]);
        expect(String(await pragma('journal_mode')).toLowerCase()).toBe('wal');
        expect(Number(await pragma('synchronous'))).toBe(expected);
        expect(Number(await pragma('foreign_keys'))).toBe(1);
      } finally {
        db.close();
      }
    }
  });

  test("the server's database file is in WAL mode", async () => {
    const c = createClient({ url: s.dbUrl });
    try {
      expect(String((await c.execute('PRAGMA journal_mode')).rows[0][0]).toLowerCase()).toBe('wal');
    } finally {
      c.close();
    }
  });
});

describe('crash safety', () => {
  test('every acknowledged scene survives SIGKILL mid-burst and a restart', async () => {
    const TOTAL = 200;
    const KILL_AFTER = 60; // acknowledged writes before the kill; the rest of the burst is in flight or not sent
    const acknowledged: string[] = [];
    const refused: string[] = [];
    let killed: Promise<void> | null = null;
    const tasks = Array.from({ length: TOTAL }, (_, i) => async () => {
      if (killed) return 'skipped';
      const r = await editor.post('/api/scenes', sceneBody(teamId, `Burst ${i}`));
      if (r.status === 201) {
        const id = r.data?.scene?.id;
        expect(typeof id).toBe('string');
        acknowledged.push(id);
        if (acknowledged.length >= KILL_AFTER && !killed) killed = s.kill('SIGKILL');
      } else {
        refused.push(`${r.status} ${JSON.stringify(r.data).slice(0, 200)}`);
      }
      return 'ok';
    });
    await pool(8, tasks); // requests cut off by the kill reject (connection reset): not acknowledged
    await killed;
    expect(killed, 'the burst reached the kill point').not.toBeNull();
    expect(s.proc.signalCode).toBe('SIGKILL');
    expect(acknowledged.length).toBeGreaterThanOrEqual(KILL_AFTER);
    // A refused write is not acknowledged, so it does not weaken what this test checks; a 4xx (e.g. a rate
    // limit) is an answer, but a 5xx is a bug (e.g. 500 SQLITE_BUSY from concurrent write transactions) and fails.
    expect(refused.filter((x) => x.startsWith('5')), 'writes of the burst answered with a server error').toEqual([]);

    await s.restart();
    const after = new ApiClient(s.url);
    await after.signIn(DEMO.editor);
    const missing: string[] = [];
    for (const id of acknowledged) {
      const r = await after.get(`/api/scenes/${id}`);
      if (r.status !== 200 || r.data?.scene?.id !== id) missing.push(`${id} → ${r.status}`);
    }
    expect(missing).toEqual([]);
    const list = await after.get('/api/scenes');
    expect(list.status).toBe(200);
    const listed = new Set(list.data.scenes.map((x: { id: string }) => x.id));
    expect(acknowledged.filter((id) => !listed.has(id))).toEqual([]);
  }, 240_000);
});

describe('npm run backup', () => {
  test('VACUUM INTO writes a readable copy with the same rows, while the server runs', async () => {
    // one more write so that the copy must include something the WAL may still hold
    const w = await editor.post('/api/scenes', sceneBody(teamId, 'Written just before the backup'));
    expect(w.status).toBe(201);
    const target = join(s.dir, 'backup-copy.db');
    const out = execFileSync(resolve('node_modules/.bin/tsx'), ['src/lib/server/db/backup.ts', target], {
      env: { ...process.env, DATABASE_URL: s.dbUrl },
      encoding: 'utf8',
    });
    expect(out).toMatch(/integrity: ok/);
    expect(existsSync(target)).toBe(true);
    // every table, the volatile ones included (nothing writes between the two reads)
    const original = await dumpTables(s.dbUrl, new Set());
    const copy = await dumpTables(`file:${target}`, new Set());
    expect(Object.keys(copy)).toEqual(Object.keys(original));
    for (const t of Object.keys(original)) expect(copy[t], `table ${t}`).toEqual(original[t]);
    expect(copy.scenes.some((row) => row.includes('Written just before the backup'))).toBe(true);

    // restore as README says: stop, put the copy in place, start: the app serves the copied data
    const restored = await startServer({ dbUrl: `file:${target}` });
    try {
      const c = new ApiClient(restored.url);
      await c.signIn(DEMO.editor);
      const list = await c.get('/api/scenes');
      expect(list.status).toBe(200);
      expect(list.data.scenes.some((x: { title: string }) => x.title === 'Written just before the backup')).toBe(true);
    } finally {
      await restored.kill();
    }
  }, 180_000);
});
