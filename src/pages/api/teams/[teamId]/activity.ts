import { and, desc, eq, lt } from 'drizzle-orm';
import { db } from '../../../../lib/server/db';
import { auditLog, users } from '../../../../lib/server/db/schema';
import { json, parseQuery, route } from '../../../../lib/server/http';
import { authorize, requireUser } from '../../../../lib/server/policy';
import { can } from '../../../../lib/contracts/roles';
import { activityQuerySchema } from '../../../../lib/contracts/team';

function withoutEmail(detail: Record<string, unknown>): Record<string, unknown> {
  const { email: _email, ...rest } = detail;
  return rest;
}

/** The team's activity, newest first, from the audit log. */
export const GET = route(async ({ locals, params, url }) => {
  const user = requireUser(locals);
  const role = await authorize(db, user, params.teamId!, 'team.read', 'Team');
  // Invited addresses are shown to those who may see the invitations themselves (GET …/invitations):
  // for everyone else the activity says that someone was invited, not who (issue 17 finding 10).
  const seesInvitees = can(role, 'team.manage');
  const q = parseQuery(activityQuerySchema, url);
  const rows = await db
    .select({
      id: auditLog.id,
      at: auditLog.at,
      action: auditLog.action,
      subjectType: auditLog.subjectType,
      subjectId: auditLog.subjectId,
      detail: auditLog.detail,
      userId: auditLog.userId,
      userName: users.name,
    })
    .from(auditLog)
    .leftJoin(users, eq(users.id, auditLog.userId))
    .where(and(eq(auditLog.teamId, params.teamId!), q.before ? lt(auditLog.at, new Date(q.before)) : undefined))
    .orderBy(desc(auditLog.at), desc(auditLog.id))
    .limit(q.limit);
  return json({
    activity: rows.map((r) => ({
      id: r.id,
      at: r.at.toISOString(),
      action: r.action,
      subjectType: r.subjectType,
      subjectId: r.subjectId,
      user: r.userId ? { id: r.userId, name: r.userName ?? '' } : null,
      detail: seesInvitees || !r.action.startsWith('member.invite') ? (r.detail ?? {}) : withoutEmail(r.detail ?? {}),
    })),
  });
});
