/** Teams, members and the signed-in user's summary, as the API returns them. */
import { z } from 'zod';
import { ROLES, type Role } from './roles';
import { isoUtc } from './scene-doc';

/** `GET /api/teams/:teamId/activity?limit=&before=`. */
export const activityQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(50),
  /** Page back: entries strictly before this instant. */
  before: isoUtc.optional(),
});

export interface TeamSummary {
  id: string;
  name: string;
  role: Role;
}

/** One member of a team (GET /api/teams/:teamId/members). */
export interface MemberOut {
  userId: string;
  email: string;
  name: string;
  role: Role;
  joinedAt: string;
}

/** An invitation not yet accepted (GET /api/teams/:teamId/invitations, owners only). */
export interface PendingInvitation {
  id: string;
  email: string;
  role: Role;
  createdAt: string;
  expiresAt: string;
}

export interface Me {
  user: { id: string; email: string; name: string };
  teams: { id: string; name: string; role: Role }[];
}

/** One entry of a team's activity (GET /api/teams/:teamId/activity), newest first. */
export interface ActivityOut {
  id: string | number;
  at: string;
  action: string;
  subjectType: string | null;
  subjectId: string | null;
  user: { id: string; name: string } | null;
  detail: Record<string, unknown>;
}

/** `GET /api/me` as a schema, for the API description (checked against `Me` below). */
export const meSchema = z.object({
  user: z.object({ id: z.string(), email: z.string(), name: z.string() }),
  teams: z.array(z.object({ id: z.string(), name: z.string(), role: z.enum(ROLES) })),
  emailVerified: z.boolean(),
});
const _meFits: Me = {} as z.infer<typeof meSchema>;
const _schemaFitsMe: Omit<z.infer<typeof meSchema>, 'emailVerified'> = {} as Me;
void _meFits;
void _schemaFitsMe;
