/**
 * Teams, memberships and invitations. Every function that acts for a user asks the policy first;
 * teams the caller is not in answer 404. Membership changes are audited in the same transaction.
 */
import { and, asc, eq, gt, isNull, sql } from 'drizzle-orm';
import { nanoid } from 'nanoid';
import { z } from 'zod';
import type { User } from 'lucia';
import { audit } from './audit';
import type { MemberOut as Member, PendingInvitation, TeamSummary } from '../contracts/team';

export type { Member, PendingInvitation, TeamSummary };
import { writeTx, type DbOrTx } from './db/client';
import { invitations, memberships, ROLES, teams, users, type Role } from './db/schema';
import { HttpError, notFound } from './http';
import { authorize } from './policy';
import { linkOrigin, sendMail } from './mail';
import { invitationMail } from './mail/templates';
import { hashToken, newToken } from './auth/secret-token';
import { reserve, type Reservation } from './rate-limit';

export const roleField = z.enum(ROLES, { errorMap: () => ({ message: `must be one of ${ROLES.join(', ')}` }) });
export const teamInput = z.object({ name: z.string({ required_error: 'is required' }).trim().min(1, 'is required').max(100, 'must be at most 100 characters') });
export const invitationInput = z.object({
  email: z.string({ required_error: 'is required' }).trim().toLowerCase().email('must be an e-mail address').max(254),
  role: roleField,
});
export const roleInput = z.object({ role: roleField });

export const INVITATION_VALID_DAYS = 7;

export async function listTeamsOf(db: DbOrTx, userId: string): Promise<TeamSummary[]> {
  return db
    .select({ id: teams.id, name: teams.name, role: memberships.role })
    .from(memberships)
    .innerJoin(teams, eq(teams.id, memberships.teamId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(teams.name), asc(teams.id));
}

export async function createTeam(db: DbOrTx, user: User, name: string): Promise<TeamSummary> {
  const id = nanoid();
  const now = new Date();
  await writeTx(db, async (tx) => {
    await tx.insert(teams).values({ id, name, createdAt: now });
    await tx.insert(memberships).values({ teamId: id, userId: user.id, role: 'owner', createdAt: now });
    await audit(tx, { teamId: id, userId: user.id, action: 'team.create', subjectType: 'team', subjectId: id, detail: { name } });
  });
  return { id, name, role: 'owner' };
}

export async function listMembers(db: DbOrTx, user: User, teamId: string): Promise<Member[]> {
  await authorize(db, user, teamId, 'team.read', 'Team');
  const rows = await db
    .select({ userId: users.id, email: users.email, name: users.name, role: memberships.role, joinedAt: memberships.createdAt })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.teamId, teamId))
    .orderBy(asc(users.name), asc(users.email));
  return rows.map((r) => ({ ...r, joinedAt: r.joinedAt.toISOString() }));
}

async function ownerCount(db: DbOrTx, teamId: string): Promise<number> {
  const r = await db
    .select({ n: sql<number>`count(*)` })
    .from(memberships)
    .where(and(eq(memberships.teamId, teamId), eq(memberships.role, 'owner')));
  return Number(r[0]?.n ?? 0);
}

async function membership(db: DbOrTx, teamId: string, userId: string) {
  const rows = await db
    .select()
    .from(memberships)
    .where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)))
    .limit(1);
  return rows[0] ?? null;
}

const lastOwner = () =>
  new HttpError(409, 'last_owner', 'A team must keep at least one owner: make another member an owner first.', 'role');

/** Owner only. Demoting the only owner answers 409 `last_owner`. */
export async function changeRole(db: DbOrTx, actor: User, teamId: string, userId: string, role: Role): Promise<Member> {
  await writeTx(db, async (tx) => {
    await authorize(tx, actor, teamId, 'team.manage', 'Team');
    const m = await membership(tx, teamId, userId);
    if (!m) throw notFound('Member');
    if (m.role === role) return;
    if (m.role === 'owner' && (await ownerCount(tx, teamId)) <= 1) throw lastOwner();
    await tx.update(memberships).set({ role }).where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)));
    await audit(tx, { teamId, userId: actor.id, action: 'member.role', subjectType: 'user', subjectId: userId, detail: { from: m.role, to: role } });
  });
  const members = await listMembers(db, actor, teamId);
  return members.find((x) => x.userId === userId)!;
}

/** Owners remove anyone; any member may leave (remove themselves). The last owner can do neither. */
export async function removeMember(db: DbOrTx, actor: User, teamId: string, userId: string): Promise<void> {
  await writeTx(db, async (tx) => {
    const self = userId === actor.id;
    await authorize(tx, actor, teamId, self ? 'team.read' : 'team.manage', 'Team');
    const m = await membership(tx, teamId, userId);
    if (!m) throw notFound('Member');
    if (m.role === 'owner' && (await ownerCount(tx, teamId)) <= 1) throw lastOwner();
    await tx.delete(memberships).where(and(eq(memberships.teamId, teamId), eq(memberships.userId, userId)));
    await audit(tx, {
      teamId,
      userId: actor.id,
      action: self ? 'member.leave' : 'member.remove',
      subjectType: 'user',
      subjectId: userId,
      detail: { role: m.role },
    });
  });
}

export async function listInvitations(db: DbOrTx, actor: User, teamId: string): Promise<PendingInvitation[]> {
  await authorize(db, actor, teamId, 'team.manage', 'Team');
  const rows = await db
    .select({ id: invitations.id, email: invitations.email, role: invitations.role, createdAt: invitations.createdAt, expiresAt: invitations.expiresAt })
    .from(invitations)
    .where(and(eq(invitations.teamId, teamId), isNull(invitations.acceptedAt), gt(invitations.expiresAt, new Date())))
    .orderBy(asc(invitations.createdAt));
  return rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString(), expiresAt: r.expiresAt.toISOString() }));
}

/**
 * Invitation mail per sender and per team (issue 17, finding 6: 25 invitations in 4.6 s). Fixed windows
 * (a clock hour, a UTC day) counted in the database, so every instance on one database agrees.
 */
export const INVITATION_LIMITS = { perSenderPerHour: 20, perTeamPerDay: 50 } as const;

/**
 * Reserves one invitation mail under both limits, before the request's body is read: 429 with
 * `Retry-After` and a message naming the limit past either. The role is checked first, so nobody
 * outside a team (nor a member below owner) can spend its allowance. The caller gives the hit back
 * (`release`) when no invitation is made (a bad body, an address that is a member already).
 */
export async function holdInvitation(db: DbOrTx, actor: User, teamId: string): Promise<Reservation> {
  await authorize(db, actor, teamId, 'team.manage', 'Team');
  return reserve([
    {
      key: `invite:sender:${actor.id}`,
      limit: INVITATION_LIMITS.perSenderPerHour,
      windowSec: 3600,
      message: `You have sent ${INVITATION_LIMITS.perSenderPerHour} invitations this hour, the most one person may send in an hour.`,
    },
    {
      key: `invite:team:${teamId}`,
      limit: INVITATION_LIMITS.perTeamPerDay,
      windowSec: 86_400,
      message: `This team has sent ${INVITATION_LIMITS.perTeamPerDay} invitations today (UTC), the most a team may send in a day.`,
    },
  ]);
}

/**
 * Owner only. Replaces any pending invitation of the same address to the team, stores the token's
 * SHA-256 and mails the link. `mailed` is false when the mail could not be handed to the SMTP server.
 */
export async function invite(
  db: DbOrTx,
  actor: User,
  teamId: string,
  input: z.infer<typeof invitationInput>,
  requestUrl: URL,
): Promise<{ invitation: PendingInvitation; mailed: boolean }> {
  const token = newToken();
  const now = new Date();
  const expiresAt = new Date(now.getTime() + INVITATION_VALID_DAYS * 86_400_000);
  const id = nanoid();
  const teamName = await writeTx(db, async (tx) => {
    await authorize(tx, actor, teamId, 'team.manage', 'Team');
    const existing = await tx
      .select({ userId: memberships.userId })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(and(eq(memberships.teamId, teamId), eq(users.email, input.email)))
      .limit(1);
    if (existing.length) throw new HttpError(409, 'already_member', 'This person is a member of the team already.', 'email');
    await tx.delete(invitations).where(and(eq(invitations.teamId, teamId), eq(invitations.email, input.email), isNull(invitations.acceptedAt)));
    await tx.insert(invitations).values({
      id, tokenHash: hashToken(token), teamId, email: input.email, role: input.role, invitedBy: actor.id, createdAt: now, expiresAt,
    });
    await audit(tx, { teamId, userId: actor.id, action: 'member.invite', subjectType: 'invitation', subjectId: id, detail: { email: input.email, role: input.role } });
    return (await tx.select({ name: teams.name }).from(teams).where(eq(teams.id, teamId)).limit(1))[0]!.name;
  });
  const mail = invitationMail({ teamName, inviterName: actor.name, role: input.role, url: `${linkOrigin(requestUrl)}/invitations/${token}`, expiresAt });
  let mailed = true;
  try {
    await sendMail({ to: input.email, ...mail });
  } catch (e) {
    mailed = false;
    console.error('[mail] invitation mail failed', e);
  }
  return { invitation: { id, email: input.email, role: input.role, createdAt: now.toISOString(), expiresAt: expiresAt.toISOString() }, mailed };
}

export async function revokeInvitation(db: DbOrTx, actor: User, teamId: string, invitationId: string): Promise<void> {
  await writeTx(db, async (tx) => {
    await authorize(tx, actor, teamId, 'team.manage', 'Team');
    const r = await tx
      .delete(invitations)
      .where(and(eq(invitations.id, invitationId), eq(invitations.teamId, teamId), isNull(invitations.acceptedAt)))
      .returning({ email: invitations.email });
    if (!r.length) throw notFound('Invitation');
    await audit(tx, { teamId, userId: actor.id, action: 'member.invite_revoke', subjectType: 'invitation', subjectId: invitationId, detail: { email: r[0]!.email } });
  });
}

export interface InvitationPreview {
  teamId: string;
  teamName: string;
  email: string;
  role: Role;
  invitedBy: string | null;
  expiresAt: string;
}

/** What the invitation page shows; null for unknown, used or expired tokens. */
export async function previewInvitation(db: DbOrTx, token: string): Promise<InvitationPreview | null> {
  const rows = await db
    .select({ teamId: invitations.teamId, teamName: teams.name, email: invitations.email, role: invitations.role, invitedBy: users.name, expiresAt: invitations.expiresAt })
    .from(invitations)
    .innerJoin(teams, eq(teams.id, invitations.teamId))
    .leftJoin(users, eq(users.id, invitations.invitedBy))
    .where(and(eq(invitations.tokenHash, hashToken(token)), isNull(invitations.acceptedAt), gt(invitations.expiresAt, new Date())))
    .limit(1);
  const r = rows[0];
  return r ? { ...r, expiresAt: r.expiresAt.toISOString() } : null;
}

/**
 * The signed-in user joins with the invitation's role. The invitation is bound to the address it was
 * sent to, so a forwarded or leaked link is useless to anyone else.
 */
export async function acceptInvitation(db: DbOrTx, user: User, token: string): Promise<TeamSummary> {
  return writeTx(db, async (tx) => {
    const now = new Date();
    const rows = await tx
      .select()
      .from(invitations)
      .where(and(eq(invitations.tokenHash, hashToken(token)), isNull(invitations.acceptedAt), gt(invitations.expiresAt, now)))
      .limit(1);
    const inv = rows[0];
    if (!inv) throw new HttpError(404, 'not_found', 'This invitation is invalid, used or expired.');
    if (inv.email !== user.email.toLowerCase()) {
      throw new HttpError(403, 'wrong_account', `This invitation was sent to ${inv.email}; sign in with that address to accept it.`);
    }
    if (await membership(tx, inv.teamId, user.id)) throw new HttpError(409, 'already_member', 'You are a member of this team already.');
    // The address must be proven: otherwise whoever holds a leaked link could sign up with it and join.
    const verified = await tx.select({ at: users.emailVerifiedAt }).from(users).where(eq(users.id, user.id)).limit(1);
    if (!verified[0]?.at) {
      throw new HttpError(403, 'email_unverified', `Confirm your e-mail address first: open the link we mailed to ${inv.email} (or ask for a new one on this page).`);
    }
    await tx.insert(memberships).values({ teamId: inv.teamId, userId: user.id, role: inv.role, createdAt: now });
    await tx.update(invitations).set({ acceptedAt: now, acceptedBy: user.id }).where(eq(invitations.id, inv.id));
    await audit(tx, { teamId: inv.teamId, userId: user.id, action: 'member.join', subjectType: 'invitation', subjectId: inv.id, detail: { role: inv.role } });
    const team = (await tx.select({ name: teams.name }).from(teams).where(eq(teams.id, inv.teamId)).limit(1))[0]!;
    return { id: inv.teamId, name: team.name, role: inv.role };
  });
}
