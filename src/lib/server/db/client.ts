import { createClient, type Client } from '@libsql/client';
import { drizzle, type LibSQLDatabase } from 'drizzle-orm/libsql';
import * as schema from './schema';
import { serialiseWrites } from './write-lock';
import { preparedReads, registerPreparedReads } from './prepared';

export type Db = LibSQLDatabase<typeof schema>;
/** A transaction handle; services accept `Db | Tx`. */
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
export type DbOrTx = Db | Tx;

export const DEFAULT_DATABASE_URL = 'file:./data/armilla.db';
const BUSY_TIMEOUT_MS = 5000;

export interface DbHandle {
  db: Db;
  client: Client;
}

/**
 * One client per process. For a local file we switch on WAL (readers never block the writer),
 * synchronous=FULL (an acknowledged write survives a power cut, not only a process crash: the
 * durability promise of the product outweighs the few ms per commit), foreign keys, and a busy
 * timeout so that several app instances on one file queue instead of failing.
 */
export async function openDb(url = DEFAULT_DATABASE_URL, authToken?: string): Promise<DbHandle> {
  if (url.startsWith('file:')) {
    const { mkdirSync } = await import('node:fs');
    const { dirname } = await import('node:path');
    const path = url.slice('file:'.length);
    if (path && path !== ':memory:') mkdirSync(dirname(path), { recursive: true });
  }
  // `timeout` is the busy timeout of every connection in the client's pool (a PRAGMA would reach only one).
  const raw = createClient({ url, ...(authToken ? { authToken } : {}), timeout: BUSY_TIMEOUT_MS });
  const client = url.startsWith('file:') ? serialiseWrites(raw) : raw;
  if (url.startsWith('file:')) {
    // journal_mode is stored in the file; synchronous is per connection and FULL is libSQL's default,
    // asserted here and checked by tests/integration/durability.test.ts.
    await client.execute('PRAGMA journal_mode = WAL');
    await client.execute('PRAGMA synchronous = FULL');
  }
  await client.execute('PRAGMA foreign_keys = ON');
  const db = drizzle(client, { schema, casing: 'snake_case' });
  // Statements prepared once for the hottest reads (prepared.ts); closed with the client.
  const reads = preparedReads(url, client, BUSY_TIMEOUT_MS);
  registerPreparedReads(db, reads);
  const closing = new Proxy(client, {
    get(target, prop) {
      if (prop === 'close') {
        return () => {
          reads.close();
          target.close();
        };
      }
      const v = Reflect.get(target, prop, target);
      return typeof v === 'function' ? v.bind(target) : v;
    },
  });
  return { db, client: closing };
}
