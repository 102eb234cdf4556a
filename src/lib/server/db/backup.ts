/**
 * `npm run backup [-- target.db]`: an online, consistent copy of the SQLite database with VACUUM INTO.
 * Safe while the app runs (readers and the writer keep going). Restore: stop the app, replace the
 * database file with the copy (delete any -wal/-shm files beside it), start the app.
 */
import { createClient } from '@libsql/client';
import { existsSync, mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { z } from 'zod';

const env = z.object({ DATABASE_URL: z.string().default('file:./data/armilla.db') }).parse(process.env);
if (!env.DATABASE_URL.startsWith('file:')) {
  console.error('backup: DATABASE_URL is not a local file; back up a libSQL server with its own tools.');
  process.exit(2);
}
const stamp = new Date().toISOString().replace(/[:.]/g, '-');
const target = resolve(process.argv[2] ?? `data/backups/armilla-${stamp}.db`);
if (existsSync(target)) {
  console.error(`backup: ${target} exists; choose another name.`);
  process.exit(2);
}
mkdirSync(dirname(target), { recursive: true });
const client = createClient({ url: env.DATABASE_URL });
await client.execute('PRAGMA busy_timeout = 5000');
await client.execute({ sql: 'VACUUM INTO ?', args: [target] });
const check = createClient({ url: `file:${target}` });
const ok = await check.execute('PRAGMA integrity_check');
console.log(`backup written to ${target} (integrity: ${String(ok.rows[0]?.[0])})`);
client.close();
check.close();
