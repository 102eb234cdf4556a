import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createClient, type Client } from '@libsql/client';
import { sql } from 'drizzle-orm';
import { DatabaseBusyError, NestedUseError, openDb, writeTx, type Database } from '../../../src/lib/server/db/client';

// The database module's failure paths, on a real SQLite file. Expected behaviour follows SQLite's
// documented semantics: SAVEPOINT/RELEASE (sqlite.org/lang_savepoint.html), deferred foreign keys checked
// at COMMIT (sqlite.org/foreignkeys.html §4.2), PRAGMA query_only (sqlite.org/pragma.html#pragma_query_only),
// and WAL's one writer at a time (sqlite.org/wal.html).
let dir: string;
let path: string;
let db: Database;
let other: Client;

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'armilla-dbmod-'));
  path = join(dir, 'm.db');
  db = await openDb(`file:${path}`, { busyBudgetMs: 5000 });
  await db.exclusive(async (_raw, client) => {
    await client.executeMultiple(`
      create table t (id integer primary key, v text not null unique);
      create table c (id integer primary key, version integer not null);
      insert into c (id, version) values (1, 1);
      create table p (id integer primary key);
      create table ch (id integer primary key, pid integer not null references p (id) deferrable initially deferred);
    `);
  });
  other = createClient({ url: `file:${path}` });
});
afterAll(() => {
  db?.close();
  other?.close();
  rmSync(dir, { recursive: true, force: true });
});

/** What another connection sees: only committed rows. */
const committed = async (q: string) => (await other.execute(q)).rows.map((r) => r[0]);
/** The messages of an error and its causes. */
const chain = (e: unknown): string => {
  const out: string[] = [];
  for (let x = e as { message?: string; cause?: unknown } | undefined, i = 0; x && i < 5; x = x.cause as typeof x, i++) out.push(String(x.message));
  return out.join(' ← ');
};
const insert = (v: string) => db.write((tx) => tx.run(sql`insert into t (v) values (${v})`));

describe('write transactions', () => {
  test('concurrent writes share commits (group commit); a failing one leaves the others intact', async () => {
    const before = { ...db.writeStats };
    const results = await Promise.allSettled(
      Array.from({ length: 30 }, (_, i) =>
        db.write(async (tx) => {
          await tx.run(sql`insert into t (v) values (${`a${i}`})`);
          if (i === 7) throw new Error('job 7 fails');
          await tx.run(sql`insert into t (v) values (${`b${i}`})`);
          return i;
        }),
      ),
    );
    expect(results.filter((r) => r.status === 'rejected')).toHaveLength(1);
    // acknowledged means committed: another connection sees every row at once
    const vs = await committed("select v from t where v like 'a%' or v like 'b%'");
    expect(vs).toHaveLength(58);
    expect(vs).not.toContain('a7');
    expect(db.writeStats.jobs - before.jobs).toBe(30);
    expect(db.writeStats.batches - before.batches).toBeLessThan(30);
  });

  test('a job that throws is rolled back, its error surfaces, and the next write goes through', async () => {
    await expect(
      db.write(async (tx) => {
        await tx.run(sql`insert into t (v) values ('thrown')`);
        throw new Error('the job fails');
      }),
    ).rejects.toThrow('the job fails');
    expect(await committed("select v from t where v = 'thrown'")).toEqual([]);
    await insert('after-throw');
    expect(await committed("select v from t where v = 'after-throw'")).toEqual(['after-throw']);
  });

  test('a failed COMMIT (deferred foreign key) rolls back, surfaces the error, releases the lock', async () => {
    // The child row's parent does not exist; a deferred key is checked only when the batch commits.
    const bad = db.write((tx) => tx.run(sql`insert into ch (pid) values (999)`));
    await expect(bad).rejects.toThrow(/FOREIGN KEY/i);
    expect(await committed('select count(*) from ch')).toEqual([0]);
    await insert('after-commit-failure');
    expect(await committed("select v from t where v = 'after-commit-failure'")).toEqual(['after-commit-failure']);
  });

  test('version race: one winner; a loser reading after its rollback sees the winner committed', async () => {
    const attempt = async () => {
      const won = await db
        .write(async (tx) => {
          const cur = await tx.get<{ version: number }>(sql`select version from c where id = 1`);
          if (cur!.version !== 1) throw new Error('conflict');
          await tx.run(sql`update c set version = 2 where id = 1 and version = 1`);
          return true;
        })
        .catch(() => false);
      const seen = await db.get<{ version: number }>(sql`select version from c where id = 1`);
      return { won, seen: Number(seen!.version) };
    };
    const out = await Promise.all(Array.from({ length: 10 }, attempt));
    expect(out.filter((o) => o.won)).toHaveLength(1);
    expect(out.every((o) => o.seen === 2)).toBe(true);
  });

  test('a nested step (writeTx on the tx) is a savepoint: it fails alone, the outer transaction commits', async () => {
    await db.write(async (tx) => {
      await tx.run(sql`insert into t (v) values ('n1')`);
      await writeTx(tx, async (inner) => {
        await inner.run(sql`insert into t (v) values ('n2')`);
        throw new Error('inner fails');
      }).catch(() => {});
    });
    expect(await committed("select v from t where v like 'n%'")).toEqual(['n1']);
  });
});

describe('misuse is loud', () => {
  test('writing through the outer handle inside a transaction throws at once (no wait for the lock)', async () => {
    let nested: unknown;
    await db.write(async (tx) => {
      await tx.run(sql`insert into t (v) values ('outer')`);
      try {
        await db.write((t2) => t2.run(sql`insert into t (v) values ('inner')`));
      } catch (e) {
        nested = e;
      }
    });
    expect(nested).toBeInstanceOf(NestedUseError);
    expect(String((nested as Error).message)).toMatch(/inside a transaction: use the `tx`/);
    expect(await committed("select v from t where v in ('outer', 'inner')")).toEqual(['outer']);
    // reading through the outer handle inside the callback is refused too (it would miss the tx's writes)
    await expect(db.write(async () => db.select({ n: sql`1` }).from(sql`t`))).rejects.toBeInstanceOf(NestedUseError);
    // and nothing is left locked
    await insert('after-nesting');
    expect(await committed("select v from t where v = 'after-nesting'")).toEqual(['after-nesting']);
  });

  test('the read handle refuses writes, whatever the SQL looks like (PRAGMA query_only)', async () => {
    const refused = async (p: Promise<unknown>) => {
      const e = await p.then(() => null, (err: unknown) => err);
      expect(e, 'the statement was accepted').not.toBeNull();
      return chain(e);
    };
    expect(await refused(db.all(sql`insert into t (v) values ('sneaky')`))).toMatch(/readonly database/i);
    expect(await refused(db.all(sql`with x as (select 'sneaky-cte' as v) insert into t (v) select v from x`))).toMatch(/readonly database/i);
    expect(await committed("select v from t where v like 'sneaky%'")).toEqual([]);
    // the types say so too: the handle has no insert, update, delete or run
    // @ts-expect-error the read handle has no insert
    expect(db.insert).toBeUndefined();
  });
});

describe('SQLITE_BUSY from another process', () => {
  /** A child node process that takes the write lock (BEGIN EXCLUSIVE) and holds it for `ms`. */
  function holdLock(ms: number): Promise<{ done: Promise<number | null> }> {
    const code = `
      const Database = require('libsql');
      const d = new Database(${JSON.stringify(path)});
      d.exec('BEGIN EXCLUSIVE');
      d.prepare("insert into t (v) values ('from-child-' || ?)").run(String(${ms}));
      process.stdout.write('locked\\n');
      setTimeout(() => { d.exec('COMMIT'); d.close(); process.exit(0); }, ${ms});
    `;
    const child = spawn(process.execPath, ['-e', code], { cwd: process.cwd(), stdio: ['ignore', 'pipe', 'inherit'] });
    const done = new Promise<number | null>((r) => child.on('exit', r));
    return new Promise((resolve, reject) => {
      child.stdout.on('data', (d) => String(d).includes('locked') && resolve({ done }));
      child.on('exit', (c) => reject(new Error(`lock holder exited early (${c})`)));
    });
  }

  test('a write waiting for the other process is retried and succeeds once the lock is free', async () => {
    const child = await holdLock(700);
    await insert('after-child');
    expect(await child.done).toBe(0);
    // the child's row committed first, then ours: we waited for it rather than failing
    const order = await committed("select v from t where v in ('from-child-700', 'after-child') order by id");
    expect(order).toEqual(['from-child-700', 'after-child']);
  }, 20_000);

  test('past the retry budget the write fails with a clear 503 error, and later writes succeed', async () => {
    const impatient = await openDb(`file:${path}`, { busyBudgetMs: 300 });
    try {
      const child = await holdLock(2500);
      const err = await impatient.write((tx) => tx.run(sql`insert into t (v) values ('too-late')`)).catch((e) => e);
      expect(err).toBeInstanceOf(DatabaseBusyError);
      expect(err.status).toBe(503);
      expect(err.headers).toEqual({ 'retry-after': '1' });
      expect(await child.done).toBe(0);
      expect(await committed("select v from t where v = 'too-late'")).toEqual([]);
      await impatient.write((tx) => tx.run(sql`insert into t (v) values ('in-time')`));
      expect(await committed("select v from t where v = 'in-time'")).toEqual(['in-time']);
    } finally {
      impatient.close();
    }
  }, 20_000);
});
