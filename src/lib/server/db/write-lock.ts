import type { Client, Transaction } from '@libsql/client';

/**
 * Serialises this process's writes to a local SQLite file.
 *
 * @libsql/client gives each transaction its own pooled connection, and its driver waits for a lock
 * synchronously. Two write transactions in one process therefore dead-lock the event loop: the second
 * one blocks Node for the whole busy timeout while the first cannot run to its COMMIT, and then fails
 * with SQLITE_BUSY. Queuing every write (and every transaction) of the process behind one async lock
 * removes that; the busy timeout still arbitrates between processes sharing the file, where the lock
 * holder runs on its own event loop. Reads go straight through: WAL readers never wait for writers.
 */
export function serialiseWrites(client: Client): Client {
  let tail: Promise<void> = Promise.resolve();
  const acquire = async (): Promise<() => void> => {
    let release!: () => void;
    const next = new Promise<void>((r) => (release = r));
    const prev = tail;
    tail = prev.then(() => next);
    await prev;
    let done = false;
    return () => {
      if (!done) {
        done = true;
        release();
      }
    };
  };
  const locked = async <T>(fn: () => Promise<T>): Promise<T> => {
    const release = await acquire();
    try {
      return await fn();
    } finally {
      release();
    }
  };
  const isRead = (stmt: unknown): boolean => {
    const sql = typeof stmt === 'string' ? stmt : (stmt as { sql?: string } | null)?.sql;
    return typeof sql === 'string' && /^\s*(select|with\s[\s\S]*?\)\s*select|explain)\b/i.test(sql);
  };

  return new Proxy(client, {
    get(target, prop, receiver) {
      switch (prop) {
        case 'execute':
          return (stmt: never, args?: never) =>
            isRead(stmt) ? target.execute(stmt, args) : locked(() => target.execute(stmt, args));
        case 'batch':
          return (stmts: never, mode?: never) => locked(() => target.batch(stmts, mode));
        case 'migrate':
          return (stmts: never) => locked(() => target.migrate(stmts));
        case 'executeMultiple':
          return (sql: string) => locked(() => target.executeMultiple(sql));
        case 'transaction':
          return async (mode?: never): Promise<Transaction> => {
            const release = await acquire();
            let tx: Transaction;
            try {
              tx = await target.transaction(mode);
            } catch (e) {
              release();
              throw e;
            }
            return new Proxy(tx, {
              get(t, p) {
                const v = Reflect.get(t, p, t);
                if (p === 'commit' || p === 'rollback') {
                  return async () => {
                    try {
                      return await (v as () => Promise<void>).call(t);
                    } finally {
                      release();
                    }
                  };
                }
                if (p === 'close') {
                  return () => {
                    try {
                      (v as () => void).call(t);
                    } finally {
                      release();
                    }
                  };
                }
                return typeof v === 'function' ? v.bind(t) : v;
              },
            });
          };
        default: {
          const v = Reflect.get(target, prop, receiver);
          return typeof v === 'function' ? v.bind(target) : v;
        }
      }
    },
  });
}
