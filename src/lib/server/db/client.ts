/**
 * The database module: the one way services reach the database (decision record: README.md).
 *
 *   db.select()…, db.query…, db.all(sql)   plain reads, on a connection that refuses writes
 *   db.write(async (tx) => …)               anything else: one transaction on the process's one writer,
 *                                           retried on SQLITE_BUSY, `503` past the retry budget
 *   db.transaction(fn)                      the same as `write` (the name drizzle users reach for)
 *   writeTx(dbOrTx, fn)                     for services that may run inside a caller's transaction
 *   db.exclusive(fn)                        migrations, PRAGMA, VACUUM: alone, between write batches
 *
 * Misuse is loud: the read handle has no insert/update/delete (types) and its connection runs with
 * `PRAGMA query_only` (SQLite refuses any write, whatever the SQL looks like); using the outer `db`
 * inside a transaction's callback — which would wait for the lock the transaction holds, or read past
 * its uncommitted writes — throws at once (AsyncLocalStorage knows the callback is running).
 *
 * Runs outside Astro too (npm start, the test harness), so it imports no astro:* module.
 */
import { AsyncLocalStorage } from 'node:async_hooks';
import { fstatSync } from 'node:fs';
import { open, type FileHandle } from 'node:fs/promises';
import { createClient, type Client } from '@libsql/client';
import { drizzle, type LibSQLDatabase } from 'drizzle-orm/libsql';
import * as schema from './schema';
import { writeQueue, type WriteStats } from './write-queue';
import { localPath, preparedReads, registerPreparedReads } from './prepared';
import { HttpError } from '../http';

type Schema = typeof schema;
/** drizzle over a connection: the writer's own (inside `exclusive`) or the reader's. */
export type RawDb = LibSQLDatabase<Schema>;
/** A write transaction's handle: reads and writes, nested steps with `writeTx(tx, …)`. */
export type Tx = Parameters<Parameters<RawDb['transaction']>[0]>[0];

/** Enough to build a select (for SQL text made once with `drizzle.mock()`, or run on any handle). */
export type QueryBuilder = Pick<RawDb, 'select'>;

/** What the read handle offers: drizzle's read builders, nothing that writes. */
type ReadMethods = Pick<RawDb, 'select' | 'selectDistinct' | '$count' | 'query' | 'all' | 'get' | 'values'>;

export interface Database extends ReadMethods {
  /** Runs `fn` as one write transaction (all or nothing); retried from the start on SQLITE_BUSY. */
  write<T>(fn: (tx: Tx) => Promise<T>): Promise<T>;
  /** Same as `write`. */
  transaction<T>(fn: (tx: Tx) => Promise<T>): Promise<T>;
  /** Runs `fn` alone with the writer's connection (migrations, PRAGMA, VACUUM); no retry. */
  exclusive<T>(fn: (raw: RawDb, client: Client) => Promise<T>): Promise<T>;
  /** Batches and jobs of the writer since start (group commit at work). */
  readonly writeStats: WriteStats;
  close(): void;
}
export type Db = Database;
/** Services take either: the app's handle, or the transaction they are called inside. */
export type DbOrTx = Database | Tx;

export const DEFAULT_DATABASE_URL = 'file:./data/armilla.db';
/** Busy timeout of the read connections (WAL readers practically never wait). */
const READ_BUSY_TIMEOUT_MS = 5000;
/**
 * The writer's busy timeout. SQLite waits for a lock synchronously, on the event loop, so it stays
 * short; a longer wait is the retry loop's, which sleeps asynchronously between tries.
 */
const WRITE_BUSY_TIMEOUT_MS = 100;
/** How long a write keeps retrying SQLITE_BUSY before the route answers 503 (ARMILLA_DB_BUSY_MS). */
export const DEFAULT_BUSY_BUDGET_MS = 5000;

export interface OpenOptions {
  authToken?: string;
  /** Group commit of the writes queued behind the writer (default on; ARMILLA_GROUP_COMMIT=0 turns it off). */
  groupCommit?: boolean;
  /** Retry budget for SQLITE_BUSY, ms (default ARMILLA_DB_BUSY_MS or 5000). */
  busyBudgetMs?: number;
  /**
   * How a commit is made durable before it is acknowledged (local files; default ARMILLA_DB_SYNC or
   * 'fsync-off-loop'): 'fsync-off-loop' = SQLite commits with synchronous = NORMAL and the module
   * fsyncs the write-ahead log on libuv's thread pool before answering the batch's jobs; 'full' =
   * SQLite's synchronous = FULL, whose fsync runs inside COMMIT, on the event loop. Either way an
   * acknowledged write has reached the disk.
   */
  sync?: 'fsync-off-loop' | 'full';
}

/** The write could not take the database's lock within the retry budget: `503` with `Retry-After`. */
export class DatabaseBusyError extends HttpError {
  constructor(waitedMs: number, cause: unknown) {
    super(503, 'busy', 'The database is busy; try again in a moment.', undefined, undefined, { 'retry-after': '1' });
    this.cause = cause;
    this.waitedMs = waitedMs;
  }
  readonly waitedMs: number;
}

/** Using the outer handle inside a transaction's callback. */
export class NestedUseError extends Error {
  constructor(what: 'write' | 'read' | 'exclusive') {
    super(
      what === 'read'
        ? 'Read through the outer db handle inside a transaction: use the `tx` the transaction gave you (the outer handle does not see the transaction\'s own writes).'
        : `db.${what}() inside a transaction: use the \`tx\` the transaction gave you, or writeTx(tx, …) for a nested step (the outer handle would wait for the write lock this transaction holds).`,
    );
    this.name = 'NestedUseError';
  }
}

/** SQLITE_BUSY / SQLITE_LOCKED, however the driver wraps it. */
export function isBusy(e: unknown): boolean {
  for (let x: unknown = e, i = 0; x && i < 5; x = (x as { cause?: unknown }).cause, i++) {
    const code = (x as { code?: unknown }).code;
    if (code === 'SQLITE_BUSY' || code === 'SQLITE_LOCKED') return true;
    if (x instanceof Error && /SQLITE_BUSY|database is locked/.test(x.message)) return true;
  }
  return false;
}

/** The transaction whose callback is running in this async context, if any. */
const inside = new AsyncLocalStorage<{ open: boolean }>();
const guard = (what: 'write' | 'read' | 'exclusive') => {
  if (inside.getStore()?.open) throw new NestedUseError(what);
};

const envFlag = (v: string | undefined, dflt: boolean) => (v === undefined || v === '' ? dflt : !/^(0|false|off|no)$/i.test(v));

/**
 * Opens the database. For a local file: WAL (readers never block the writer), synchronous = FULL (an
 * acknowledged write survives a power cut, not only a process crash), foreign keys; one writer
 * connection behind the write queue, one read connection with `query_only`, and the prepared hot
 * reads on a third (prepared.ts). A libSQL server (or memory database) gets one client for both, with
 * its own transactions; the read handle then refuses writes by its type only.
 */
export async function openDb(url = DEFAULT_DATABASE_URL, opts: OpenOptions | string = {}): Promise<Database> {
  const o: OpenOptions = typeof opts === 'string' ? { authToken: opts } : opts;
  const busyBudgetMs = o.busyBudgetMs ?? Number(process.env.ARMILLA_DB_BUSY_MS || DEFAULT_BUSY_BUDGET_MS);
  const groupCommit = o.groupCommit ?? envFlag(process.env.ARMILLA_GROUP_COMMIT, true);
  const path = localPath(url);
  if (path !== null) {
    const { mkdirSync } = await import('node:fs');
    const { dirname } = await import('node:path');
    mkdirSync(dirname(path), { recursive: true });
  }
  const auth = o.authToken ? { authToken: o.authToken } : {};
  // One connection per client (`concurrency: 1`): PRAGMAs hold for every statement, and the writer's
  // queue is the only user of its connection.
  const writer = createClient({ url, ...auth, ...(path !== null ? { timeout: WRITE_BUSY_TIMEOUT_MS, concurrency: 1 } : {}) });
  // journal_mode is stored in the file; synchronous and foreign_keys are per connection (FULL is
  // libSQL's default, asserted here and checked by tests/integration/durability.test.ts).
  if (url.startsWith('file:')) await writer.execute('PRAGMA journal_mode = WAL');
  const syncMode = o.sync ?? (process.env.ARMILLA_DB_SYNC === 'full' ? 'full' : 'fsync-off-loop');
  const offLoop = path !== null && syncMode === 'fsync-off-loop';
  const setUpWriter = async () => {
    if (url.startsWith('file:')) await writer.execute(`PRAGMA synchronous = ${offLoop ? 'NORMAL' : 'FULL'}`);
    await writer.execute('PRAGMA foreign_keys = ON');
  };
  await setUpWriter();
  let reader = writer;
  if (path !== null) {
    reader = createClient({ url, timeout: READ_BUSY_TIMEOUT_MS, concurrency: 1 });
    await reader.execute('PRAGMA query_only = ON');
  }
  const raw: RawDb = drizzle(writer, { schema, casing: 'snake_case' });
  const readDb: RawDb = drizzle(reader, { schema, casing: 'snake_case' });
  const reads = preparedReads(url, reader, READ_BUSY_TIMEOUT_MS);

  const syncer = offLoop ? fileSyncer(`${path}-wal`) : null;
  // Local file: every write transaction goes through the queue (see write-queue.ts).
  const queue =
    path !== null
      ? writeQueue(writer, {
          maxBatchJobs: groupCommit ? undefined : 1,
          reopen: async () => {
            await writer.reconnect();
            await setUpWriter();
          },
          ...(syncer ? { sync: syncer.sync } : {}),
        })
      : null;
  const jobClient = {
    transaction: () => queue!.transaction(),
  } as unknown as Client;
  const jobs: RawDb = queue ? drizzle(jobClient, { schema, casing: 'snake_case' }) : raw;
  const stats: WriteStats = queue?.stats ?? { batches: 0, jobs: 0, largestBatch: 0 };

  async function write<T>(fn: (tx: Tx) => Promise<T>): Promise<T> {
    guard('write');
    const started = Date.now();
    for (let attempt = 0; ; attempt++) {
      const store = { open: true };
      try {
        return await inside.run(store, () => jobs.transaction(fn));
      } catch (e) {
        if (!isBusy(e)) throw e;
        const waited = Date.now() - started;
        if (waited >= busyBudgetMs) {
          console.warn(`[db] a write gave up after ${waited} ms of SQLITE_BUSY (${attempt + 1} tries)`);
          throw new DatabaseBusyError(waited, e);
        }
        // jittered back-off, asynchronous: the event loop serves other requests meanwhile
        await new Promise((r) => setTimeout(r, Math.min(100, 5 + attempt * 10) * (0.5 + Math.random())));
      } finally {
        store.open = false;
      }
    }
  }

  const exclusive = <T>(fn: (rawDb: RawDb, client: Client) => Promise<T>): Promise<T> => {
    guard('exclusive');
    return queue ? queue.alone(() => fn(raw, writer)) : fn(raw, writer);
  };

  /** A read builder of the read handle, refused inside a transaction's callback. */
  const read =
    <K extends keyof ReadMethods>(k: K) =>
    (...args: unknown[]) => {
      guard('read');
      return (readDb[k] as (...a: unknown[]) => unknown).apply(readDb, args);
    };

  const db = {
    select: read('select'),
    selectDistinct: read('selectDistinct'),
    $count: read('$count'),
    all: read('all'),
    get: read('get'),
    values: read('values'),
    get query() {
      guard('read');
      return readDb.query;
    },
    write,
    transaction: write,
    exclusive,
    writeStats: stats,
    close() {
      syncer?.close();
      reads.close();
      if (reader !== writer) reader.close();
      writer.close();
    },
  } as unknown as Database;
  registerPreparedReads(db, reads);
  return db;
}

/**
 * fsync of a file on libuv's thread pool (the event loop goes on meanwhile). fsync applies to the
 * file, not the descriptor, so this flushes what SQLite's connection wrote to it. The file stays open
 * between calls; it is opened again if it was deleted meanwhile (SQLite deletes the WAL only when the
 * last connection to the database closes).
 */
function fileSyncer(file: string) {
  let handle: FileHandle | null = null;
  return {
    async sync(): Promise<void> {
      if (handle && fstatSync(handle.fd).nlink === 0) {
        await handle.close().catch(() => {});
        handle = null;
      }
      handle ??= await open(file, 'r');
      await handle.sync();
    },
    close() {
      void handle?.close().catch(() => {});
      handle = null;
    },
  };
}

const isTx = (db: DbOrTx): db is Tx => typeof (db as Tx).rollback === 'function';

/**
 * A write step of a service: on the app's handle, its own transaction (`db.write`, with the retry);
 * inside a caller's transaction, a savepoint of it (fails alone, commits with the caller).
 */
export function writeTx<T>(db: DbOrTx, fn: (tx: Tx) => Promise<T>): Promise<T> {
  return isTx(db) ? db.transaction(fn) : db.write(fn);
}
