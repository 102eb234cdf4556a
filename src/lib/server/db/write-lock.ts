import type { Client, InStatement, InArgs, ResultSet, Transaction, TransactionMode } from '@libsql/client';

/**
 * Serialises this process's writes to a local SQLite file, and commits them in groups.
 *
 * @libsql/client gives each transaction its own pooled connection, and its driver waits for a lock
 * synchronously. Two write transactions in one process therefore dead-lock the event loop: the second
 * one blocks Node for the whole busy timeout while the first cannot run to its COMMIT, and then fails
 * with SQLITE_BUSY. Queuing every write (and every transaction) of the process behind one async lock
 * removes that; the busy timeout still arbitrates between processes sharing the file, where the lock
 * holder runs on its own event loop. Reads go straight through: WAL readers never wait for writers.
 *
 * Group commit. With `synchronous = FULL` every COMMIT waits for an fsync of the WAL (about 2 ms on the
 * reference machine, spent on the event loop: the driver is synchronous), which made the fsync the
 * larger part of a save. So the writes queued behind the lock run in one SQLite transaction, a batch:
 * each write transaction of the application (and each single write statement) is a SAVEPOINT inside
 * it, released when the job commits and rolled back on its own when the job fails or rolls back, so
 * every job still succeeds or fails alone. A job's `commit()` resolves only after the batch's one
 * COMMIT has returned, so nobody is told "saved" before the write is durable: the same promise as one
 * transaction per job, with one fsync for many. If the COMMIT fails, or SQLite abandons the whole
 * transaction (disk full, I/O error), every job of the batch that had not been acknowledged gets the
 * error. A batch takes the jobs already waiting when it starts and those that arrive while it runs
 * (it looks once more after one turn of the event loop), up to MAX_BATCH_JOBS jobs or MAX_BATCH_MS.
 * Statements that cannot run inside a transaction (PRAGMA, VACUUM, the driver's batch and migrate,
 * read or deferred transactions) run alone between batches, in queue order.
 */
export const MAX_BATCH_JOBS = 64;
export const MAX_BATCH_MS = 10;

const SAVEPOINT = 'armilla_job';

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

export interface WriteStats {
  batches: number;
  jobs: number;
  largestBatch: number;
}

export function serialiseWrites(client: Client, stats?: WriteStats): Client {
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
      // BEGIN IMMEDIATE failed (e.g. another process holds the lock past the busy timeout): the first
      // job gets the error (writeTx retries it); the others try again with a batch of their own.
      (queue.shift() as Extract<Entry, { kind: 'job' }>).fail(e);
      return;
    }
    const acks: Ack[] = [];
    const started = Date.now();
    let jobs = 0;
    let lost: unknown = null;
    for (;;) {
      if (queue.length === 0) await new Promise((r) => setImmediate(r));
      const head = queue[0];
      if (!head || head.kind !== 'job') break;
      // the first job always runs (a slow BEGIN must not starve it)
      if (jobs > 0 && (jobs >= MAX_BATCH_JOBS || Date.now() - started > MAX_BATCH_MS)) break;
      queue.shift();
      jobs++;
      acks.push(await head.start(tx));
      if (tx.closed) {
        lost = new BatchLost(null);
        break;
      }
    }
    if (stats) {
      stats.batches++;
      stats.jobs += jobs;
      stats.largestBatch = Math.max(stats.largestBatch, jobs);
    }
    if (lost) {
      tx.close();
      for (const a of acks) a.failed(lost);
      return;
    }
    try {
      await tx.commit();
    } catch (e) {
      for (const a of acks) a.failed(e);
      return;
    }
    for (const a of acks) a.committed();
  }

  /** A transaction of the application: a savepoint of the current batch. */
  const jobTransaction = (): Promise<Transaction> =>
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

  /** A single write statement outside a transaction: a savepoint of its own in the current batch. */
  const jobStatement = (stmt: InStatement, args?: InArgs): Promise<ResultSet> =>
    new Promise<ResultSet>((resolve, reject) => {
      enqueue({
        kind: 'job',
        fail: reject,
        start: async (tx) => {
          let result: ResultSet;
          try {
            await tx.execute(`SAVEPOINT ${SAVEPOINT}`);
            result = await tx.execute(statementOf(stmt, args));
            await tx.execute(`RELEASE ${SAVEPOINT}`);
          } catch (e) {
            rollbackQuietly(tx);
            // answered when the batch ends, like the others: what the caller reads next is committed
            return { committed: () => reject(e), failed: () => reject(e) };
          }
          return { committed: () => resolve(result), failed: reject };
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

  /** A read or deferred transaction: alone, holding the queue until it ends. */
  const aloneTransaction = (mode: TransactionMode): Promise<Transaction> =>
    new Promise<Transaction>((resolveTx, rejectTx) => {
      enqueue({
        kind: 'alone',
        run: () =>
          new Promise<void>((release) => {
            client.transaction(mode).then(
              (tx) => resolveTx(releasingTransaction(tx, release)),
              (e) => {
                rejectTx(e);
                release();
              },
            );
          }),
      });
    });

  const isRead = (stmt: unknown): boolean => {
    const sql = typeof stmt === 'string' ? stmt : (stmt as { sql?: string } | null)?.sql;
    return typeof sql === 'string' && /^\s*(select|with\s[\s\S]*?\)\s*select|explain)\b/i.test(sql);
  };
  /** Plain data changes may share a batch; anything else (PRAGMA, VACUUM, DDL) runs alone. */
  const isDataChange = (stmt: unknown): boolean => {
    const sql = typeof stmt === 'string' ? stmt : (stmt as { sql?: string } | null)?.sql;
    return typeof sql === 'string' && /^\s*(insert|update|delete|replace)\b/i.test(sql);
  };

  return new Proxy(client, {
    get(target, prop, receiver) {
      switch (prop) {
        case 'execute':
          return (stmt: InStatement, args?: InArgs) => {
            if (isRead(stmt)) return args === undefined ? target.execute(stmt) : target.execute(stmt as string, args);
            if (isDataChange(stmt)) return jobStatement(stmt, args);
            return alone(() => (args === undefined ? target.execute(stmt) : target.execute(stmt as string, args)));
          };
        case 'batch':
          return (stmts: never, mode?: never) => alone(() => target.batch(stmts, mode));
        case 'migrate':
          return (stmts: never) => alone(() => target.migrate(stmts));
        case 'executeMultiple':
          return (sql: string) => alone(() => target.executeMultiple(sql));
        case 'transaction':
          return (mode?: TransactionMode) => (mode === undefined || mode === 'write' ? jobTransaction() : aloneTransaction(mode));
        default: {
          const v = Reflect.get(target, prop, receiver);
          return typeof v === 'function' ? v.bind(target) : v;
        }
      }
    },
  });
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

/** A transaction that releases the queue when it ends. */
function releasingTransaction(tx: Transaction, release: () => void): Transaction {
  let done = false;
  const once = () => {
    if (!done) {
      done = true;
      release();
    }
  };
  return new Proxy(tx, {
    get(t, p) {
      const v = Reflect.get(t, p, t);
      if (p === 'commit' || p === 'rollback') {
        return async () => {
          try {
            return await (v as () => Promise<void>).call(t);
          } finally {
            once();
          }
        };
      }
      if (p === 'close') {
        return () => {
          try {
            (v as () => void).call(t);
          } finally {
            once();
          }
        };
      }
      return typeof v === 'function' ? v.bind(t) : v;
    },
  });
}
