import Database from 'libsql';
import type { Client } from '@libsql/client';

/**
 * Statements prepared once, for the hottest reads (a share link's lookup on every viewer's poll).
 *
 * @libsql/client prepares every statement anew: for the three-table lookup of a share link that costs
 * about 70 µs, and reading the column names and copying the row about as much again — more than
 * SQLite needs to run the query. For a local file this keeps one extra read connection per process
 * (the `libsql` driver under @libsql/client) with its statements prepared once and rows returned as
 * plain arrays. Reads only, outside transactions: like every read of the client, each one sees the
 * last committed state of the file (WAL), and a statement is reset after each use so it holds no
 * snapshot. For anything but a plain file path (memory, remote) it falls back to the client.
 */
export interface PreparedReads {
  /** Rows of `sql` (positional `?` arguments) as arrays of column values, in select order. */
  all(sql: string, args: unknown[]): Promise<unknown[][]>;
  close(): void;
}

const readers = new WeakMap<object, PreparedReads>();

/** The prepared reads of a database handle (registered by openDb), or undefined for a transaction. */
export const preparedReadsOf = (db: object): PreparedReads | undefined => readers.get(db);
export const registerPreparedReads = (db: object, reads: PreparedReads) => readers.set(db, reads);

/** A file path that a second connection can open, or null (memory databases, URL options). */
export function localPath(url: string): string | null {
  if (!url.startsWith('file:') || url.includes('?')) return null;
  let path = url.slice('file:'.length);
  if (path.startsWith('//')) path = path.slice(2);
  if (!path || path === ':memory:' || path.startsWith(':memory:')) return null;
  return path;
}

export function preparedReads(url: string, client: Client, timeoutMs: number): PreparedReads {
  const path = localPath(url);
  if (path === null) {
    return {
      async all(sql, args) {
        const r = await client.execute({ sql, args: args as never });
        return r.rows.map((row) => Array.from(row as ArrayLike<unknown>));
      },
      close() {},
    };
  }
  let conn: Database.Database | null = null;
  const statements = new Map<string, Database.Statement>();
  return {
    async all(sql, args) {
      if (!conn) {
        conn = new Database(path, { timeout: timeoutMs } as Database.Options);
        // reads only: SQLite itself refuses a write on this connection
        conn.exec('PRAGMA query_only = ON');
      }
      let stmt = statements.get(sql);
      if (!stmt) {
        stmt = conn.prepare(sql);
        stmt.raw(true);
        statements.set(sql, stmt);
      }
      return stmt.all(args) as unknown[][];
    },
    close() {
      statements.clear();
      conn?.close();
      conn = null;
    },
  };
}
