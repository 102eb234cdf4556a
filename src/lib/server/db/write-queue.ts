import type { Client, InArgs, InStatement, Transaction } from '@libsql/client';

/**
 * The one writer of a process: every write transaction of the application, queued behind one async
 * lock, on the one connection of a private client (see README.md, "Decision").
 *
 * @libsql/client waits for SQLite's locks synchronously, so two write transactions open at once in one
 * process dead-lock the event loop until SQLITE_BUSY. Queuing them removes that; the busy timeout and the
 * retry in `Database.write` arbitrate between processes sharing the file.
 *
 * Group commit (an option, on by default). With `synchronous = FULL` every COMMIT waits for an fsync of
 * the WAL (≈ 2 ms here, on the event loop: the driver is synchronous). So the jobs queued behind the
 * lock run in one SQLite transaction, a batch: each job is a SAVEPOINT inside it, released when the job
 * commits and rolled back on its own when the job fails, so every job still succeeds or fails alone.
 * A job's `commit()` resolves only after the batch's COMMIT has returned: nobody is told "saved" before
 * the write is durable. If the COMMIT fails, or SQLite abandons the transaction (disk full, I/O error),
 * every job of the batch gets the error. A batch takes the jobs waiting when it starts and those that
 * arrive while it runs (it looks once more after one turn of the event loop), up to `maxBatchJobs` jobs
 * or `maxBatchMs`. `maxBatchJobs: 1` turns group commit off (one BEGIN … COMMIT per job).
 */
export const MAX_BATCH_JOBS = 64;
export const MAX_BATCH_MS = 10;

const SAVEPOINT = 'armilla_job';

export interface WriteStats {
  batches: number;
  jobs: number;
  largestBatch: number;
}

export interface WriteQueueOptions {
  maxBatchJobs?: number;
  maxBatchMs?: number;
  /**
   * Replaces the connection after a BEGIN that failed (SQLITE_BUSY). Needed: the `libsql` driver does
   * not reset a statement that failed, and SQLite then refuses every later SAVEPOINT on that connection
   * ("cannot open savepoint - SQL statements in progress") until the statement is garbage-collected.
   */
  reopen?: () => Promise<void>;
  /**
   * Makes a committed batch durable before its jobs are told (see client.ts, "sync"): called after
   * each COMMIT; the jobs are answered when it resolves, and the next batch does not wait for it.
   */
  sync?: () => Promise<void>;
}

export interface WriteQueue {
  /** A write transaction of the application: a savepoint of the current batch, in queue order. */
  transaction(): Promise<Transaction>;
  /** Runs `fn` alone between batches (migrations, PRAGMA, VACUUM): nothing else writes meanwhile. */
  alone<T>(fn: () => Promise<T>): Promise<T>;
  readonly stats: WriteStats;
}

/** Told how the batch of a finished job ended: committed, or failed / lost with an error. */
type Ack = { committed: () => void; failed: (e: unknown) => void };
type Entry =
  | { kind: 'alone'; run: () => Promise<unknown> }
  | { kind: 'job'; start: (tx: Transaction) => Promise<Ack>; fail: (e: unknown) => void };

class BatchLost extends Error {
  constructor(cause: unknown) {
    super('The write was not saved: the database abandoned the transaction it was part of.', { cause });
  }
}

export function writeQueue(client: Client, opts: WriteQueueOptions = {}): WriteQueue {
  const maxJobs = Math.max(1, opts.maxBatchJobs ?? MAX_BATCH_JOBS);
  const maxMs = opts.maxBatchMs ?? MAX_BATCH_MS;
  const stats: WriteStats = { batches: 0, jobs: 0, largestBatch: 0 };
  const queue: Entry[] = [];
  let running = false;

  const pump = () => {
    if (running || queue.length === 0) return;
    running = true;
    const next = () => {
      running = false;
      pump();
    };
    const head = queue[0];
    if (head.kind === 'alone') {
      queue.shift();
      head.run().then(next, next);
    } else {
      runBatch().then(next, next);
    }
  };
  const enqueue = (e: Entry) => {
    queue.push(e);
    pump();
  };

  async function runBatch(): Promise<void> {
    let tx: Transaction;
    try {
      tx = await client.transaction('write');
    } catch (e) {
      await opts.reopen?.().catch((err) => console.error('[db] could not reopen the writer connection', err));
      // BEGIN IMMEDIATE failed (another process holds the lock past the busy timeout): every waiting
      // job gets the error at once (Database.write retries each after a back-off) instead of each
      // waiting out the busy timeout in turn.
      for (let i = 0; i < queue.length; ) {
        const entry = queue[i]!;
        if (entry.kind === 'job') {
          queue.splice(i, 1);
          entry.fail(e);
        } else i++;
      }
      return;
    }
    const acks: Ack[] = [];
    const started = Date.now();
    let jobs = 0;
    let lost: unknown = null;
    for (;;) {
      if (queue.length === 0 && maxJobs > 1) await new Promise((r) => setImmediate(r));
      const head = queue[0];
      if (!head || head.kind !== 'job') break;
      // the first job always runs (a slow BEGIN must not starve it)
      if (jobs > 0 && (jobs >= maxJobs || Date.now() - started > maxMs)) break;
      queue.shift();
      jobs++;
      acks.push(await head.start(tx));
      if (tx.closed) {
        lost = new BatchLost(null);
        break;
      }
    }
    stats.batches++;
    stats.jobs += jobs;
    stats.largestBatch = Math.max(stats.largestBatch, jobs);
    if (lost) {
      tx.close();
      for (const a of acks) a.failed(lost);
      return;
    }
    try {
      await tx.commit();
    } catch (e) {
      // The client rolls the connection back before it is used again (a failed COMMIT, say a deferred
      // foreign key, leaves SQLite's transaction open); make sure, then tell every job of the batch.
      tx.close();
      for (const a of acks) a.failed(e);
      return;
    }
    if (!opts.sync) {
      for (const a of acks) a.committed();
      return;
    }
    // The next batch starts while this one's fsync runs off the event loop; its jobs hear when it is done.
    opts.sync().then(
      () => acks.forEach((a) => a.committed()),
      (e) => {
        const err = new Error('The write was committed but could not be made durable (fsync of the write-ahead log failed).', { cause: e });
        acks.forEach((a) => a.failed(err));
      },
    );
  }

  const transaction = (): Promise<Transaction> =>
    new Promise<Transaction>((resolveTx, rejectTx) => {
      enqueue({
        kind: 'job',
        fail: rejectTx,
        start: async (tx) => {
          try {
            await tx.execute(`SAVEPOINT ${SAVEPOINT}`);
          } catch (e) {
            rejectTx(e);
            return NO_ACK;
          }
          return new Promise<Ack>((finish) => resolveTx(savepointTransaction(tx, finish)));
        },
      });
    });

  const alone = <T>(fn: () => Promise<T>): Promise<T> =>
    new Promise<T>((resolve, reject) => {
      enqueue({
        kind: 'alone',
        run: () => {
          const p = fn();
          p.then(resolve, reject);
          return p;
        },
      });
    });

  return { transaction, alone, stats };
}

const statementOf = (stmt: InStatement, args?: InArgs): InStatement =>
  args === undefined ? stmt : { sql: stmt as string, args };

function rollbackQuietly(tx: Transaction) {
  // Both statements run synchronously in the driver; a lost transaction has no savepoint left.
  tx.execute(`ROLLBACK TO ${SAVEPOINT}`).catch(() => {});
  tx.execute(`RELEASE ${SAVEPOINT}`).catch(() => {});
}

const NO_ACK: Ack = { committed: () => {}, failed: () => {} };

/**
 * The application's view of its savepoint. `commit()` releases the savepoint and resolves once the
 * batch has committed (rejects if it did not); `rollback()` undoes the job's changes only and resolves
 * when the batch has ended, so that what the caller reads next (say, the winner of a version race in
 * the same batch) is committed state; `close()` undoes at once.
 */
function savepointTransaction(tx: Transaction, finish: (ack: Ack) => void): Transaction {
  let open = true;
  const check = () => {
    if (!open) throw new Error('The transaction is closed');
  };
  /** Undoes the job; the promise resolves when the batch has ended. */
  const undo = (): Promise<void> => {
    if (!open) return Promise.resolve();
    open = false;
    rollbackQuietly(tx);
    return new Promise<void>((resolve) => finish({ committed: resolve, failed: () => resolve() }));
  };
  const view: Transaction = {
    async execute(stmt: InStatement | string, args?: InArgs) {
      check();
      return tx.execute(statementOf(stmt, args));
    },
    async batch(stmts: Array<InStatement>) {
      check();
      return tx.batch(stmts);
    },
    async executeMultiple(sql: string) {
      check();
      return tx.executeMultiple(sql);
    },
    async commit() {
      check();
      try {
        await tx.execute(`RELEASE ${SAVEPOINT}`);
      } catch (e) {
        await undo();
        throw e;
      }
      open = false;
      return new Promise<void>((resolve, reject) => finish({ committed: resolve, failed: reject }));
    },
    rollback() {
      return undo();
    },
    close() {
      void undo();
    },
    get closed() {
      return !open;
    },
  } as Transaction;
  return view;
}
