/** Shapes the islands read from the API (type-only: nothing here reaches the bundle). */
import type { SceneOut, Anchor } from '../server/scenes';
import type { Camera, Layers, Pin, Site, Step, Target } from '../scenes/scene';

export type { SceneOut, Anchor, Camera, Layers, Pin, Site, Step, Target };
export type Role = 'owner' | 'editor' | 'reviewer' | 'viewer';
export type LinkRole = 'viewer' | 'reviewer';

/** The scene as a guest of a share link sees it. */
export type PublicScene = Omit<SceneOut, 'createdBy' | 'updatedBy'>;

export interface Me {
  user: { id: string; email: string; name: string };
  teams: { id: string; name: string; role: Role }[];
}

export interface SiteOut extends Site {
  id: string;
  teamId: string;
}

export interface EnvelopeOut {
  id: string;
  teamId: string;
  name: string;
  data: Record<string, unknown>;
}

export interface VersionOut {
  version: number;
  authorId: string | null;
  authorName?: string | null;
  createdAt: string;
  title?: string;
}

export type { CommentOut } from '../server/comments';
export type { PresenterOut } from '../server/presenter';

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

export interface ActivityOut {
  id: string | number;
  action: string;
  subjectType?: string | null;
  subjectId?: string | null;
  userName?: string | null;
  userId?: string | null;
  detail?: Record<string, unknown> | null;
  createdAt: string;
}


/** The editable part of a scene: what autosave sends and what a conflict compares. */
export const EDITABLE_FIELDS = ['title', 'description', 'site', 'time', 'layers', 'camera', 'envelopeId', 'envelope', 'targets', 'pins', 'steps'] as const;
export type EditableField = (typeof EDITABLE_FIELDS)[number];
export type SceneFields = Pick<SceneOut, EditableField>;
