/**
 * The comments of a scene (members) or of a share link (guests), as a query. Apart from ReviewPanel so a
 * viewer link, which loads the panel only when it shows it, can still count and mark comments.
 */
import { useQuery } from '@tanstack/react-query';
import { apiGet } from '../../lib/client/api';
import type { CommentOut } from '../../lib/contracts/comment';

export type ReviewAccess =
  | { kind: 'member'; sceneId: string; canComment: boolean; canResolve: boolean }
  | { kind: 'guest'; token: string; canComment: boolean };

export function commentsKey(a: ReviewAccess) {
  return a.kind === 'member' ? ['comments', a.sceneId] : ['shared-comments', a.token];
}

export function useComments(a: ReviewAccess, enabled = true) {
  return useQuery({
    queryKey: commentsKey(a),
    enabled,
    refetchInterval: 15_000,
    queryFn: () => apiGet<{ comments: CommentOut[] }>(a.kind === 'member' ? `/api/scenes/${a.sceneId}/comments` : `/api/shared/${encodeURIComponent(a.token)}/comments`).then((r) => r.comments),
  });
}

