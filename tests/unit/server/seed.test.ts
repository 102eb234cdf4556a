import { afterAll, beforeAll, expect, test } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { sql } from 'drizzle-orm';
import { openDb, type Database } from '../../../src/lib/server/db/client';
import { migrateDb } from '../../../src/lib/server/db/migrate';
import { seedDemo } from '../../../src/lib/server/seed';
import { verifyPassword } from '../../../src/lib/server/auth/password';

// Expected accounts: the API contract's "Demo accounts" list (/work/shared/api-contract.md).
let dir: string;
let db: Database;
beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'armilla-seed-'));
  db = await openDb(`file:${join(dir, 'seed.db')}`);
  await migrateDb(db);
}, 60_000);
afterAll(() => {
  db?.close();
  rmSync(dir, { recursive: true, force: true });
});

const q = async (query: string) => db.all<Record<string, unknown>>(sql.raw(query));

test('seeds exactly the contract accounts and teams on an empty database, then never again', async () => {
  expect(await seedDemo(db)).toBe(true);
  const rows = await q(
    'select u.email, t.name as team, m.role from memberships m join users u on u.id = m.user_id join teams t on t.id = m.team_id order by u.email',
  );
  expect(rows).toEqual([
    { email: 'editor@larkspur.example', team: 'Larkspur Ridge Observatory', role: 'editor' },
    { email: 'outsider@elsewhere.example', team: 'Elsewhere Skywatchers', role: 'owner' },
    { email: 'owner@larkspur.example', team: 'Larkspur Ridge Observatory', role: 'owner' },
    { email: 'reviewer@larkspur.example', team: 'Larkspur Ridge Observatory', role: 'reviewer' },
    { email: 'viewer@larkspur.example', team: 'Larkspur Ridge Observatory', role: 'viewer' },
  ]);
  const hash = String((await q("select password_hash from users where email = 'viewer@larkspur.example'"))[0]!.password_hash);
  expect(await verifyPassword(hash, 'armilla-demo')).toBe(true);

  const before = await q('select count(*) as n from users');
  expect(await seedDemo(db)).toBe(false);
  expect(await q('select count(*) as n from users')).toEqual(before);
}, 60_000);

test('a database that has any user is left alone', async () => {
  await db.write((tx) => tx.run(sql`delete from memberships`));
  expect(await seedDemo(db)).toBe(false);
  expect(await q('select count(*) as n from memberships')).toEqual([{ n: 0 }]);
}, 60_000);
