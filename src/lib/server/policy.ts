/**
 * The one place that decides who may do what. Every route asks here.
 * Resources of a team the caller is not in answer 404 (never reveal they exist).
 */
import { and, eq } from 'drizzle-orm';
import type { User } from 'lucia';
import type { DbOrTx } from './db/client';
import { memberships } from './db/schema';
import { HttpError, notFound, unauthorized } from './http';
import { can, type Action, type Role } from '../contracts/roles';

export type { Action };

export function requireUser(locals: App.Locals): User {
  if (!locals.user) throw unauthorized();
  return locals.user;
}

export async function roleIn(db: DbOrTx, userId: string, teamId: string): Promise<Role | null> {
  const rows = await db
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.userId, userId), eq(memberships.teamId, teamId)))
    .limit(1);
  return rows[0]?.role ?? null;
}

/**
 * Throws 404 when the user is not in the team, 403 when the role is too low; returns the role.
 * `what` names the resource in the 404 message.
 */
export async function authorize(db: DbOrTx, user: User, teamId: string, action: Action, what = 'Resource'): Promise<Role> {
  return decide(await roleIn(db, user.id, teamId), action, what);
}

/** authorize() for a role already read (e.g. joined with the resource): the same 404 / 403. */
export function decide(role: Role | null, action: Action, what = 'Resource'): Role {
  if (role === null) throw notFound(what);
  if (!can(role, action)) throw new HttpError(403, 'forbidden', `Your role (${role}) cannot do that.`);
  return role;
}
