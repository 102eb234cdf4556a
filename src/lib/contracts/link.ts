/** Share links: request body and the answer (API contract "Share links"). */
import { z } from 'zod';
import { knownKeysOnly } from './known-keys';
import { isoUtc } from './scene-doc';
import type { LinkRole } from './roles';

const linkCreateShape = z.object({
  role: z.enum(['viewer', 'reviewer'], { required_error: 'is required' }),
  expiresAt: isoUtc.nullable().optional(),
});
export const linkCreateSchema = knownKeysOnly(linkCreateShape, linkCreateShape);


export interface LinkOut {
  id: string;
  sceneId?: string;
  role: LinkRole;
  createdAt: string;
  expiresAt: string | null;
  revokedAt: string | null;
  lastUsedAt: string | null;
  revoked?: boolean;
  expired?: boolean;
  active?: boolean;
}
