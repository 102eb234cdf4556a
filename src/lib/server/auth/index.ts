import type { AstroCookies } from 'astro';
import type { Session, User } from 'lucia';
import { lucia } from './lucia';

export type { Session, User } from 'lucia';
export { hashPassword, verifyPassword, dummyHash } from './password';

export const SESSION_COOKIE = lucia.sessionCookieName;

/** Starts a new session (a fresh id on every sign-in) and sets its cookie. */
export async function startSession(userId: string, cookies: AstroCookies): Promise<Session> {
  const session = await lucia.createSession(userId, {});
  const c = lucia.createSessionCookie(session.id);
  cookies.set(c.name, c.value, c.attributes);
  return session;
}

export async function endSession(sessionId: string, cookies: AstroCookies): Promise<void> {
  await lucia.invalidateSession(sessionId);
  const c = lucia.createBlankSessionCookie();
  cookies.set(c.name, c.value, c.attributes);
}

export const endAllSessions = (userId: string) => lucia.invalidateUserSessions(userId);

/** Validates the cookie; refreshes it when lucia extended the session; blanks it when invalid. */
export async function readSession(cookies: AstroCookies): Promise<{ user: User | null; session: Session | null }> {
  const id = cookies.get(lucia.sessionCookieName)?.value ?? null;
  if (!id) return { user: null, session: null };
  const { session, user } = await lucia.validateSession(id);
  if (session?.fresh) {
    const c = lucia.createSessionCookie(session.id);
    cookies.set(c.name, c.value, c.attributes);
  }
  if (!session) {
    const c = lucia.createBlankSessionCookie();
    cookies.set(c.name, c.value, c.attributes);
  }
  return { user, session };
}
