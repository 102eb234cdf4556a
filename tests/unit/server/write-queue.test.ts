import { afterAll, beforeAll, expect, test } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createClient, type Client } from '@libsql/client';
import { drizzle } from 'drizzle-orm/libsql';
import { sql } from 'drizzle-orm';
import { writeQueue } from '../../../src/lib/server/db/write-queue';

// The write queue's durability barrier: with `sync` (the module's fsync of the WAL off the event loop),
// no job hears "committed" before the sync of its batch has finished, and a failed sync fails the jobs.
let dir: string;
let raw: Client;
let pendingSyncs: Array<{ resolve: () => void; reject: (e: unknown) => void }> = [];

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'armilla-wqueue-'));
  raw = createClient({ url: `file:${join(dir, 'q.db')}`, concurrency: 1 });
  await raw.execute('PRAGMA journal_mode = WAL');
  await raw.execute('create table t (id integer primary key, v text not null)');
});
afterAll(() => {
  raw?.close();
  rmSync(dir, { recursive: true, force: true });
});

const queue = () =>
  writeQueue(raw, { sync: () => new Promise<void>((resolve, reject) => pendingSyncs.push({ resolve, reject })) });

test('a job is answered only after its batch has been synced', async () => {
  pendingSyncs = [];
  const db = drizzle({ transaction: queue().transaction } as unknown as Client);
  let answered = false;
  const job = db.transaction((tx) => tx.run(sql`insert into t (v) values ('a')`)).then(() => (answered = true));
  while (!pendingSyncs.length) await new Promise((r) => setTimeout(r, 5));
  await new Promise((r) => setTimeout(r, 20));
  expect(answered).toBe(false);
  pendingSyncs[0]!.resolve();
  await job;
  expect(answered).toBe(true);
});

test('a failed sync fails the jobs of its batch with a clear error', async () => {
  pendingSyncs = [];
  const db = drizzle({ transaction: queue().transaction } as unknown as Client);
  const job = db.transaction((tx) => tx.run(sql`insert into t (v) values ('b')`));
  while (!pendingSyncs.length) await new Promise((r) => setTimeout(r, 5));
  pendingSyncs[0]!.reject(new Error('EIO'));
  await expect(job).rejects.toThrow(/could not be made durable/);
});
