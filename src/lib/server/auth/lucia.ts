import { Lucia, type DatabaseSession, type DatabaseUser } from 'lucia';
import { eq, lte, sql } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/libsql';
import { preparedReadsOf } from '../db/prepared';
import { DrizzleSQLiteAdapter } from '@lucia-auth/adapter-drizzle';
import { db } from '../db';
import { sessions, users } from '../db/schema';

/**
 * The drizzle adapter, with the lookup every signed-in request makes done in one statement prepared
 * once (db/prepared.ts) instead of two built and prepared per request, and its writes through the
 * database module's write path (`db.write`). Sessions are still read from the database on every
 * request, so ending one takes effect at once on every instance.
 */
class SessionAdapter extends DrizzleSQLiteAdapter {
  override async setSession(s: DatabaseSession): Promise<void> {
    await db.write((tx) => tx.insert(sessions).values({ id: s.id, userId: s.userId, expiresAt: Math.floor(s.expiresAt.getTime() / 1000) }));
  }
  override async updateSessionExpiration(sessionId: string, expiresAt: Date): Promise<void> {
    await db.write((tx) => tx.update(sessions).set({ expiresAt: Math.floor(expiresAt.getTime() / 1000) }).where(eq(sessions.id, sessionId)));
  }
  override async deleteSession(sessionId: string): Promise<void> {
    await db.write((tx) => tx.delete(sessions).where(eq(sessions.id, sessionId)));
  }
  override async deleteUserSessions(userId: string): Promise<void> {
    await db.write((tx) => tx.delete(sessions).where(eq(sessions.userId, userId)));
  }
  override async deleteExpiredSessions(): Promise<void> {
    await db.write((tx) => tx.delete(sessions).where(lte(sessions.expiresAt, Math.floor(Date.now() / 1000))));
  }

  override async getSessionAndUser(sessionId: string): Promise<[DatabaseSession | null, DatabaseUser | null]> {
    const reads = preparedReadsOf(db);
    if (!reads) return super.getSessionAndUser(sessionId);
    const r = (await reads.all(SESSION_LOOKUP_SQL, [sessionId]))[0];
    if (!r) return [null, null];
    const [id, userId, expiresAtUnix, email, name] = r as [string, string, number, string, string];
    return [
      { id, userId, expiresAt: new Date(Number(expiresAtUnix) * 1000), attributes: {} },
      { id: userId, attributes: { email, name } },
    ];
  }
}

const SESSION_LOOKUP_SQL = drizzle
  .mock({ casing: 'snake_case' })
  .select({ id: sessions.id, userId: sessions.userId, expiresAt: sessions.expiresAt, email: users.email, name: users.name })
  .from(sessions)
  .innerJoin(users, eq(users.id, sessions.userId))
  .where(eq(sessions.id, sql.placeholder('id')))
  .toSQL().sql;

// lucia v3 is frozen upstream; it is used only inside src/lib/server/auth/ so it can be swapped out.
const adapter = new SessionAdapter(db as never, sessions, users);

export const lucia = new Lucia(adapter, {
  sessionCookie: {
    name: 'armilla_session',
    attributes: { secure: import.meta.env.PROD && process.env.INSECURE_COOKIES !== '1', sameSite: 'lax', path: '/' },
  },
  getUserAttributes: (attrs) => ({ email: attrs.email, name: attrs.name }),
});

declare module 'lucia' {
  interface Register {
    Lucia: typeof lucia;
    DatabaseUserAttributes: { email: string; name: string };
  }
}
