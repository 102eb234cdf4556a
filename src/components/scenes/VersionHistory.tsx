/** Every saved version with its author and time; restoring makes a new version with the old content. */
import { useQuery, useMutation, useQueryClient } from '@tanstack/react-query';
import { apiGet, apiPost, errorText } from '../../lib/client/api';
import type { SceneOut, VersionOut } from '../../lib/contracts/scene';
import { timeAgo } from '../../lib/client/scene-view';
import { Button } from '../ui/Button';
import { Alert } from '../ui/Alert';

export function VersionHistory({ scene, canRestore, onRestored, memberNames }: { scene: SceneOut; canRestore: boolean; onRestored: (s: SceneOut) => void; memberNames: Map<string, string> }) {
  const qc = useQueryClient();
  const q = useQuery({
    queryKey: ['versions', scene.id, scene.version],
    queryFn: () => apiGet<{ versions: VersionOut[]; current: number }>(`/api/scenes/${scene.id}/versions`),
  });
  const restore = useMutation({
    mutationFn: (n: number) => apiPost<{ scene: SceneOut }>(`/api/scenes/${scene.id}/versions/${n}/restore`, { version: scene.version }),
    onSuccess: (r) => {
      onRestored(r.scene);
      void qc.invalidateQueries({ queryKey: ['versions', scene.id] });
    },
  });
  if (q.isPending) return <p className="text-sm text-ink-300">Loading history…</p>;
  if (q.isError) return <Alert tone="error">{errorText(q.error)}</Alert>;
  return (
    <div className="flex flex-col gap-2">
      {restore.isError && <Alert tone="error">{errorText(restore.error)}</Alert>}
      <ol className="flex flex-col gap-1" aria-label="Versions, newest first">
        {q.data.versions.map((v) => {
          const author = v.authorName ?? (v.authorId ? memberNames.get(v.authorId) : null) ?? (v.authorId ? 'A team member' : 'Armilla');
          const current = v.version === scene.version;
          return (
            <li key={v.version} className="flex items-center justify-between gap-2 rounded bg-ink-850 px-3 py-2 text-sm">
              <div className="min-w-0">
                <p>
                  <span className="font-semibold">v{v.version}</span> {v.title ? <span className="text-ink-300">· {v.title}</span> : null}
                  {current && <span className="ml-2 text-xs text-brass-300">current</span>}
                </p>
                <p className="text-xs text-ink-300">
                  {author} · <time dateTime={v.createdAt} title={new Date(v.createdAt).toLocaleString()}>{timeAgo(v.createdAt)}</time>
                </p>
              </div>
              {canRestore && !current && (
                <Button variant="secondary" className="px-2 py-1 text-xs" busy={restore.isPending && restore.variables === v.version} onClick={() => restore.mutate(v.version)} aria-label={`Restore version ${v.version}`}>
                  Restore
                </Button>
              )}
            </li>
          );
        })}
      </ol>
    </div>
  );
}
