import { describe, expect, test } from 'vitest';
import { can, linkCan, type Action } from '../../../src/lib/contracts/roles';
import { ROLES, type Role } from '../../../src/lib/server/db/schema';

// The expected table is the product brief's role list ("editors edit, reviewers comment, viewers watch
// read-only"; owners manage members), written out independently of the policy's rank table.
const EXPECTED: Record<Action, Role[]> = {
  'team.read': ['owner', 'editor', 'reviewer', 'viewer'],
  'scene.read': ['owner', 'editor', 'reviewer', 'viewer'],
  'scene.comment': ['owner', 'editor', 'reviewer'],
  'comment.resolve': ['owner', 'editor', 'reviewer'],
  'scene.write': ['owner', 'editor'],
  'scene.share': ['owner', 'editor'],
  'scene.delete': ['owner', 'editor'],
  'site.write': ['owner', 'editor'],
  'envelope.write': ['owner', 'editor'],
  'team.manage': ['owner'],
};

describe('policy can()', () => {
  for (const [action, allowed] of Object.entries(EXPECTED) as [Action, Role[]][]) {
    test(`${action}: allowed for ${allowed.join(', ')} only`, () => {
      for (const role of ROLES) expect(can(role, action), `${role} → ${action}`).toBe(allowed.includes(role));
    });
  }

  test('a non-member (null) can do nothing', () => {
    for (const action of Object.keys(EXPECTED) as Action[]) expect(can(null, action)).toBe(false);
  });

  test('share links: viewer links read, reviewer links read and comment, neither writes', () => {
    expect(linkCan('viewer', 'scene.read')).toBe(true);
    expect(linkCan('viewer', 'scene.comment')).toBe(false);
    expect(linkCan('reviewer', 'scene.comment')).toBe(true);
    expect(linkCan('reviewer', 'comment.resolve')).toBe(false);
    expect(linkCan('reviewer', 'scene.write')).toBe(false);
  });
});
