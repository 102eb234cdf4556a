/**
 * The pure part of the role policy, shared by the server (src/lib/server/policy.ts asks here before it
 * answers 403) and the browser (which only hides what the server would refuse anyway).
 */

/** Team roles, highest first. */
export const ROLES = ['owner', 'editor', 'reviewer', 'viewer'] as const;
export type Role = (typeof ROLES)[number];

/** Roles a share link can carry. */
export const LINK_ROLES = ['viewer', 'reviewer'] as const;
export type LinkRole = (typeof LINK_ROLES)[number];

export type Action =
  | 'team.read'
  | 'team.manage'
  | 'scene.read'
  | 'scene.comment'
  | 'comment.resolve'
  | 'scene.write'
  | 'scene.share'
  | 'scene.delete'
  | 'site.write'
  | 'envelope.write';

export const RANK: Record<Role, number> = { viewer: 0, reviewer: 1, editor: 2, owner: 3 };

/** The lowest role that may perform each action. */
export const NEEDS: Record<Action, Role> = {
  'team.read': 'viewer',
  'scene.read': 'viewer',
  'scene.comment': 'reviewer',
  'comment.resolve': 'reviewer',
  'scene.write': 'editor',
  'scene.share': 'editor',
  'scene.delete': 'editor',
  'site.write': 'editor',
  'envelope.write': 'editor',
  'team.manage': 'owner',
};

/** May a member with `role` perform `action`? (`null` = not a member.) */
export function can(role: Role | null, action: Action): boolean {
  return role !== null && RANK[role] >= RANK[NEEDS[action]];
}

/** Share links carry a role of their own (viewer or reviewer) and can only read and comment. */
export function linkCan(linkRole: LinkRole, action: Action): boolean {
  return can(linkRole, action) && (action === 'scene.read' || action === 'scene.comment');
}
