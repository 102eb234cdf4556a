/**
 * The demo world that `npm start` creates on an empty database (API contract, "Demo accounts").
 * All people, teams and addresses are invented; addresses use the reserved `.example` domain.
 * Runs outside Astro (runtime/start.ts, the test harness), so it imports no astro:* module.
 */
import { sql } from 'drizzle-orm';
import { nanoid } from 'nanoid';
import { audit } from './audit';
import { hashPassword } from './auth/password';
import type { Db } from './db/client';
import { memberships, teams, users, type Role } from './db/schema';
import { seedDemoScenes } from './seed-scenes';

export const DEMO_PASSWORD = 'armilla-demo';
export const DEMO_TEAM = 'Larkspur Ridge Observatory';
export const OTHER_TEAM = 'Elsewhere Skywatchers';

const PEOPLE = {
  owner: { email: 'owner@larkspur.example', name: 'Ines Calloway', role: 'owner' },
  editor: { email: 'editor@larkspur.example', name: 'Tomas Reyland', role: 'editor' },
  reviewer: { email: 'reviewer@larkspur.example', name: 'Priya Hallow', role: 'reviewer' },
  viewer: { email: 'viewer@larkspur.example', name: 'Jonah Beck', role: 'viewer' },
  outsider: { email: 'outsider@elsewhere.example', name: 'Odile Marchetti', role: 'owner' },
} as const satisfies Record<string, { email: string; name: string; role: Role }>;

type Who = keyof typeof PEOPLE;

/** Seeds the demo on a database without users and returns true; otherwise touches nothing and returns false. */
export async function seedDemo(db: Db): Promise<boolean> {
  const count = async () => Number((await db.select({ n: sql<number>`count(*)` }).from(users))[0]?.n ?? 0);
  if ((await count()) > 0) return false;
  const who = Object.keys(PEOPLE) as Who[];
  // Hash before the transaction: scrypt is slow and the write lock should be short.
  const hashes = await Promise.all(who.map(() => hashPassword(DEMO_PASSWORD)));
  const ids = Object.fromEntries(who.map((w) => [w, nanoid()])) as Record<Who, string>;
  const teamId = nanoid();
  const otherTeamId = nanoid();
  const now = new Date();
  return db.transaction(async (tx) => {
    // Re-check inside the write transaction: two processes starting on one empty file seed once.
    const again = await tx.select({ n: sql<number>`count(*)` }).from(users);
    if (Number(again[0]?.n ?? 0) > 0) return false;
    await tx.insert(users).values(who.map((w, i) => ({ id: ids[w], email: PEOPLE[w].email, name: PEOPLE[w].name, passwordHash: hashes[i]!, createdAt: now, emailVerifiedAt: now })));
    await tx.insert(teams).values([
      { id: teamId, name: DEMO_TEAM, createdAt: now },
      { id: otherTeamId, name: OTHER_TEAM, createdAt: now },
    ]);
    await tx.insert(memberships).values(
      who.map((w) => ({ teamId: w === 'outsider' ? otherTeamId : teamId, userId: ids[w], role: PEOPLE[w].role, createdAt: now })),
    );
    await audit(tx, { teamId, userId: ids.owner, action: 'demo.seed', detail: { members: 4 } });
    await seedDemoScenes(tx, { teamId, otherTeamId, users: ids });
    return true;
  });
}
