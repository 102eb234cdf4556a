/**
 * One typed TanStack Query hook per query key: the hook owns the key, the URL and the answer's type.
 * To add one: (1) put the answer's shape in src/lib/contracts/ if the server sends it; (2) add a key
 * maker to `keys` below; (3) write `useThing(id)` calling `useQuery({ queryKey: keys.thing(id),
 * queryFn: ({ signal }) => apiGet<Answer>(url, signal) })`; (4) invalidate with `keys.thing(id)` after
 * a mutation. Components never build a key or a URL for a GET themselves.
 */
import { useQuery } from '@tanstack/react-query';
import { apiGet } from './api';
import type { SceneListRow } from './scene-list';
import type { ChartCommentOut, CommentOut } from '../contracts/comment';
import type { EnvelopeOut } from '../contracts/envelope';
import type { LinkOut } from '../contracts/link';
import type { LinkRole } from '../contracts/roles';
import type { PublicScene, VersionOut } from '../contracts/scene';
import type { SiteOut } from '../contracts/site';
import type { ActivityOut, MemberOut, PendingInvitation } from '../contracts/team';

const enc = encodeURIComponent;

/** Every query key in the browser. A prefix (e.g. `keys.versions(id)`) invalidates all its variants. */
export const keys = {
  members: (teamId: string) => ['members', teamId] as const,
  invitations: (teamId: string) => ['invitations', teamId] as const,
  activity: (teamId: string) => ['activity', teamId] as const,
  scenes: (teamId: string) => ['scenes', teamId] as const,
  sites: (teamId: string) => ['sites', teamId] as const,
  envelopes: (teamId: string) => ['envelopes', teamId] as const,
  links: (sceneId: string) => ['links', sceneId] as const,
  versions: (sceneId: string, version?: number) => (version === undefined ? (['versions', sceneId] as const) : (['versions', sceneId, version] as const)),
  shared: (token: string) => ['shared', token] as const,
  chartComments: (token: string) => ['chart-comments', token] as const,
  comments: (access: CommentsAccess) => (access.kind === 'member' ? (['comments', access.sceneId] as const) : (['shared-comments', access.token] as const)),
};

/** Comments are read by members (by scene) or by guests of a share link (by token). */
export type CommentsAccess = { kind: 'member'; sceneId: string } | { kind: 'guest'; token: string };

export const useMembers = (teamId: string) =>
  useQuery({ queryKey: keys.members(teamId), queryFn: ({ signal }) => apiGet<{ members: MemberOut[] }>(`/api/teams/${enc(teamId)}/members`, signal) });

export const useInvitations = (teamId: string, enabled = true) =>
  useQuery({ queryKey: keys.invitations(teamId), enabled, queryFn: ({ signal }) => apiGet<{ invitations: PendingInvitation[] }>(`/api/teams/${enc(teamId)}/invitations`, signal) });

export const useActivity = (teamId: string) =>
  useQuery({ queryKey: keys.activity(teamId), refetchInterval: 30_000, queryFn: ({ signal }) => apiGet<{ activity: ActivityOut[] }>(`/api/teams/${enc(teamId)}/activity?limit=20`, signal) });

export const useScenes = (teamId: string, enabled = true) =>
  useQuery({ queryKey: keys.scenes(teamId), enabled, queryFn: ({ signal }) => apiGet<{ scenes: SceneListRow[] }>(`/api/scenes?teamId=${enc(teamId)}`, signal) });

export const useSites = (teamId: string, enabled = true) =>
  useQuery({ queryKey: keys.sites(teamId), enabled, queryFn: ({ signal }) => apiGet<{ sites: SiteOut[] }>(`/api/teams/${enc(teamId)}/sites`, signal) });

export const useEnvelopes = (teamId: string) =>
  useQuery({ queryKey: keys.envelopes(teamId), queryFn: ({ signal }) => apiGet<{ envelopes: EnvelopeOut[] }>(`/api/teams/${enc(teamId)}/envelopes`, signal) });

export const useLinks = (sceneId: string) =>
  useQuery({ queryKey: keys.links(sceneId), queryFn: ({ signal }) => apiGet<{ links: LinkOut[] }>(`/api/scenes/${enc(sceneId)}/links`, signal) });

export const useVersions = (sceneId: string, version: number) =>
  useQuery({ queryKey: keys.versions(sceneId, version), queryFn: ({ signal }) => apiGet<{ versions: VersionOut[]; current: number }>(`/api/scenes/${enc(sceneId)}/versions`, signal) });

export const useSharedScene = (token: string) =>
  useQuery({
    queryKey: keys.shared(token),
    retry: false,
    refetchInterval: 60_000,
    queryFn: ({ signal }) => apiGet<{ scene: PublicScene; role: LinkRole }>(`/api/shared/${enc(token)}`, signal),
  });

export const useCommentList = (access: CommentsAccess, enabled = true) =>
  useQuery({
    queryKey: keys.comments(access),
    enabled,
    refetchInterval: 15_000,
    queryFn: ({ signal }) =>
      apiGet<{ comments: CommentOut[] }>(access.kind === 'member' ? `/api/scenes/${enc(access.sceneId)}/comments` : `/api/shared/${enc(access.token)}/comments`, signal).then((r) => r.comments),
  });

/** The comments pinned to the altitude chart, through any share link (viewer links included). */
export const useChartComments = (token: string, enabled = true) =>
  useQuery({
    queryKey: keys.chartComments(token),
    enabled,
    refetchInterval: 30_000,
    queryFn: ({ signal }) => apiGet<{ comments: ChartCommentOut[] }>(`/api/shared/${enc(token)}/chart-comments`, signal).then((r) => r.comments),
  });
