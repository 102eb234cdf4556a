/**
 * Another process holds the database's write lock longer than the server's retry budget: a save answers
 * 503 with Retry-After (not 500, and not a hang), and saves work again once the lock is free.
 * SQLite: one writer at a time in WAL mode (sqlite.org/wal.html); HTTP 503 + Retry-After (RFC 9110 §15.6.4).
 */
import { afterAll, beforeAll, expect, test } from 'vitest';
import { spawn } from 'node:child_process';
import { startServer, type TestServer } from './helpers/server';
import { ApiClient, DEMO } from './helpers/client';

let s: TestServer;
let editor: ApiClient;
let sceneId: string;

beforeAll(async () => {
  s = await startServer({ env: { ARMILLA_DB_BUSY_MS: '400' } });
  editor = new ApiClient(s.url);
  await editor.signIn(DEMO.editor);
  sceneId = (await editor.get('/api/scenes')).data.scenes[0].id;
});
afterAll(async () => {
  await s?.stop();
});

/** A child process that takes the write lock (BEGIN EXCLUSIVE) on the server's file and holds it for `ms`. */
function holdLock(file: string, ms: number): Promise<{ done: Promise<number | null> }> {
  const code = `
    const Database = require('libsql');
    const d = new Database(${JSON.stringify(file)});
    d.exec('BEGIN EXCLUSIVE');
    process.stdout.write('locked\\n');
    setTimeout(() => { d.exec('ROLLBACK'); d.close(); process.exit(0); }, ${ms});
  `;
  const child = spawn(process.execPath, ['-e', code], { cwd: process.cwd(), stdio: ['ignore', 'pipe', 'inherit'] });
  const done = new Promise<number | null>((r) => child.on('exit', r));
  return new Promise((resolve, reject) => {
    child.stdout.on('data', (d) => String(d).includes('locked') && resolve({ done }));
    child.on('exit', (c) => reject(new Error(`lock holder exited early (${c})`)));
  });
}

test('a save while another process holds the lock past the retry budget answers 503 + Retry-After', async () => {
  const version = (await editor.get(`/api/scenes/${sceneId}`)).data.scene.version;
  const { done } = await holdLock(s.dbUrl.slice('file:'.length), 3000);
  const r = await editor.patch(`/api/scenes/${sceneId}`, { version, title: 'Saved while locked' });
  expect(r.status, s.log()).toBe(503);
  expect(r.headers.get('retry-after')).toBe('1');
  expect(r.data.error.code).toBe('busy');
  expect(await done).toBe(0);
  // the lock is gone: the same save goes through, and the refused one left nothing behind
  const again = await editor.patch(`/api/scenes/${sceneId}`, { version, title: 'Saved after the lock' });
  expect(again.status).toBe(200);
  expect(again.data.scene.version).toBe(version + 1);
  expect(again.data.scene.title).toBe('Saved after the lock');
});
