import { Lucia } from 'lucia';
import { DrizzleSQLiteAdapter } from '@lucia-auth/adapter-drizzle';
import { db } from '../db';
import { sessions, users } from '../db/schema';

// lucia v3 is frozen upstream; it is used only inside src/lib/server/auth/ so it can be swapped out.
const adapter = new DrizzleSQLiteAdapter(db as never, sessions, users);

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
